/**
 * tridiagonalLowestEigenvalues (Newton from guesses + Sturm check + bisection) against SciPy's
 * LAPACK solver for selected eigenvalues (scipy.linalg.eigh_tridiagonal(select='i'), live
 * through test/reference/linalg_eigen.py).
 */
import { describe, expect, it } from 'vitest';
import { sturmCount, tridiagonalLowestEigenvalues } from '../../src/linalg/tridiagonal-lowest-eigenvalues.js';
import { Random } from '../../src/util/random.js';
import { expectAllClose } from '../support/close.js';
import { randomTridiagonal, transmonTridiagonal, wilkinsonPlus, type Tridiagonal } from '../support/matrices.js';
import { runPython } from '../support/python.js';

const rng = new Random(99);
const cases: { name: string; t: Tridiagonal; k: number }[] = [];
for (const n of [1, 2, 6, 21, 60]) cases.push({ name: `random n=${n}`, t: randomTridiagonal(rng, n), k: Math.min(n, 5) });
cases.push({ name: 'transmon E_J/E_C=50', t: transmonTridiagonal(0.25, 12.5, 20), k: 8 });
cases.push({ name: 'transmon E_J/E_C=2 (charge regime)', t: transmonTridiagonal(1, 2, 20), k: 8 });
cases.push({ name: 'Wilkinson W21+ (close pairs)', t: wilkinsonPlus(21), k: 21 });
{
  const t = randomTridiagonal(rng, 15);
  t.e[6] = 0;
  cases.push({ name: 'split matrix', t, k: 10 });
}

const reference = runPython<{ results: { values: number[] }[] }>('linalg_eigen.py', {
  problems: cases.map((c) => ({ kind: 'tridiagonal-lowest', d: [...c.t.d], e: [...c.t.e], k: c.k })),
}).results;

describe('tridiagonalLowestEigenvalues(d, e, n, k, out, guesses)', () => {
  it('without guesses (bisection) matches eigh_tridiagonal(select="i") to 1e-12 relative', () => {
    cases.forEach((c, i) => expectAllClose(tridiagonalLowestEigenvalues(c.t.d, c.t.e, c.t.n, c.k), reference[i].values, 1e-12, c.name));
  });

  it('with good guesses (Newton) gives the same values to 1e-12 relative', () => {
    cases.forEach((c, i) => {
      const g = reference[i].values.map((x, j) => x + 1e-3 * (j % 2 === 0 ? 1 : -1));
      expectAllClose(tridiagonalLowestEigenvalues(c.t.d, c.t.e, c.t.n, c.k, undefined, g), reference[i].values, 1e-12, c.name);
    });
  });

  it('with misleading guesses (all at the top of the spectrum, or NaN) the Sturm check still finds the k lowest', () => {
    cases.forEach((c, i) => {
      const top = reference[i].values[c.k - 1];
      const bad = new Array<number>(c.k).fill(top);
      expectAllClose(tridiagonalLowestEigenvalues(c.t.d, c.t.e, c.t.n, c.k, undefined, bad), reference[i].values, 1e-12, `${c.name} (top guesses)`);
      const nan = new Array<number>(c.k).fill(NaN);
      expectAllClose(tridiagonalLowestEigenvalues(c.t.d, c.t.e, c.t.n, c.k, undefined, nan), reference[i].values, 1e-12, `${c.name} (NaN guesses)`);
    });
  });

  it('sturmCount(x) counts the eigenvalues below x', () => {
    cases.forEach((c, i) => {
      const w = reference[i].values;
      for (let j = 0; j < w.length - 1; j++) {
        if (w[j + 1] - w[j] < 1e-9) continue;
        expect(sturmCount(c.t.d, c.t.e, c.t.n, 0.5 * (w[j] + w[j + 1]), 1e-300), c.name).toBe(j + 1);
      }
    });
  });

  it('rejects k > n with a RangeError', () => {
    expect(() => tridiagonalLowestEigenvalues(new Float64Array(3), new Float64Array(2), 3, 4)).toThrow(RangeError);
  });
});
