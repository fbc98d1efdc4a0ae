/**
 * The predicted error of one reference cycle (README physics conventions sec. 4): every planned
 * CZ once, in its layer, and every qubit idling while the cycle runs.
 *
 *   cycle duration  cycleOverhead (single-qubit gates, readout, reset) + the sum over layers of
 *                   the layer's longest slot (a gate's slot: its duration plus the ramps of any
 *                   spectator it moves), so fewer layers make a shorter cycle;
 *   gates           the sum of the gates' budgets (src/plan/gate-budget.ts);
 *   idles           per qubit, the one-qubit idle error of src/budget/idle-error.ts at its parking
 *                   point over its idle time (the cycle minus the slots of the gates it moves or
 *                   partners in; a moved spectator idles at parking in this account, its extra
 *                   dephasing is in the gate's spectatorMoves term): T1, dephasing (white and
 *                   quasi-static 1/f with sigma for the idle time, second order at a sweet spot),
 *                   thermal excitation at qubitTemperature, and half of each coupled pair's
 *                   residual-ZZ error (4/5) sin^2(pi zeta t / 2) over the time both idle;
 *   error           gates + idles: a sum of average infidelities of the cycle's operations (the
 *                   first-order error of the whole cycle; common practice for error budgets).
 *                   An edge without a feasible gate is not counted (`uncounted` says how many):
 *                   such a plan breaks a rule, and its cycle error is a lower bound.
 */
import type { PlanContext } from './context.js';
import type { ExactQubitState } from './exact-state.js';
import type { EdgePlan } from './interaction/plan-edge.js';
import type { LayerPlan } from './layers.js';
import type { GateBudget } from './gate-budget.js';
import { qubitIdleError, zzIdleError } from '../budget/idle-error.js';
import { slotNs } from './rules/cz-duration.js';

export interface QubitIdleBudget {
  t1: number;
  dephasing: number;
  zz: number;
  thermal: number;
  total: number;
  /** Idle time in the cycle (ns). */
  idleNs: number;
}

export interface CycleBudget {
  durationNs: number;
  /** Longest slot of each layer (ns). */
  layerNs: number[];
  gates: number;
  idles: number;
  error: number;
  qubits: QubitIdleBudget[];
  /** Edges whose gate is not counted (no feasible gate: unreachable crossing, failed design). */
  uncounted: number;
}

/**
 * A gate's slot (src/plan/rules/cz-duration.ts): the designed gate plus its spectator moves, or
 * before design the duration model's slot (the planned edge's durationNs).
 */
export function slotDurationNs(ctx: PlanContext, e: EdgePlan, designedNs?: number): number {
  return designedNs === undefined ? e.durationNs : slotNs(designedNs, e.parked.length > 0, e.rampNs, ctx.rules);
}

export function cycleBudget(
  ctx: PlanContext,
  edges: readonly EdgePlan[],
  layers: LayerPlan,
  states: readonly ExactQubitState[],
  zzGHz: Float64Array,
  budgets: readonly (GateBudget | null)[],
  slotsNs: readonly number[],
): CycleBudget {
  const r = ctx.rules;
  // (the position in `edges` of each layout edge index, the first as findIndex gives it: a
  // look-up, not a search of the list per gate of every layer)
  const position = new Int32Array(ctx.edges.length).fill(-1);
  for (let k = edges.length - 1; k >= 0; k--) {
    const i = edges[k].edge;
    if (Number.isInteger(i) && i >= 0 && i < position.length) position[i] = k;
  }
  const positionOf = (i: number): number => (Number.isInteger(i) && i >= 0 && i < position.length ? position[i] : edges.findIndex((e) => e.edge === i));
  const layerNs = layers.layers.map((list) => {
    let m = 0;
    for (const edgeIndex of list) {
      const k = positionOf(edgeIndex);
      if (k >= 0 && Number.isFinite(slotsNs[k])) m = Math.max(m, slotsNs[k]);
    }
    return m;
  });
  const durationNs = r.cycleOverheadNs + layerNs.reduce((a, b) => a + b, 0);
  const busy = new Float64Array(ctx.n);
  edges.forEach((e, k) => {
    if (!Number.isFinite(slotsNs[k])) return;
    busy[e.mover] += slotsNs[k];
    busy[e.partner] += slotsNs[k];
  });
  const idleNs = Array.from(busy, (b) => Math.max(0, durationNs - b));
  const qubits: QubitIdleBudget[] = states.map((st, q) => {
    const t = ctx.transmons[q];
    if (!t.coherenceSpec) return { t1: 0, dephasing: 0, zz: 0, thermal: 0, total: 0, idleNs: idleNs[q] };
    const e = qubitIdleError(
      { coherence: t.coherenceSpec, f01GHz: st.f01GHz, slopeGHz: st.df01dFluxGHz, curvatureGHz: t.fluxCurvatureGHz(st.flux) },
      idleNs[q],
      { averagingTimeNs: r.noiseAveragingTimeNs, temperatureK: r.qubitTemperatureK },
    );
    return { t1: e.t1, dephasing: e.dephasing, zz: 0, thermal: e.thermal, total: 0, idleNs: idleNs[q] };
  });
  for (const edge of ctx.edges) {
    const z = zzGHz[edge.index];
    if (!Number.isFinite(z)) continue;
    const share = 0.5 * zzIdleError(z, Math.min(idleNs[edge.a], idleNs[edge.b]));
    qubits[edge.a].zz += share;
    qubits[edge.b].zz += share;
  }
  let idles = 0;
  for (const q of qubits) {
    q.total = q.t1 + q.dephasing + q.zz + q.thermal;
    idles += q.total;
  }
  let gates = 0;
  let uncounted = 0;
  for (const b of budgets) {
    if (b) gates += b.total;
    else uncounted++;
  }
  return { durationNs, layerNs, gates, idles, error: gates + idles, qubits, uncounted };
}
