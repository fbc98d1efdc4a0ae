/**
 * Coherence model (src/transmon/coherence.ts). The 1/f flux-noise rate is checked against a
 * direct numerical evaluation of the Gaussian phase-noise model it comes from (Ithier et al.,
 * Phys. Rev. B 72, 134519 (2005); Koch et al. 2007 sec. VI): <dphi^2(t)> =
 * (2 pi df/dPhi)^2 int df S(f) (sin(pi f t)/(pi f))^2 with S(f) = A^2/|f| cut off below f_ir,
 * integrated by Simpson's rule (in ln f below f = 1/(pi t)), coherence exp(-<dphi^2>/2) solved for its 1/e time.
 * The closed form drops the constant 3/2 - gamma_Euler next to |ln(2 pi f_ir t)| (~9.7), so it
 * should be about 5% fast; we require agreement within 7%.
 */
import { describe, expect, it } from 'vitest';
import { coherenceFor, fluxNoiseDephasingRate, fluxNoiseLogFactor } from '../../src/transmon/coherence.js';
import { bracketedNewton } from '../../src/linalg/bracketed-root.js';
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

/** 1/e time (ns) of exp(-<dphi^2>/2) for slope D (GHz/Phi0), amplitude A (Phi0), cutoff f_ir (Hz). */
function numericalDephasingTime(slopeGHz: number, a: number, firHz: number): number {
  const phaseVariance = (tNs: number) => {
    const t = tNs * 1e-9;
    const w = 2 * Math.PI * slopeGHz * 1e9 * a; // rad/s per unit of the integral
    // 2 int_{f_ir}^inf (1/f) (sin(pi f t)/(pi f))^2 df = 2 t^2 int_{pi f_ir t}^inf sin^2 x / x^3 dx
    return w * w * 2 * t * t * sincIntegral(Math.PI * firHz * t);
  };
  return bracketedNewton((t, s) => {
    s.value = NaN;
    return phaseVariance(t) / 2 - 1;
  }, 1, 1e9, { xTol: 1e-6 });
}

describe('fluxNoiseDephasingRate(df01/dPhi, A_Phi)', () => {
  it('log factor sqrt(|ln(2 pi f_ir t_m)|) is 3.11 for the defaults f_ir = 1 Hz, t_m = 10 us', () => {
    expectClose(fluxNoiseLogFactor(), Math.sqrt(-Math.log(2 * Math.PI * 1e-5)), 1e-15, 'log factor');
    expect(fluxNoiseLogFactor()).toBeCloseTo(3.11, 2);
  });

  it('the quadrature reproduces int_{x0}^inf sin^2 x / x^3 dx = -ln(2 x0) + 3/2 - gamma_Euler + O(x0^2) (derived; gamma from memory)', () => {
    for (const x0 of [1e-6, 1e-4]) expectClose(sincIntegral(x0) + Math.log(2 * x0), 1.5 - 0.5772156649015329, 1e-7, `x0=${x0}`);
  });

  it('matches the numerically integrated Gaussian phase-noise decay (1/e time) within 7%', () => {
    for (const [slope, a] of [[5, 2e-6], [12, 3e-6], [1, 1e-6], [20, 5e-6]]) {
      const tNumeric = numericalDephasingTime(slope, a, 1);
      // Evaluate the closed form's log at the time it predicts for (self-consistent t_m).
      const rate = fluxNoiseDephasingRate(slope, a, { measurementNs: tNumeric });
      const ratio = 1 / rate / tNumeric;
      expect(ratio, `D=${slope} GHz/Phi0, A=${a}: closed form ${1 / rate} ns, numeric ${tNumeric} ns`).toBeGreaterThan(1);
      expect(ratio).toBeLessThan(1.07);
    }
  });

  it('is linear in the amplitude and the slope, and zero at a sweet spot', () => {
    const r = fluxNoiseDephasingRate(8, 2e-6);
    expectClose(fluxNoiseDephasingRate(16, 2e-6), 2 * r, 1e-15, 'slope');
    expectClose(fluxNoiseDephasingRate(-8, 6e-6), 3 * r, 1e-15, 'amplitude and sign');
    expect(fluxNoiseDephasingRate(0, 2e-6)).toBe(0);
  });
});

describe('coherenceFor(spec, slope)', () => {
  it('1/T2 = 1/(2 T1) + 1/T_phi with 1/T_phi = 1/T_phi,white + Gamma_1/f (README physics conventions sec. 4)', () => {
    const spec = { t1Ns: 60_000, tphiNs: 90_000, fluxNoisePhi0: 2.5e-6 };
    const c = coherenceFor(spec, 7.5);
    const g = fluxNoiseDephasingRate(7.5, 2.5e-6);
    expectClose(1 / c.tphiNs, 1 / 90_000 + g, 1e-15, '1/T_phi');
    expectClose(1 / c.t2Ns, 1 / 120_000 + 1 / 90_000 + g, 1e-15, '1/T2');
    expect(c.t1Ns).toBe(60_000);
  });

  it('at a sweet spot only the white part remains; with no dephasing source T_phi is infinite and T2 = 2 T1', () => {
    const s = coherenceFor({ t1Ns: 50_000, tphiNs: 80_000, fluxNoisePhi0: 3e-6 }, 0);
    expect(s.tphiNs).toBe(80_000);
    const n = coherenceFor({ t1Ns: 50_000, fluxNoisePhi0: 3e-6 }, 0);
    expect(n.tphiNs).toBe(Infinity);
    expectClose(n.t2Ns, 100_000, 1e-15, 'T2 = 2 T1');
  });
});
