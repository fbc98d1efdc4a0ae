/**
 * symmetricEigen (cyclic Jacobi) against numpy.linalg.eigh (LAPACK, live through
 * test/reference/linalg_eigen.py) and mathjs eigs, and by the invariants A V = V D, V^T V = I
 * (the checks ml-matrix uses for its decompositions).
 */
import { describe, expect, it } from 'vitest';
import { eigs } from 'mathjs';
import { symmetricEigen } from '../../src/linalg/symmetric-eigen.js';
import { Random } from '../../src/util/random.js';
import { expectAllClose } from '../support/close.js';
import { eigenResiduals, identityPlusRankOne, normInf, randomSymmetric } from '../support/matrices.js';
import { runPython } from '../support/python.js';

const rng = new Random(31337);
const cases: { name: string; n: number; a: Float64Array }[] = [];
for (const n of [1, 2, 3, 8, 18, 36]) cases.push({ name: `random n=${n}`, n, a: randomSymmetric(rng, n) });
cases.push({ name: 'random scale 100 n=12', n: 12, a: randomSymmetric(rng, 12, 100) });
cases.push({ name: 'identity plus rank one (degenerate)', n: 10, a: identityPlusRankOne(rng, 10) });
{
  // Coupled-transmon-like: diagonal spread over tens of GHz, couplings of a few MHz.
  const n = 18;
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) a[i * n + i] = 4.7 * i + rng.between(-0.2, 0.2);
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j < n; j++) {
      const x = (i + j) % 2 === 1 ? rng.between(-0.02, 0.02) : 0;
      a[i * n + j] = x;
      a[j * n + i] = x;
    }
  cases.push({ name: 'weakly coupled ladder n=18', n, a });
}

const reference = runPython<{ results: { values: number[] }[] }>('linalg_eigen.py', {
  problems: cases.map((c) => ({ kind: 'symmetric', n: c.n, a: [...c.a] })),
}).results;

describe('symmetricEigen(a, n)', () => {
  it('eigenvalues match numpy.linalg.eigh to 1e-12 relative', () => {
    cases.forEach((c, i) => expectAllClose(symmetricEigen(c.a, c.n).values, reference[i].values, 1e-12, c.name));
  });

  it('eigenvalues match mathjs eigs to 1e-10 relative', () => {
    for (const c of cases.filter((x) => x.n <= 18)) {
      const rows: number[][] = [];
      for (let i = 0; i < c.n; i++) rows.push([...c.a.subarray(i * c.n, (i + 1) * c.n)]);
      const ref = (eigs(rows).values as number[]).slice().sort((x, y) => x - y);
      expectAllClose(symmetricEigen(c.a, c.n).values, ref, 1e-10, `${c.name} vs mathjs`);
    }
  });

  it('satisfies A V = V D and V^T V = I to 1e-13 n ||A||', () => {
    for (const c of cases) {
      const { n, a } = c;
      const { values, vectors } = symmetricEigen(a, n);
      const scale = Math.max(1, normInf(a, n));
      const { residual, orthogonality } = eigenResiduals(a, n, values, vectors);
      expect(residual, `${c.name} residual`).toBeLessThanOrEqual(1e-13 * n * scale);
      expect(orthogonality, `${c.name} orthogonality`).toBeLessThanOrEqual(1e-13 * n);
    }
  });

  it('writes into a caller-supplied out and scratch and leaves the input untouched', () => {
    const n = 6;
    const a = randomSymmetric(new Random(5), n);
    const copy = a.slice();
    const out = { values: new Float64Array(n), vectors: new Float64Array(n * n) };
    const res = symmetricEigen(a, n, out, new Float64Array(n * n));
    expect(res.values).toBe(out.values);
    expect(res.vectors).toBe(out.vectors);
    expect([...a]).toEqual([...copy]);
  });

  it('rejects bad sizes with a RangeError', () => {
    expect(() => symmetricEigen(new Float64Array(3), 2)).toThrow(RangeError);
  });
});
