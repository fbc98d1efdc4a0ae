/**
 * The spectrum of one flux-tunable transmon at one flux: f01, f12, anharmonicity and the flux
 * slopes of f01 and f12 (README physics conventions sec. 1; Koch et al., Phys. Rev. A 76, 042319
 * (2007)).
 *
 *     f01 = E1 - E0,   f12 = E2 - E1,   alpha = E2 - 2 E1 + E0   (GHz; alpha < 0)
 *
 * Slopes by the Hellmann-Feynman theorem: H depends on flux only through E_J(Phi) and
 * dH/dE_J = -cos(phi), so
 *
 *     dE_m/dPhi = -<m|cos phi|m> dE_J/dPhi,
 *     df01/dPhi = -(<1|cos phi|1> - <0|cos phi|0>) dE_J/dPhi        (GHz per Phi0),
 *
 * with the expectation values from the charge-basis eigenvectors (test: against a central
 * finite difference). Levels at offset charge n_g = 0 (the transmon stage's working point),
 * computed in the charge-parity blocks (src/transmon/parity-eigenbasis.ts).
 */
import { josephsonEnergy, josephsonEnergySlope } from './josephson.js';
import type { TransmonLevels } from './levels.js';
import { lowestLevels } from './level-memo.js';

/** A transmon's circuit parameters (what src/transmon/resolve.ts produces from the layout). */
export interface TransmonParams {
  /** Charging energy E_C (GHz). */
  ecGHz: number;
  /** Total SQUID Josephson energy E_JS = E_J1 + E_J2 (GHz). */
  ejsGHz: number;
  /** Junction asymmetry d = |E_J1 - E_J2| / (E_J1 + E_J2), 0 <= d < 1. */
  asymmetry: number;
}

export interface SpectrumPoint {
  /** External flux (Phi0). */
  flux: number;
  /** E_J(Phi) (GHz). */
  ejGHz: number;
  f01GHz: number;
  f12GHz: number;
  anharmonicityGHz: number;
  /** df01/dPhi (GHz per Phi0); <= 0 on 0 <= Phi <= 1/2. */
  df01dFluxGHz: number;
  /** df12/dPhi (GHz per Phi0). */
  df12dFluxGHz: number;
}

export const SPECTRUM_DEFAULTS = Object.freeze({ chargeCutoff: 20 });

/** <m|cos phi|m> = sum_n c_n c_{n+1} for a real charge-basis wave function (row m of `levels.vectors`). */
export function cosPhiExpectation(levels: TransmonLevels, m: number): number {
  const dim = 2 * levels.chargeCutoff + 1;
  const v = levels.vectors;
  const row = m * dim;
  let s = 0;
  for (let j = 0; j < dim - 1; j++) s += v[row + j] * v[row + j + 1];
  return s;
}

/** f01, f12, alpha and the slopes at flux `flux` (Phi0). */
export function spectrumAt(params: TransmonParams, flux: number, options: { chargeCutoff?: number } = {}): SpectrumPoint {
  const nCut = options.chargeCutoff ?? SPECTRUM_DEFAULTS.chargeCutoff;
  const ej = josephsonEnergy(params.ejsGHz, params.asymmetry, flux);
  const dEj = josephsonEnergySlope(params.ejsGHz, params.asymmetry, flux);
  const L = lowestLevels(params.ecGHz, ej, nCut, 3, true);
  const c0 = L.c0;
  const c1 = L.c1;
  const c2 = L.c2;
  return {
    flux,
    ejGHz: ej,
    f01GHz: L.e1 - L.e0,
    f12GHz: L.e2 - L.e1,
    anharmonicityGHz: L.e2 - 2 * L.e1 + L.e0,
    df01dFluxGHz: -(c1 - c0) * dEj,
    df12dFluxGHz: -(c2 - c1) * dEj,
  };
}

/**
 * df01/dPhi alone (GHz per Phi0): spectrumAt's df01dFluxGHz, bit for bit, from the two lowest
 * levels and their vectors only (spectrumAt solves three). Each level of a parity block comes from
 * its own Newton solve from its own start value and its own twisted factorisation
 * (src/transmon/parity-eigenbasis.ts), so levels 0 and 1 and their vectors do not depend on how
 * many levels are asked for. For callers that need only the slope (the spectator-move term's
 * quasi-static dephasing, the flux curvature).
 */
export function f01FluxSlopeAt(params: TransmonParams, flux: number, options: { chargeCutoff?: number } = {}): number {
  const nCut = options.chargeCutoff ?? SPECTRUM_DEFAULTS.chargeCutoff;
  const ej = josephsonEnergy(params.ejsGHz, params.asymmetry, flux);
  const dEj = josephsonEnergySlope(params.ejsGHz, params.asymmetry, flux);
  const L = lowestLevels(params.ecGHz, ej, nCut, 2, true);
  return -(L.c1 - L.c0) * dEj;
}

/**
 * f12 alone (GHz): spectrumAt's f12GHz, bit for bit, from the three lowest levels without their
 * vectors (the eigenvalues do not depend on whether vectors are computed).
 */
export function f12At(params: TransmonParams, flux: number, options: { chargeCutoff?: number } = {}): number {
  const nCut = options.chargeCutoff ?? SPECTRUM_DEFAULTS.chargeCutoff;
  const L = lowestLevels(params.ecGHz, josephsonEnergy(params.ejsGHz, params.asymmetry, flux), nCut, 3, false);
  return L.e2 - L.e1;
}

/**
 * f01 for (E_C, E_J) and its slope with respect to E_J, df01/dE_J = <0|cos phi|0> - <1|cos phi|1>
 * (Hellmann-Feynman). Writes the slope into `slope.value` when given.
 */
export function f01ForJosephsonEnergy(ecGHz: number, ejGHz: number, chargeCutoff: number, slope?: { value: number }): number {
  const L = lowestLevels(ecGHz, ejGHz, chargeCutoff, 2, slope !== undefined);
  if (slope) slope.value = L.c0 - L.c1;
  return L.e1 - L.e0;
}

/** f12 for (E_C, E_J) and df12/dE_J = <1|cos phi|1> - <2|cos phi|2>. */
export function f12ForJosephsonEnergy(ecGHz: number, ejGHz: number, chargeCutoff: number, slope?: { value: number }): number {
  const L = lowestLevels(ecGHz, ejGHz, chargeCutoff, 3, slope !== undefined);
  if (slope) slope.value = L.c1 - L.c2;
  return L.e2 - L.e1;
}
