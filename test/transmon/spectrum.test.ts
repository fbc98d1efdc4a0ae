/**
 * spectrumAt / tunableRange against outside references:
 * - f01, f12, alpha at several fluxes from SciPy Mathieu characteristic values at
 *   q = E_J(Phi) / (2 E_C) (Koch 2007, Eq. 2.5; test/reference/transmon_mathieu.py);
 * - the Hellmann-Feynman slopes df01/dPhi, df12/dPhi against central finite differences of the
 *   exact levels (fourth-order stencil, step 1e-4 Phi0);
 * - f_max, f_min at Phi = 0 and 1/2 from the Mathieu values at E_JS and d E_JS.
 */
import { describe, expect, it } from 'vitest';
import { josephsonEnergy } from '../../src/transmon/josephson.js';
import { f01FluxSlopeAt, f12At, spectrumAt, type TransmonParams } from '../../src/transmon/spectrum.js';
import { tunableRange } from '../../src/transmon/tunable-range.js';
import { expectClose } from '../support/close.js';
import { runPython } from '../support/python.js';

const devices: TransmonParams[] = [
  { ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 },
  { ecGHz: 0.25, ejsGHz: 12.5, asymmetry: 0 },
  { ecGHz: 0.18, ejsGHz: 30, asymmetry: 0.6 },
];
const fluxes = [0, 0.07, 0.2, 0.31, 0.44, 0.5];
const cases = devices.flatMap((p) => fluxes.map((f) => ({ ec: p.ecGHz, ej: josephsonEnergy(p.ejsGHz, p.asymmetry, f), levels: 3, ng: 0 })));
const ref = runPython<{ results: { mathieu: number[] }[] }>('transmon_mathieu.py', { cases }).results;

describe('spectrumAt(params, flux)', () => {
  it('f01, f12 and alpha match Mathieu characteristic values (SciPy) to 1e-11 relative', () => {
    devices.forEach((p, di) =>
      fluxes.forEach((flux, fi) => {
        const m = ref[di * fluxes.length + fi].mathieu;
        const s = spectrumAt(p, flux);
        const label = `device ${di} Phi=${flux}`;
        expectClose(s.f01GHz, m[1] - m[0], 1e-11, `${label} f01`);
        expectClose(s.f12GHz, m[2] - m[1], 1e-11, `${label} f12`);
        expectClose(s.anharmonicityGHz, m[2] - 2 * m[1] + m[0], 1e-11, `${label} alpha`);
      }),
    );
  });

  it('Hellmann-Feynman df01/dPhi and df12/dPhi match a fourth-order central finite difference to 1e-7 relative', () => {
    const h = 1e-4;
    for (const p of devices) {
      for (const flux of [0.03, 0.15, 0.25, 0.38, 0.47, -0.2]) {
        const f = (x: number) => spectrumAt(p, x);
        const fd = (g: (x: number) => number) => (-g(flux + 2 * h) + 8 * g(flux + h) - 8 * g(flux - h) + g(flux - 2 * h)) / (12 * h);
        const s = f(flux);
        expectClose(s.df01dFluxGHz, fd((x) => f(x).f01GHz), 1e-7, `df01/dPhi d=${p.asymmetry} Phi=${flux}`);
        expectClose(s.df12dFluxGHz, fd((x) => f(x).f12GHz), 1e-7, `df12/dPhi d=${p.asymmetry} Phi=${flux}`);
      }
    }
  });

  it('slopes vanish at both sweet spots (d > 0) and f01 falls on 0 < Phi < 1/2', () => {
    const p = devices[0];
    expect(Math.abs(spectrumAt(p, 0).df01dFluxGHz)).toBeLessThanOrEqual(1e-12);
    expect(Math.abs(spectrumAt(p, 0.5).df01dFluxGHz)).toBeLessThanOrEqual(1e-12);
    let prev = Infinity;
    for (let i = 0; i <= 50; i++) {
      const s = spectrumAt(p, i / 100);
      expect(s.f01GHz).toBeLessThan(prev);
      if (i > 0 && i < 50) expect(s.df01dFluxGHz).toBeLessThan(0);
      prev = s.f01GHz;
    }
  });
});

describe('f01FluxSlopeAt and f12At (the slope or f12 alone, for callers that need only that)', () => {
  it('are spectrumAt\'s df01dFluxGHz and f12GHz bit for bit (fewer levels, the same solves), across devices, fluxes and charge cutoffs', () => {
    for (const p of devices) {
      for (let i = 0; i <= 60; i++) {
        const flux = -0.1 + (0.7 * i) / 60;
        for (const chargeCutoff of [undefined, 8, 15]) {
          const o = chargeCutoff === undefined ? {} : { chargeCutoff };
          const s = spectrumAt(p, flux, o);
          expect(f01FluxSlopeAt(p, flux, o)).toBe(s.df01dFluxGHz);
          expect(f12At(p, flux, o)).toBe(s.f12GHz);
        }
      }
    }
  });

  it('f01FluxSlopeAt matches a fourth-order central finite difference of f01 to 1e-7 relative, and f12At the Mathieu f12 (SciPy) to 1e-11', () => {
    const h = 1e-4;
    for (const p of devices) {
      for (const flux of [0.03, 0.15, 0.25, 0.38, 0.47]) {
        const f = (x: number) => spectrumAt(p, x).f01GHz;
        const fd = (-f(flux + 2 * h) + 8 * f(flux + h) - 8 * f(flux - h) + f(flux - 2 * h)) / (12 * h);
        expectClose(f01FluxSlopeAt(p, flux), fd, 1e-7, `df01/dPhi d=${p.asymmetry} Phi=${flux}`);
      }
    }
    devices.forEach((p, di) =>
      fluxes.forEach((flux, fi) => {
        const m = ref[di * fluxes.length + fi].mathieu;
        expectClose(f12At(p, flux), m[2] - m[1], 1e-11, `device ${di} Phi=${flux} f12`);
      }),
    );
  });
});

describe('tunableRange(params)', () => {
  it('f_max and f_min are the Mathieu f01 at E_JS and d E_JS', () => {
    devices.forEach((p, di) => {
      const r = tunableRange(p);
      const top = ref[di * fluxes.length].mathieu;
      const bottom = ref[di * fluxes.length + fluxes.length - 1].mathieu;
      expectClose(r.fMaxGHz, top[1] - top[0], 1e-11, `device ${di} f_max`);
      expectClose(r.fMinGHz, bottom[1] - bottom[0], 1e-11, `device ${di} f_min`);
      expect(r.fMinGHz).toBeLessThan(r.fMaxGHz);
    });
  });

  it('a symmetric SQUID tunes down to f01 = 4 E_C (E_J = 0: levels 4 E_C n^2)', () => {
    expectClose(tunableRange(devices[1]).fMinGHz, 4 * devices[1].ecGHz, 1e-12, 'f_min at d = 0');
  });
});
