/**
 * tridiagonalEigenvector (inverse iteration) against SciPy's eigenvectors
 * (scipy.linalg.eigh_tridiagonal, live through test/reference/linalg_eigen.py), up to sign,
 * and by the invariants T x = lambda x, |x| = 1.
 */
import { describe, expect, it } from 'vitest';
import { tridiagonalEigenvector } from '../../src/linalg/tridiagonal-eigenvector.js';
import { Random } from '../../src/util/random.js';
import { expectClose } from '../support/close.js';
import { randomTridiagonal, transmonTridiagonal, type Tridiagonal } from '../support/matrices.js';
import { runPython } from '../support/python.js';

const rng = new Random(4242);
const cases: { name: string; t: Tridiagonal }[] = [];
for (const n of [2, 5, 16, 41]) cases.push({ name: `random n=${n}`, t: randomTridiagonal(rng, n) });
cases.push({ name: 'transmon E_J/E_C=50 N=20', t: transmonTridiagonal(0.25, 12.5, 20) });
cases.push({ name: 'transmon n_g=0.25', t: transmonTridiagonal(0.3, 6, 15, 0.25) });

const reference = runPython<{ results: { values: number[]; vectors: number[] }[] }>('linalg_eigen.py', {
  problems: cases.map((c) => ({ kind: 'tridiagonal', d: [...c.t.d], e: [...c.t.e] })),
}).results;

function residual(t: Tridiagonal, lambda: number, x: Float64Array): number {
  let r = 0;
  for (let i = 0; i < t.n; i++) {
    let y = (t.d[i] - lambda) * x[i];
    if (i > 0) y += t.e[i - 1] * x[i - 1];
    if (i < t.n - 1) y += t.e[i] * x[i + 1];
    r = Math.max(r, Math.abs(y));
  }
  return r;
}

describe('tridiagonalEigenvector(d, e, n, lambda)', () => {
  it('agrees with SciPy eigenvectors up to sign to 1e-10 + 100 eps ||T|| / gap (eigenvalues separated by > 1e-6)', () => {
    cases.forEach((c, ci) => {
      const { values, vectors } = reference[ci];
      const n = c.t.n;
      const norm = Math.max(...values.map(Math.abs));
      for (let k = 0; k < n; k++) {
        const gap = Math.min(k > 0 ? values[k] - values[k - 1] : Infinity, k < n - 1 ? values[k + 1] - values[k] : Infinity);
        if (gap < 1e-6) continue;
        const x = tridiagonalEigenvector(c.t.d, c.t.e, n, values[k]);
        let dot = 0;
        for (let i = 0; i < n; i++) dot += x[i] * vectors[i * n + k];
        const sign = dot >= 0 ? 1 : -1;
        // Vector accuracy of either solver ~ eps ||T|| / gap (Davis-Kahan sin-theta theorem).
        const rtol = 1e-10 + (100 * Number.EPSILON * norm) / gap;
        for (let i = 0; i < n; i++) expectClose(x[i], sign * vectors[i * n + k], rtol, `${c.name} vector ${k} component ${i}`);
      }
    });
  });

  it('satisfies |T x - lambda x|_inf <= 1e-13 ||T|| and |x| = 1', () => {
    cases.forEach((c, ci) => {
      const { values } = reference[ci];
      let norm = 0;
      for (let i = 0; i < c.t.n; i++) norm = Math.max(norm, Math.abs(c.t.d[i]) + 2 * Math.max(...c.t.e.map(Math.abs), 0));
      for (let k = 0; k < c.t.n; k++) {
        const x = tridiagonalEigenvector(c.t.d, c.t.e, c.t.n, values[k]);
        expect(residual(c.t, values[k], x), `${c.name} residual ${k}`).toBeLessThanOrEqual(1e-13 * norm);
        let s = 0;
        for (let i = 0; i < c.t.n; i++) s += x[i] * x[i];
        expectClose(s, 1, 1e-14, `${c.name} norm ${k}`);
      }
    });
  });

  it('returns [1] for a 1 x 1 matrix', () => {
    expect([...tridiagonalEigenvector([3], [], 1, 3)]).toEqual([1]);
  });
});
