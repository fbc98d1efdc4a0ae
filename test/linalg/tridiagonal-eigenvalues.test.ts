/**
 * tridiagonalEigenvalues (implicit QL) against SciPy's LAPACK tridiagonal solver
 * (scipy.linalg.eigh_tridiagonal, run live through test/reference/linalg_eigen.py) and against
 * mathjs eigs on the same matrices (dense form).
 */
import { describe, expect, it } from 'vitest';
import { eigs } from 'mathjs';
import { tridiagonalEigenvalues } from '../../src/linalg/tridiagonal-eigenvalues.js';
import { Random } from '../../src/util/random.js';
import { expectAllClose } from '../support/close.js';
import { randomTridiagonal, transmonTridiagonal, tridiagonalToDense, wilkinsonPlus, type Tridiagonal } from '../support/matrices.js';
import { runPython } from '../support/python.js';

const rng = new Random(20240501);
const cases: { name: string; t: Tridiagonal }[] = [];
for (const n of [1, 2, 3, 5, 10, 20, 51, 100]) cases.push({ name: `random n=${n}`, t: randomTridiagonal(rng, n) });
for (const n of [7, 30]) cases.push({ name: `random scale 50 n=${n}`, t: randomTridiagonal(rng, n, 50) });
cases.push({ name: 'transmon E_C=0.25 E_J=12.5 N=25', t: transmonTridiagonal(0.25, 12.5, 25) });
cases.push({ name: 'transmon n_g=0.3 N=20', t: transmonTridiagonal(0.2, 10, 20, 0.3) });
cases.push({ name: 'Wilkinson W21+', t: wilkinsonPlus(21) });
{
  const t = randomTridiagonal(rng, 12);
  t.e[4] = 0;
  t.e[8] = 0;
  cases.push({ name: 'split at two zero off-diagonals', t });
}
{
  const t = randomTridiagonal(rng, 9);
  t.e.fill(0);
  cases.push({ name: 'diagonal', t });
}
{
  const t = randomTridiagonal(rng, 10);
  for (let i = 0; i < 10; i++) t.d[i] = 3;
  t.e.fill(1e-9);
  cases.push({ name: 'nearly degenerate cluster', t });
}

const reference = runPython<{ results: { values: number[] }[] }>('linalg_eigen.py', {
  problems: cases.map((c) => ({ kind: 'tridiagonal', d: [...c.t.d], e: [...c.t.e] })),
}).results;

describe('tridiagonalEigenvalues(d, e, n)', () => {
  it('matches scipy.linalg.eigh_tridiagonal (LAPACK) to 1e-12 relative on seeded random and structured matrices', () => {
    cases.forEach((c, i) => {
      const w = tridiagonalEigenvalues(c.t.d, c.t.e, c.t.n);
      // Eigenvalues of a symmetric matrix are perfectly conditioned: error <= few ulp of ||T||.
      expectAllClose(w, reference[i].values, 1e-12, c.name);
    });
  });

  it('matches mathjs eigs on the dense form to 1e-10 relative', () => {
    for (const c of cases.filter((x) => x.t.n <= 30)) {
      const dense = tridiagonalToDense(c.t);
      const rows: number[][] = [];
      for (let i = 0; i < c.t.n; i++) rows.push([...dense.subarray(i * c.t.n, (i + 1) * c.t.n)]);
      const ref = (eigs(rows).values as number[]).slice().sort((a, b) => a - b);
      // mathjs eigs (Jacobi, its default precision) is itself accurate to ~1e-12 here.
      expectAllClose(tridiagonalEigenvalues(c.t.d, c.t.e, c.t.n), ref, 1e-10, `${c.name} vs mathjs`);
    }
  });

  it('returns ascending values and preserves the trace', () => {
    for (const c of cases) {
      const w = tridiagonalEigenvalues(c.t.d, c.t.e, c.t.n);
      let tr = 0;
      let sum = 0;
      for (let i = 0; i < c.t.n; i++) {
        tr += c.t.d[i];
        sum += w[i];
        if (i > 0) expect(w[i]).toBeGreaterThanOrEqual(w[i - 1]);
      }
      expect(Math.abs(tr - sum)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(tr)) * c.t.n);
    }
  });

  it('does not modify its inputs and writes into a caller buffer', () => {
    const t = randomTridiagonal(new Random(7), 8);
    const d0 = t.d.slice();
    const e0 = t.e.slice();
    const out = new Float64Array(8);
    const res = tridiagonalEigenvalues(t.d, t.e, 8, out);
    expect(res).toBe(out);
    expect([...t.d]).toEqual([...d0]);
    expect([...t.e]).toEqual([...e0]);
  });

  it('rejects bad sizes with a RangeError', () => {
    expect(() => tridiagonalEigenvalues(new Float64Array(3), new Float64Array(1), 3)).toThrow(RangeError);
    expect(() => tridiagonalEigenvalues(new Float64Array(0), new Float64Array(0), 0)).toThrow(RangeError);
  });
});
