import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { runFluxlane } from '../support/cli.js';

const LAYOUT = 'layouts/bowline-5.yaml';
const dir = mkdtempSync(path.join(tmpdir(), 'fluxlane-gate-'));

describe('fluxlane gate', () => {
  it('--json prints the contract of issue 5, and the exported waveform re-simulates to the same metrics', async () => {
    const wave = path.join(dir, 'q1q0.csv');
    const g = await runFluxlane(['gate', LAYOUT, '--edge', 'Q1-Q0', '--family', 'erf', '--waveform', wave, '--json']);
    expect(g.code).toBe(0);
    const d = g.json();
    for (const key of ['edge', 'mover', 'family', 'rampTime', 'holdTime', 'duration', 'interactionFrequency', 'crossingOffset', 'conditionalPhase', 'leakage', 'fidelity', 'virtualZ', 'speedLimit', 'untuned']) {
      expect(d, key).toHaveProperty(key);
    }
    expect(d.edge).toEqual(['Q1', 'Q0']);
    expect(d.rampTime).toBeCloseTo(8e-9, 15);
    expect(readFileSync(wave, 'utf8').startsWith('time_ns,flux_phi0\n')).toBe(true);
    const s = await runFluxlane(['simulate', LAYOUT, '--edge', 'Q1-Q0', '--trajectory', wave, '--json']);
    expect(s.code).toBe(0);
    const r = s.json();
    expect(r.conditionalPhase).toBeCloseTo(d.conditionalPhase, 9);
    expect(r.leakage).toBeCloseTo(d.leakage, 12);
    expect(r.fidelity).toBeCloseTo(d.fidelity, 9);
    expect(r.virtualZ.a).toBeCloseTo(d.virtualZ.a, 9);
  });

  it('--noise adds fidelityNoisy; the text output carries the caution', async () => {
    const g = await runFluxlane(['gate', LAYOUT, '--edge', 'Q1-Q0', '--family', 'erf', '--noise']);
    expect(g.code).toBe(0);
    expect(g.out).toContain('with decoherence');
    expect(g.out).toContain('verify on hardware');
  });

  it('an impossible duration exits 1 with the reason', async () => {
    const dir2 = mkdtempSync(path.join(tmpdir(), 'fluxlane-gate-'));
    const yaml = readFileSync(LAYOUT, 'utf8').replace(/maxGate: [^\n]*/, 'maxGate: 12 ns');
    expect(yaml).toContain('maxGate: 12 ns');
    const file = path.join(dir2, 'short.yaml');
    (await import('node:fs')).writeFileSync(file, yaml);
    const g = await runFluxlane(['gate', file, '--edge', 'Q1-Q0', '--family', 'erf', '--json']);
    expect(g.code).toBe(1);
    expect(g.json().feasible).toBe(false);
    expect(g.json().reason).toContain('maximum gate duration');
  });

  it('bad options are bad input (exit 2)', async () => {
    for (const args of [
      ['--family', 'square'],
      ['--ramp', 'fast'],
      ['--phase', '7'],
      ['--crossing', '10-01'],
      ['--mover', 'Q3'],
    ]) {
      const r = await runFluxlane(['gate', LAYOUT, '--edge', 'Q1-Q0', ...args]);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.err).toMatch(/option --|expected/);
    }
  });
});
