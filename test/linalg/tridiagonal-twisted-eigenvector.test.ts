/**
 * tridiagonalTwistedEigenvector (twisted factorisation, Dhillon and Parlett 2004) against
 * SciPy's eigenvectors (scipy.linalg.eigh_tridiagonal via test/reference/linalg_eigen.py) up to
 * sign, and by the invariants |T x - lambda x| small, |x| = 1, on random and transmon matrices.
 */
import { describe, expect, it } from 'vitest';
import { tridiagonalTwistedEigenvector } from '../../src/linalg/tridiagonal-twisted-eigenvector.js';
import { Random } from '../../src/util/random.js';
import { expectClose } from '../support/close.js';
import { randomTridiagonal, transmonTridiagonal, type Tridiagonal } from '../support/matrices.js';
import { runPython } from '../support/python.js';

const rng = new Random(777);
const cases: { name: string; t: Tridiagonal }[] = [];
for (const n of [2, 3, 8, 21, 40]) cases.push({ name: `random n=${n}`, t: randomTridiagonal(rng, n) });
cases.push({ name: 'transmon E_J/E_C=90 N=20', t: transmonTridiagonal(0.21, 19, 20) });
cases.push({ name: 'transmon E_J/E_C=5 N=12', t: transmonTridiagonal(0.3, 1.5, 12) });
{
  // Even parity block of a transmon: d = 4 E_C k^2, e_0 = -E_J/sqrt 2, e_k = -E_J/2.
  const n = 21;
  const d = new Float64Array(n);
  const e = new Float64Array(n - 1);
  for (let k = 0; k < n; k++) d[k] = 0.84 * k * k;
  e.fill(-7.5);
  e[0] = -15 / Math.SQRT2;
  cases.push({ name: 'transmon even parity block', t: { d, e, n } });
}

const reference = runPython<{ results: { values: number[]; vectors: number[] }[] }>('linalg_eigen.py', {
  problems: cases.map((c) => ({ kind: 'tridiagonal', d: [...c.t.d], e: [...c.t.e] })),
}).results;

describe('tridiagonalTwistedEigenvector(d, e, n, lambda)', () => {
  it('agrees with SciPy eigenvectors up to sign to 1e-10 + 100 eps ||T|| / gap', () => {
    cases.forEach((c, ci) => {
      const { values, vectors } = reference[ci];
      const n = c.t.n;
      const norm = Math.max(...values.map(Math.abs));
      for (let k = 0; k < n; k++) {
        const gap = Math.min(k > 0 ? values[k] - values[k - 1] : Infinity, k < n - 1 ? values[k + 1] - values[k] : Infinity);
        if (gap < 1e-6) continue;
        const x = tridiagonalTwistedEigenvector(c.t.d, c.t.e, n, values[k]);
        let dot = 0;
        for (let i = 0; i < n; i++) dot += x[i] * vectors[i * n + k];
        const sign = dot >= 0 ? 1 : -1;
        const rtol = 1e-10 + (100 * Number.EPSILON * norm) / gap;
        for (let i = 0; i < n; i++) expectClose(x[i], sign * vectors[i * n + k], rtol, `${c.name} vector ${k}[${i}]`);
      }
    });
  });

  it('has residual |T x - lambda x|_inf <= 1e-13 ||T|| and unit norm for well-separated eigenvalues', () => {
    cases.forEach((c, ci) => {
      const { values } = reference[ci];
      const n = c.t.n;
      const norm = Math.max(...values.map(Math.abs), 1);
      for (let k = 0; k < n; k++) {
        const gap = Math.min(k > 0 ? values[k] - values[k - 1] : Infinity, k < n - 1 ? values[k + 1] - values[k] : Infinity);
        if (gap < 1e-6 * norm) continue;
        const x = tridiagonalTwistedEigenvector(c.t.d, c.t.e, n, values[k]);
        let res = 0;
        let s = 0;
        for (let i = 0; i < n; i++) {
          let y = (c.t.d[i] - values[k]) * x[i];
          if (i > 0) y += c.t.e[i - 1] * x[i - 1];
          if (i < n - 1) y += c.t.e[i] * x[i + 1];
          res = Math.max(res, Math.abs(y));
          s += x[i] * x[i];
        }
        expect(res, `${c.name} residual ${k}`).toBeLessThanOrEqual(1e-13 * norm);
        expectClose(s, 1, 1e-14, `${c.name} norm ${k}`);
      }
    });
  });

  it('handles n = 1 and an exactly zero off-diagonal', () => {
    expect([...tridiagonalTwistedEigenvector([2], [], 1, 2)]).toEqual([1]);
    const x = tridiagonalTwistedEigenvector([1, 3, 5], [0, 0.5], 3, 1);
    expectClose(Math.abs(x[0]), 1, 1e-15, 'decoupled first component');
  });
});
