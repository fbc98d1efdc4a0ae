/**
 * The planner ranks spectator points and options with evaluations that sum the swept crossings
 * into the budget's term (GateEvaluation.sweptError) instead of listing them, and lists them only
 * for the evaluations a plan keeps (src/plan/interaction/plan-edge.ts, sweptListOf). Each planned
 * edge's list must be the one a listing evaluation of its final scenario gives (same crossings,
 * same order), and its estimated error the one computed from that list (sweptCrossingError, the
 * budget's own sum). Checked on every feasible edge of two demo plans.
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { planChip } from '../../src/plan/plan.js';
import { evaluateGate, type GateScenario } from '../../src/plan/rules/cz-evaluate.js';
import { optionScore, parkingOf, type EdgeContext } from '../../src/plan/interaction/plan-edge.js';
import { sweptCrossingError } from '../../src/plan/gate-budget.js';

describe('swept crossings of planned edges', () => {
  for (const name of ['clove-17', 'hitch-30']) {
    it(`${name}: each feasible edge lists what a listing evaluation of its scenario lists, and scores by that list`, () => {
      const plan = planChip(loadLayoutFile(`layouts/${name}.yaml`, `layouts/${name}.yaml`));
      const { ctx, states } = plan;
      const ec: EdgeContext = { ctx, options: plan.options, blockers: plan.parking.state.blockers, states };
      let listed = 0;
      for (const e of plan.edges) {
        if (!e.feasible) continue;
        const scenario: GateScenario = {
          edge: e.edge, mover: e.mover, partner: e.partner, crossing: e.crossing,
          fromGHz: states[e.mover].f01GHz, toGHz: e.crossingGHz, moverF12AtToGHz: e.moverF12AtInteractionGHz,
          crossingCouplingGHz: e.crossingCouplingGHz, rampNs: e.rampNs, parking: parkingOf(states),
          parked: new Map(e.parked.map((p) => [p.qubit, { f01GHz: p.fGHz, f12GHz: p.f12GHz }])),
        };
        const ev = evaluateGate(ctx, scenario, { messages: false });
        expect(ev.sweptError).toBeUndefined();
        expect(e.swept).toEqual(ev.swept);
        listed += e.swept.length;
        // the plan's score is the estimate with the listed crossings' sum
        expect(optionScore(ec, scenario, e.moverInteractionFlux)(ev, e.parked)).toBe(e.score);
        const summed = evaluateGate(ctx, scenario, { messages: false, sweptError: true });
        expect(summed.sweptError).toBe(sweptCrossingError(ctx, { mover: e.mover, partner: e.partner, swept: ev.swept }));
      }
      expect(listed).toBeGreaterThan(0);
    });
  }
});
