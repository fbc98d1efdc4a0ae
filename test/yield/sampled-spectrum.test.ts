/**
 * SampledSpectrum (a drawn transmon's planner table from the reduced spectrum) against the
 * exact transmon stage (Transmon: charge-basis levels, checked against NumPy and Mathieu values
 * in test/transmon) and against the planner's QubitTable of the same transmon, point for point:
 * the planning range, f01 -> (f12, levels, matrix elements, E_J ratio, slopes), the inverse maps.
 */
import { describe, expect, it } from 'vitest';
import { QubitTable } from '../../src/plan/qubit-table.js';
import { sharedReducedSpectrum } from '../../src/transmon/reduced-spectrum.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { SampledSpectrum } from '../../src/yield/sampled-spectrum.js';

const cases = [
  { ec: 0.213, ejs: 24.1, d: 0.31, noise: 3e-6 },
  { ec: 0.18, ejs: 31.7, d: 0.05, noise: 1.5e-6 },
  { ec: 0.26, ejs: 11.2, d: 0.55, noise: undefined },
];

describe('SampledSpectrum', () => {
  for (const c of cases) {
    const t = new Transmon('Q', { ecGHz: c.ec, ejsGHz: c.ejs, asymmetry: c.d }, c.noise === undefined ? {} : { coherenceSpec: { t1Ns: 5e4, fluxNoisePhi0: c.noise } });
    const s = new SampledSpectrum(sharedReducedSpectrum(), c.ec, c.ejs, c.d, c.noise);
    const q = new QubitTable(t);
    const label = `E_C ${c.ec}, E_JS ${c.ejs}, d ${c.d}`;

    it(`${label}: planning range as QubitTable's; f12 and flux at five points as the exact Transmon (1e-9 GHz)`, () => {
      expect(Math.abs(s.fLowGHz - q.fLowGHz)).toBeLessThan(1e-7);
      expect(Math.abs(s.fMaxGHz - t.fMaxGHz)).toBeLessThan(1e-9);
      for (let k = 0; k <= 4; k++) {
        const f = s.fLowGHz + ((s.fMaxGHz - s.fLowGHz) * k) / 4.0001;
        const flux = t.fluxForF01(f);
        const sp = t.spectrum(flux);
        const st = s.at(f);
        expect(Math.abs(st.f01 - f), `f01 at ${f}`).toBeLessThan(1e-9);
        expect(Math.abs(st.f12 - sp.f12GHz), `f12 at ${f}`).toBeLessThan(1e-9);
        expect(Math.abs(s.fluxAt(f) - flux), `flux at ${f}`).toBeLessThan(1e-8);
        expect(Math.abs(s.slopeAt(f) - sp.df01dFluxGHz) / Math.max(1, Math.abs(sp.df01dFluxGHz)), `slope at ${f}`).toBeLessThan(1e-6);
        const b = t.eigenbasis(flux, 6);
        const n = (i: number, j: number) => Math.abs(b.charge[i * 6 + j]);
        for (const [x, i, j] of [[st.n01, 0, 1], [st.n12, 1, 2], [st.n03, 0, 3], [st.n23, 2, 3], [st.n05, 0, 5], [st.n14, 1, 4]] as const) {
          expect(Math.abs(x - n(i, j)), `n${i}${j} at ${f}`).toBeLessThan(1e-8);
        }
        expect(Math.abs(st.e3 - (b.energies[3] - b.energies[0])), `E3 at ${f}`).toBeLessThan(1e-8);
        const qt = q.at(f);
        expect(Math.abs(st.df01dEj - qt.df01dEj) / Math.abs(qt.df01dEj), `dE01/dE_J at ${f}`).toBeLessThan(1e-5);
        // QubitTable interpolates to ~1e-7 GHz, so near the sweet spot (slope -> 0) only ~1e-6 GHz/Phi0 absolute
        const slopeS = s.fluxSlopeOf(s.at(f));
        const slopeQ = q.fluxSlopeOf(q.at(f));
        expect(Math.abs(slopeS - slopeQ), `flux slope at ${f}`).toBeLessThan(1e-4 * Math.abs(slopeQ) + 1e-6);
      }
    });

    it(`${label}: f01ForF12 and f01ForLevel invert at(), and answer null outside the planning range`, () => {
      const f = 0.6 * s.fLowGHz + 0.4 * s.fMaxGHz;
      const st = { ...s.at(f) };
      expect(Math.abs(s.f01ForF12(st.f12)! - f)).toBeLessThan(1e-9);
      expect(Math.abs(s.f01ForLevel(3, st.e3)! - f)).toBeLessThan(1e-9);
      expect(Math.abs(s.f01ForLevel(4, st.e4 - st.f01, true)! - f)).toBeLessThan(1e-9);
      expect(Math.abs(s.f01ForF12(st.f12)! - q.f01ForF12(st.f12)!)).toBeLessThan(1e-6);
      expect(s.f01ForF12(s.at(s.fMaxGHz).f12 + 0.01)).toBeNull();
      expect(s.f01ForF12(s.at(s.fLowGHz).f12 - 0.01)).toBeNull();
      expect(s.covers(s.fMaxGHz + 1e-3)).toBe(false);
    });
  }
});

describe('SampledSpectrum memos', () => {
  it('give, for 400 frequencies asked in turns and again after a reset, exactly what a fresh object computes', () => {
    const table = sharedReducedSpectrum();
    const reused = new SampledSpectrum(table, 0.2, 20, 0.3, 2e-6);
    for (const [ec, ejs, d] of [[0.21, 22.5, 0.35], [0.19, 27.1, 0.12]] as const) {
      reused.reset(ec, ejs, d, 2e-6);
      const fresh = () => new SampledSpectrum(table, ec, ejs, d, 2e-6);
      const fs = Array.from({ length: 400 }, (_, k) => reused.fLowGHz - 0.05 + ((reused.fMaxGHz - reused.fLowGHz + 0.1) * ((k * 7919) % 400)) / 399);
      for (let round = 0; round < 3; round++) {
        for (const f of fs) {
          expect(reused.at(f, { ...reused.at(0) })).toEqual(fresh().at(f, { ...reused.at(0) }));
          const f12 = 0.8 * f;
          expect(reused.f01ForF12(f12)).toBe(fresh().f01ForF12(f12));
        }
      }
    }
  });
});
