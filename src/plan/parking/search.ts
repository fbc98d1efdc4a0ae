/**
 * The parking search: a greedy construction in frequency-group order followed by a seeded local
 * search (min-conflicts with random kicks: Minton et al., Artif. Intell. 58, 161 (1992)).
 *
 * Construction: fixed qubits first; then the groups of ./colouring.ts in order of their mean
 * domain top (highest first), inside a group by domain top; each qubit takes its cheapest
 * candidate (./state.ts) against the qubits already placed.
 *
 * Local search: sweeps over the movable qubits in a seeded random order; each moves to its cheapest candidate when that lowers its cost. When a sweep moves
 * nothing but rules are still broken, a kick moves one qubit that blocks a violating qubit to a
 * random candidate of its own; kicks are bounded. Everything depends only on the layout and the
 * seed (src/util/random.ts), so the same seed gives the same assignment.
 */
import { goldenSection } from '../../util/golden-section.js';
import { Random } from '../../util/random.js';
import type { ParkingState } from './state.js';

export interface SearchStats {
  sweeps: number;
  moves: number;
  kicks: number;
}

/** Smallest cost decrease (estimated error per cycle) that counts as an improvement. */
const IMPROVEMENT = 1e-7;

/**
 * Smallest decrease of a qubit's cost for which a visit of the refined descent moves it (estimated
 * error per cycle; the threshold BUDGET_MOVE_GAIN of src/plan/interaction/plan-edge.ts sets for a
 * spectator move). With IMPROVEMENT alone the refined descent never settled: its golden sections
 * keep finding points a little better than the last as the neighbours move, and on the generated
 * 16 x 16 chip it spent all 40 sweeps (about 10,400 visits and 4,100 moves; of the search's 4,313
 * moves 3,334 gained less than 1e-5); with this threshold it stops after 7 sweeps (about 1,150
 * visits) and the plans measured were no worse (README "Planner").
 */
const REFINED_MIN_GAIN = 1e-4;

/** Candidates tried per qubit in a joint move. */
const JOINT_CANDIDATES = 3;

/** A joint move is tried only when the qubit alone would gain this much (estimated error per cycle). */
const JOINT_MIN_GAIN = 1e-3;

/** Total cost of qubit i where it stands (violation * penalty + soft). */
function currentCost(state: ParkingState, i: number): number {
  const b = state.blockersOf(i);
  const c = state.costAt(i, state.freq[i], b);
  return c.violation + c.soft;
}

/**
 * Move qubit i to its cheapest candidate, refined by a golden-section search inside its allowed
 * interval when `refine` (then only when that lowers its cost by at least REFINED_MIN_GAIN);
 * returns true when it moved.
 */
export function improveQubit(state: ParkingState, i: number, refine = true): boolean {
  // nothing it reads changed since a visit that found no better point: the same answer again
  if (state.settled(i, refine)) return false;
  const blockers = state.blockersOf(i);
  const cands = state.candidates(i, blockers);
  let bestF = state.freq[i];
  const here = state.costAt(i, bestF, blockers);
  let best = here.violation + here.soft;
  const start = best;
  for (const f of cands) {
    // (the point where it stands costs `here` again, never less: skipped; the others need only
    // be known below best - IMPROVEMENT: a bound at or above it answers the same)
    if (f === state.freq[i]) continue;
    const c = state.costAt(i, f, blockers, best - IMPROVEMENT);
    const total = c.violation + c.soft;
    if (total < best - IMPROVEMENT) {
      best = total;
      bestF = f;
    }
  }
  // Refine inside the allowed interval of the best point (the cost has interior minima where
  // dephasing, ZZ and the other terms balance): 8 samples, then golden-section around the best.
  if (refine && best < state.options.search.violationPenalty) {
    const a = state.allowed(i, blockers).find((x) => bestF >= x.lo - 1e-12 && bestF <= x.hi + 1e-12);
    if (a && a.hi - a.lo > 2e-3) {
      const nudge = Math.min(state.options.search.nudgeGHz, (a.hi - a.lo) / 4);
      const lo = a.lo + nudge;
      const hi = a.hi - nudge;
      const total = (f: number) => {
        const c = state.costAt(i, f, blockers);
        return c.violation + c.soft;
      };
      const samples = 8;
      const step = (hi - lo) / samples;
      let x0 = bestF;
      let c0 = best;
      for (let k = 0; k <= samples; k++) {
        const f = lo + k * step;
        // (only whether it is below c0 matters: a bound at or above c0 answers the same)
        const cs = state.costAt(i, f, blockers, c0);
        const c = cs.violation + cs.soft;
        if (c < c0) {
          c0 = c;
          x0 = f;
        }
      }
      const { c: m1, fc: c1, d: m2, fd: c2 } = goldenSection(total, Math.max(lo, x0 - step), Math.min(hi, x0 + step), 10);
      for (const [f, c] of [[x0, c0], [m1, c1], [m2, c2]] as const) {
        if (c < best - IMPROVEMENT) {
          best = c;
          bestF = f;
        }
      }
    }
  }
  if (bestF !== state.freq[i] && best < start - (refine ? REFINED_MIN_GAIN : 0)) {
    state.set(i, bestF);
    return true;
  }
  state.markSettled(i, refine);
  return false;
}

/** Place the qubits of `members` (indices) one by one in `order`, each against those already active. */
export function construct(state: ParkingState, order: readonly number[]): void {
  for (const i of order) {
    state.active[i] = 1;
    state.touch();
    if (state.movable(i)) {
      state.set(i, state.startOf(i));
      improveQubit(state, i);
    }
  }
}

/** The construction order: fixed first, then groups by mean domain top (highest first). */
export function constructionOrder(state: ParkingState, members: readonly number[], groups: readonly number[]): number[] {
  const ctx = state.ctx;
  const top = (i: number) => ctx.domains[i]?.hi ?? ctx.ranges[i].hi;
  const mean = new Map<number, { sum: number; count: number }>();
  for (const i of members) {
    const m = mean.get(groups[i]) ?? { sum: 0, count: 0 };
    m.sum += top(i);
    m.count++;
    mean.set(groups[i], m);
  }
  const groupRank = (g: number) => {
    const m = mean.get(g)!;
    return m.sum / m.count;
  };
  return [...members].sort((a, b) => {
    const fa = ctx.fixed[a] !== undefined ? 0 : 1;
    const fb = ctx.fixed[b] !== undefined ? 0 : 1;
    return fa - fb || groupRank(groups[b]) - groupRank(groups[a]) || groups[a] - groups[b] || top(b) - top(a) || a - b;
  });
}

/**
 * Seeded local search over the active movable qubits. A worklist keeps the sweeps cheap on big
 * chips: after the first full sweep, only qubits next to one that moved (neighbours and
 * next-nearest neighbours) are visited again. Without `refine`, candidates are not refined by the
 * golden-section search (a cheaper first descent).
 */
export function localSearch(state: ParkingState, rng: Random, limits: { sweeps: number; kicks: number }, refine = true): SearchStats {
  const n = state.ctx.n;
  const free: number[] = [];
  for (let i = 0; i < n; i++) if (state.movable(i)) free.push(i);
  const stats: SearchStats = { sweeps: 0, moves: 0, kicks: 0 };
  if (free.length === 0) return stats;
  let work: number[] = free;
  const progress: KickProgress = { lowest: Infinity, since: 0 };
  for (let sweep = 0; sweep < limits.sweeps; sweep++) {
    stats.sweeps++;
    const order = shuffled(work, rng);
    const next = new Set<number>();
    let moved = 0;
    for (const i of order) {
      if (!improveQubit(state, i, refine)) continue;
      moved++;
      for (const j of neighbourhood(state, [i])) if (state.movable(j)) next.add(j);
    }
    stats.moves += moved;
    if (moved > 0) {
      work = [...next].sort((a, b) => a - b);
      continue;
    }
    const stuck = allViolating(state);
    if (stuck.length === 0) break;
    const before = stats.kicks;
    kickPhase(state, rng, stuck, limits.kicks, stats, progress);
    if (stats.kicks === before) break;
    work = free;
  }
  return stats;
}

/**
 * Kicks in a row that do not lower the chip's violation measure below its lowest value in the
 * descent end the descent's kicks. Without it a chip with
 * a violation no kick can clear (on drawn chips of the yield's replan mode: a qubit whose window
 * its tunable range misses, and the next-nearest collisions of where it is left) spent the whole
 * budget, 200 kicks per descent, each settling a neighbourhood: about a third of a drawn 10 x 10
 * chip's plan. The demos and the generated chips need no kicks.
 */
const KICK_PATIENCE = 40;

/** The lowest violation measure of the chip seen by the kick phases of one descent, and the kicks since it was reached. */
interface KickProgress {
  lowest: number;
  since: number;
}

/**
 * Kicks: move a qubit that blocks a violating one (or the violating qubit itself) to a random
 * candidate, let the neighbourhood settle, and keep the result unless the neighbourhood breaks
 * more rules than before. Stops when nothing is broken, the kick budget is spent, or
 * KICK_PATIENCE kicks in a row have not lowered the chip's violation measure (at the phase's
 * start the sum over the violating qubits, then changed by each kept kick's change in its
 * neighbourhood) below its lowest value in this descent.
 */
function kickPhase(state: ParkingState, rng: Random, stuck: number[], budget: number, stats: SearchStats, progress: KickProgress): void {
  let pending = stuck;
  // the chip's violation measure, kept up to date with the kept kicks' changes in their regions
  let measure = stuck.reduce((s, i) => s + state.violationOf(i), 0);
  if (measure < progress.lowest - 1e-9) {
    progress.lowest = measure;
    progress.since = 0;
  }
  while (pending.length > 0 && stats.kicks < budget && progress.since < KICK_PATIENCE) {
    stats.kicks++;
    progress.since++;
    const v = pending[rng.int(pending.length)];
    const f = state.freq[v];
    const owners = state
      .blockersOf(v)
      .filter((b) => f > b.lo && f < b.hi && b.other >= 0 && state.movable(b.other))
      .map((b) => b.other);
    const pool = state.movable(v) ? [...owners, v] : owners;
    if (pool.length === 0) {
      pending = pending.filter((x) => x !== v);
      continue;
    }
    const u = pool[rng.int(pool.length)];
    const region = neighbourhood(state, [u, v]);
    const saved = region.map((i) => state.freq[i]);
    const violationBefore = region.reduce((s, i) => s + state.violationOf(i), 0);
    const cands = state.candidates(u, state.blockersOf(u)).filter((x) => x !== state.freq[u]);
    if (cands.length === 0) continue;
    state.set(u, cands[rng.int(cands.length)]);
    for (let pass = 0; pass < 6; pass++) {
      let moved = 0;
      for (const i of shuffled(region, rng)) if (i !== u && state.movable(i) && improveQubit(state, i, false)) moved++;
      if (improveQubit(state, u, false)) moved++;
      stats.moves += moved;
      if (moved === 0) break;
    }
    const violationAfter = region.reduce((s, i) => s + state.violationOf(i), 0);
    if (violationAfter > violationBefore) region.forEach((i, k) => state.set(i, saved[k]));
    else measure += violationAfter - violationBefore;
    if (measure < progress.lowest - 1e-9) {
      progress.lowest = measure;
      progress.since = 0;
    }
    pending = region.filter((i) => state.active[i] && state.violationOf(i) > 0);
    if (pending.length === 0) pending = allViolating(state);
  }
}

/** The qubits, their neighbours and next-nearest neighbours (active only), in index order. */
function neighbourhood(state: ParkingState, seeds: readonly number[]): number[] {
  const ctx = state.ctx;
  const set = new Set<number>();
  for (const s of seeds) {
    set.add(s);
    for (const j of ctx.neighbours[s]) set.add(j);
    for (const p of ctx.nextNearestOf[s]) {
      const pair = ctx.nextNearest[p];
      set.add(pair.a === s ? pair.b : pair.a);
    }
  }
  return [...set].filter((i) => state.active[i]).sort((a, b) => a - b);
}

/** Active qubits that break a rule where they stand. */
export function allViolating(state: ParkingState): number[] {
  const out: number[] = [];
  for (let i = 0; i < state.ctx.n; i++) if (state.active[i] && state.violationOf(i) > 0) out.push(i);
  return out;
}

function shuffled(list: readonly number[], rng: Random): number[] {
  const a = [...list];
  for (let k = a.length - 1; k > 0; k--) {
    const j = rng.int(k + 1);
    [a[k], a[j]] = [a[j], a[k]];
  }
  return a;
}

export { currentCost };

/**
 * Joint moves (escape from single-qubit local minima such as "the qubit would rather sit higher
 * but its neighbour blocks it"): for each movable qubit below its domain top, in a seeded order,
 * try its three cheapest candidates above it computed without its coupled neighbours (by its own
 * cost terms; only those that would lower its own cost by at least 1e-3), let those neighbours
 * re-optimise, and keep
 * the best result when the cost of the qubit and its neighbours (violations included) falls.
 * Returns the number of accepted joint moves.
 */
export function jointMoves(state: ParkingState, rng: Random): number {
  const ctx = state.ctx;
  let accepted = 0;
  const free: number[] = [];
  for (let i = 0; i < ctx.n; i++) if (state.movable(i)) free.push(i);
  for (const i of shuffled(free, rng)) {
    const region = [i, ...ctx.neighbours[i].filter((j) => state.active[j])];
    const regionCost = () => region.reduce((s, q) => s + currentCost(state, q), 0);
    const saved = region.map((q) => state.freq[q]);
    const base = regionCost();
    // Candidates of i above where it stands (towards its sweet spot), computed with its coupled
    // neighbours out of the way; the few cheapest by the qubit's own terms.
    const off = region.slice(1);
    const top = ctx.domains[i]!.hi;
    if (saved[0] >= top - state.options.search.nudgeGHz) continue;
    for (const j of off) state.active[j] = 0;
    state.touch();
    const own = state.blockersOf(i);
    const here = state.costAt(i, saved[0], own);
    const hereTotal = here.violation + here.soft;
    const cands = state
      .candidates(i, own)
      .filter((f) => f > saved[0] + 1e-6)
      // (only the points below hereTotal - JOINT_MIN_GAIN are kept and ranked: a bound at or above it answers the same)
      .map((f) => ({ f, c: state.costAt(i, f, own, hereTotal - JOINT_MIN_GAIN) }))
      // only points that would pay for themselves without the neighbours' terms
      .filter((x) => x.c.violation + x.c.soft < hereTotal - JOINT_MIN_GAIN)
      .sort((a, b) => a.c.violation + a.c.soft - (b.c.violation + b.c.soft) || a.f - b.f)
      .slice(0, JOINT_CANDIDATES)
      .map((x) => x.f);
    for (const j of off) state.active[j] = 1;
    state.touch();
    if (cands.length === 0) continue;
    let best = base;
    let bestFreqs: number[] | null = null;
    for (const f of cands) {
      state.set(i, f);
      for (const j of off) if (state.movable(j)) improveQubit(state, j, false);
      improveQubit(state, i, false);
      const c = regionCost();
      if (c < best - IMPROVEMENT) {
        best = c;
        bestFreqs = region.map((q) => state.freq[q]);
      }
      region.forEach((q, k) => state.set(q, saved[k]));
    }
    if (bestFreqs) {
      region.forEach((q, k) => state.set(q, bestFreqs![k]));
      accepted++;
    }
  }
  return accepted;
}
