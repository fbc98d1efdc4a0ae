/**
 * Parking assignment for the whole chip: a frequency for every qubit inside its domain (window
 * intersected with its planning range), fixed `park` values kept, every idle rule of
 * src/plan/rules/catalogue.ts satisfied, and the cost of ./cost.ts minimised.
 *
 * 1. Frequency groups by DSATUR colouring (./colouring.ts); greedy construction (./search.ts).
 * 2. Seeded local search with the fast rules (tables, second-order ZZ): a descent, joint moves,
 *    then a descent with refined candidates.
 * 3. Exact check: every qubit's exact flux, every pair's exact dressed ZZ (CoupledPair). Each
 *    edge's ZZ estimate is rescaled to the exact value at the current point and, while an exact
 *    ZZ breaks the limit, the search runs again from where it stands (at most
 *    calibrationRounds rounds).
 * 4. The final exact evaluation (src/plan/rules/idle-evaluate.ts); when rules are still broken,
 *    ./explain.ts finds the smallest set of qubits whose windows and rules cannot all hold and
 *    says so in words.
 */
import type { LayerFitting } from '../layer-moves.js';
import { Random } from '../../util/random.js';
import type { PlanContext } from '../context.js';
import type { PlanOptions } from '../options.js';
import { evaluateIdle, exactStates, exactZz, type IdleEvaluation } from '../rules/idle-evaluate.js';
import { narrowResonanceZz, secondOrderZz } from '../zz-second-order.js';
import { frequencyGroupsOf } from './colouring.js';
import { explainInfeasible, type Explanation } from './explain.js';
import { construct, constructionOrder, jointMoves, localSearch, type SearchStats } from './search.js';
import { ParkingState } from './state.js';

export interface ParkingResult {
  parkingGHz: Float64Array;
  /** Frequency group of each qubit. */
  groups: number[];
  idle: IdleEvaluation;
  explanations: Explanation[];
  stats: SearchStats & { rounds: number; repairTrials?: number; repairMoves?: number; layerFitting?: LayerFitting | null };
  /** The search state at the end (blocked intervals for margins). */
  state: ParkingState;
}

export function assignParking(ctx: PlanContext, options: PlanOptions, progress?: (stage: string) => void): ParkingResult {
  const state = new ParkingState(ctx, options);
  const groups = frequencyGroupsOf(ctx);
  const all = ctx.ids.map((_, i) => i);
  construct(state, constructionOrder(state, all, groups));
  progress?.('constructed');
  const rng = new Random(options.seed);
  const stats: SearchStats & { rounds: number } = { sweeps: 0, moves: 0, kicks: 0, rounds: 0 };
  let exact: ExactPoint | null = null;
  for (let round = 0; round < Math.max(1, options.search.calibrationRounds); round++) {
    stats.rounds++;
    // A cheap descent first, joint moves out of local minima, then the refined descent.
    const add = (s: SearchStats) => {
      stats.sweeps += s.sweeps;
      stats.moves += s.moves;
      stats.kicks += s.kicks;
    };
    add(localSearch(state, rng, options.search, false));
    jointMoves(state, rng);
    add(localSearch(state, rng, options.search, true));
    progress?.(`search round ${round + 1}`);
    if (!recalibrate(ctx, state, (exact = emptyExactPoint(ctx)))) break;
  }
  // (no search ran since the last calibration: its exact fluxes and ZZ are those of this parking)
  const states = exactStates(ctx, state.freq, exact?.flux);
  const idle = evaluateIdle(ctx, state.freq, { states, zzGHz: exactZz(ctx, states, exact ?? undefined) });
  const explanations = idle.violations.length > 0 ? explainInfeasible(ctx, options, state, groups, idle.violations) : [];
  return { parkingGHz: Float64Array.from(state.freq), groups, idle, explanations, stats, state };
}

/** What recalibrate found at a parking point: each qubit's exact flux (NaN outside its tunable range) and the exact ZZ of the edges it computed (`has`). */
export interface ExactPoint {
  flux: Float64Array;
  zzGHz: Float64Array;
  has: Uint8Array;
}

function emptyExactPoint(ctx: PlanContext): ExactPoint {
  return { flux: new Float64Array(ctx.n), zzGHz: new Float64Array(ctx.edges.length), has: new Uint8Array(ctx.edges.length) };
}

/**
 * Rescale each edge's ZZ estimate to the exact dressed ZZ at the current parking point; returns
 * true when some exact ZZ breaks the limit (so another search round is worth running). `found`,
 * when given, receives the exact fluxes and ZZ values it computed (the final idle evaluation
 * reuses them when no search ran since).
 */
export function recalibrate(ctx: PlanContext, state: ParkingState, found?: ExactPoint): boolean {
  const flux = ctx.transmons.map((t, i) => {
    const f = state.freq[i];
    return f >= t.fMinGHz && f <= t.fMaxGHz ? t.fluxForF01(f) : NaN;
  });
  if (found) found.flux.set(flux);
  let broken = false;
  for (const e of ctx.edges) {
    if (Number.isNaN(flux[e.a]) || Number.isNaN(flux[e.b])) continue;
    const exact = ctx.pair(e.index).zz(flux[e.a], flux[e.b]);
    if (found) {
      found.zzGHz[e.index] = exact;
      found.has[e.index] = 1;
    }
    const estimate = secondOrderZz(state.states[e.a], state.states[e.b], e.gChargeGHz) + narrowResonanceZz(state.states[e.a], state.states[e.b], e.gChargeGHz);
    if (Math.abs(estimate) > 1e-9 && Number.isFinite(exact)) {
      const ratio = exact / estimate;
      if (ratio > 0.2 && ratio < 5) state.zzScale[e.index] = ratio;
    }
    if (Math.abs(exact) > ctx.rules.zzLimitGHz) broken = true;
  }
  state.blockers.clearZzCache();
  // the ZZ calibration changed: every cost and every settled visit is out of date
  state.touch();
  return broken;
}
