/**
 * Benchmarks of the physics core (issue 3 targets): one transmon spectrum point (f01, f12,
 * alpha and df01/dPhi) < 20 us; one pair ZZ with K = 6 levels per transmon, both transmon spectra
 * computed anew (both fluxes change every call) < 100 us; a 1,000-point ZZ sweep of the mover
 * across its range (uniform in frequency, inverse flux map included). Plus the pieces.
 */
import type { Benchmark } from './run.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { resolveTransmon } from '../../src/transmon/resolve.js';
import { CoupledPair } from '../../src/pair/pair.js';
import { zzSweep } from '../../src/pair/zz-sweep.js';

const qa = new Transmon('A', { ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 });
const qb = new Transmon('B', { ecGHz: 0.2, ejsGHz: 22, asymmetry: 0.3 });
const pair = new CoupledPair(qa, qb, 0.0142, { levels: 6 });

let i = 0;
/** A flux in [0.02, 0.48] that differs on every call. */
function nextFlux(): number {
  i = (i + 1) % 4096;
  return 0.02 + (0.46 * i) / 4096;
}

export const spectrumPoint: Benchmark = {
  name: 'transmon spectrum point (f01, f12, alpha, df01/dPhi)',
  target: 20,
  run: () => qa.spectrum(nextFlux()),
};

export const f01Only: Benchmark = {
  name: 'transmon f01 only',
  run: () => qa.f01(nextFlux()),
};

export const fluxForF01: Benchmark = {
  name: 'transmon inverse map f01 -> flux',
  run: () => qa.fluxForF01(qa.fMinGHz + (qa.fMaxGHz - qa.fMinGHz) * nextFlux() * 2),
};

export const pairZz: Benchmark = {
  name: 'pair static ZZ, K = 6, both transmon spectra included',
  target: 100,
  run: () => {
    const f = nextFlux();
    return pair.zz(f, 0.5 - f);
  },
};

export const pairZzMoverOnly: Benchmark = {
  name: 'pair static ZZ, K = 6, partner cached (as in a sweep)',
  run: () => pair.zz(nextFlux(), 0.2),
};

export const pairSpectrum: Benchmark = {
  name: 'pair dressed spectrum, all 36 levels, K = 6',
  run: () => {
    const f = nextFlux();
    return pair.spectrum(f, 0.5 - f);
  },
};

export const sweep1000: Benchmark = {
  name: '1,000-point ZZ sweep of the mover across its range',
  run: () => zzSweep(pair, 'a', 0.1 + 0.2 * nextFlux(), { points: 1000 }),
};

export const resolveFrequencies: Benchmark = {
  name: 'resolveTransmon from (fMax, alpha, fMin)',
  run: () => resolveTransmon({ kind: 'frequencies', fMaxGHz: 6.05 + 0.01 * nextFlux(), anharmonicityGHz: -0.214, fMinGHz: 3.9 }, 'Q'),
};
