/**
 * One plan for every command on Clove-17 (test/support/one-plan.ts): every edge's own waveform
 * re-simulated with `simulate --plan` gives the plan's metrics to 1e-6; gates.csv, gates.txt and
 * plan.json agree field by field; `check` agrees with the plan edge by edge.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { runFluxlane } from '../support/cli.js';
import { compareCheck, compareTables, planDemo, resimulateEveryEdge, type PlannedDemo } from '../support/one-plan.js';
import { GATE_COLUMNS } from '../../src/report/gate-columns.js';

let demo: PlannedDemo;
beforeAll(async () => {
  demo = await planDemo('layouts/clove-17.yaml');
}, 600_000);

describe('one plan for every command: Clove-17', () => {
  it('simulate --plan of each edge\'s own waveform reproduces the plan\'s metrics to 1e-6', async () => {
    const r = await resimulateEveryEdge(demo, 1e-6);
    expect(r.simulated).toBe(demo.plan.edges.filter((e: any) => e.gate?.feasible === true).length);
  }, 600_000);

  it('gates.csv, gates.txt and plan.json carry the same numbers, field by field', () => {
    expect(compareTables(demo, GATE_COLUMNS)).toBeGreaterThan(demo.plan.edges.length * GATE_COLUMNS.length);
  });

  it('simulate --plan puts the spectators a gate moves where the plan moves them (D6-X1: Z2 and Z4)', async () => {
    const e = demo.plan.edges.find((x: any) => x.qubits.join('-') === 'D6-X1');
    expect(Object.keys(e.spectatorParking)).toEqual(['Z2', 'Z4']);
    const r = await runFluxlane(['simulate', demo.layout, '--edge', 'D6-X1', '--plan', demo.planPath, '--spectator', 'Z2', 'Z4', '--json']);
    expect(r.code, r.err).toBe(0);
    for (const s of ['Z2', 'Z4']) expect(r.json().fluxes[s]).toEqual({ flux: e.spectatorParkingFlux[s], source: 'plan, moved for the gate' });
  }, 300_000);

  it('check and plan agree on feasibility and the rules broken, edge by edge', async () => {
    expect(await compareCheck(demo)).toBe(24);
  }, 300_000);
});
