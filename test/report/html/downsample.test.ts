/**
 * Largest-triangle-three-buckets (Steinarsson 2013, sec. 4.2): two examples worked by hand from
 * the method's definition, its invariants, and the accuracy of the kept samples on a smooth
 * curve, measured with NumPy's np.interp and held to the linear-interpolation error bound
 * max|f''| h^2 / 8 (h the widest gap between kept samples; e.g. Burden and Faires, Numerical
 * Analysis, Thm. 3.3 for n = 1).
 */
import { describe, expect, it } from 'vitest';
import { largestTriangleThreeBuckets } from '../../../src/report/html/downsample.js';
import { runPython } from '../../support/python.js';

describe('largestTriangleThreeBuckets', () => {
  it('keeps first, the largest-triangle sample of each bucket, and last (worked by hand)', () => {
    const x = [0, 1, 2, 3, 4];
    const y = [0, 5, 1, 0, 0];
    // m = 3: one bucket {1, 2, 3} (every = 3); next "bucket" is the last sample (4, 0); the
    // triangle areas with (0, 0) and (4, 0) are 2 * |4 y_j| / 2 -> 20, 4, 0: sample 1 wins.
    expect([...largestTriangleThreeBuckets(x, y, 3)]).toEqual([0, 1, 4]);
    // m = 4: every = 1.5, buckets {1} and {2, 3}; for the second, a = (1, 5) and the next mean
    // is (4, 0): |(1-4)(y_j-5) - (1-x_j)(0-5)| = 7 for j = 2 and 5 for j = 3: sample 2 wins.
    expect([...largestTriangleThreeBuckets(x, y, 4)]).toEqual([0, 1, 2, 4]);
  });

  it('returns every index when the target is not below the count, and at least 3 samples otherwise', () => {
    expect([...largestTriangleThreeBuckets([0, 1, 2], [1, 2, 3], 10)]).toEqual([0, 1, 2]);
    const n = 50;
    const x = Array.from({ length: n }, (_, i) => i);
    const y = x.map((v) => Math.sin(v));
    expect(largestTriangleThreeBuckets(x, y, 1)).toHaveLength(3);
    expect(() => largestTriangleThreeBuckets([0, 1], [0], 5)).toThrow(RangeError);
  });

  it('indices are strictly increasing, one per bucket, and do not depend on the units of x and y', () => {
    const n = 1001;
    const x = Array.from({ length: n }, (_, i) => i * 0.07);
    const y = x.map((t) => Math.exp(-(((t - 30) / 6) ** 2)) + 0.2 * Math.sin(t));
    const keep = largestTriangleThreeBuckets(x, y, 120);
    expect(keep).toHaveLength(120);
    expect(keep[0]).toBe(0);
    expect(keep[119]).toBe(n - 1);
    const every = (n - 2) / 118;
    for (let i = 1; i < 119; i++) {
      expect(keep[i]).toBeGreaterThan(keep[i - 1]);
      expect(keep[i]).toBeGreaterThanOrEqual(Math.floor((i - 1) * every) + 1);
      expect(keep[i]).toBeLessThan(Math.floor(i * every) + 1);
    }
    const rescaled = largestTriangleThreeBuckets(x.map((t) => 1e-9 * t + 5), y.map((v) => 3e4 * v - 2), 120);
    expect([...rescaled]).toEqual([...keep]);
  });

  it('keeps a flat-top pulse within the linear-interpolation bound, checked with np.interp', () => {
    // A flux pulse shape: erf edges, a flat top, back down (f'' is largest on the edges).
    const n = 4000;
    const T = 60;
    const x = Array.from({ length: n }, (_, i) => (i * T) / (n - 1));
    const sigma = 1.5;
    const f = (t: number) => 0.3 * (1 / (1 + Math.exp(-(t - 10) / sigma)) - 1 / (1 + Math.exp(-(t - 50) / sigma)));
    const y = x.map(f);
    const keep = largestTriangleThreeBuckets(x, y, 300);
    const kx = [...keep].map((k) => x[k]);
    const ky = [...keep].map((k) => y[k]);
    const out = runPython<{ maxError: number }>('interp_error.py', { x, y, kx, ky });
    let h = 0;
    for (let i = 1; i < kx.length; i++) h = Math.max(h, kx[i] - kx[i - 1]);
    // max |f''| of 0.3 * logistic((t - c) / sigma): 0.3 / sigma^2 * max|s(1-s)(1-2s)| = 0.3 / sigma^2 * 0.0962.
    const fpp = (0.3 / sigma ** 2) * 0.0962;
    expect(out.maxError).toBeLessThanOrEqual((fpp * h * h) / 8 + 1e-12);
    expect(out.maxError).toBeLessThan(2e-3 * 0.3);
  });
});
