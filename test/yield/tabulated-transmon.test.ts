/**
 * TabulatedTransmon (a drawn transmon's spectrum from the reduced table, src/yield/tabulated-transmon.ts):
 * - f01 and f12 against SciPy's Mathieu characteristic values at q = E_J(Phi) / (2 E_C) (Koch et
 *   al., PRA 76, 042319 (2007), Eq. 2.5; test/reference/transmon_mathieu.py) to 1e-9 relative;
 * - df01/dPhi against a fourth-order central difference of those Mathieu f01 values (step 1e-4
 *   Phi0) to 1e-6 relative;
 * - the inverse maps, the flux curvature and |<0|n|1>| against the exact Transmon (whose own
 *   checks against SciPy are in test/transmon) to 1e-9 in flux, 1e-5 relative in curvature and
 *   1e-9 relative in the matrix element;
 * - outside the table (a symmetric SQUID's lower sweet spot, E_J -> 0) it gives the exact answers.
 */
import { describe, expect, it } from 'vitest';
import { josephsonEnergy } from '../../src/transmon/josephson.js';
import { sharedReducedSpectrum } from '../../src/transmon/reduced-spectrum.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { TabulatedTransmon, TabulatedWork } from '../../src/yield/tabulated-transmon.js';
import { runPython } from '../support/python.js';

const devices = [
  { ecGHz: 0.213, ejsGHz: 24.1, asymmetry: 0.31 },
  { ecGHz: 0.18, ejsGHz: 31.7, asymmetry: 0.05 },
  { ecGHz: 0.26, ejsGHz: 11.2, asymmetry: 0.55 },
];
const fluxes = [0, 0.05, 0.17, 0.29, 0.41, 0.5];
const H = 1e-4;
const offsets = [-2, -1, 0, 1, 2];
const cases = devices.flatMap((p) => fluxes.flatMap((x) => offsets.map((k) => ({ ec: p.ecGHz, ej: josephsonEnergy(p.ejsGHz, p.asymmetry, Math.min(0.5, Math.max(0, x)) + k * H), levels: 3, ng: 0 }))));
const ref = runPython<{ results: { mathieu: number[] }[] }>('transmon_mathieu.py', { cases }).results;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1e-12, Math.abs(b));

describe('TabulatedTransmon', () => {
  devices.forEach((p, di) => {
    const tab = new TabulatedTransmon(sharedReducedSpectrum(), 'Q', p);
    const exact = new Transmon('Q', p);
    const label = `E_C ${p.ecGHz}, E_JS ${p.ejsGHz}, d ${p.asymmetry}`;

    it(`${label}: f01, f12 (Mathieu, 1e-9) and df01/dPhi (finite difference of Mathieu f01, 1e-6)`, () => {
      expect(tab.tabulatedSpectrum).toBe(true);
      fluxes.forEach((x, fi) => {
        const base = (di * fluxes.length + fi) * offsets.length;
        const f01 = (k: number) => ref[base + k].mathieu[1] - ref[base + k].mathieu[0];
        const s = tab.spectrum(x);
        expect(rel(s.f01GHz, f01(2)), `f01 at ${x}`).toBeLessThan(1e-9);
        expect(rel(s.f12GHz, ref[base + 2].mathieu[2] - ref[base + 2].mathieu[1]), `f12 at ${x}`).toBeLessThan(1e-9);
        expect(rel(tab.f01(x), f01(2))).toBeLessThan(1e-9);
        if (x > 2 * H && x < 0.5 - 2 * H) {
          const fd = (f01(0) - 8 * f01(1) + 8 * f01(3) - f01(4)) / (12 * H);
          expect(rel(s.df01dFluxGHz, fd), `slope at ${x}`).toBeLessThan(1e-6);
        } else expect(Math.abs(s.df01dFluxGHz)).toBeLessThan(1e-9 * Math.abs(s.f01GHz));
      });
    });

    it(`${label}: inverse maps, curvature and |<0|n|1>| as the exact Transmon`, () => {
      for (const x of [0.02, 0.13, 0.27, 0.38, 0.47]) {
        const f = exact.f01(x);
        expect(Math.abs(tab.fluxForF01OrNull(f)! - x), `flux for f01 at ${x}`).toBeLessThan(1e-9);
        const f12 = exact.spectrum(x).f12GHz;
        expect(Math.abs(tab.fluxForF12OrNull(f12)! - x), `flux for f12 at ${x}`).toBeLessThan(1e-9);
        expect(rel(tab.fluxCurvatureGHz(x), exact.fluxCurvatureGHz(x)), `curvature at ${x}`).toBeLessThan(1e-5);
        expect(rel(tab.chargeElement01(x), exact.chargeElement01(x))).toBeLessThan(1e-9);
      }
      expect(rel(tab.fluxCurvatureGHz(0), exact.fluxCurvatureGHz(0))).toBeLessThan(1e-5);
      expect(tab.fluxForF01OrNull(exact.fMaxGHz + 1e-3)).toBeNull();
      expect(tab.fluxForF01OrNull(exact.fMinGHz - 1e-3)).toBeNull();
    });
  });

  it('outside the table (symmetric SQUID near its lower sweet spot) it answers as the exact Transmon', () => {
    const p = { ecGHz: 0.2, ejsGHz: 20, asymmetry: 0 };
    const tab = new TabulatedTransmon(sharedReducedSpectrum(), 'Q', p);
    const exact = new Transmon('Q', p);
    for (const x of [0.49, 0.499]) {
      expect(tab.spectrum(x)).toEqual(exact.spectrum(x));
      expect(tab.chargeElement01(x)).toBe(exact.chargeElement01(x));
    }
    const f = exact.f01(0.3);
    expect(tab.fluxForF01OrNull(f)).toBe(exact.fluxForF01OrNull(f));
  });
});

describe('TabulatedTransmon memos', () => {
  it('spectrum and fluxCurvatureGHz of 300 fluxes asked three times over equal a fresh object\'s answers exactly, and hand out copies', () => {
    const p = { ecGHz: 0.205, ejsGHz: 23.3, asymmetry: 0.28 };
    const tab = new TabulatedTransmon(sharedReducedSpectrum(), 'Q', p);
    const xs = Array.from({ length: 300 }, (_, k) => (0.5 * ((k * 7919) % 300)) / 299);
    for (let round = 0; round < 3; round++) {
      for (const x of xs) {
        const fresh = new TabulatedTransmon(sharedReducedSpectrum(), 'Q', p);
        const got = tab.spectrum(x);
        expect(got).toEqual(fresh.spectrum(x));
        got.f01GHz = -1;
        expect(tab.spectrum(x).f01GHz).toBe(fresh.spectrum(x).f01GHz);
        expect(tab.fluxCurvatureGHz(x)).toBe(fresh.fluxCurvatureGHz(x));
      }
    }
  });

  it('sharedSpectrum (what spectrumMemo lends) equals a fresh object\'s spectrum exactly, and stays so as more points are remembered', () => {
    const p = { ecGHz: 0.205, ejsGHz: 23.3, asymmetry: 0.28 };
    const tab = new TabulatedTransmon(sharedReducedSpectrum(), 'Q', p);
    const xs = Array.from({ length: 200 }, (_, k) => (0.5 * ((k * 7919) % 200)) / 199);
    const lent = xs.map((x) => tab.sharedSpectrum(x));
    for (let round = 0; round < 2; round++) {
      xs.forEach((x, k) => {
        const fresh = new TabulatedTransmon(sharedReducedSpectrum(), 'Q', p).spectrum(x);
        expect(tab.sharedSpectrum(x)).toEqual(fresh);
        // a point lent earlier is never changed by later look-ups (the memo replaces, never rewrites)
        expect(lent[k]).toEqual(fresh);
      });
    }
  });

  it('fluxForF01OrNull of frequencies inside and outside the range, asked three times over, equals a fresh object\'s answer (null included)', () => {
    const p = { ecGHz: 0.205, ejsGHz: 23.3, asymmetry: 0.28 };
    const tab = new TabulatedTransmon(sharedReducedSpectrum(), 'Q', p);
    const lo = tab.fMinGHz;
    const hi = tab.fMaxGHz;
    // 200 frequencies from 0.2 GHz below the range to 0.2 GHz above it
    const fs = Array.from({ length: 200 }, (_, k) => lo - 0.2 + ((hi - lo + 0.4) * ((k * 7919) % 200)) / 199);
    let nulls = 0;
    for (let round = 0; round < 3; round++) {
      for (const f of fs) {
        const fresh = new TabulatedTransmon(sharedReducedSpectrum(), 'Q', p).fluxForF01OrNull(f);
        expect(tab.fluxForF01OrNull(f)).toBe(fresh);
        if (fresh === null) nulls++;
      }
    }
    expect(nulls).toBeGreaterThan(10);
    expect(nulls).toBeLessThan(3 * fs.length - 10);
  });

  it('a transmon taking over another\'s memos (a run\'s reuse) answers as a fresh one', () => {
    const work = new TabulatedWork();
    const first = new TabulatedTransmon(sharedReducedSpectrum(), 'Q', { ecGHz: 0.205, ejsGHz: 23.3, asymmetry: 0.28 }, {}, work);
    const xs = [0, 0.013, 0.2, 0.31, 0.5];
    for (const x of xs) first.spectrum(x), first.fluxCurvatureGHz(x), first.fluxForF01OrNull(first.f01(x));
    const p = { ecGHz: 0.198, ejsGHz: 24.9, asymmetry: 0.33 };
    const second = new TabulatedTransmon(sharedReducedSpectrum(), 'Q', p, {}, work);
    const fresh = new TabulatedTransmon(sharedReducedSpectrum(), 'Q', p);
    for (const x of xs) {
      expect(second.spectrum(x)).toEqual(fresh.spectrum(x));
      expect(second.fluxCurvatureGHz(x)).toBe(fresh.fluxCurvatureGHz(x));
      // the first transmon's frequencies asked of the second (its own flux, or null)
      expect(second.fluxForF01OrNull(first.f01(x))).toBe(fresh.fluxForF01OrNull(first.f01(x)));
    }
  });
});
