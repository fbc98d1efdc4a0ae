/**
 * The error of one qubit idling for t ns (README physics conventions sec. 4), as a one-qubit
 * average gate infidelity 1 - F_avg, F_avg = (2 F_pro + 1) / 3 (Horodecki, Horodecki and
 * Horodecki, Phys. Rev. A 60, 1888 (1999); Nielsen, Phys. Lett. A 303, 249 (2002)).
 *
 * The idle channel: populations relax with gamma = 1 - exp(-t / T1) and are excited thermally
 * with p_up; the coherence is multiplied by lambda = sqrt(1 - gamma) c_phi(t), where
 * c_phi = exp(-t / tphi) c_1/f(t) is the pure-dephasing envelope (white times quasi-static 1/f,
 * src/transmon/coherence.ts). Its process fidelity (the Choi state's overlap with the maximally
 * entangled state) is F_pro = (2 - gamma + 2 lambda) / 4, so
 *
 *     1 - F_avg = (2 + gamma - 2 sqrt(1 - gamma) c_phi) / 6                  (exact for this channel)
 *              = t1 part (c_phi = 1)  +  dephasing part sqrt(1 - gamma) (1 - c_phi) / 3.
 *
 * Thermal excitation: detailed balance, Gamma_up = Gamma_down exp(-h f01 / (k_B T_eff)), gives
 * p_up = (t / T1) exp(-h f01 / (k_B T_eff)) over the idle (the effective temperature is the rule
 * `qubitTemperature`); it costs like a relaxation of that probability,
 * (2 + p - 2 sqrt(1 - p)) / 6 ~ p / 3.
 *
 * Residual ZZ: an uncorrected phase phi = 2 pi zeta t on |11> of a coupled pair (phi wrapped to
 * (-pi, pi]), after the best single-qubit phases, is exp(i phi/4 Z Z) up to local phases, with
 * two-qubit average infidelity (4/5) sin^2(phi / 4) (from |Tr U|^2 = 16 cos^2(phi / 4) and
 * F_avg = (|Tr U|^2 / 4 + 1) / 5, d = 4). Each qubit of the pair carries half of it in the per-qubit split.
 */
import { dephasingCoherence, type CoherenceOptions, type CoherenceSpec } from '../transmon/coherence.js';

/** h / k_B in K per GHz (CODATA 2018: h = 6.62607015e-34 J s, k_B = 1.380649e-23 J/K). */
export const H_OVER_KB_K_PER_GHZ = (6.62607015e-34 * 1e9) / 1.380649e-23;

export interface IdlePoint {
  coherence: CoherenceSpec;
  f01GHz: number;
  /** df01/dPhi and d2f01/dPhi2 at the parking flux (GHz/Phi0, GHz/Phi0^2). */
  slopeGHz: number;
  curvatureGHz: number;
}

export interface IdleErrorParts {
  t1: number;
  dephasing: number;
  thermal: number;
}

export interface IdleErrorOptions extends CoherenceOptions {
  /** Effective qubit temperature (K) for thermal excitation; 0 for none. */
  temperatureK?: number;
}

/** T1, dephasing and thermal parts of one qubit's idle error over t ns. */
/** `out`, when given, receives the parts and is returned (the idle-error scans ask hundreds of thousands of times). */
export function qubitIdleError(p: IdlePoint, tNs: number, options: IdleErrorOptions = {}, out?: IdleErrorParts): IdleErrorParts {
  if (!(tNs > 0)) return fill(out, 0, 0, 0);
  const t1 = p.coherence.t1Ns;
  const gamma = Number.isFinite(t1) && t1 > 0 ? -Math.expm1(-tNs / t1) : 0;
  const c = dephasingCoherence(p.coherence, tNs, p.slopeGHz, p.curvatureGHz, options);
  const t1Part = relaxationError(gamma);
  const dephasing = (Math.sqrt(1 - gamma) * (1 - c)) / 3;
  const temp = options.temperatureK ?? 0;
  const pUp = temp > 0 && Number.isFinite(t1) && t1 > 0 ? Math.min(1, (tNs / t1) * Math.exp(-(H_OVER_KB_K_PER_GHZ * p.f01GHz) / temp)) : 0;
  return fill(out, t1Part, dephasing, relaxationError(pUp));
}

function fill(out: IdleErrorParts | undefined, t1: number, dephasing: number, thermal: number): IdleErrorParts {
  if (!out) return { t1, dephasing, thermal };
  out.t1 = t1;
  out.dephasing = dephasing;
  out.thermal = thermal;
  return out;
}

/** (2 + p - 2 sqrt(1 - p)) / 6, written to keep digits for small p. */
export function relaxationError(p: number): number {
  if (!(p > 0)) return 0;
  // 2 - 2 sqrt(1 - p) = 2 p / (1 + sqrt(1 - p))
  return (p + (2 * p) / (1 + Math.sqrt(1 - p))) / 6;
}

/**
 * Two-qubit average infidelity of an uncorrected ZZ phase phi = 2 pi zeta t: (4/5) sin^2(phi / 4)
 * with phi taken in (-pi, pi] (a phase of 2 pi on |11> is no error).
 */
export function zzIdleError(zetaGHz: number, tNs: number): number {
  let phi = (2 * Math.PI * zetaGHz * tNs) % (2 * Math.PI);
  if (phi > Math.PI) phi -= 2 * Math.PI;
  else if (phi <= -Math.PI) phi += 2 * Math.PI;
  const s = Math.sin(phi / 4);
  return 0.8 * s * s;
}
