/**
 * The cubic Hermite kernels (src/linalg/cubic-hermite.ts) against SciPy's CubicHermiteSpline
 * (live through test/reference/cubic_hermite.py) on one cell, the inverse against its PPoly.solve,
 * and the fourth-order slopes against
 * exact derivatives of quartics (Fornberg's stencils are exact to degree 4; Math. Comp. 51, 699
 * (1988)).
 */
import { describe, expect, it } from 'vitest';
import { finiteDifferenceSlopes, hermite, hermiteInverse, hermiteSlope, hermiteWeights } from '../../src/linalg/cubic-hermite.js';
import { runPython } from '../support/python.js';

const X0 = 1.7;
const H = 0.35;
const Y = [2.3, -0.8];
const DYDX = [4.1, -1.9];
const T = [0, 0.1, 0.37, 0.5, 0.81, 1];
const ref = runPython<{ values: number[]; slopes: number[] }>('cubic_hermite.py', { x: [X0, X0 + H], y: Y, dydx: DYDX, at: T.map((t) => X0 + t * H) });

// an increasing cell (end slopes below 3 (y1 - y0) / h: monotone, the Fritsch-Carlson condition,
// SIAM J. Numer. Anal. 17, 238 (1980), from memory) and values to invert, its ends included
const YI = [5.1, 6.4];
const DYDXI = [4.9, 2.2];
const TARGETS = [5.1, 5.1000001, 5.37, 5.75, 6.0, 6.399999, 6.4];
const inverseRef = runPython<{ roots: number[] }>('cubic_hermite.py', { x: [X0, X0 + H], y: YI, dydx: DYDXI, at: [], solve: TARGETS });

describe('cubic Hermite on one cell', () => {
  it('hermite and hermiteSlope / h match SciPy CubicHermiteSpline to 1e-14', () => {
    T.forEach((t, i) => {
      expect(Math.abs(hermite(Y[0], Y[1], DYDX[0] * H, DYDX[1] * H, t) - ref.values[i])).toBeLessThan(1e-14);
      expect(Math.abs(hermiteSlope(Y[0], Y[1], DYDX[0] * H, DYDX[1] * H, t) / H - ref.slopes[i])).toBeLessThan(1e-13);
    });
  });

  it('hermiteWeights with unscaled derivatives give the same interpolant', () => {
    const w = new Float64Array(4);
    T.forEach((t, i) => {
      hermiteWeights(t, H, w);
      expect(Math.abs(w[0] * Y[0] + w[1] * DYDX[0] + w[2] * Y[1] + w[3] * DYDX[1] - ref.values[i])).toBeLessThan(1e-14);
      expect(w[0] + w[2]).toBeCloseTo(1, 15); // a constant is reproduced
    });
  });
});

describe('hermiteInverse', () => {
  it('finds where an increasing cell takes a value: SciPy PPoly.solve on CubicHermiteSpline to 1e-13 in x', () => {
    TARGETS.forEach((target, i) => {
      const t = hermiteInverse(YI[0], YI[1], DYDXI[0] * H, DYDXI[1] * H, target, (target - YI[0]) / (YI[1] - YI[0]), 1e-14, 30);
      expect(Math.abs(X0 + t * H - inverseRef.roots[i]), `target ${target}`).toBeLessThan(1e-13);
    });
  });

  it('converges in a few steps on 20,000 seeded increasing cells, to the last bits (the bisection fallback once restarted converged solves: 3,704 of these reached the 30-step cap, one 1.4e-8 from its target)', () => {
    let seed = 12345;
    const next = () => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 2 ** 32);
    const stats = { iterations: 0 };
    let most = 0;
    let total = 0;
    const cells = 20000;
    for (let k = 0; k < cells; k++) {
      const y0 = 3 + 4 * next();
      const y1 = y0 + 0.01 + 0.3 * next();
      const d0 = 3 * (y1 - y0) * next();
      const d1 = 3 * (y1 - y0) * next();
      const target = hermite(y0, y1, d0, d1, next());
      const t = hermiteInverse(y0, y1, d0, d1, target, (target - y0) / (y1 - y0), 1e-14, 30, stats);
      expect(t).toBeGreaterThanOrEqual(0);
      expect(t).toBeLessThanOrEqual(1);
      // a few units in the last place of the values (about 1e-15 here)
      expect(Math.abs(hermite(y0, y1, d0, d1, t) - target)).toBeLessThan(1e-14);
      most = Math.max(most, stats.iterations);
      total += stats.iterations;
    }
    // (measured: at most 12, mean 5.3; steep ends make Newton bisect at first)
    expect(most).toBeLessThanOrEqual(14);
    expect(total / cells).toBeLessThan(6);
  });
});

describe('finiteDifferenceSlopes', () => {
  it('is exact for a quartic at every point, ends included (to 1e-10 of the slope scale)', () => {
    const p = (x: number) => 0.3 * x ** 4 - 1.1 * x ** 3 + 0.5 * x ** 2 - 2 * x + 7;
    const dp = (x: number) => 1.2 * x ** 3 - 3.3 * x ** 2 + x - 2;
    const m = 9;
    const h = 0.25;
    const v = new Float64Array(m + 3);
    const out = new Float64Array(m + 3);
    const off = 3;
    for (let k = 0; k < m; k++) v[off + k] = p(-1 + k * h);
    finiteDifferenceSlopes(v, out, off, m, h);
    for (let k = 0; k < m; k++) expect(Math.abs(out[off + k] - dp(-1 + k * h))).toBeLessThan(1e-10 * 20);
    expect([...out.subarray(0, off)]).toEqual([0, 0, 0]);
  });

  it('few samples: second-order differences; h = 0: zero slopes', () => {
    const v = Float64Array.from([1, 3, 7]);
    const out = new Float64Array(3);
    finiteDifferenceSlopes(v, out, 0, 3, 0.5);
    expect([...out]).toEqual([4, 6, 8]);
    finiteDifferenceSlopes(v, out, 0, 3, 0);
    expect([...out]).toEqual([0, 0, 0]);
  });
});
