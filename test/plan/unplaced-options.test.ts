/**
 * Options left without spectator placement (src/plan/interaction/plan-edge.ts, unclearableFindings):
 * an option whose gate, with no spectator moved, breaks a rule blamed on no qubit or on the mover
 * or the partner is reported as it stands. The planner's choice must be the one it makes with every
 * option's spectators placed: so each such option must stay infeasible when its spectators are
 * placed in full, and an edge with no clean option must have every option placed. Checked on
 * every option of two demo plans and a generated chip. Such an option's report is made from the
 * evaluation that found it stuck (no messages, swept crossings summed): checked against the full
 * evaluation of its scenario (findings messages aside, and the estimated error).
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile, parseLayoutText } from '../../src/layout/load.js';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { planChip } from '../../src/plan/plan.js';
import { evaluateOptionForTest, optionScore, unclearableFindings, type EdgeContext } from '../../src/plan/interaction/plan-edge.js';
import { evaluateGate, type CzFinding } from '../../src/plan/rules/cz-evaluate.js';

const chips = {
  'Clove-17': () => loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'),
  'Hitch-30': () => loadLayoutFile('layouts/hitch-30.yaml', 'layouts/hitch-30.yaml'),
  'generated 6 x 6': () => parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 6, cols: 6, seed: 3 })), 'square-6x6.yaml'),
};

describe('options left without spectator placement', () => {
  for (const [name, layout] of Object.entries(chips)) {
    it(`${name}: each is infeasible with its spectators placed too, and keeps the findings no move clears`, () => {
      const plan = planChip(layout());
      const ec: EdgeContext = { ctx: plan.ctx, options: plan.options, blockers: plan.parking.state.blockers, states: plan.states };
      let unplaced = 0;
      plan.edges.forEach((e) => {
        // an edge without a clean option has every option placed (the choice is then by fewest problems)
        if (!e.options.some((o) => o.feasible)) for (const o of e.options) expect(o.note).not.toMatch(/^infeasible whatever/);
        for (const o of e.options) {
          if (o.interactionGHz === null || !Number.isFinite(o.score)) continue;
          const first = evaluateOptionForTest(ec, e.edge, o.mover, o.crossing, e.rampNs, true);
          if (!first.unplaced) continue;
          expect(first.report.note).toMatch(/^infeasible whatever spectators do: /);
          expect(first.report.parked).toEqual([]);
          // its report comes from the first evaluation (no messages, swept crossings summed): the
          // findings and the score of the full evaluation of the same scenario, messages aside
          const full0 = evaluateGate(plan.ctx, first.scenario!);
          const strip = (f: CzFinding) => ({ ...f, message: '' });
          expect(first.report.problems.map(strip)).toEqual(full0.findings.map(strip));
          expect(full0.findings.every((f) => f.message.length > 0)).toBe(true);
          expect(first.report.score).toBe(optionScore(ec, first.scenario!, first.report.moverFlux!)(full0, []));
          unplaced++;
          const full = evaluateOptionForTest(ec, e.edge, o.mover, o.crossing, e.rampNs, false);
          expect(full.unplaced).toBe(false);
          expect(full.report.feasible, `${plan.ctx.edges[e.edge].key} ${plan.ctx.ids[o.mover]} ${o.crossing}`).toBe(false);
          const key = (f: { rule: string; qubits: string[] }) => `${f.rule} ${f.qubits.join('/')}`;
          const stuck = unclearableFindings(first.report.problems, o.mover, o.mover === plan.ctx.edges[e.edge].a ? plan.ctx.edges[e.edge].b : plan.ctx.edges[e.edge].a);
          expect(stuck.length).toBeGreaterThan(0);
          const after = new Set(full.report.problems.map(key));
          for (const f of stuck) if (f.rule !== 'cz-duration') expect(after.has(key(f)), key(f)).toBe(true);
        }
      });
      expect(unplaced).toBeGreaterThan(0);
    });
  }
});
