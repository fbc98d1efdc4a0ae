/** The transmon stage's public API (re-exports only). */
export { Transmon, type TransmonEigenbasis, type TransmonOptions, type SweetSpotLevels } from './transmon.js';
export { ReducedSpectrum, sharedReducedSpectrum, REDUCED_SPECTRUM_DEFAULTS, type ReducedState, type ReducedChannel } from './reduced-spectrum.js';
export { resolveTransmon, RESOLVE_DEFAULTS, type ResolveOptions } from './resolve.js';
export { spectrumAt, SPECTRUM_DEFAULTS, type SpectrumPoint, type TransmonParams } from './spectrum.js';
export { tunableRange, type TunableRange } from './tunable-range.js';
export { fluxForFrequency, fluxForFrequencyOrNull, josephsonEnergyForFrequency, type FluxForFrequencyOptions, type TransitionName } from './flux-for-frequency.js';
export { coherenceFor, dephasingCoherence, quasiStaticCoherence, quasiStaticFluxSigma, COHERENCE_DEFAULTS, type Coherence, type CoherenceOptions, type CoherenceSpec } from './coherence.js';
export { josephsonEnergyFromResistance, ambegaokarBaratoffConstant, AMBEGAOKAR_BARATOFF_DEFAULTS } from './ambegaokar-baratoff.js';
export { josephsonEnergy, josephsonEnergySlope, fluxForJosephsonEnergy } from './josephson.js';
export { transmonLevels, TRANSMON_LEVEL_DEFAULTS, type TransmonLevels, type TransmonLevelOptions } from './levels.js';
export { chargeMatrix, cosPhiMatrix } from './matrix-elements.js';
export { parityEigenbasis, chargeMatrixFromParity, cosPhiMatrixFromParity, cosPhiElement, type ParityEigenbasis } from './parity-eigenbasis.js';
export { chargeCutoffFor } from './charge-cutoff.js';
