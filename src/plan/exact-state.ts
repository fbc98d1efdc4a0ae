/**
 * The exact state of one qubit at a frequency, from the transmon stage (no tables): flux on the
 * branch 0 <= Phi <= 1/2, f12, anharmonicity, df01/dPhi, coherence there, and the expected
 * frequency spread from fabrication
 *
 *     sigma_f = |df01 / d ln E_J| * resistanceSpread,   df01/dE_J = -(<1|cos phi|1> - <0|cos phi|0>)
 *
 * (Hellmann-Feynman on the exact charge-basis levels; E_J = h Delta / (8 e^2 R_n) by
 * Ambegaokar-Baratoff, so a relative spread of R_n is the same relative spread of E_J at any
 * flux; common practice for the junction spread: about 2 % (1 sigma)). Used for every number the
 * planner reports and every rule it checks in the end.
 */
import type { Transmon } from '../transmon/transmon.js';

export interface ExactQubitState {
  f01GHz: number;
  flux: number;
  f12GHz: number;
  anharmonicityGHz: number;
  df01dFluxGHz: number;
  t1Ns: number;
  tphiNs: number;
  t2Ns: number;
  /** Expected f01 spread from fabrication (1 sigma, GHz). */
  sigmaGHz: number;
}

/** Exact state at f01 = fGHz (throws the transmon's InputError when f is outside its tunable range). */
export function exactQubitState(t: Transmon, fGHz: number, resistanceSpread: number): ExactQubitState {
  const flux = t.fluxForF01(fGHz);
  return exactQubitStateAtFlux(t, flux, resistanceSpread, fGHz);
}

export function exactQubitStateAtFlux(t: Transmon, flux: number, resistanceSpread: number, f01GHz?: number): ExactQubitState {
  const sp = t.spectrum(flux);
  const basis = t.eigenbasis(flux, 2);
  const df01dEj = -(basis.cosPhi[3] - basis.cosPhi[0]);
  const sigmaGHz = Math.abs(df01dEj * basis.ejGHz) * resistanceSpread;
  let t1Ns = Infinity;
  let tphiNs = Infinity;
  let t2Ns = Infinity;
  if (t.coherenceSpec) {
    const c = t.coherence(flux, sp.df01dFluxGHz);
    t1Ns = c.t1Ns;
    tphiNs = c.tphiNs;
    t2Ns = c.t2Ns;
  }
  return {
    f01GHz: f01GHz ?? sp.f01GHz,
    flux,
    f12GHz: sp.f12GHz,
    anharmonicityGHz: sp.anharmonicityGHz,
    df01dFluxGHz: sp.df01dFluxGHz,
    t1Ns,
    tphiNs,
    t2Ns,
    sigmaGHz,
  };
}

/** f01, f12 and flux only (exact; cheaper than the full state): what a moved spectator needs. */
export function exactTransitions(t: Transmon, fGHz: number): { f01GHz: number; f12GHz: number; flux: number } {
  const flux = t.fluxForF01(fGHz);
  return { f01GHz: fGHz, f12GHz: t.f12(flux), flux };
}
