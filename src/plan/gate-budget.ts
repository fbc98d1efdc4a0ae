/**
 * The error budget of each planned CZ (README physics conventions sec. 4), every term an
 * average gate infidelity, their sum the predicted gate error:
 *
 *   coherent        1 - F of the designed waveform (leakage and the rest)          [gate stage]
 *   t1              first-order T1 term on the designed trajectory                  [gate stage]
 *   whiteDephasing  first-order white-dephasing term                                [gate stage]
 *   fluxNoise       quasi-static 1/f offsets of both transmons, averaged with the
 *                   nominal virtual-Z phases (src/budget/gate-flux-noise.ts)         [gate stage]
 *   spectators      every other neighbour of the mover (and on an 11-02 crossing of the
 *                   partner) where it sits during the gate, simulated as a third transmon
 *                   in |0> and |1> (src/budget/spectator-error.ts)                    [gate stage]
 *   sweptCrossings  Landau-Zener transfers 1 - exp(-4 pi^2 g^2 / v) of both passages of every
 *                   crossing a moving qubit passes (at the waveform's own rate for the mover,
 *                   at the planned ramp for moved spectators), each times the share of the
 *                   computational states (with a spectator in |0> or |1> equally) that can
 *                   make the transition: 1/2 for an exchange with the partner or a defect, 1/4
 *                   with a spectator or on a 11-20 / 11-02 type crossing (a transfer p of one
 *                   input state costs p/4 of average fidelity, d = 4)
 *   spectatorMoves  the extra slot time of moving spectators (two ramps) during which the pair
 *                   idles at parking ((6/5) times the sum of the two one-qubit idle errors, the
 *                   two-qubit average infidelity of independent idles, d = 4), plus each moved
 *                   spectator's extra quasi-static dephasing at its temporary point over the slot
 *
 * Without a designed pulse (`fluxlane check`, `plan --no-pulses`) the first five come from the
 * fast estimate (src/budget/gate-estimate.ts; spectators as half their summed admixture,
 * src/plan/interaction/plan-edge.ts estimateEdgeBudget) and `method` says "estimated".
 */
import type { PlanContext } from './context.js';
import type { EdgePlan } from './interaction/plan-edge.js';
import type { ExactQubitState } from './exact-state.js';
import type { GateDesign } from './gate-seam.js';
import type { DesignBudget } from '../gate/design.js';
import type { SpectatorShare } from '../budget/waveform-budget.js';
import type { SweptCrossing } from './rules/cz-evaluate.js';
import { landauZenerTransfer } from './landau-zener.js';
import { sweptShareOf } from './swept-share.js';
import { spectatorMovesNs } from './rules/cz-duration.js';
import { qubitIdleError, type IdleErrorOptions } from '../budget/idle-error.js';
import { quasiStaticCoherence, quasiStaticFluxSigma } from '../transmon/coherence.js';
import { fluxCurvatureMemo, fluxSlopeMemo, spectrumMemo } from './exact-memo.js';

export interface GateBudget {
  coherent: number;
  t1: number;
  whiteDephasing: number;
  fluxNoise: number;
  spectators: number;
  sweptCrossings: number;
  spectatorMoves: number;
  total: number;
  /** 'simulated' for a designed gate, 'estimated' before pulse design. */
  method: 'simulated' | 'estimated';
  /** Leakage the spectators add (simulated gates only). */
  spectatorLeakage: number | null;
  /** Per spectator (simulated gates only). */
  spectatorShares: SpectatorShare[];
}

/** Share of the computational states (and spectator states) a swept crossing can transfer (./swept-share.ts). */
export function sweptShare(c: SweptCrossing, e: Pick<EdgePlan, 'mover' | 'partner'>): number {
  return sweptShareOf(c.rule, c.moving, c.other, e.mover, e.partner);
}

/**
 * The swept-crossing term: both passages of each crossing, the mover's at the rate its waveform
 * sweeps there (|df01/dt| between the samples around it), moved spectators' at their planned rate.
 */
export function sweptCrossingError(ctx: PlanContext, e: Pick<EdgePlan, 'mover' | 'partner' | 'swept'>, waveform?: { timeNs: ArrayLike<number>; flux: ArrayLike<number> }): number {
  let sum = 0;
  const f = waveform ? Array.from(waveform.flux, (x) => ctx.transmons[e.mover].f01(x)) : null;
  for (const c of e.swept) {
    const share = sweptShare(c, e);
    if (c.moving === e.mover && f && waveform) {
      for (let k = 0; k + 1 < f.length; k++) {
        if ((f[k] - c.atGHz) * (f[k + 1] - c.atGHz) > 0 || f[k] === f[k + 1]) continue;
        const rate = Math.abs(f[k + 1] - f[k]) / (waveform.timeNs[k + 1] - waveform.timeNs[k]);
        sum += share * landauZenerTransfer(c.couplingGHz, rate);
      }
    } else {
      sum += 2 * share * c.transfer;
    }
  }
  return sum;
}

/** One-qubit idle error of qubit q at flux x over t ns (src/budget/idle-error.ts). */
function idleAt(ctx: PlanContext, q: number, flux: number, f01GHz: number, tNs: number): { total: number; dephasing: number } {
  const t = ctx.transmons[q];
  if (!t.coherenceSpec || !(tNs > 0)) return { total: 0, dephasing: 0 };
  const sp = spectrumMemo(ctx, q, flux);
  const o: IdleErrorOptions = { averagingTimeNs: ctx.rules.noiseAveragingTimeNs, temperatureK: ctx.rules.qubitTemperatureK };
  const e = qubitIdleError({ coherence: t.coherenceSpec, f01GHz, slopeGHz: sp.df01dFluxGHz, curvatureGHz: fluxCurvatureMemo(ctx, q, flux) }, tNs, o);
  return { total: e.t1 + e.dephasing + e.thermal, dephasing: e.dephasing };
}

/** The spectator-move term: the pair idling through the extra two ramps, and each moved spectator's extra dephasing. */
export function spectatorMoveError(ctx: PlanContext, e: Pick<EdgePlan, 'mover' | 'partner' | 'parked' | 'rampNs'>, states: readonly ExactQubitState[], slotNs: number): number {
  if (e.parked.length === 0) return 0;
  let sum = spectatorMovePairError(ctx, e, states);
  for (const p of e.parked) {
    const spec = ctx.transmons[p.qubit].coherenceSpec;
    if (!spec?.fluxNoisePhi0) continue;
    const sigma = quasiStaticFluxSigma(spec.fluxNoisePhi0, slotNs, ctx.rules.noiseAveragingTimeNs);
    // (the slope alone, from two levels: fluxSlopeMemo gives spectrumMemo's df01dFluxGHz)
    const moved = (1 - quasiStaticCoherence(slotNs, fluxSlopeMemo(ctx, p.qubit, p.flux), 0, sigma)) / 3;
    const parked = (1 - quasiStaticCoherence(slotNs, fluxSlopeMemo(ctx, p.qubit, states[p.qubit].flux), 0, sigma)) / 3;
    sum += Math.max(0, moved - parked);
  }
  return sum;
}

/**
 * The pair's part of the spectator-move term (the pair idling through the two extra ramps), the
 * term's value before the moved spectators' dephasing is added (each addition >= 0): with
 * spectators moved, spectatorMoveError is at least this.
 */
export function spectatorMovePairError(ctx: PlanContext, e: Pick<EdgePlan, 'mover' | 'partner' | 'rampNs'>, states: readonly ExactQubitState[]): number {
  const a = states[e.mover];
  const b = states[e.partner];
  // (the last answer is remembered: the planner asks for the same pair at every spectator point
  // it tries; the key is everything the answer reads but the context's fixed transmons and rules)
  const k = lastPairError;
  if (k !== null && k.ctx === ctx && k.mover === e.mover && k.partner === e.partner && k.rampNs === e.rampNs && k.fluxA === a.flux && k.fA === a.f01GHz && k.fluxB === b.flux && k.fB === b.f01GHz) return k.value;
  const extra = spectatorMovesNs(true, e.rampNs, ctx.rules);
  const pair = idleTotal(ctx, e.mover, a.flux, a.f01GHz, extra) + idleTotal(ctx, e.partner, b.flux, b.f01GHz, extra);
  const value = 1.2 * pair;
  lastPairError = { ctx, mover: e.mover, partner: e.partner, rampNs: e.rampNs, fluxA: a.flux, fA: a.f01GHz, fluxB: b.flux, fB: b.f01GHz, value };
  return value;
}

/**
 * idleAt(...).total remembered per context and qubit for the last (flux, f01, time) it was asked
 * for: a qubit is the mover or partner of several gates, each asking for its idle error at its
 * parking over the same extra time (a yield run's drawn chip asks for every gate once). The value
 * is the one computing it again gives (idleAt reads only these, the qubit's coherence and the
 * context's rules; tested).
 */
class IdleMemo {
  readonly flux: Float64Array;
  readonly f01: Float64Array;
  readonly tNs: Float64Array;
  readonly total: Float64Array;
  constructor(n: number) {
    this.flux = new Float64Array(n).fill(NaN);
    this.f01 = new Float64Array(n);
    this.tNs = new Float64Array(n);
    this.total = new Float64Array(n);
  }
}

const idleMemos = new WeakMap<PlanContext, IdleMemo>();

function idleTotal(ctx: PlanContext, q: number, flux: number, f01GHz: number, tNs: number): number {
  let m = idleMemos.get(ctx);
  if (!m) idleMemos.set(ctx, (m = new IdleMemo(ctx.n)));
  // (Object.is keeps 0 and -0 apart; a NaN flux, also an empty slot's key, is never answered from the memo)
  if (Object.is(m.flux[q], flux) && Object.is(m.f01[q], f01GHz) && Object.is(m.tNs[q], tNs) && !Number.isNaN(flux)) return m.total[q];
  const total = idleAt(ctx, q, flux, f01GHz, tNs).total;
  m.flux[q] = flux;
  m.f01[q] = f01GHz;
  m.tNs[q] = tNs;
  m.total[q] = total;
  return total;
}

/** For tests: idleAt's total for qubit q as remembered and computed anew. */
export function idleTotalForTest(ctx: PlanContext, q: number, flux: number, f01GHz: number, tNs: number): { remembered: number; computed: number } {
  return { remembered: idleTotal(ctx, q, flux, f01GHz, tNs), computed: idleAt(ctx, q, flux, f01GHz, tNs).total };
}

let lastPairError: { ctx: PlanContext; mover: number; partner: number; rampNs: number; fluxA: number; fA: number; fluxB: number; fB: number; value: number } | null = null;

/** The gate stage's part of a designed gate's budget (src/gate/design.ts DesignBudget, or verify's recomputation). */
export type StageBudget = Pick<DesignBudget, 'coherent' | 't1' | 'whiteDephasing' | 'fluxNoise' | 'spectators' | 'spectatorLeakage' | 'spectatorShares'>;

/** The budget of a designed gate (design.budget from the gate stage, plus the planner's terms). */
export function designedGateBudget(ctx: PlanContext, e: EdgePlan, states: readonly ExactQubitState[], design: GateDesign, slotNs: number): GateBudget | null {
  if (!design.feasible || !design.budget) return null;
  return gateBudgetFromStage(ctx, e, states, design.budget, design.waveform, slotNs);
}

/** The stage's terms of a designed waveform plus the planner's: swept crossings at the waveform's rates, spectator moves over the slot. */
export function gateBudgetFromStage(ctx: PlanContext, e: EdgePlan, states: readonly ExactQubitState[], b: StageBudget, waveform: { timeNs: ArrayLike<number>; flux: ArrayLike<number> }, slotNs: number): GateBudget {
  const swept = sweptCrossingError(ctx, e, waveform);
  const moves = spectatorMoveError(ctx, e, states, slotNs);
  const total = b.coherent + b.t1 + b.whiteDephasing + b.fluxNoise + b.spectators + swept + moves;
  return {
    coherent: b.coherent, t1: b.t1, whiteDephasing: b.whiteDephasing, fluxNoise: b.fluxNoise, spectators: b.spectators,
    sweptCrossings: swept, spectatorMoves: moves, total, method: 'simulated', spectatorLeakage: b.spectatorLeakage, spectatorShares: b.spectatorShares,
  };
}

/** The estimated budget of a planned gate without a designed pulse. */
export function estimatedGateBudget(
  ctx: PlanContext,
  e: EdgePlan,
  states: readonly ExactQubitState[],
  estimate: { t1: number; whiteDephasing: number; fluxNoise: number; spectators: number },
  /** The swept-crossing term when the caller has it (evaluateGate's sweptError for this gate; e.swept is then empty). */
  knownSwept?: number,
): GateBudget {
  const swept = knownSwept ?? sweptCrossingError(ctx, e);
  const moves = spectatorMoveError(ctx, e, states, e.durationNs);
  const total = estimate.t1 + estimate.whiteDephasing + estimate.fluxNoise + estimate.spectators + swept + moves;
  return {
    coherent: 0, t1: estimate.t1, whiteDephasing: estimate.whiteDephasing, fluxNoise: estimate.fluxNoise, spectators: estimate.spectators,
    sweptCrossings: swept, spectatorMoves: moves, total, method: 'estimated', spectatorLeakage: null, spectatorShares: [],
  };
}

export { idleAt as qubitIdleAt };
