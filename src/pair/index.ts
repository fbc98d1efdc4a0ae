/** The pair stage's public API (re-exports only). */
export { CoupledPair, COUPLED_PAIR_DEFAULTS, type CoupledPairOptions, type PairSpectrum } from './pair.js';
export { dressedSpectrum, dressedComputationalEnergies, dressedSpectrumScratch, staticZz, type CouplingBasis, type DressedSpectrum } from './dressed-spectrum.js';
export { chargeCouplingForPair, chargeCouplingFromExchange, exchangeCouplingAt, exchangeFromChargeCoupling } from './coupling.js';
export { pairResonances, RESONANCE_NAMES, type PairResonances, type Resonance, type ResonanceName } from './resonances.js';
export { zzSweep, ZZ_SWEEP_DEFAULTS, type ZzSweepOptions, type ZzSweepPoint } from './zz-sweep.js';
export { productSpace, productIndex, productLevels, productLabel, productHamiltonian, paritySectors, subMatrix, type ProductSpace, type TransmonPart, type ChargeCoupling } from './product-basis.js';
