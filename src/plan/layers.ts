/**
 * Parallel gate layers: two CZs may run at the same time only when no condition of
 * README physics conventions sec. 5 couples them. Gates conflict when
 *   (a) they share a qubit: mover, partner or a spectator parked for either (a spectator both
 *       gates park at the very same point is one move serving both, and no conflict);
 *   (b) a qubit one gate moves (its mover, or a spectator it parks) is coupled to a qubit the
 *       other gate moves, and the two excursions come closer than the spectator admixture limit
 *       allows (g / sqrt(spectatorAdmixture), sqrt2 g for the f12 bands) to a 01-01, 11-20 or
 *       11-02 crossing (each excursion taken as the whole band between its parking and its
 *       destination, and the f12 band with it: both move at once, so any overlap may be crossed);
 *   (c) a qubit one gate moves and a qubit the other moves share a neighbour and their
 *       destinations are closer than detuningNext0101.
 * Rules (b) and (c) skip a spectator both gates park at the same point: each gate's own rules
 * checked its sweep against the qubits that gate moves.
 * The conflict graph (adjacency lists, one vertex per gate) is coloured with DSATUR (Brelaz 1979,
 * src/plan/parking/colouring.ts), improved by iterated greedy (./iterated-greedy.ts, seeded);
 * colours are layers. The number of layers is at least the chip's maximum degree (the gates on
 * one qubit all conflict), reported as the lower bound; the explanation colours the conflicts
 * kind by kind (shared qubits, moved spectators, close excursions, next-nearest) and says how
 * many layers each kind adds.
 */
import type { PlanContext } from './context.js';
import type { EdgePlan } from './interaction/plan-edge.js';
import { dsaturOfAdjacency } from './parking/colouring.js';
import { admixtureHalfWidth } from './rules/spectator-admixture.js';
import { colourCount, greedyColouring, iteratedGreedy } from './iterated-greedy.js';

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
  /** What the count comes from. */
  explanation: LayerExplanation;
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
  const e = ctx.edgeBetween(x.qubit, y.qubit);
  if (e >= 0) {
    // the spectator admixture limit as a distance, with the layout's g (its largest value) for
    // 01-01 and sqrt2 g for the 11-20 and 11-02 type crossings (./rules/spectator-admixture.ts)
    const g = ctx.edges[e].gGHz;
    const pad01 = admixtureHalfWidth(g, r.spectatorAdmixture);
    const pad12 = admixtureHalfWidth(Math.SQRT2 * g, r.spectatorAdmixture);
    return overlap(x.lo, x.hi, y.lo, y.hi, pad01) || overlap(x.lo12, x.hi12, y.lo, y.hi, pad12) || overlap(x.lo, x.hi, y.lo12, y.hi12, pad12);
  }
  if (!(Math.abs(x.toGHz - y.toGHz) < r.detuningNext0101GHz)) return false;
  // (a loop, not some() with a closure: the layer fitting asks this for every candidate pair)
  const list = ctx.nextNearestOf[x.qubit];
  for (let i = 0; i < list.length; i++) {
    const pair = ctx.nextNearest[list[i]];
    if ((pair.a === x.qubit ? pair.b : pair.a) === y.qubit) return true;
  }
  return false;
}

/**
 * Spectators both gates move to the very same point (f01 equal): one move serves both gates, so
 * such a spectator does not keep them apart, and its sweep was checked by each gate's own rules.
 */
export function sharedSpectators(g1: EdgePlan, g2: EdgePlan): Set<number> {
  const out = new Set<number>();
  for (const p of g1.parked) if (g2.parked.some((q) => q.qubit === p.qubit && q.fGHz === p.fGHz)) out.add(p.qubit);
  return out;
}

/** True when the gates occupy a common qubit other than a shared spectator (rule a). */
function occupyCommonQubit(g1: EdgePlan, g2: EdgePlan, shared: ReadonlySet<number>): boolean {
  const t1 = new Set(touchedQubits(g1));
  return touchedQubits(g2).some((q) => t1.has(q) && !shared.has(q));
}

/** A pair of moved qubits (rules b, c) with a shared spectator on either side is each gate's own concern. */
function movedPairConflict(ctx: PlanContext, m1: readonly MovedQubit[], m2: readonly MovedQubit[], shared: ReadonlySet<number>): boolean {
  for (const x of m1) {
    if (shared.has(x.qubit)) continue;
    for (const y of m2) if (!shared.has(y.qubit) && movedConflict(ctx, x, y)) return true;
  }
  return false;
}

/** The conflict test of two gates (rules a-c). */
export function gatesConflict(ctx: PlanContext, g1: EdgePlan, m1: readonly MovedQubit[], g2: EdgePlan, m2: readonly MovedQubit[]): boolean {
  const shared = sharedSpectators(g1, g2);
  return occupyCommonQubit(g1, g2, shared) || movedPairConflict(ctx, m1, m2, shared);
}

/** Which condition made two gates conflict (the first that holds, in this order). */
export type ConflictKind = 'shared' | 'spectator' | 'close' | 'next';

/**
 * The layers a subset of the conflicts alone would need, added kind by kind: what stands in the
 * way of fewer layers.
 */
export interface LayerExplanation {
  /** Layers with only shared movers and partners (at least the largest degree). */
  shared: number;
  /** ... and spectators moved for one gate that another gate touches. */
  spectator: number;
  /** ... and coupled moving qubits whose excursions come close. */
  close: number;
  /** ... and moving next-nearest neighbours ending close (all conflicts: the plan's count). */
  next: number;
  /** Conflicting pairs of each kind. */
  pairs: Record<ConflictKind, number>;
}

/**
 * The kind of conflict between two gates, or null (rules a-c of the banner). Without allocation
 * (the layer fitting asks it for every candidate pair of every candidate set of plans): the same
 * tests as gatesConflict's sets (sharedSpectators, touchedQubits), on the plans' own lists.
 */
export function conflictKind(ctx: PlanContext, g1: EdgePlan, m1: readonly MovedQubit[], g2: EdgePlan, m2: readonly MovedQubit[]): ConflictKind | null {
  if (g2.mover === g1.mover || g2.mover === g1.partner || g2.partner === g1.mover || g2.partner === g1.partner) return 'shared';
  if (touches(g1, g2.mover) && !isSharedSpectator(g1, g2, g2.mover)) return 'spectator';
  if (touches(g1, g2.partner) && !isSharedSpectator(g1, g2, g2.partner)) return 'spectator';
  // (indexed loops: no iterator objects in a test asked for every candidate pair)
  const parked2 = g2.parked;
  for (let i = 0; i < parked2.length; i++) {
    const q = parked2[i].qubit;
    if (touches(g1, q) && !isSharedSpectator(g1, g2, q)) return 'spectator';
  }
  for (let i = 0; i < m1.length; i++) {
    const x = m1[i];
    if (isSharedSpectator(g1, g2, x.qubit)) continue;
    for (let j = 0; j < m2.length; j++) {
      const y = m2[j];
      if (isSharedSpectator(g1, g2, y.qubit) || !movedConflict(ctx, x, y)) continue;
      return ctx.edgeBetween(x.qubit, y.qubit) >= 0 ? 'close' : 'next';
    }
  }
  return null;
}

/** True when qubit q is among the qubits gate g occupies (touchedQubits). */
function touches(g: EdgePlan, q: number): boolean {
  if (q === g.mover || q === g.partner) return true;
  const parked = g.parked;
  for (let i = 0; i < parked.length; i++) if (parked[i].qubit === q) return true;
  return false;
}

/** True when q is in sharedSpectators(g1, g2): some spectator of g1 on q that g2 parks on q at the same f01. */
function isSharedSpectator(g1: EdgePlan, g2: EdgePlan, q: number): boolean {
  const p1 = g1.parked;
  const p2 = g2.parked;
  for (let i = 0; i < p1.length; i++) {
    if (p1[i].qubit !== q) continue;
    const f = p1[i].fGHz;
    for (let j = 0; j < p2.length; j++) if (p2[j].qubit === q && p2[j].fGHz === f) return true;
  }
  return false;
}

/** Up to this many plans conflictKinds marks the pairs it has considered in a bit array (at most 2 MB), beyond in a set. */
const SEEN_BITMAP_PLANS = 4096;

/** Iterated-greedy rounds per layering (bounded for large chips: about 4e6 adjacency visits). */
const LAYER_ROUNDS = 200;

/**
 * The kind of every conflicting pair of gates (key a * plans.length + b, a < b indices into
 * `plans`): the conflict graph's edges, each with the first condition of the banner that holds.
 */
export function conflictKinds(
  ctx: PlanContext,
  plans: readonly EdgePlan[],
  parkingF12: readonly number[],
  parkingGHz: ArrayLike<number>,
  cache?: ConflictCache,
  /** Up to this many plans the pairs met are marked in a bit array, beyond in a set (tests lower it). */
  bitmapPlans = SEEN_BITMAP_PLANS,
): ReadonlyMap<number, ConflictKind> {
  if (cache && (cache.parkingF12 !== parkingF12 || cache.parkingGHz !== parkingGHz)) throw new Error('conflictKinds: the cache belongs to other parking frequencies');
  // (the same plan objects in the same order as a list worked out before: its kinds, the same
  // read-only map; no caller changes it)
  const known = cache?.kindsOf(plans);
  if (known) return known;
  const moved = plans.map((p) => (cache ? cache.movedOf(ctx, p) : movedQubits(ctx, p, parkingF12, parkingGHz)));
  const touching: number[][] = Array.from({ length: ctx.n }, () => []);
  plans.forEach((p, k) => {
    for (const q of touchedQubits(p)) touching[q].push(k);
  });
  // candidate pairs: gates touching a common qubit, or a neighbour or next-nearest neighbour of a moved qubit
  const m = plans.length;
  const scan = new PairScan(ctx, plans, moved, m <= bitmapPlans);
  for (const list of touching) for (let i = 0; i < list.length; i++) for (let j = i + 1; j < list.length; j++) scan.consider(list[i], list[j]);
  const nearOf = nearLists(ctx);
  for (let k1 = 0; k1 < m; k1++) {
    const mk = moved[k1];
    for (let j = 0; j < mk.length; j++) {
      const near = nearOf[mk[j].qubit];
      for (let i = 0; i < near.length; i++) {
        const list = touching[near[i]];
        for (let t = 0; t < list.length; t++) scan.consider(k1, list[t]);
      }
    }
  }
  const kinds = scan.kinds;
  cache?.rememberKinds(plans, kinds);
  return kinds;
}

/**
 * The candidate pairs of conflictKinds, each given its kind at its first meeting (a < b; key
 * a * m + b): the 32 x 32 chip's check meets 0.72-1.01 million candidate pairs per list (counted
 * on a copy, 2026-12-04), of them 81,000-87,000 for the first time.
 * Pairs already considered are marked one bit per pair (a byte array up to SEEN_BITMAP_PLANS
 * plans, else a set). (Not remembered per pair of plan objects across lists: on the 32 x 32 chip
 * 28 % of the pairs met first would be found there, and the maps cost more than conflictKind
 * saved.) A class rather than a closure made per call: the engine's optimised code of
 * conflictKinds calls the same method on every call (a new closure per call undid it, "wrong call
 * target", each time the layer fitting asked for another list).
 */
class PairScan {
  readonly kinds = new Map<number, ConflictKind>();
  private readonly m: number;
  private readonly seenBits: Uint8Array | null;
  private readonly seenSet: Set<number> | null;

  constructor(
    private readonly ctx: PlanContext,
    private readonly plans: readonly EdgePlan[],
    private readonly moved: readonly (readonly MovedQubit[])[],
    bitmap: boolean,
  ) {
    this.m = plans.length;
    this.seenBits = bitmap ? new Uint8Array(Math.ceil((this.m * this.m) / 8)) : null;
    this.seenSet = bitmap ? null : new Set<number>();
  }

  consider(k1: number, k2: number): void {
    if (k1 === k2) return;
    const a = k1 < k2 ? k1 : k2;
    const b = k1 < k2 ? k2 : k1;
    const key = a * this.m + b;
    let first: boolean;
    if (this.seenBits) first = firstMeeting(this.seenBits, key);
    else if ((first = !this.seenSet!.has(key))) this.seenSet!.add(key);
    if (!first) return;
    const kind = conflictKind(this.ctx, this.plans[a], this.moved[a], this.plans[b], this.moved[b]);
    if (kind) this.kinds.set(key, kind);
  }
}

/** Sets the bit of `key` and says whether it was clear (the pair's first meeting). */
function firstMeeting(bits: Uint8Array, key: number): boolean {
  const byte = key >> 3;
  const bit = 1 << (key & 7);
  if (bits[byte] & bit) return false;
  bits[byte] |= bit;
  return true;
}

/**
 * Per qubit, its neighbours and then its next-nearest neighbours not already listed (the order a
 * set built the same way iterates in), worked out once per context.
 */
export function nearLists(ctx: PlanContext): readonly Int32Array[] {
  let lists = nearListMemo.get(ctx);
  if (!lists) {
    lists = ctx.neighbours.map((ns, q) => {
      const near = new Set<number>(ns);
      for (const p of ctx.nextNearestOf[q]) near.add(ctx.nextNearest[p].a === q ? ctx.nextNearest[p].b : ctx.nextNearest[p].a);
      return Int32Array.from(near);
    });
    nearListMemo.set(ctx, lists);
  }
  return lists;
}

const nearListMemo = new WeakMap<PlanContext, readonly Int32Array[]>();

/**
 * The moved qubits of each plan, remembered by plan object, and the conflict kinds of the last few
 * lists of plans, for one set of parking frequencies: the layer fitting (./layer-moves.ts) colours
 * several candidate sets of plans that share most of their plan objects, and a plan's moved
 * qubits depend only on the plan and the parking (plans are never changed in place). The same
 * answers as computing them again (tested).
 */
export class ConflictCache {
  private readonly moved = new WeakMap<EdgePlan, MovedQubit[]>();
  /** The kinds of the last few lists of plans (plan objects in order), as conflictKinds found them. */
  private readonly lists: { plans: EdgePlan[]; kinds: ReadonlyMap<number, ConflictKind> }[] = [];

  constructor(
    readonly parkingF12: readonly number[],
    readonly parkingGHz: ArrayLike<number>,
  ) {}

  movedOf(ctx: PlanContext, plan: EdgePlan): MovedQubit[] {
    let m = this.moved.get(plan);
    if (!m) this.moved.set(plan, (m = movedQubits(ctx, plan, this.parkingF12, this.parkingGHz)));
    return m;
  }

  /** The kinds conflictKinds found for the same plan objects in the same order, if among the last LISTS_KEPT lists. */
  kindsOf(plans: readonly EdgePlan[]): ReadonlyMap<number, ConflictKind> | undefined {
    return this.lists.find((l) => l.plans.length === plans.length && l.plans.every((p, i) => p === plans[i]))?.kinds;
  }

  rememberKinds(plans: readonly EdgePlan[], kinds: ReadonlyMap<number, ConflictKind>): void {
    this.lists.push({ plans: [...plans], kinds });
    if (this.lists.length > LISTS_KEPT) this.lists.shift();
  }
}

/** Lists of plans whose conflict kinds a ConflictCache keeps (the layer fitting colours up to four, then explains the one it keeps). */
const LISTS_KEPT = 4;

/** Every pair of gates that cannot share a layer (indices into `plans`, first < second): the conflict graph's edges. Used by planLayers and by verify. */
export function conflictingPairs(ctx: PlanContext, plans: readonly EdgePlan[], parkingF12: readonly number[], parkingGHz: ArrayLike<number>): [number, number][] {
  return [...conflictKinds(ctx, plans, parkingF12, parkingGHz).keys()].map((key) => [Math.floor(key / plans.length), key % plans.length] as [number, number]);
}

/**
 * The layers of `plans`. `start`, when given, is a colouring of the whole conflict graph (layer of
 * each plan), for example one the layer fitting built (./layer-moves.ts) or the layers before pulse
 * design; the final colouring then starts from the better of it (repaired by greedy colouring in
 * its class order where a conflict appeared) and DSATUR (iterated greedy never adds colours).
 * With `explain: false` the kind-by-kind explanation is left out (its counts NaN; the layer
 * fitting colours candidates it then drops, and explains the one it keeps: explainLayers).
 */
export function planLayers(
  ctx: PlanContext,
  plans: readonly EdgePlan[],
  parkingF12: readonly number[],
  parkingGHz: ArrayLike<number>,
  seed = 1,
  start?: ArrayLike<number>,
  options: { explain?: boolean; cache?: ConflictCache } = {},
): LayerPlan {
  const kinds = conflictKinds(ctx, plans, parkingF12, parkingGHz, options.cache);
  const lowerBound = lowerBoundOf(ctx);
  const colours = colourKinds(ctx, plans, kinds, new Set(KIND_ORDER), seed, start);
  const layerOf = Array.from(colours);
  const count = plans.length === 0 ? 0 : Math.max(...layerOf) + 1;
  const layers: number[][] = Array.from({ length: count }, () => []);
  plans.forEach((p, k) => layers[layerOf[k]].push(p.edge));
  const plan: LayerPlan = { layerOf, layers, lowerBound, conflicts: kinds.size, explanation: { shared: NaN, spectator: NaN, close: NaN, next: count, pairs: pairCounts(kinds) } };
  if (options.explain !== false) plan.explanation = explainKinds(ctx, plans, kinds, count, seed);
  return plan;
}

/** The explanation of a layer plan of `plans` (computed again from their conflicts; its own count stays the final one). */
export function explainLayers(ctx: PlanContext, plans: readonly EdgePlan[], parkingF12: readonly number[], parkingGHz: ArrayLike<number>, layers: LayerPlan, seed = 1, cache?: ConflictCache): LayerPlan {
  const kinds = conflictKinds(ctx, plans, parkingF12, parkingGHz, cache);
  return { ...layers, explanation: explainKinds(ctx, plans, kinds, layers.layers.length, seed) };
}

const KIND_ORDER: ConflictKind[] = ['shared', 'spectator', 'close', 'next'];

const lowerBoundOf = (ctx: PlanContext) => ctx.edgesOf.reduce((m, list) => Math.max(m, list.length), 0);

function pairCounts(kinds: ReadonlyMap<number, ConflictKind>): Record<ConflictKind, number> {
  const pairs: Record<ConflictKind, number> = { shared: 0, spectator: 0, close: 0, next: 0 };
  kinds.forEach((kind) => void pairs[kind]++);
  return pairs;
}

/** The layers the conflicts up to each kind alone need (the last: the plan's own count). */
function explainKinds(ctx: PlanContext, plans: readonly EdgePlan[], kinds: ReadonlyMap<number, ConflictKind>, count: number, seed: number): LayerExplanation {
  const counts = KIND_ORDER.slice(0, -1).map((_, k) => (plans.length === 0 ? 0 : colourCount(colourKinds(ctx, plans, kinds, new Set(KIND_ORDER.slice(0, k + 1)), seed))));
  // a subset of the conflicts never needs more layers than all of them
  const cap = (x: number) => Math.min(x, count);
  return { shared: cap(counts[0]), spectator: cap(counts[1]), close: cap(counts[2]), next: count, pairs: pairCounts(kinds) };
}

/** Colour the conflict graph restricted to the `allowed` kinds (DSATUR or a valid `given` start, then iterated greedy). */
function colourKinds(ctx: PlanContext, plans: readonly EdgePlan[], kinds: ReadonlyMap<number, ConflictKind>, allowed: ReadonlySet<ConflictKind>, seed: number, given?: ArrayLike<number>): Int32Array {
  // (DSATUR on the adjacency lists: the same colours as on a graphology graph with one node per
  // plan in this order, without building one; src/plan/parking/colouring.ts)
  // (forEach, not for-of over the entries: no [key, kind] array per conflict; the same order)
  const adjacency: number[][] = plans.map(() => []);
  const m = plans.length;
  kinds.forEach((kind, key) => {
    if (!allowed.has(kind)) return;
    const a = Math.floor(key / m);
    const b = key % m;
    adjacency[a].push(b);
    adjacency[b].push(a);
  });
  let first: Int32Array = dsaturOfAdjacency(adjacency);
  if (given && given.length === plans.length) {
    // a start that no longer holds (a design moved a spectator) is repaired by greedy colouring
    // class by class in its order, which keeps most of its layers
    const start: Int32Array = validColouring(adjacency, given) ? Int32Array.from(given) : greedyColouring(adjacency, classOrder(given));
    if (colourCount(start) < colourCount(first)) first = start;
  }
  const visits = adjacency.reduce((s, l) => s + l.length, 0) + plans.length;
  const rounds = Math.max(1, Math.min(LAYER_ROUNDS, Math.floor(4e6 / Math.max(1, visits))));
  return iteratedGreedy(adjacency, first, { iterations: rounds, seed, lowerBound: lowerBoundOf(ctx) });
}

/** Vertices listed colour class by colour class (then by index): the order greedy colouring keeps the classes in. */
function classOrder(colour: ArrayLike<number>): number[] {
  return Array.from({ length: colour.length }, (_, v) => v).sort((a, b) => colour[a] - colour[b] || a - b);
}

/** True when no two adjacent vertices share a colour (and every colour is a non-negative integer). */
function validColouring(adjacency: readonly number[][], colour: ArrayLike<number>): boolean {
  if (colour.length !== adjacency.length) return false;
  for (let v = 0; v < adjacency.length; v++) {
    if (!Number.isInteger(colour[v]) || colour[v] < 0) return false;
    for (const w of adjacency[v]) if (colour[w] === colour[v]) return false;
  }
  return true;
}

/** One sentence on what the layer count comes from (the explanation's steps that add layers). */
export function layerExplanationText(x: LayerExplanation, lowerBound: number): string {
  const parts = [`the gates sharing a qubit need ${x.shared} (at least ${lowerBound}, the largest degree)`];
  if (x.spectator > x.shared) parts.push(`spectators moved for one gate and used by another add ${x.spectator - x.shared} (${x.pairs.spectator} conflicting pairs)`);
  if (x.close > x.spectator) parts.push(`coupled moving qubits whose excursions come close add ${x.close - x.spectator} (${x.pairs.close} pairs)`);
  if (x.next > x.close) parts.push(`moving next-nearest neighbours ending close add ${x.next - x.close} (${x.pairs.next} pairs)`);
  return `${x.next} layers: ${parts.join('; ')}`;
}
