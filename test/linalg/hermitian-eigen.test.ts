/**
 * hermitianEigen (complex Jacobi) against numpy.linalg.eigvalsh on complex Hermitian matrices
 * (LAPACK zheevd, live through test/reference/linalg_eigen.py) and mathjs eigs, and by the
 * invariants A V = V D, V^H V = I; the warm start must give the same decomposition.
 */
import { describe, expect, it } from 'vitest';
import { complex, eigs } from 'mathjs';
import { hermitianEigen } from '../../src/linalg/hermitian-eigen.js';
import { Random } from '../../src/util/random.js';
import { expectAllClose } from '../support/close.js';
import { randomHermitian } from '../support/matrices.js';
import { runPython } from '../support/python.js';

const rng = new Random(2718);
const cases: { name: string; n: number; re: Float64Array; im: Float64Array }[] = [];
for (const n of [1, 2, 4, 9, 16, 30]) cases.push({ name: `random n=${n}`, n, ...randomHermitian(rng, n) });
{
  // Real symmetric as a Hermitian matrix (im = 0), with a repeated eigenvalue.
  const n = 6;
  const re = new Float64Array(n * n);
  const im = new Float64Array(n * n);
  for (let i = 0; i < n; i++) re[i * n + i] = i < 3 ? 2 : 5;
  re[0 * n + 1] = re[1 * n + 0] = 0; // keep the degeneracy
  im[3 * n + 4] = 0.5;
  im[4 * n + 3] = -0.5;
  cases.push({ name: 'degenerate with a purely imaginary coupling', n, re, im });
}

const reference = runPython<{ results: { values: number[] }[] }>('linalg_eigen.py', {
  problems: cases.map((c) => ({ kind: 'hermitian', n: c.n, re: [...c.re], im: [...c.im] })),
}).results;

function invariants(c: (typeof cases)[number], e: ReturnType<typeof hermitianEigen>): { res: number; orth: number } {
  const { n, re, im } = c;
  const { values, vectorsRe: vr, vectorsIm: vi } = e;
  let res = 0;
  let orth = 0;
  for (let i = 0; i < n; i++)
    for (let k = 0; k < n; k++) {
      let xr = 0;
      let xi = 0;
      for (let j = 0; j < n; j++) {
        xr += re[i * n + j] * vr[j * n + k] - im[i * n + j] * vi[j * n + k];
        xi += re[i * n + j] * vi[j * n + k] + im[i * n + j] * vr[j * n + k];
      }
      res = Math.max(res, Math.abs(xr - vr[i * n + k] * values[k]), Math.abs(xi - vi[i * n + k] * values[k]));
      let gr = 0;
      let gi = 0;
      for (let j = 0; j < n; j++) {
        gr += vr[j * n + i] * vr[j * n + k] + vi[j * n + i] * vi[j * n + k];
        gi += vr[j * n + i] * vi[j * n + k] - vi[j * n + i] * vr[j * n + k];
      }
      orth = Math.max(orth, Math.abs(gr - (i === k ? 1 : 0)), Math.abs(gi));
    }
  return { res, orth };
}

describe('hermitianEigen(re, im, n)', () => {
  it('eigenvalues match numpy.linalg.eigvalsh (complex) to 1e-12 relative', () => {
    cases.forEach((c, i) => expectAllClose(hermitianEigen(c.re, c.im, c.n).values, reference[i].values, 1e-12, c.name));
  });

  it('eigenvalues match mathjs eigs (complex) to 1e-10 relative', () => {
    for (const c of cases.filter((x) => x.n <= 9)) {
      const rows = [];
      for (let i = 0; i < c.n; i++) {
        const row = [];
        for (let j = 0; j < c.n; j++) row.push(complex(c.re[i * c.n + j], c.im[i * c.n + j]));
        rows.push(row);
      }
      const ref = (eigs(rows).values as unknown[]).map((v) => (typeof v === 'number' ? v : (v as { re: number }).re)).sort((x, y) => x - y);
      expectAllClose(hermitianEigen(c.re, c.im, c.n).values, ref, 1e-10, `${c.name} vs mathjs`);
    }
  });

  it('satisfies A V = V D and V^H V = I to 1e-13 n', () => {
    for (const c of cases) {
      const { res, orth } = invariants(c, hermitianEigen(c.re, c.im, c.n));
      expect(res, `${c.name} residual`).toBeLessThanOrEqual(1e-13 * c.n * 4);
      expect(orth, `${c.name} orthogonality`).toBeLessThanOrEqual(1e-13 * c.n);
    }
  });

  it('a warm start from the eigenvectors of a nearby matrix gives the same eigenvalues and valid vectors', () => {
    const c = cases.find((x) => x.n === 16)!;
    const first = hermitianEigen(c.re, c.im, c.n);
    const re2 = c.re.slice();
    const im2 = c.im.slice();
    const r = new Random(1);
    for (let i = 0; i < c.n; i++)
      for (let j = i; j < c.n; j++) {
        const dx = 1e-3 * r.between(-1, 1);
        re2[i * c.n + j] += dx;
        if (j !== i) re2[j * c.n + i] += dx;
      }
    const cold = hermitianEigen(re2, im2, c.n);
    const warm = hermitianEigen(re2, im2, c.n, { start: { re: first.vectorsRe, im: first.vectorsIm } });
    expectAllClose(warm.values, cold.values, 1e-12, 'warm vs cold');
    const { res, orth } = invariants({ ...c, re: re2, im: im2 }, warm);
    expect(res).toBeLessThanOrEqual(1e-13 * c.n * 4);
    expect(orth).toBeLessThanOrEqual(1e-13 * c.n);
  });
});
