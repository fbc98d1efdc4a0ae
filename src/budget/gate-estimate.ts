/**
 * A fast estimate of a CZ's error budget before any pulse is designed (the planner's search and
 * `fluxlane check`), from the quantities of the two transmons at their gate points. Terms, each
 * an average gate infidelity (README physics conventions sec. 4):
 *
 *   t1, whiteDephasing   the first-order estimate of src/sim/simulate-gate.ts on a square
 *                        pulse: the excited qubit E spends half the hold in |2> (one full
 *                        11 -> 20 -> 11 cycle), so with d = 4,
 *                          t1    = (2/5) T (G_A + G_B) + (1/10) t_hold (G_E - G_other),  G = 1/T1
 *                          white = (2/5) T (W_A + W_B) + (1/5) t_hold W_E,             W = 1/T_phi,white
 *                        (from 1 - F = (1/20) int sum_j [4 sum_k ||L_j psi_k||^2 - |sum_k <psi_k|L_j|psi_k>|^2]
 *                        with the number operator's mean and square in |11> <-> |20> averaged over the cycle);
 *   fluxNoise            the quasi-static offsets of both transmons (sigma for the gate's duration T,
 *                        src/transmon/coherence.ts): a static offset delta shifts the phase of each
 *                        computational state by delta times its accumulated frequency slope; with
 *                        phase vector theta = delta (s_00, s_01, s_10, s_11) and the nominal virtual-Z
 *                        phases, 1 - F = [4 sum theta^2 - (sum theta)^2] / 20 to second order (the
 *                        expansion of F = [Tr M M^dag + |Tr V^dag M|^2] / 20 for a diagonal phase error). For the mover A
 *                        s_10 = 2 pi f'_A(int) (t_hold + 2 t_ramp), s_11 = s_10 + 2 pi f'_12,A t_hold / 2
 *                        (|20> carries the extra 1-2 slope half the hold) when A is the excited qubit;
 *                        for the static partner B, s_01 = 2 pi f'_B T and s_11 = s_01 - 2 pi f'_B t_hold / 2
 *                        when B gives its excitation to A (or + f'_12,B when B is excited).
 * The mover is taken at its interaction-point slope for the ramps too: the designed ramps are
 * adiabatic with respect to the crossing and spend most of their time near it (with the mean of
 * the parking and interaction slopes instead, the estimate fell 20-30 % short on Bowline-5).
 * Checked against the simulated budget of designed gates (test/budget/gate-estimate.test.ts).
 */
import { quasiStaticFluxSigma, type CoherenceSpec } from '../transmon/coherence.js';

export interface GateEstimatePoint {
  coherence?: CoherenceSpec;
  /** df01/dPhi and df12/dPhi where the qubit sits during the hold (GHz/Phi0). */
  slopeGHz: number;
  slope12GHz: number;
}

export interface GateEstimateInput {
  mover: GateEstimatePoint;
  partner: GateEstimatePoint;
  /** Which qubit reaches |2>: the mover (11-20) or the partner (11-02). */
  excited: 'mover' | 'partner';
  holdNs: number;
  rampNs: number;
  /** Whole gate duration (ns), ramps, hold and the line's settling. */
  durationNs: number;
  averagingTimeNs: number;
}

export interface GateEstimate {
  t1: number;
  whiteDephasing: number;
  fluxNoise: number;
}

const rate = (t: number | undefined): number => (t !== undefined && Number.isFinite(t) && t > 0 ? 1 / t : 0);

/** `out`, when given, receives the terms and is returned (callers that ask millions of times reuse one). */
export function estimateGateBudget(x: GateEstimateInput, out?: GateEstimate): GateEstimate {
  const T = x.durationNs;
  const h = x.holdNs;
  const gA = rate(x.mover.coherence?.t1Ns);
  const gB = rate(x.partner.coherence?.t1Ns);
  const wA = rate(x.mover.coherence?.tphiNs);
  const wB = rate(x.partner.coherence?.tphiNs);
  const moverExcited = x.excited === 'mover';
  const gE = moverExcited ? gA : gB;
  const gO = moverExcited ? gB : gA;
  const wE = moverExcited ? wA : wB;
  const t1 = 0.4 * T * (gA + gB) + 0.1 * h * (gE - gO);
  const whiteDephasing = 0.4 * T * (wA + wB) + 0.2 * h * wE;
  const twoPi = 2 * Math.PI;
  // mover: phases of |10> and |11> per unit offset
  const m = x.mover;
  const sA = twoPi * m.slopeGHz * (h + 2 * x.rampNs);
  const s11A = x.excited === 'mover' ? sA + (twoPi * m.slope12GHz * h) / 2 : sA - (twoPi * m.slopeGHz * h) / 2;
  // partner: phases of |01> and |11>
  const p = x.partner;
  const sB = twoPi * p.slopeGHz * T;
  const s11B = x.excited === 'partner' ? sB + (twoPi * p.slope12GHz * h) / 2 : sB - (twoPi * p.slopeGHz * h) / 2;
  const sgA = quasiStaticFluxSigma(m.coherence?.fluxNoisePhi0 ?? 0, T, x.averagingTimeNs);
  const sgB = quasiStaticFluxSigma(p.coherence?.fluxNoisePhi0 ?? 0, T, x.averagingTimeNs);
  const fluxNoise = phaseCoefficient(0, 0, sA, s11A) * sgA * sgA + phaseCoefficient(0, sB, 0, s11B) * sgB * sgB;
  if (!out) return { t1, whiteDephasing, fluxNoise };
  out.t1 = t1;
  out.whiteDephasing = whiteDephasing;
  out.fluxNoise = fluxNoise;
  return out;
}

/**
 * [4 sum theta^2 - (sum theta)^2] / 20 of the phase vector (t0, t1, t2, t3), summed in that order.
 * (Module level, not a closure made per call: the planner's search calls estimateGateBudget
 * millions of times on a large chip.)
 */
function phaseCoefficient(t0: number, t1: number, t2: number, t3: number): number {
  let sq = 0;
  let sum = 0;
  sq += t0 * t0;
  sum += t0;
  sq += t1 * t1;
  sum += t1;
  sq += t2 * t2;
  sum += t2;
  sq += t3 * t3;
  sum += t3;
  return (4 * sq - sum * sum) / 20;
}
