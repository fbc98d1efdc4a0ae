// The V8 settings of the command's process (src/cli/v8-tuning.ts): applied unless the user gave
// them to node, and without effect on any output (the same bytes with V8's default budget).
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { tuneV8, V8_SETTINGS } from '../../src/cli/v8-tuning.js';

describe('tuneV8', () => {
  it('sets each setting the user did not give node', () => {
    const set: string[] = [];
    expect(tuneV8([], '', (f) => set.push(f))).toEqual(['--interrupt-budget=250000']);
    expect(set).toEqual(V8_SETTINGS.map((s) => `${s.flag}=${s.value}`));
  });

  it('leaves a setting given on the command line or in NODE_OPTIONS, in either spelling', () => {
    const set: string[] = [];
    expect(tuneV8(['--interrupt-budget=1000'], '', (f) => set.push(f))).toEqual([]);
    expect(tuneV8([], '--max-old-space-size=4096 --interrupt_budget=5000', (f) => set.push(f))).toEqual([]);
    expect(set).toEqual([]);
  });

  it('sets it when the user gave only another flag whose name begins the same way', () => {
    const set: string[] = [];
    expect(tuneV8(['--interrupt-budget-factor-for-feedback-allocation=8'], '', (f) => set.push(f))).toEqual(['--interrupt-budget=250000']);
    expect(set).toEqual(['--interrupt-budget=250000']);
  });
});

describe('the command with and without the settings', () => {
  // With V8's default budget given on node's command line (67,584 in Node 20's V8 11.3), tuneV8
  // leaves it (node refuses V8 flags in NODE_OPTIONS but a few).
  const run = (nodeArgs: string[]) =>
    spawnSync(process.execPath, [...nodeArgs, '--import', 'tsx', 'src/cli/main.ts', 'check', 'layouts/clove-17.yaml', '--json'], {
      encoding: 'utf8',
      env: { ...process.env, FLUXLANE_DEBUG: '' },
    });

  it('prints the same bytes', () => {
    const tuned = run([]);
    const plain = run(['--interrupt-budget=67584']);
    expect(plain.stderr).toBe('');
    expect(tuned.stderr).toBe('');
    expect(tuned.stdout.length).toBeGreaterThan(1000);
    expect(tuned.stdout).toBe(plain.stdout);
  });
});
