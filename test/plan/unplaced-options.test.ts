/**
 * Options left without spectator placement (src/plan/interaction/plan-edge.ts, unclearableFindings):
 * an option whose gate, with no spectator moved, breaks a rule blamed on no qubit or on the mover
 * or the partner is reported as it stands. The planner's choice must be the one it makes with every
 * option's spectators placed: so each such option must stay infeasible when its spectators are
 * placed in full, and an edge with no clean option must have every option placed. Checked on
 * every option of two demo plans and a generated chip.
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile, parseLayoutText } from '../../src/layout/load.js';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { planChip } from '../../src/plan/plan.js';
import { evaluateOptionForTest, unclearableFindings, type EdgeContext } from '../../src/plan/interaction/plan-edge.js';

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
