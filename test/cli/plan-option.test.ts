/**
 * `--plan PLAN.json` on gate, simulate and pair (src/cli/plan-option.ts): the plan's mover,
 * crossing, parking, family, ramp and phase; options override; without a plan and without fluxes
 * the output names the fluxes assumed (Bowline-5, planned once).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runFluxlane } from '../support/cli.js';

const LAYOUT = 'layouts/bowline-5.yaml';
const dir = mkdtempSync(join(tmpdir(), 'fluxlane-plan-option-'));
const planPath = join(dir, 'out/plan.json');
let plan: any;

beforeAll(async () => {
  const r = await runFluxlane(['plan', resolve(LAYOUT), '-o', 'out'], { cwd: dir });
  expect(r.code).toBe(0);
  plan = JSON.parse(readFileSync(planPath, 'utf8'));
}, 60_000);

describe('gate --plan', () => {
  it('without a plan --edge Q0-Q1 moves Q0 and says which fluxes it assumed; with the plan it designs the plan\'s gate again (mover Q1, its parking, family, ramp)', async () => {
    const bare = await runFluxlane(['gate', LAYOUT, '--edge', 'Q0-Q1', '--json']);
    expect(bare.json().mover).toBe('Q0');
    expect(bare.json().fluxes.Q1.source).toBe('assumed: upper sweet spot');
    const text = await runFluxlane(['gate', LAYOUT, '--edge', 'Q0-Q1', '--family', 'erf']);
    expect(text.out).toMatch(/assumed: Q0, Q1 at the upper sweet spot \(Phi = 0\), since no --plan, no flux option and no layout park gives their flux/);
    const e = plan.edges.find((x: any) => x.qubits.join('-') === 'Q0-Q1');
    const r = await runFluxlane(['gate', LAYOUT, '--edge', 'Q0-Q1', '--plan', planPath, '--json']);
    expect(r.code, r.err).toBe(0);
    const g = r.json();
    expect(g.mover).toBe(e.mover);
    expect(g.crossing).toBe(e.crossing);
    expect(g.family).toBe(e.gate.family);
    expect(g.fluxes[e.mover]).toEqual({ flux: plan.qubits[e.mover].parkingFlux, source: 'plan' });
    expect(g.fluxes[e.partner]).toEqual({ flux: plan.qubits[e.partner].parkingFlux, source: 'plan' });
    // the same design up to the tuner's tolerance (the plan's parking fluxes are read back with
    // 12 digits, and the hold is corrected until the phase is within 2e-5 rad)
    expect(g.rampTime).toBe(e.gate.rampTime);
    expect(g.duration).toBe(e.gate.duration);
    expect(Math.abs(g.holdTime - e.gate.holdTime)).toBeLessThan(1e-12);
    expect(Math.abs(g.interactionFrequency - e.gate.interactionFrequency)).toBeLessThan(1e3);
    expect(Math.abs(g.conditionalPhase - e.gate.conditionalPhase)).toBeLessThan(1e-4);
    expect(Math.abs(g.fidelity - e.gate.fidelity)).toBeLessThan(1e-6);
    const over = await runFluxlane(['gate', LAYOUT, '--edge', 'Q0-Q1', '--plan', planPath, '--static-flux', '0.1', '--json']);
    expect(over.json().fluxes[e.partner]).toEqual({ flux: 0.1, source: 'option' });
  });
});

describe('pair --plan', () => {
  it('evaluates the pair at the plan\'s parking with the plan\'s mover; a flux option overrides one qubit', async () => {
    const e = plan.edges.find((x: any) => x.qubits.join('-') === 'Q0-Q2');
    const r = await runFluxlane(['pair', LAYOUT, '--edge', 'Q0-Q2', '--plan', planPath, '--json']);
    const p = r.json();
    expect(p.mover).toBe(e.mover);
    expect(p.flux).toEqual({ Q0: plan.qubits.Q0.parkingFlux, Q2: plan.qubits.Q2.parkingFlux });
    expect(p.fluxes.Q0.source).toBe('plan');
    expect(Math.abs(p.zz - e.zz)).toBeLessThan(1e-3 * Math.abs(e.zz)); // the plan's static ZZ at parking (12 digits of flux)
    const o = await runFluxlane(['pair', LAYOUT, '--edge', 'Q0-Q2', '--plan', planPath, '--flux-a', '0.05', '--json']);
    expect(o.json().fluxes).toEqual({ Q0: { flux: 0.05, source: 'option' }, Q2: { flux: plan.qubits.Q2.parkingFlux, source: 'plan' } });
  });
});

describe('simulate --plan', () => {
  it('simulates the plan\'s own waveform, with neighbours at their plan parking; needs a trajectory or a plan; refuses an AWG program with a hint', async () => {
    const r = await runFluxlane(['simulate', LAYOUT, '--edge', 'Q0-Q3', '--plan', planPath, '--spectator', 'Q1', '--json']);
    expect(r.code, r.err).toBe(0);
    const s = r.json();
    expect(s.trajectory).toBe('waveforms/Q0-Q3.qubit.csv');
    expect(s.fluxes.Q1).toEqual({ flux: plan.qubits.Q1.parkingFlux, source: 'plan' });
    const none = await runFluxlane(['simulate', LAYOUT, '--edge', 'Q0-Q3']);
    expect(none.code).toBe(2);
    expect(none.err).toMatch(/option --trajectory: expected a trajectory CSV file \(or --plan PLAN.json/);
    const awg = await runFluxlane(['simulate', LAYOUT, '--edge', 'Q0-Q3', '--trajectory', join(dir, 'out/waveforms/Q0-Q3.awg.csv')]);
    expect(awg.code).toBe(2);
    expect(awg.err).toMatch(/this is an AWG program, before the flux line; simulate reads the flux the qubit sees/);
    const bad = await runFluxlane(['simulate', LAYOUT, '--edge', 'Q0-Q3', '--plan', join(dir, 'nope.json')]);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/nope\.json: expected a readable plan file, found no such file/);
  });
});
