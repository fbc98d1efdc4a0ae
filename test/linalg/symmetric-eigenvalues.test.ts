/**
 * symmetricEigenvalues (Householder + implicit QL) against numpy.linalg.eigh (LAPACK, live
 * through test/reference/linalg_eigen.py); the Householder reduction keeps the trace and the
 * Frobenius norm (orthogonal similarity) and its tridiagonal matrix has SciPy's eigenvalues.
 */
import { describe, expect, it } from 'vitest';
import { symmetricEigenvalues, symmetricEigenvaluesScratch } from '../../src/linalg/symmetric-eigenvalues.js';
import { symmetricTridiagonalReduction } from '../../src/linalg/symmetric-tridiagonal-reduction.js';
import { Random } from '../../src/util/random.js';
import { expectAllClose, expectClose } from '../support/close.js';
import { randomSymmetric } from '../support/matrices.js';
import { runPython } from '../support/python.js';

const rng = new Random(8080);
const cases: { name: string; n: number; a: Float64Array }[] = [];
for (const n of [1, 2, 3, 4, 9, 18, 32, 50]) cases.push({ name: `random n=${n}`, n, a: randomSymmetric(rng, n) });
{
  // Already tridiagonal / diagonal / with zero columns: reflections must be skipped correctly.
  const n = 7;
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) a[i * n + i] = i * 1.5 - 3;
  a[0 * n + 1] = a[1 * n + 0] = 0.3;
  a[4 * n + 6] = a[6 * n + 4] = -0.7;
  cases.push({ name: 'sparse with zero sub-columns', n, a });
}
{
  // Two-transmon parity sector: diagonal spread over tens of GHz, MHz couplings.
  const n = 18;
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) a[i * n + i] = 5 * i + rng.between(-0.3, 0.3);
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j < n; j++) {
      const x = rng.between(-0.01, 0.01);
      a[i * n + j] = x;
      a[j * n + i] = x;
    }
  cases.push({ name: 'weakly coupled ladder n=18', n, a });
}

const reference = runPython<{ results: { values: number[] }[] }>('linalg_eigen.py', {
  problems: cases.map((c) => ({ kind: 'symmetric', n: c.n, a: [...c.a] })),
}).results;

describe('symmetricEigenvalues(a, n)', () => {
  it('matches numpy.linalg.eigh to 1e-12 relative', () => {
    cases.forEach((c, i) => expectAllClose(symmetricEigenvalues(c.a, c.n), reference[i].values, 1e-12, c.name));
  });

  it('reuses a scratch buffer across calls with identical results', () => {
    const c = cases.find((x) => x.n === 18)!;
    const s = symmetricEigenvaluesScratch(18);
    const first = symmetricEigenvalues(c.a, 18, undefined, s).slice();
    const second = symmetricEigenvalues(c.a, 18, undefined, s);
    expect([...second]).toEqual([...first]);
  });

  it('rejects a scratch of the wrong size', () => {
    expect(() => symmetricEigenvalues(new Float64Array(9), 3, undefined, symmetricEigenvaluesScratch(4))).toThrow(RangeError);
  });
});

describe('symmetricTridiagonalReduction(a, n)', () => {
  it('keeps the trace and the Frobenius norm to 1e-13 relative (orthogonal similarity)', () => {
    for (const c of cases) {
      const { d, e } = symmetricTridiagonalReduction(c.a, c.n);
      let tr = 0;
      let fro = 0;
      let trT = 0;
      let froT = 0;
      for (let i = 0; i < c.n; i++) {
        tr += c.a[i * c.n + i];
        trT += d[i];
        froT += d[i] * d[i] + (i < c.n - 1 ? 2 * e[i] * e[i] : 0);
        for (let j = 0; j < c.n; j++) fro += c.a[i * c.n + j] ** 2;
      }
      expectClose(trT, tr, 1e-13 * c.n, `${c.name} trace`);
      expectClose(froT, fro, 1e-13 * c.n, `${c.name} Frobenius`);
    }
  });
});
