/**
 * spectatorParkingCandidates (src/plan/interaction/spectator-parking.ts) reads the spectator's
 * matrix elements at its parking point from its spectrum table. Tables answer `at` in one shared
 * scratch object, which the f12 preimages of the same table overwrite; the bands must be built
 * from the parking point's values all the same. Reference: the same search on tables that answer
 * every `at` with a new object (no sharing), which must give exactly the same candidates, on every
 * planned gate of Hitch-30 and every other neighbour of its mover (Hitch-30: the demo where the
 * shared object changed plans, 37 -> 35 rule breaks in `check` when it was fixed, 2026-12-03).
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { planChip } from '../../src/plan/plan.js';
import { scenarioOf } from '../../src/plan/plan-budget.js';
import { spectatorParkingCandidates } from '../../src/plan/interaction/spectator-parking.js';
import { IdleBlockers } from '../../src/plan/rules/idle-blockers.js';
import type { PlanContext } from '../../src/plan/context.js';
import type { SpectrumTable, TableState } from '../../src/plan/qubit-table.js';
import { exactQubitState } from '../../src/plan/exact-state.js';

const hitch = planChip(loadLayoutFile('layouts/hitch-30.yaml', 'layouts/hitch-30.yaml'));
const { ctx } = hitch;

/** The table with `at` answering a new object every time (the values unchanged). */
function unshared(t: SpectrumTable): SpectrumTable {
  return new Proxy(t, {
    get(target, prop, receiver) {
      if (prop === 'at') return (f: number, out?: TableState) => ({ ...target.at(f, out) });
      const v = Reflect.get(target, prop, receiver);
      return typeof v === 'function' ? v.bind(target) : v;
    },
  });
}

describe('spectatorParkingCandidates', () => {
  it('gives the same candidates whether or not the tables share their answer objects (Hitch-30, every gate and spectator)', () => {
    const ctx2: PlanContext = { ...ctx, tables: ctx.tables.map(unshared) };
    let compared = 0;
    let withPoints = 0;
    for (const e of hitch.edges) {
      if (!Number.isFinite(e.interactionGHz)) continue;
      const s = scenarioOf(hitch, e);
      for (const P of ctx.neighbours[e.mover]) {
        if (P === e.partner) continue;
        const a = spectatorParkingCandidates(ctx, new IdleBlockers(ctx), s, P);
        const b = spectatorParkingCandidates(ctx2, new IdleBlockers(ctx2), s, P);
        expect(a, `${ctx.ids[e.mover]}-${ctx.ids[e.partner]} spectator ${ctx.ids[P]}`).toEqual(b);
        compared++;
        if (a.points.length > 0) withPoints++;
      }
    }
    expect(compared).toBeGreaterThan(30);
    expect(withPoints).toBeGreaterThan(10);
  });
});

describe('spectatorRangeMarginSpreads', () => {
  it('keeps every candidate point of a moved spectator that many fabrication spreads inside its range (Hitch-30, every gate and spectator; sigma_f from the exact spectrum, src/plan/exact-state.ts)', () => {
    const K = 3;
    const ctxK: PlanContext = { ...ctx, rules: { ...ctx.rules, spectatorRangeMarginSpreads: K } };
    let inside = 0;
    let nearEdgeWithout = 0;
    for (const e of hitch.edges) {
      if (!Number.isFinite(e.interactionGHz)) continue;
      const s = scenarioOf(hitch, e);
      for (const P of ctx.neighbours[e.mover]) {
        if (P === e.partner) continue;
        const t = ctx.transmons[P];
        const lo = ctx.tables[P].fLowGHz;
        const hi = ctx.tables[P].fMaxGHz;
        // the exact expected spread at each end (the search uses the tabulated one: 1 % apart at most)
        const sLo = exactQubitState(t, Math.max(lo, t.fMinGHz), ctx.rules.resistanceSpread).sigmaGHz;
        const sHi = exactQubitState(t, Math.min(hi, t.fMaxGHz), ctx.rules.resistanceSpread).sigmaGHz;
        for (const x of spectatorParkingCandidates(ctxK, new IdleBlockers(ctxK), s, P).points) {
          expect(x, `${ctx.ids[P]} for ${ctx.ids[e.mover]}-${ctx.ids[e.partner]}`).toBeGreaterThanOrEqual(lo + 0.99 * K * sLo);
          expect(x).toBeLessThanOrEqual(hi - 0.99 * K * sHi);
          inside++;
        }
        for (const x of spectatorParkingCandidates(ctx, new IdleBlockers(ctx), s, P).points) if (x < lo + K * sLo || x > hi - K * sHi) nearEdgeWithout++;
      }
    }
    expect(inside).toBeGreaterThan(10);
    // the default (0) leaves points nearer the range ends: the rule changes the candidates
    expect(nearEdgeWithout).toBeGreaterThan(0);
  });
});
