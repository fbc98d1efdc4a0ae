/**
 * `fluxlane plan` (src/cli/commands/plan.ts): the files it writes, the JSON contract of issue 6
 * (SI units: Hz, s, rad; flux in Phi0), determinism, exit codes, and the gate stage seam.
 */
import { describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runFluxlane } from '../support/cli.js';
import { loadGateDesigner } from '../../src/plan/gate-seam.js';

const DEMOS = ['layouts/bowline-5.yaml', 'layouts/clove-17.yaml', 'layouts/hitch-30.yaml', 'layouts/reef-49.yaml'];

describe('fluxlane plan --no-pulses', () => {
  it('writes plan.json, gates.csv and gates.txt with the documented contract', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-plan-'));
    const r = await runFluxlane(['plan', resolve('layouts/bowline-5.yaml'), '--no-pulses', '-o', 'out'], { cwd: dir });
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const plan = JSON.parse(readFileSync(join(dir, 'out/plan.json'), 'utf8'));
    expect(plan).toMatchObject({ format: 'fluxlane-plan', version: 1, chip: 'Bowline-5', ok: true, pulses: false });
    expect(Object.keys(plan.qubits)).toEqual(['Q0', 'Q1', 'Q2', 'Q3', 'Q4']);
    for (const q of Object.values<any>(plan.qubits)) {
      expect(Object.keys(q)).toEqual(expect.arrayContaining(['parkingFrequency', 'parkingFlux', 'f12', 'margin']));
      expect(q.parkingFrequency).toBeGreaterThan(3e9); // Hz
      expect(q.parkingFrequency).toBeLessThan(7e9);
      expect(q.parkingFlux).toBeGreaterThanOrEqual(0);
      expect(q.parkingFlux).toBeLessThanOrEqual(0.5);
    }
    expect(plan.qubits.Q4.parkingFrequency).toBe(6.44e9); // the layout's fixed park
    expect(plan.edges).toHaveLength(4);
    for (const e of plan.edges) {
      expect(Object.keys(e)).toEqual(expect.arrayContaining(['qubits', 'mover', 'crossing', 'interactionFrequency', 'spectatorParking', 'layer', 'zz', 'gate']));
      expect(['11-20', '11-02']).toContain(e.crossing);
      expect(e.qubits).toContain(e.mover);
      expect(e.gate).toBeNull();
      expect(Math.abs(e.zz)).toBeLessThanOrEqual(150e3); // Bowline-5's zzLimit, Hz
      expect([15e-9, 10e-9, 7.5e-9, 5e-9]).toContain(e.rampTime); // the planning ramp or a faster fallback
    }
    expect(plan.layers).toHaveLength(4);
    expect(plan.layerSummary).toMatchObject({ count: 4, lowerBound: 4, conflicts: 6 });
    expect(plan.layerSummary.explanation.text).toMatch(/4 layers/);
    // the error budget (issue contract): per qubit over the reference cycle, per edge, the cycle
    for (const q of Object.values<any>(plan.qubits)) {
      expect(Object.keys(q.idle)).toEqual(expect.arrayContaining(['t1', 'dephasing', 'zz', 'thermal', 'total']));
      expect(q.idle.total).toBeCloseTo(q.idle.t1 + q.idle.dephasing + q.idle.zz + q.idle.thermal, 12);
    }
    for (const e of plan.edges) {
      const b = e.budget;
      expect(b.method).toBe('estimated');
      const parts = ['coherent', 't1', 'whiteDephasing', 'fluxNoise', 'spectators', 'sweptCrossings', 'spectatorMoves'];
      expect(b.total).toBeCloseTo(parts.reduce((a, k) => a + b[k], 0), 12);
      expect(b.total).toBeLessThanOrEqual(plan.rules.gateErrorLimit);
    }
    expect(Object.keys(plan.cycle)).toEqual(expect.arrayContaining(['duration', 'error', 'gates', 'idles']));
    expect(plan.cycle.error).toBeCloseTo(plan.cycle.gates + plan.cycle.idles, 12);
    expect(plan.cycle.gates).toBeCloseTo(plan.edges.reduce((a: number, e: any) => a + e.budget.total, 0), 12);
    expect(plan.violations).toEqual([]);
    expect(Array.isArray(plan.flags)).toBe(true);
    const csv = readFileSync(join(dir, 'out/gates.csv'), 'utf8').trimEnd().split('\n');
    expect(csv[0]).toMatch(/^edge,mover,partner,crossing,interaction_frequency_hz,layer,/);
    expect(csv).toHaveLength(5);
    expect(readFileSync(join(dir, 'out/gates.txt'), 'utf8')).toMatch(/^edge\s+mover\s+crossing\s+interaction/);
    expect(r.out).toMatch(/ok: every rule holds/);
    expect(r.out).toMatch(/Model estimates/);
  });

  it('same layout and seed -> byte-identical plan.json; --json prints the same document', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-plan-'));
    const file = resolve('layouts/hitch-30.yaml');
    await runFluxlane(['plan', file, '--no-pulses', '-o', 'a'], { cwd: dir });
    await runFluxlane(['plan', file, '--no-pulses', '-o', 'b'], { cwd: dir });
    const a = readFileSync(join(dir, 'a/plan.json'), 'utf8');
    expect(readFileSync(join(dir, 'b/plan.json'), 'utf8')).toBe(a);
    expect(readFileSync(join(dir, 'b/gates.csv'), 'utf8')).toBe(readFileSync(join(dir, 'a/gates.csv'), 'utf8'));
    const j = await runFluxlane(['plan', file, '--no-pulses', '--json'], { cwd: dir });
    expect(j.out).toBe(a);
  });

  it.each(DEMOS)('plans %s with no violation, or exits 1 with every broken edge explained', async (file) => {
    const r = await runFluxlane(['plan', file, '--no-pulses', '--json']);
    const plan = r.json();
    expect(r.code).toBe(plan.violations.length === 0 ? 0 : 1);
    if (plan.violations.length === 0) {
      expect(plan.edges.every((e: any) => e.feasible)).toBe(true);
      return;
    }
    for (const e of plan.edges.filter((x: any) => !x.feasible)) {
      expect(e.reason).toMatch(/no option clears every rule; kept .* with the fewest problems/);
      const key = e.qubits.join('-');
      expect(plan.violations.some((v: any) => v.edge === key)).toBe(true);
    }
    expect(plan.explanations.some((x: any) => x.kind === 'edge')).toBe(true);
  });

  it('draws progress bars on a terminal only, and erases them', async () => {
    const tty = await runFluxlane(['plan', 'layouts/hitch-30.yaml', '--no-pulses'], { stderrIsTTY: true });
    expect(tty.err).toMatch(/\rspectra \[#*\.*\] \d+\/30/);
    expect(tty.err).toMatch(/\rinteraction \[#*\.*\] \d+\/32/);
    expect(tty.err.endsWith('\r\x1b[K')).toBe(true);
    const piped = await runFluxlane(['plan', 'layouts/hitch-30.yaml', '--no-pulses']);
    expect(piped.err).toBe('');
  });

  it('bad options exit 2 naming the option', async () => {
    const r = await runFluxlane(['plan', 'layouts/bowline-5.yaml', '--no-pulses', '--seed', 'x']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/option --seed: expected an integer/);
    const ramp = await runFluxlane(['plan', 'layouts/bowline-5.yaml', '--ramp', '5 GHz']);
    expect(ramp.code).toBe(2);
    expect(ramp.err).toMatch(/option --ramp: expected a ramp time such as "10 ns"/);
  });
});

describe('fluxlane plan with pulse design', () => {
  it('designs a CZ per edge through the gate stage, or says the stage is missing and to use --no-pulses', async () => {
    const designer = await loadGateDesigner();
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-plan-'));
    const r = await runFluxlane(['plan', resolve('layouts/bowline-5.yaml'), '-o', 'out'], { cwd: dir });
    if (designer === null) {
      expect(r.code).toBe(2);
      expect(r.err).toMatch(/gate stage \(src\/gate\/design\.ts\), found none in this build; run with --no-pulses/);
      expect(existsSync(join(dir, 'out'))).toBe(false);
      return;
    }
    expect([0, 1]).toContain(r.code);
    const plan = JSON.parse(readFileSync(join(dir, 'out/plan.json'), 'utf8'));
    expect(plan.pulses).toBe(true);
    for (const e of plan.edges) {
      expect(Object.keys(e.gate)).toEqual(expect.arrayContaining(['edge', 'mover', 'family', 'rampTime', 'holdTime', 'duration', 'interactionFrequency', 'crossingOffset', 'conditionalPhase', 'leakage', 'fidelity', 'fidelityNoisy', 'virtualZ', 'speedLimit', 'untuned']));
      expect(existsSync(join(dir, 'out', e.gate.waveform))).toBe(true);
      expect(e.gate.fidelityNoisy).toBeLessThan(e.gate.fidelity); // decoherence is on by default
    }
    expect(readFileSync(join(dir, 'out/gates.csv'), 'utf8').split('\n')[1]).toMatch(/,faquad,|,[a-z-]+,/);
    // The plan with its waveforms passes verify, which re-reads every waveform file.
    const v = await runFluxlane(['verify', resolve('layouts/bowline-5.yaml'), 'out/plan.json', '--json'], { cwd: dir });
    expect(v.code).toBe(r.code);
    expect(v.json().checked.waveforms).toBe(4);
  });

  it('writes the same files with the designs on worker threads as in one thread (--threads; Clove-17: 24 designs, enough for the workers)', async () => {
    const { readdirSync } = await import('node:fs');
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-plan-'));
    const one = await runFluxlane(['plan', resolve('layouts/clove-17.yaml'), '--threads', '1', '-o', 'one'], { cwd: dir });
    const two = await runFluxlane(['plan', resolve('layouts/clove-17.yaml'), '--threads', '2', '-o', 'two'], { cwd: dir });
    expect(two.code).toBe(one.code);
    expect(two.err).not.toMatch(/worker threads could not run/);
    const files = (d: string): string[] => readdirSync(join(dir, d), { recursive: true }).map(String).sort();
    expect(files('two')).toEqual(files('one'));
    expect(files('one')).toContain('plan.json');
    for (const f of files('one')) {
      if (f === 'waveforms') continue;
      expect(readFileSync(join(dir, 'two', f), 'utf8'), f).toBe(readFileSync(join(dir, 'one', f), 'utf8'));
    }
    const bad = await runFluxlane(['plan', resolve('layouts/bowline-5.yaml'), '--threads', '0'], { cwd: dir });
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--threads: expected an integer from 1 to 64, found "0"/);
  }, 60_000);
});
