/**
 * The cubic Hermite kernels (src/linalg/cubic-hermite.ts) against SciPy's CubicHermiteSpline
 * (live through test/reference/cubic_hermite.py) on one cell, and the fourth-order slopes against
 * exact derivatives of quartics (Fornberg's stencils are exact to degree 4; Math. Comp. 51, 699
 * (1988)).
 */
import { describe, expect, it } from 'vitest';
import { finiteDifferenceSlopes, hermite, hermiteSlope, hermiteWeights } from '../../src/linalg/cubic-hermite.js';
import { runPython } from '../support/python.js';

const X0 = 1.7;
const H = 0.35;
const Y = [2.3, -0.8];
const DYDX = [4.1, -1.9];
const T = [0, 0.1, 0.37, 0.5, 0.81, 1];
const ref = runPython<{ values: number[]; slopes: number[] }>('cubic_hermite.py', { x: [X0, X0 + H], y: Y, dydx: DYDX, at: T.map((t) => X0 + t * H) });

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
