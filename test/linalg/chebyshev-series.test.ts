/**
 * Chebyshev-Lobatto interpolation (src/linalg/chebyshev-series.ts) against NumPy: the degree-n
 * least-squares Chebyshev fit through the n + 1 points (numpy.polynomial.chebyshev.chebfit,
 * live through test/reference/chebyshev_interpolant.py) is the interpolant, so its coefficients
 * are the reference. chebyshevCoefficientRows must give the same rows as the full transform.
 */
import { describe, expect, it } from 'vitest';
import { chebyshevCoefficientRows, chebyshevCoefficients, chebyshevEvaluate, chebyshevPoints } from '../../src/linalg/chebyshev-series.js';
import { runPython } from '../support/python.js';

const A = 2;
const B = 5;
const problems = [
  { f: 'exp', n: 16 },
  { f: 'runge', n: 32 },
  { f: 'abs', n: 64 },
].map((p) => ({ ...p, a: A, b: B }));

const reference = runPython<{ results: { x: number[]; values: number[]; coefficients: number[] }[] }>('chebyshev_interpolant.py', { problems }).results;

/** The three test functions side by side (width 3) at the points of degree n. */
function interleaved(n: number): Float64Array {
  const x = chebyshevPoints(A, B, n);
  const v = new Float64Array((n + 1) * 3);
  for (let j = 0; j <= n; j++) {
    v[j * 3] = Math.exp(x[j]);
    v[j * 3 + 1] = 1 / (1 + 25 * (x[j] - 3.5) ** 2);
    v[j * 3 + 2] = Math.abs(x[j] - 3.3);
  }
  return v;
}

describe('chebyshev series', () => {
  it('points are numpy cos(pi j / n) Lobatto points on [a, b] (to 1e-15 relative)', () => {
    problems.forEach((p, i) => {
      const x = chebyshevPoints(A, B, p.n);
      reference[i].x.forEach((r, j) => expect(Math.abs(x[j] - r)).toBeLessThanOrEqual(1e-15 * B));
    });
  });

  it('coefficients match numpy chebfit through the n + 1 points to 1e-12 of max |f|', () => {
    problems.forEach((p, i) => {
      const v = interleaved(p.n);
      const c = chebyshevCoefficients(v, p.n, 3);
      const scale = Math.max(...reference[i].values.map(Math.abs));
      reference[i].coefficients.forEach((r, k) => expect(Math.abs(c[k * 3 + i] - r), `${p.f} c_${k}`).toBeLessThanOrEqual(1e-12 * scale));
    });
  });

  it('chebyshevCoefficientRows gives exactly the rows of the full transform', () => {
    for (const n of [1, 16, 64]) {
      const v = interleaved(n);
      const full = chebyshevCoefficients(v, n, 3);
      const ks = [n, 0, n - 1, Math.floor(n / 2)];
      const rows = chebyshevCoefficientRows(v, n, 3, ks);
      ks.forEach((k, i) => {
        for (let q = 0; q < 3; q++) expect(rows[i * 3 + q]).toBe(full[k * 3 + q]);
      });
    }
    expect(() => chebyshevCoefficientRows(interleaved(4), 4, 3, [5])).toThrow(RangeError);
  });

  it('the interpolant reproduces exp between the nodes (its tail at n = 16 is below 1e-13)', () => {
    const n = 16;
    const c = chebyshevCoefficients(interleaved(n), n, 3);
    const out = new Float64Array(3);
    for (const x of [2.05, 3.1, 4.77]) {
      chebyshevEvaluate(c, n, 3, A, B, x, out);
      expect(Math.abs(out[0] - Math.exp(x)) / Math.exp(x)).toBeLessThan(1e-13);
    }
  });
});
