/**
 * `fluxlane yield` and `fluxlane yield-merge` as commands: the text and JSON outputs, a kept plan
 * read from a file, one chip in detail, the progress bar (terminal only, silent with --json), and
 * bad input (exit 2, one message naming the option).
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runFluxlane } from '../support/cli.js';

const demo = join(process.cwd(), 'layouts/bowline-5.yaml');
const tmp = () => mkdtempSync(join(tmpdir(), 'fluxlane-yield-'));

describe('fluxlane yield', () => {
  it('prints the yield with its Wilson interval, the failing rules and the sweep; --json gives the same numbers', async () => {
    const args = ['yield', demo, '--samples', '40', '--threads', '1', '--sweep-spread', '0.5%,2%'];
    const text = await runFluxlane(args);
    expect(text.code).toBe(0);
    expect(text.err).toBe('');
    const j = (await runFluxlane([...args, '--json'])).json();
    expect(j).toMatchObject({ format: 'fluxlane-yield', version: 1, chip: 'Bowline-5', layout: demo, mode: 'fixed', seed: 1, samples: 40, planSeed: null, cycleError: null });
    expect(j.layoutSha256).toMatch(/^[0-9a-f]{64}$/);
    expect(j.spread).toEqual({ rn: 0.02, ec: 0.01, g: 0.03, measured: { rn: [], ec: [] } });
    expect(j.plan).toEqual({ source: 'planned', seed: 1, holds: true, violations: 0 });
    expect(j.confidence).toEqual({ level: 0.95, z: 1.959963984540054, method: 'Wilson score interval' });
    const y = j.yield;
    expect(y.samples).toBe(40);
    expect(y.low).toBeLessThanOrEqual(y.fraction);
    expect(y.high).toBeGreaterThanOrEqual(y.fraction);
    expect(text.out).toContain(`yield ${(100 * y.fraction).toFixed(1)} % (${y.successes} of 40), 95 % interval ${(100 * y.low).toFixed(1)} % to ${(100 * y.high).toFixed(1)} % (Wilson)`);
    expect(j.failures.rules[0]).toMatchObject({ rule: 'window' });
    expect(text.out).toMatch(/\n {4}window +\d+ +\d+\.\d % +\d+\n/);
    expect(j.failures.examples.length).toBeGreaterThan(0);
    expect(j.sweepSpread.map((s: { rn: number }) => s.rn)).toEqual([0.005, 0.02]);
    // the 2 % row of the sweep is the run itself
    expect(j.sweepSpread[1]).toEqual({ rn: 0.02, ...y });
    expect(text.out).toMatch(/yield against junction R_n spread[^\n]*\n.*\n {4}0\.50 % /);
    expect(text.out).toMatch(/\(model estimates: verify on hardware\)/);
  });

  it('keeps a plan read from a file (--plan), and --sample K lists what one drawn chip breaks', async () => {
    const dir = tmp();
    expect((await runFluxlane(['plan', demo, '--no-pulses', '-o', 'p'], { cwd: dir })).code).toBe(0);
    const r = await runFluxlane(['yield', demo, '--plan', 'p/plan.json', '--samples', '10', '--threads', '1', '--json'], { cwd: dir });
    expect(r.code, r.err).toBe(0);
    expect(r.json().plan).toMatchObject({ source: 'file', file: 'p/plan.json' });
    const failing = r.json().failures.examples[0].sample as number;
    const one = await runFluxlane(['yield', demo, '--plan', 'p/plan.json', '--samples', '10', '--sample', String(failing), '--json'], { cwd: dir });
    expect(one.code).toBe(0);
    const d = one.json();
    expect(d).toMatchObject({ sample: failing, ok: false, mode: 'fixed' });
    expect(d.violations[0].message).toBe(r.json().failures.examples[0].reason);
    expect(Object.keys(d.qubits)).toEqual(['Q0', 'Q1', 'Q2', 'Q3', 'Q4']);
    expect(d.qubits.Q1.ec).toBeGreaterThan(1e8); // Hz
  });

  it('replan mode plans each chip anew', async () => {
    const r = await runFluxlane(['yield', demo, '--mode', 'replan', '--samples', '3', '--threads', '1', '--json']);
    expect(r.code, r.err).toBe(0);
    expect(r.json()).toMatchObject({ mode: 'replan', planSeed: 1, plan: null, yield: { samples: 3 } });
  });

  it('draws a progress bar with the running yield on a terminal, and nothing with --json', async () => {
    const tty = await runFluxlane(['yield', demo, '--samples', '20', '--threads', '1'], { stderrIsTTY: true });
    expect(tty.err).toMatch(/^\ryield \(fixed\) \[[#.]+\] \d+\/20 \d+\.\d s yield \d+\.\d %/);
    expect(tty.err.endsWith('\r\x1b[K')).toBe(true);
    const json = await runFluxlane(['yield', demo, '--samples', '20', '--threads', '1', '--json'], { stderrIsTTY: true });
    expect(json.err).toBe('');
  });

  it.each([
    [['--spread-rn', '20%'], 'option --spread-rn: expected a relative spread from 0 to 10% (e.g. "2%" or 0.02), found "20%"\n'],
    [['--spread-ec', 'lots'], 'option --spread-ec: expected a relative spread from 0 to 10% (e.g. "2%" or 0.02), found "lots"\n'],
    [['--sweep-spread', '1%,1%'], 'option --sweep-spread: expected distinct spreads, found "1%,1%"\n'],
    [['--samples', '0'], 'option --samples: expected an integer from 1 to 10000000, found "0"\n'],
    [['--mode', 'replan', '--plan', 'x.json'], 'option --plan: expected with --mode fixed (the plan to keep), found --mode replan (every chip is planned anew)\n'],
    [['--max-cycle-error', '0.01'], 'option --max-cycle-error: expected with --mode replan (the ceiling applies to each new plan), found --mode fixed\n'],
    [['--mode', 'replan', '--max-cycle-error', '2'], 'option --max-cycle-error: expected an error per cycle (a number between 0 and 1), found "2"\n'],
    [['--shard', '3/3'], 'option --shard: expected K/N with 0 <= K < N <= 100000 (e.g. 0/8, as Slurm numbers array tasks), found "3/3"\n'],
    [['--shard', '0/3'], 'shard 0/3: expected -o FILE for its part (or --json to print it)\n'],
    [['--samples', '5', '--sample', '5'], 'option --sample: expected a sample index below --samples 5, found 5\n'],
    [['--plan', 'missing.json'], 'missing.json: expected a readable plan file, found no such file\n'],
  ])('bad input %j exits 2 with one message', async (extra, message) => {
    const r = await runFluxlane(['yield', demo, '--threads', '1', ...extra], { cwd: tmp() });
    expect(r.err).toBe(message);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
  });

  it('a bad layout is refused with its position, as by every command', async () => {
    const r = await runFluxlane(['yield', 'package.json']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^package\.json:\d+:\d+: /);
  });
});

describe('fluxlane yield-merge', () => {
  it('one part merges into the whole run (a run of one shard)', async () => {
    const dir = tmp();
    const args = ['yield', demo, '--samples', '12', '--threads', '1'];
    expect((await runFluxlane([...args, '--shard', '0/1', '-o', 'p0.json'], { cwd: dir })).code).toBe(0);
    expect((await runFluxlane([...args, '-o', 'whole.json'], { cwd: dir })).code).toBe(0);
    const m = await runFluxlane(['yield-merge', 'p0.json', '-o', 'merged.json'], { cwd: dir });
    expect(m.code, m.err).toBe(0);
    expect(m.out).toMatch(/\nwrote merged\.json \(1 part\(s\)\)\n$/);
    expect(readFileSync(join(dir, 'merged.json'), 'utf8')).toBe(readFileSync(join(dir, 'whole.json'), 'utf8'));
  });

  it('refuses a file that is not JSON, naming it', async () => {
    const r = await runFluxlane(['yield-merge', demo]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/bowline-5\.yaml: expected a yield part \(JSON written by fluxlane yield --shard K\/N -o FILE\), found a JSON syntax error/);
  });
});
