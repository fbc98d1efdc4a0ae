/**
 * The allocation-free conflict test of two gates (src/plan/layers.ts conflictKind) against the
 * rules written with sets (rules a-c of layers.ts's banner: sharedSpectators, touchedQubits,
 * movedConflict), over every ordered pair of Clove-17's planned gates and of variants in which
 * one gate's spectators sit at another gate's points (shared), slightly off them (not shared) or
 * on the other gate's pair; and conflictKinds's pairs (candidates, each considered once) against
 * the brute force over all pairs. A wrong shortcut (a shared spectator missed or taken for one too many,
 * a rule tested out of order) changes some pair's kind here.
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { planChip } from '../../src/plan/plan.js';
import { conflictKind, conflictKinds, gatesConflict, movedConflict, movedQubits, sharedSpectators, touchedQubits, type ConflictKind, type MovedQubit } from '../../src/plan/layers.js';
import type { EdgePlan } from '../../src/plan/interaction/plan-edge.js';
import type { PlanContext } from '../../src/plan/context.js';

const clove = planChip(loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'));

/** The rules with sets, as the banner states them. */
function plainKind(ctx: PlanContext, g1: EdgePlan, m1: readonly MovedQubit[], g2: EdgePlan, m2: readonly MovedQubit[]): ConflictKind | null {
  const pair1 = new Set([g1.mover, g1.partner]);
  if (pair1.has(g2.mover) || pair1.has(g2.partner)) return 'shared';
  const shared = sharedSpectators(g1, g2);
  const t1 = new Set(touchedQubits(g1));
  if (touchedQubits(g2).some((q) => t1.has(q) && !shared.has(q))) return 'spectator';
  for (const x of m1) {
    if (shared.has(x.qubit)) continue;
    for (const y of m2) {
      if (shared.has(y.qubit) || !movedConflict(ctx, x, y)) continue;
      return ctx.edgeBetween(x.qubit, y.qubit) >= 0 ? 'close' : 'next';
    }
  }
  return null;
}

/** True when a plan parks its own mover or partner (some variants below do; no planned gate does). */
const parksOwnPair = (g: EdgePlan): boolean => g.parked.some((p) => p.qubit === g.mover || p.qubit === g.partner);

describe('conflictKind', () => {
  it('planned gates never park their own mover or partner', () => {
    expect(clove.edges.some((e) => e.parked.length > 0)).toBe(true);
    for (const e of clove.edges) expect(parksOwnPair(e)).toBe(false);
  });

  it('gives the kind the set-based rules give, for every pair of planned gates and of variants', () => {
    const ctx = clove.ctx;
    const f12 = clove.states.map((s) => s.f12GHz);
    const ghz = clove.parking.parkingGHz;
    const plans: EdgePlan[] = [...clove.edges];
    // variants: each gate with the spectators of every other gate copied in (same points: shared
    // with it), moved 1 kHz (not shared), and a gate parking the other's partner
    for (const a of clove.edges) {
      for (const b of clove.edges) {
        if (a === b || b.parked.length === 0) continue;
        plans.push({ ...a, parked: [...a.parked, ...b.parked.filter((p) => !a.parked.some((q) => q.qubit === p.qubit))] });
        plans.push({ ...a, parked: b.parked.map((p) => ({ ...p, fGHz: p.fGHz + 1e-6 })) });
      }
      plans.push({ ...a, parked: [...a.parked, { ...(a.parked[0] ?? { fGHz: 5, flux: 0.1, f12GHz: 4.8, reason: 'test' }), qubit: clove.edges[(a.edge + 1) % clove.edges.length].partner }] });
    }
    const moved = plans.map((p) => movedQubits(ctx, p, f12, ghz));
    const count: Record<string, number> = {};
    for (let i = 0; i < plans.length; i++) {
      for (let j = 0; j < plans.length; j++) {
        if (i === j) continue;
        const want = plainKind(ctx, plans[i], moved[i], plans[j], moved[j]);
        const got = conflictKind(ctx, plans[i], moved[i], plans[j], moved[j]);
        if (got !== want) expect(got, `pair ${i}, ${j}`).toBe(want);
        // gatesConflict (the sets) holds exactly when there is a kind, for plans that do not park
        // their own mover or partner (no planned gate does: below); the layer fitting relies on it
        if (!parksOwnPair(plans[i]) && !parksOwnPair(plans[j])) {
          const conflict = gatesConflict(ctx, plans[i], moved[i], plans[j], moved[j]);
          if (conflict !== (got !== null)) expect(conflict, `gatesConflict, pair ${i}, ${j}`).toBe(got !== null);
        }
        count[String(want)] = (count[String(want)] ?? 0) + 1;
      }
    }
    // every kind (and no conflict) occurs, so each branch was compared
    for (const k of ['shared', 'spectator', 'close', 'null']) expect(count[k] ?? 0, k).toBeGreaterThan(0);
    // conflictKinds (candidate pairs, each considered once: a bit per pair) finds every
    // conflicting pair the brute force over all pairs finds, with its kind
    const brute: [number, ConflictKind][] = [];
    for (let i = 0; i < plans.length; i++) {
      for (let j = i + 1; j < plans.length; j++) {
        const k = conflictKind(ctx, plans[i], moved[i], plans[j], moved[j]);
        if (k) brute.push([i * plans.length + j, k]);
      }
    }
    const found = [...conflictKinds(ctx, plans, f12, ghz)].sort((x, y) => x[0] - y[0]);
    expect(found.length).toBeGreaterThan(100);
    expect(found).toEqual(brute);
  });
});
