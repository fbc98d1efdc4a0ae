/**
 * Pairs of one thread share their work buffers (src/pair/pair.ts sharedScratch). Checked against
 * the direct form, each answer computed with buffers of its own (dressedComputationalEnergies and
 * dressedSpectrum given a fresh dressedSpectrumScratch), bit for bit, with the calls of three
 * pairs (two with K = 6, one with K = 5) interleaved at random fluxes, and spectra taken earlier
 * unchanged by later calls of other pairs. (The physics of the dressed spectrum is checked against
 * NumPy in ./dressed-spectrum.test.ts.)
 */
import { describe, expect, it } from 'vitest';
import { Transmon } from '../../src/transmon/transmon.js';
import { CoupledPair } from '../../src/pair/pair.js';
import { dressedComputationalEnergies, dressedSpectrum, dressedSpectrumScratch } from '../../src/pair/dressed-spectrum.js';
import { Random } from '../../src/util/random.js';

const qa = new Transmon('A', { ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 });
const qb = new Transmon('B', { ecGHz: 0.2, ejsGHz: 22, asymmetry: 0.3 });
const qc = new Transmon('C', { ecGHz: 0.23, ejsGHz: 15.5, asymmetry: 0.2 });

function zzDirect(p: CoupledPair, fa: number, fb: number): number {
  const e = dressedComputationalEnergies(p.basisA(fa), p.basisB(fb), p.gChargeGHz, p.levels, dressedSpectrumScratch(p.levels));
  return e[3] - e[2] - e[1] + e[0];
}

describe('pairs sharing work buffers', () => {
  it('answer as with buffers of their own, whatever other pairs asked in between', () => {
    const pairs = [new CoupledPair(qa, qb, 0.012), new CoupledPair(qb, qc, 0.009), new CoupledPair(qa, qc, 0.01, { levels: 5 })];
    const rng = new Random(11);
    const held: { pair: CoupledPair; fa: number; fb: number; dressed: Float64Array; bare: Float64Array }[] = [];
    for (let n = 0; n < 60; n++) {
      const p = pairs[rng.int(pairs.length)];
      const fa = 0.4 * rng.uniform();
      const fb = 0.4 * rng.uniform();
      expect(Object.is(p.zz(fa, fb), zzDirect(p, fa, fb))).toBe(true);
      if (n % 3 === 0) {
        const s = p.spectrum(fa, fb);
        const direct = dressedSpectrum(p.basisA(fa), p.basisB(fb), p.gChargeGHz, p.levels, { scratch: dressedSpectrumScratch(p.levels) });
        expect(Array.from(s.dressed)).toEqual(Array.from(direct.dressed));
        expect(Array.from(s.bare)).toEqual(Array.from(direct.bare));
        held.push({ pair: p, fa, fb, dressed: s.dressed, bare: s.bare });
      }
    }
    // spectra handed out earlier are the caller's: later calls of any pair leave them as they were
    for (const h of held) {
      const direct = dressedSpectrum(h.pair.basisA(h.fa), h.pair.basisB(h.fb), h.pair.gChargeGHz, h.pair.levels, { scratch: dressedSpectrumScratch(h.pair.levels) });
      expect(Array.from(h.dressed)).toEqual(Array.from(direct.dressed));
      expect(Array.from(h.bare)).toEqual(Array.from(direct.bare));
    }
  });
});
