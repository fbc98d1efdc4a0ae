/**
 * Tunable range of a flux-tunable transmon (README physics conventions sec. 1): f01 is largest at
 * the upper sweet spot Phi = 0 (E_J = E_JS) and smallest at Phi = 1/2 (E_J = d E_JS), and falls
 * monotonically in between because f01 grows with E_J at fixed E_C (Koch et al., Phys. Rev. A
 * 76, 042319 (2007)).
 */
import { spectrumAt, type SpectrumPoint, type TransmonParams } from './spectrum.js';

export interface TunableRange {
  fMaxGHz: number;
  fMinGHz: number;
  /** The spectrum at Phi = 0 and at Phi = 1/2. */
  top: SpectrumPoint;
  bottom: SpectrumPoint;
}

export function tunableRange(params: TransmonParams, options: { chargeCutoff?: number } = {}): TunableRange {
  const top = spectrumAt(params, 0, options);
  const bottom = spectrumAt(params, 0.5, options);
  return { fMaxGHz: top.f01GHz, fMinGHz: bottom.f01GHz, top, bottom };
}
