/**
 * One plan for every command on Hitch-30 (test/support/one-plan.ts): every edge's own waveform
 * re-simulated with `simulate --plan` gives the plan's metrics to 1e-6; gates.csv, gates.txt and
 * plan.json agree field by field; `check` agrees with the plan edge by edge.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { compareCheck, compareTables, planDemo, resimulateEveryEdge, type PlannedDemo } from '../support/one-plan.js';
import { GATE_COLUMNS } from '../../src/report/gate-columns.js';

let demo: PlannedDemo;
beforeAll(async () => {
  demo = await planDemo('layouts/hitch-30.yaml');
}, 600_000);

describe('one plan for every command: Hitch-30', () => {
  it('simulate --plan of each edge\'s own waveform reproduces the plan\'s metrics to 1e-6', async () => {
    const r = await resimulateEveryEdge(demo, 1e-6);
    expect(r.simulated).toBe(demo.plan.edges.filter((e: any) => e.gate?.feasible === true).length);
  }, 600_000);

  it('gates.csv, gates.txt and plan.json carry the same numbers, field by field', () => {
    expect(compareTables(demo, GATE_COLUMNS)).toBeGreaterThan(demo.plan.edges.length * GATE_COLUMNS.length);
  });

  it('check and plan agree on feasibility and the rules broken, edge by edge', async () => {
    expect(await compareCheck(demo)).toBe(32);
  }, 300_000);
});
