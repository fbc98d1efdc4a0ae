/**
 * Coherence model (src/transmon/coherence.ts): quasi-static 1/f flux noise and white dephasing.
 *
 * Outside references:
 *  - the Gaussian average of the idle phase, with the second-order (curvature) term, against a
 *    numerical integral by scipy.integrate.quad (test/reference/quasi_static_coherence.py);
 *  - the quasi-static variance sigma^2 = 2 A^2 ln(f_uv / f_ir) against the Gaussian phase-noise
 *    integral of the 1/f spectrum it approximates (Ithier et al., Phys. Rev. B 72, 134519 (2005);
 *    Koch et al. 2007 sec. VI): <dphi^2(t)> = (2 pi df/dPhi)^2 2 A^2 t^2 int_{pi f_ir t}^inf sin^2 x / x^3 dx,
 *    integrated by Simpson's rule; with f_uv = 1/t the two differ by the constant
 *    ln(2 pi) - 3/2 + gamma_Euler = 0.915 next to ln(1/(f_ir t)) (derived), a few per cent of the
 *    variance for idles of 40 ns to 10 us;
 *  - the Ramsey 1/e times against a root found on the closed forms (white only: T_phi = tphi and
 *    1/T2 = 1/(2 T1) + 1/tphi, common practice).
 */
import { describe, expect, it } from 'vitest';
import { coherenceFor, dephasingCoherence, quasiStaticCoherence, quasiStaticFluxSigma } from '../../src/transmon/coherence.js';
import { runPython } from '../support/python.js';
import { expectClose } from '../support/close.js';

/** Simpson's rule for g on [a, b] with n (even) intervals. */
function simpson(g: (x: number) => number, a: number, b: number, n: number): number {
  const h = (b - a) / n;
  let s = g(a) + g(b);
  for (let i = 1; i < n; i++) s += (i % 2 === 1 ? 4 : 2) * g(a + i * h);
  return (s * h) / 3;
}

/** int_1^inf sin^2(x) / x^3 dx: Simpson on [1, 1000] (step 0.01) plus the tail 1/(4 * 1000^2). */
const UPPER_PART = simpson((x) => Math.sin(x) ** 2 / x ** 3, 1, 1000, 100_000) + 1 / (4 * 1000 ** 2);

/** int_{x0}^inf sin^2(x) / x^3 dx for x0 < 1 (the part below 1 by Simpson in u = ln x). */
function sincIntegral(x0: number): number {
  return simpson((u) => Math.sin(Math.exp(u)) ** 2 / Math.exp(2 * u), Math.log(x0), 0, 4000) + UPPER_PART;
}

describe('quasiStaticFluxSigma(A, T, T_avg)', () => {
  it('is A sqrt(2 ln(T_avg / T)), and 0 when the operation lasts as long as the calibration', () => {
    expectClose(quasiStaticFluxSigma(3e-6, 40, 1e9), 3e-6 * Math.sqrt(2 * Math.log(1e9 / 40)), 1e-15, 'sigma');
    expect(quasiStaticFluxSigma(3e-6, 1e9, 1e9)).toBe(0);
    expect(quasiStaticFluxSigma(0, 40, 1e9)).toBe(0);
  });

  it('its phase variance (2 pi f\' t sigma)^2 matches the 1/f Gaussian phase-noise integral within 10 % (Ithier et al. 2005)', () => {
    const a = 3e-6;
    const slope = 5;
    for (const tNs of [40, 200, 1000, 10_000]) {
      const t = tNs * 1e-9;
      const exact = (2 * Math.PI * slope * 1e9 * a) ** 2 * 2 * t * t * sincIntegral(Math.PI * 1 * t);
      const sigma = quasiStaticFluxSigma(a, tNs, 1e9);
      const quasi = (2 * Math.PI * slope * tNs * sigma) ** 2;
      expect(quasi / exact, `t = ${tNs} ns`).toBeGreaterThan(1);
      expect(quasi / exact).toBeLessThan(1.1);
    }
  });
});

describe('quasiStaticCoherence(t, df/dPhi, d2f/dPhi2, sigma)', () => {
  it('is exp(-(2 pi f\' sigma t)^2 / 2) without curvature (Gaussian average of a linear phase)', () => {
    const sigma = 1.7e-5;
    for (const [t, f1] of [[40, 5], [1000, 2], [500, -8]]) {
      expectClose(quasiStaticCoherence(t, f1, 0, sigma), Math.exp(-((2 * Math.PI * f1 * sigma * t) ** 2) / 2), 1e-14, `t=${t} f1=${f1}`);
    }
    expect(quasiStaticCoherence(1000, 5, 0, 0)).toBe(1);
  });

  it('matches scipy.integrate.quad of the Gaussian average with slope and curvature (mean shift removed) to 1e-9', () => {
    const cases = [
      { t: 1000, f1: 0, f2: -60, sigma: 2e-4 },
      { t: 5000, f1: 0, f2: -60, sigma: 5e-4 },
      { t: 1000, f1: 2, f2: -40, sigma: 4e-5 },
      { t: 300, f1: -6, f2: 25, sigma: 6e-5 },
    ];
    const ref = runPython<{ values: number[] }>('quasi_static_coherence.py', { cases });
    cases.forEach((c, k) => expectClose(quasiStaticCoherence(c.t, c.f1, c.f2, c.sigma), ref.values[k], 1e-9, JSON.stringify(c)));
  });

  it('at a sweet spot the curvature of a real transmon costs little at realistic noise (second order kept, documented)', () => {
    // d2f/dPhi2 of about -60 GHz/Phi0^2, sigma ~ 1.6e-5 Phi0 over 1 us: 1 - c ~ 1e-9
    const c = quasiStaticCoherence(1000, 0, -60, quasiStaticFluxSigma(3e-6, 1000));
    expect(1 - c).toBeGreaterThan(0);
    expect(1 - c).toBeLessThan(1e-7);
  });
});

describe('coherenceFor(spec, df/dPhi, d2f/dPhi2)', () => {
  it('with white dephasing only, T_phi = tphi and 1/T2 = 1/(2 T1) + 1/tphi (common practice)', () => {
    const c = coherenceFor({ t1Ns: 60_000, tphiNs: 90_000 }, 7.5, 0);
    expectClose(c.tphiNs, 90_000, 1e-9, 'T_phi');
    expectClose(c.t2Ns, 1 / (1 / 120_000 + 1 / 90_000), 1e-9, 'T2');
    expect(c.whiteRatePerNs).toBeCloseTo(1 / 90_000, 15);
  });

  it('with quasi-static 1/f noise, T_phi is where the Ramsey envelope falls to 1/e, and it shortens with the slope', () => {
    const spec = { t1Ns: 50_000, tphiNs: 80_000, fluxNoisePhi0: 3e-6 };
    const c = coherenceFor(spec, 5, 0);
    expectClose(dephasingCoherence(spec, c.tphiNs, 5, 0), Math.exp(-1), 1e-9, 'envelope at T_phi');
    expectClose(Math.exp(-c.t2Ns / 100_000) * dephasingCoherence(spec, c.t2Ns, 5, 0), Math.exp(-1), 1e-9, 'envelope at T2');
    expect(coherenceFor(spec, 10, 0).tphiNs).toBeLessThan(c.tphiNs);
    // a few us on a 5 GHz/Phi0 slope with 3 uPhi0/sqrt(Hz): the scale the check quotes
    expect(c.tphiNs).toBeGreaterThan(1000);
    expect(c.tphiNs).toBeLessThan(5000);
  });

  it('at a sweet spot without a white part there is no decay of note (T_phi far beyond T1) and T2 -> 2 T1', () => {
    const n = coherenceFor({ t1Ns: 50_000, fluxNoisePhi0: 3e-6 }, 0, 0);
    expect(n.tphiNs).toBe(Infinity);
    expectClose(n.t2Ns, 100_000, 1e-9, 'T2 = 2 T1');
  });
});
