/**
 * Gate-aware repair of the parking: after the interaction plan, an edge that no option can clear
 * (typically: a spectator of the mover sits in the swept band and cannot get out of the way, or
 * the partner parks so low that the mover's excursion crosses half the chip) is retried with one
 * of its qubits parked elsewhere. For each such edge, in order, the qubits tried are its partner,
 * the other qubits its findings name, then its mover; for each, up to `candidates` parking points
 * that keep every idle rule (the cheapest point of each of its allowed intervals first, then the
 * next cheapest, by the parking cost). A move is kept
 * when it clears the edge, keeps the exact ZZ of the moved qubit's pairs within the limit, and
 * does not leave more edges infeasible nearby (edges with a qubit within three couplings of the
 * moved one are re-planned: a plan depends on its qubits' neighbours, the mover's next-nearest
 * neighbours and its parked spectators' neighbours); otherwise it is undone. The caller re-plans
 * those edges once more after all moves, so every final plan sees the final parking. The number of trials is bounded
 * (trialsPerEdge times the number of edges), so the result stays deterministic and the time
 * bounded.
 */
import type { PlanContext } from '../context.js';
import { exactQubitState, type ExactQubitState } from '../exact-state.js';
import type { ParkingState } from '../parking/state.js';
import { planEdge, type EdgeContext, type EdgePlan } from './plan-edge.js';

export const REPAIR_DEFAULTS = Object.freeze({ candidates: 3, trialsPerEdge: 0.5 });

export interface RepairStats {
  trials: number;
  moves: number;
  fixed: number;
  /** Edges whose plans may depend on a moved qubit (to re-plan against the final parking). */
  touched: number[];
}

export function repairInfeasibleEdges(ec: EdgeContext, state: ParkingState, states: ExactQubitState[], plans: EdgePlan[], limits = REPAIR_DEFAULTS): RepairStats {
  const { ctx } = ec;
  const stats: RepairStats = { trials: 0, moves: 0, fixed: 0, touched: [] };
  const touched = new Set<number>();
  const budget = limits.trialsPerEdge * ctx.edges.length;
  const near = nearbyEdges(ctx);
  for (const e of ctx.edges) {
    if (plans[e.index].feasible) continue;
    if (stats.trials >= budget) break;
    const plan = plans[e.index];
    const named = plan.findings.flatMap((f) => f.qubits.map((q) => ctx.index.get(q)!)).filter((q) => q !== plan.mover && q !== plan.partner);
    const tryQubits = [...new Set([plan.partner, ...named.sort((a, b) => a - b), plan.mover])].filter((q) => state.movable(q));
    let fixed = false;
    for (const q of tryQubits) {
      if (fixed || stats.trials >= budget) break;
      const blockers = state.blockersOf(q);
      const scored = state
        .candidates(q, blockers)
        .filter((f) => Math.abs(f - state.freq[q]) > 1e-6)
        .map((f) => ({ f, c: state.costAt(q, f, blockers) }))
        .filter((x) => x.c.violation === 0)
        .sort((a, b) => a.c.soft - b.c.soft || a.f - b.f);
      // The cheapest point of each allowed interval first (a qubit in the way often has to go far).
      const allowed = state.allowed(q, blockers);
      const intervalOf = (f: number) => allowed.findIndex((a) => f >= a.lo - 1e-12 && f <= a.hi + 1e-12);
      const firstOfEach: number[] = [];
      const rest: number[] = [];
      const seenInterval = new Set<number>();
      const seen = new Set<number>();
      for (const x of scored) {
        if (seen.has(x.f)) continue;
        seen.add(x.f);
        const k = intervalOf(x.f);
        if (!seenInterval.has(k)) {
          seenInterval.add(k);
          firstOfEach.push(x.f);
        } else rest.push(x.f);
      }
      const cands = [...firstOfEach, ...rest].slice(0, limits.candidates);
      for (const f of cands) {
        if (stats.trials >= budget) break;
        stats.trials++;
        if (tryMove(ec, state, states, plans, near, e.index, q, f)) {
          for (const k of near[q]) touched.add(k);
          stats.moves++;
          stats.fixed++;
          fixed = true;
          break;
        }
      }
    }
  }
  stats.touched = [...touched].sort((a, b) => a - b);
  return stats;
}

function tryMove(ec: EdgeContext, state: ParkingState, states: ExactQubitState[], plans: EdgePlan[], near: number[][], edge: number, q: number, f: number): boolean {
  const { ctx } = ec;
  const oldF = state.freq[q];
  const oldState = states[q];
  state.set(q, f);
  const undo = () => {
    state.set(q, oldF);
    states[q] = oldState;
  };
  states[q] = exactQubitState(ctx.transmons[q], f, ctx.rules.resistanceSpread);
  for (const k of ctx.edgesOf[q]) {
    const e = ctx.edges[k];
    if (Math.abs(ctx.pair(k).zz(states[e.a].flux, states[e.b].flux)) > ctx.rules.zzLimitGHz) {
      undo();
      return false;
    }
  }
  // trials plan for feasibility (the same verdicts as in full); the caller plans every touched edge again in full
  const quick: EdgeContext = { ...ec, feasibilityOnly: true };
  const first = planEdge(quick, edge, plans[edge]);
  if (!first.feasible) {
    undo();
    return false;
  }
  const affected = near[q].filter((k) => k !== edge);
  const before = affected.filter((k) => !plans[k].feasible).length;
  // Re-plan the nearby edges, stopping as soon as more of them fail than before (the move is
  // then undone whatever the rest give).
  const replanned: EdgePlan[] = [];
  let after = 0;
  for (const k of affected) {
    const p = planEdge(quick, k, plans[k]);
    replanned.push(p);
    if (!p.feasible && ++after > before) {
      undo();
      return false;
    }
  }
  plans[edge] = first;
  affected.forEach((k, j) => (plans[k] = replanned[j]));
  return true;
}

/** Edges with an endpoint within three couplings of each qubit (their plans may depend on its frequency). */
function nearbyEdges(ctx: PlanContext): number[][] {
  return ctx.ids.map((_, q) => {
    let within = new Set<number>([q]);
    for (let step = 0; step < 3; step++) {
      const next = new Set(within);
      for (const x of within) for (const j of ctx.neighbours[x]) next.add(j);
      within = next;
    }
    const edges = new Set<number>();
    for (const x of within) for (const k of ctx.edgesOf[x]) edges.add(k);
    return [...edges].sort((a, b) => a - b);
  });
}
