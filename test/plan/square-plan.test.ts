/**
 * The planner on the generated 100-qubit square chip (`fluxlane generate square --rows 10 --cols
 * 10`, seed 1): the parking leaves the interaction stage a clean option on every edge and the plan
 * breaks no collision rule, and with the generator's defaults (src/chip/generate.ts) no budget
 * rule either (gate-error, idle-error: README "What ok means"). Every rule is evaluated exactly by the planner's own
 * final checks (the exact dressed ZZ of CoupledPair; Landau-Zener transfers through swept
 * crossings, src/plan/landau-zener.ts, tested against SciPy in test/plan/landau-zener.test.ts), and
 * the exact ZZ of every coupled pair is recomputed here from the pair stage at the planned fluxes.
 */
import { describe, expect, it } from 'vitest';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { parseLayoutText } from '../../src/layout/load.js';
import { planChip } from '../../src/plan/plan.js';

const BUDGET_RULES = new Set(['gate-error', 'idle-error', 'spectator-leakage']);

describe('plan of the generated 10 x 10 square chip (seed 1), no pulse design', () => {
  const layout = parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 10, cols: 10, seed: 1 })), 'square-10x10.yaml');
  const plan = planChip(layout);

  it('every edge has a clean option and no collision rule is broken', () => {
    expect(plan.edges.filter((e) => !e.feasible).map((e) => plan.ctx.edges[e.edge].key)).toEqual([]);
    expect(plan.violations.filter((v) => !BUDGET_RULES.has(v.rule)).map((v) => `${v.rule} ${v.qubits.join('-')}`)).toEqual([]);
  });

  it('no budget rule is broken either: every gate estimate under 1 %, every idle error under 2 % per cycle', () => {
    expect(plan.violations.map((v) => `${v.rule} ${v.qubits.join('-')}`)).toEqual([]);
    for (const g of plan.budget.gates) if (g) expect(g.total).toBeLessThan(plan.ctx.rules.gateErrorLimit);
    for (const q of plan.budget.cycle.qubits) expect(q.total).toBeLessThan(plan.ctx.rules.idleErrorLimit);
  });

  it('the exact static ZZ of every coupled pair at the planned fluxes is within zzLimit', () => {
    const { ctx } = plan;
    for (const e of ctx.edges) {
      const zz = ctx.pair(e.index).zz(plan.states[e.a].flux, plan.states[e.b].flux);
      expect(Math.abs(zz)).toBeLessThanOrEqual(ctx.rules.zzLimitGHz);
    }
  });

  it('the parking leaves few edges to the gate-aware repair (at most 10 % of the edges tried)', () => {
    // at the plan's full spectator weight (0.5 per admixture) 56 of the 180 edges had no clean
    // option before the repair and the repair spent its whole budget, 89 trials; see src/plan/parking/cost.ts
    expect(plan.parking.stats.repairTrials ?? 0).toBeLessThanOrEqual(18);
  });
});
