/**
 * Inverse of the flux map on the working branch 0 <= Phi <= 1/2 (README physics conventions
 * sec. 1): the flux at which a transmon's f01 (or f12) takes a target value.
 *
 * Method: on 0 <= Phi <= 1/2, E_J(Phi) falls monotonically from E_JS to d E_JS, and f01 (f12)
 * grows monotonically with E_J, so the target fixes E_J uniquely. We find it by safeguarded
 * Newton on [d E_JS, E_JS] (src/linalg/bracketed-root.ts; the slope df/dE_J comes from
 * Hellmann-Feynman, <m|cos phi|m>), starting from the asymptotic inverse
 * E_J ~ (f + E_C)^2 / (8 E_C) (Koch et al. 2007), and map it to flux in closed form
 * (src/transmon/josephson.ts fluxForJosephsonEnergy). Solving in E_J rather than Phi avoids the
 * vanishing slope df/dPhi at both sweet spots. The result reproduces the target to ~1e-12 GHz.
 */
import { inputError, type Diagnostic } from '../util/errors.js';
import { bracketedNewton } from '../linalg/bracketed-root.js';
import { fluxForJosephsonEnergy } from './josephson.js';
import { f01ForJosephsonEnergy, f12ForJosephsonEnergy, SPECTRUM_DEFAULTS, type TransmonParams } from './spectrum.js';

export type TransitionName = 'f01' | 'f12';

export interface FluxForFrequencyOptions {
  /** Which transition to match (default f01). */
  transition?: TransitionName;
  chargeCutoff?: number;
  /** The transition's values at E_J = d E_JS and E_J = E_JS, when known (saves work). */
  range?: readonly [number, number];
}

/**
 * E_J in [d E_JS, E_JS] at which the transition equals `targetGHz`, or NaN when the target is
 * outside the range the transition spans there.
 */
export function josephsonEnergyForFrequency(params: TransmonParams, targetGHz: number, options: FluxForFrequencyOptions = {}): number {
  const nCut = options.chargeCutoff ?? SPECTRUM_DEFAULTS.chargeCutoff;
  const ec = params.ecGHz;
  const transition = options.transition === 'f12' ? f12ForJosephsonEnergy : f01ForJosephsonEnergy;
  const lo = params.asymmetry * params.ejsGHz;
  const hi = params.ejsGHz;
  const fLo = options.range ? options.range[0] : transition(ec, lo, nCut);
  const fHi = options.range ? options.range[1] : transition(ec, hi, nCut);
  // A target within round-off of an end is that end (the sweet spot itself): a range the caller
  // computed itself, or a frequency read back from a file that keeps 12 significant digits
  // (relative error up to 5e-12, which near a sweet spot, where f is flat, would otherwise move the
  // flux by ~1e-6 Phi0).
  const slack = 1e-11 * Math.max(1, Math.abs(targetGHz));
  if (Math.abs(targetGHz - fHi) <= slack) return hi;
  if (Math.abs(targetGHz - fLo) <= slack) return lo;
  if (!(targetGHz > Math.min(fLo, fHi) && targetGHz < Math.max(fLo, fHi))) return NaN;
  const shift = options.transition === 'f12' ? 2 * ec : ec;
  const guess = (targetGHz + shift) ** 2 / (8 * ec);
  return bracketedNewton((ej, slope) => transition(ec, ej, nCut, slope) - targetGHz, lo, hi, {
    guess,
    fLo: fLo - targetGHz,
    fHi: fHi - targetGHz,
    xTol: 1e-14 * hi,
    fTol: 1e-13 * Math.max(1, Math.abs(targetGHz)),
  });
}

/** The flux 0 <= Phi <= 1/2 where the transition equals `targetGHz`, or null outside the range. */
export function fluxForFrequencyOrNull(params: TransmonParams, targetGHz: number, options: FluxForFrequencyOptions = {}): number | null {
  const ej = josephsonEnergyForFrequency(params, targetGHz, options);
  if (Number.isNaN(ej)) return null;
  if (ej >= params.ejsGHz) return 0;
  if (ej <= params.asymmetry * params.ejsGHz) return 0.5;
  return fluxForJosephsonEnergy(params.ejsGHz, params.asymmetry, ej);
}

/**
 * As fluxForFrequencyOrNull, but a target outside the tunable range throws an InputError naming
 * the qubit, the target and the range (`where` adds file/line/path of whatever asked).
 */
export function fluxForFrequency(
  params: TransmonParams,
  targetGHz: number,
  qubitId: string,
  options: FluxForFrequencyOptions & { where?: Omit<Diagnostic, 'message'> } = {},
): number {
  const flux = fluxForFrequencyOrNull(params, targetGHz, options);
  if (flux !== null) return flux;
  const nCut = options.chargeCutoff ?? SPECTRUM_DEFAULTS.chargeCutoff;
  const transition = options.transition === 'f12' ? f12ForJosephsonEnergy : f01ForJosephsonEnergy;
  const a = transition(params.ecGHz, params.asymmetry * params.ejsGHz, nCut);
  const b = transition(params.ecGHz, params.ejsGHz, nCut);
  const name = options.transition ?? 'f01';
  return inputError(
    `qubit ${qubitId}: ${name} = ${fmtGHz(targetGHz)} is outside its tunable range ${fmtGHz(Math.min(a, b))} to ${fmtGHz(Math.max(a, b))}`,
    options.where ?? {},
  );
}

function fmtGHz(x: number): string {
  return `${Number.isFinite(x) ? +x.toFixed(6) : x} GHz`;
}
