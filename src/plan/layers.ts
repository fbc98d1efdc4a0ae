/**
 * Parallel gate layers: two CZs may run at the same time only when no condition of
 * README physics conventions sec. 5 couples them. Gates conflict when
 *   (a) they share a qubit: mover, partner or a spectator parked for either;
 *   (b) a qubit one gate moves (its mover, or a spectator it parks) is coupled to a qubit the
 *       other gate moves, and the two excursions come within spectatorDetuning of a 01-01, 11-20
 *       or 11-02 crossing (each excursion taken as the whole band between its parking and its
 *       destination, and the f12 band with it: both move at once, so any overlap may be crossed);
 *   (c) a qubit one gate moves and a qubit the other moves share a neighbour and their
 *       destinations are closer than detuningNext0101.
 * The conflict graph (graphology, one node per edge key) is coloured with DSATUR (Brelaz 1979,
 * src/plan/parking/colouring.ts); colours are layers. The number of layers is at least the
 * chip's maximum degree (the gates on one qubit all conflict), reported as the lower bound.
 */
import { UndirectedGraph } from 'graphology';
import type { PlanContext } from './context.js';
import type { EdgePlan } from './interaction/plan-edge.js';
import { dsaturColouring } from './parking/colouring.js';

export interface MovedQubit {
  qubit: number;
  /** f01 band swept (parking to destination). */
  lo: number;
  hi: number;
  /** f12 band swept. */
  lo12: number;
  hi12: number;
  /** f01 at the destination. */
  toGHz: number;
}

export interface LayerPlan {
  /** Layer index of each edge (by edge index). */
  layerOf: number[];
  /** Edge indices per layer. */
  layers: number[][];
  lowerBound: number;
  /** Number of conflicting pairs of gates. */
  conflicts: number;
}

/** The qubits a gate moves, with their f01 and f12 bands (tabulated f12; exact at the ends). */
export function movedQubits(ctx: PlanContext, plan: EdgePlan, parkingF12: readonly number[], parkingGHz: ArrayLike<number>): MovedQubit[] {
  const out: MovedQubit[] = [];
  if (Number.isFinite(plan.interactionGHz)) {
    const a = plan.mover;
    const from = parkingGHz[a];
    const to = plan.interactionGHz;
    const f12to = plan.moverF12AtInteractionGHz;
    out.push({ qubit: a, lo: Math.min(from, to), hi: Math.max(from, to), lo12: Math.min(parkingF12[a], f12to), hi12: Math.max(parkingF12[a], f12to), toGHz: to });
  }
  for (const p of plan.parked) {
    const from = parkingGHz[p.qubit];
    out.push({ qubit: p.qubit, lo: Math.min(from, p.fGHz), hi: Math.max(from, p.fGHz), lo12: Math.min(parkingF12[p.qubit], p.f12GHz), hi12: Math.max(parkingF12[p.qubit], p.f12GHz), toGHz: p.fGHz });
  }
  return out;
}

/** The qubits a gate occupies: mover, partner and parked spectators. */
export function touchedQubits(plan: EdgePlan): number[] {
  return [plan.mover, plan.partner, ...plan.parked.map((p) => p.qubit)];
}

const overlap = (alo: number, ahi: number, blo: number, bhi: number, pad: number) => alo < bhi + pad && blo < ahi + pad;

/** True when moved qubits x (of one gate) and y (of another) conflict by rule (b) or (c). */
export function movedConflict(ctx: PlanContext, x: MovedQubit, y: MovedQubit): boolean {
  const r = ctx.rules;
  if (ctx.edgeBetween(x.qubit, y.qubit) >= 0) {
    const sd = r.spectatorDetuningGHz;
    return overlap(x.lo, x.hi, y.lo, y.hi, sd) || overlap(x.lo12, x.hi12, y.lo, y.hi, sd) || overlap(x.lo, x.hi, y.lo12, y.hi12, sd);
  }
  const shares = ctx.nextNearestOf[x.qubit].some((p) => {
    const pair = ctx.nextNearest[p];
    return (pair.a === x.qubit ? pair.b : pair.a) === y.qubit;
  });
  return shares && Math.abs(x.toGHz - y.toGHz) < r.detuningNext0101GHz;
}

/** The conflict test of two gates (rules a-c). */
export function gatesConflict(ctx: PlanContext, g1: EdgePlan, m1: readonly MovedQubit[], g2: EdgePlan, m2: readonly MovedQubit[]): boolean {
  const t1 = new Set(touchedQubits(g1));
  if (touchedQubits(g2).some((q) => t1.has(q))) return true;
  for (const x of m1) for (const y of m2) if (movedConflict(ctx, x, y)) return true;
  return false;
}

/**
 * Every pair of gates that cannot share a layer (indices into `plans`, each pair once, first <
 * second in the order found): the conflict graph's edges. Used by planLayers and by verify.
 */
export function conflictingPairs(ctx: PlanContext, plans: readonly EdgePlan[], parkingF12: readonly number[], parkingGHz: ArrayLike<number>): [number, number][] {
  const moved = plans.map((p) => movedQubits(ctx, p, parkingF12, parkingGHz));
  const touching: number[][] = Array.from({ length: ctx.n }, () => []);
  plans.forEach((p, k) => {
    for (const q of touchedQubits(p)) touching[q].push(k);
  });
  const seen = new Set<number>();
  const pairs: [number, number][] = [];
  const m = plans.length;
  const link = (k1: number, k2: number) => {
    if (k1 === k2) return;
    const key = Math.min(k1, k2) * m + Math.max(k1, k2);
    if (!seen.has(key)) {
      seen.add(key);
      pairs.push([k1, k2]);
    }
  };
  // (a) shared qubits
  for (const list of touching) for (let i = 0; i < list.length; i++) for (let j = i + 1; j < list.length; j++) link(list[i], list[j]);
  // (b), (c): gates touching a neighbour or next-nearest neighbour of a moved qubit
  plans.forEach((_, k1) => {
    for (const x of moved[k1]) {
      const near = new Set<number>(ctx.neighbours[x.qubit]);
      for (const p of ctx.nextNearestOf[x.qubit]) near.add(ctx.nextNearest[p].a === x.qubit ? ctx.nextNearest[p].b : ctx.nextNearest[p].a);
      for (const q of near) {
        for (const k2 of touching[q]) {
          if (k2 <= k1) continue;
          if (moved[k2].some((y) => y.qubit === q && movedConflict(ctx, x, y))) link(k1, k2);
        }
      }
    }
  });
  return pairs;
}

export function planLayers(ctx: PlanContext, plans: readonly EdgePlan[], parkingF12: readonly number[], parkingGHz: ArrayLike<number>): LayerPlan {
  const graph = new UndirectedGraph();
  for (const p of plans) graph.addNode(ctx.edges[p.edge].key);
  const pairs = conflictingPairs(ctx, plans, parkingF12, parkingGHz);
  for (const [k1, k2] of pairs) graph.addEdge(ctx.edges[plans[k1].edge].key, ctx.edges[plans[k2].edge].key);
  const conflicts = pairs.length;
  const colours = dsaturColouring(graph);
  const layerOf = plans.map((p) => colours.get(ctx.edges[p.edge].key)!);
  const count = plans.length === 0 ? 0 : Math.max(...layerOf) + 1;
  const layers: number[][] = Array.from({ length: count }, () => []);
  plans.forEach((p, k) => layers[layerOf[k]].push(p.edge));
  const lowerBound = ctx.edgesOf.reduce((m, list) => Math.max(m, list.length), 0);
  return { layerOf, layers, lowerBound, conflicts };
}
