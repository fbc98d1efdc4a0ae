/**
 * symmetricEigenQL (Householder with accumulation + implicit QL with vectors, EISPACK tred2/tql2)
 * against numpy.linalg.eigh (LAPACK, live through test/reference/linalg_eigen.py): eigenvalues,
 * eigenvectors up to sign where the eigenvalue is simple, the spanned subspace where it is not,
 * and the invariants A V = V D, V^T V = I.
 */
import { describe, expect, it } from 'vitest';
import { symmetricEigenQL, symmetricEigenQLScratch } from '../../src/linalg/symmetric-eigen-ql.js';
import { Random } from '../../src/util/random.js';
import { expectAllClose } from '../support/close.js';
import { eigenResiduals, identityPlusRankOne, normInf, randomSymmetric } from '../support/matrices.js';
import { runPython } from '../support/python.js';

const rng = new Random(4242);
const cases: { name: string; n: number; a: Float64Array }[] = [];
for (const n of [1, 2, 3, 5, 8, 17, 36, 64]) cases.push({ name: `random n=${n}`, n, a: randomSymmetric(rng, n) });
cases.push({ name: 'random scale 100 n=12', n: 12, a: randomSymmetric(rng, 12, 100) });
cases.push({ name: 'identity plus rank one (degenerate)', n: 10, a: identityPlusRankOne(rng, 10) });
{
  // Already diagonal with repeats and a zero block: every reflection is skipped.
  const n = 7;
  const a = new Float64Array(n * n);
  [3, -1, 3, 0, 0, 2.5, -1].forEach((x, i) => (a[i * n + i] = x));
  cases.push({ name: 'diagonal with repeated values', n, a });
}
{
  // Three-transmon parity sector: diagonal spread over tens of GHz with near-degenerate
  // manifolds, couplings of tens of MHz between states differing by one excitation swap.
  const n = 50;
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) a[i * n + i] = 4.9 * Math.floor(i / 8) + rng.between(-0.4, 0.4);
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j < n; j++) {
      const x = (i + j) % 3 === 0 ? rng.between(-0.03, 0.03) : 0;
      a[i * n + j] = x;
      a[j * n + i] = x;
    }
  cases.push({ name: 'three-transmon-like sector n=50', n, a });
}

const reference = runPython<{ results: { values: number[]; vectors: number[] }[] }>('linalg_eigen.py', {
  problems: cases.map((c) => ({ kind: 'symmetric', n: c.n, a: [...c.a] })),
}).results;

describe('symmetricEigenQL(a, n)', () => {
  it('eigenvalues match numpy.linalg.eigh to 1e-12 relative', () => {
    cases.forEach((c, i) => expectAllClose(symmetricEigenQL(c.a, c.n).values, reference[i].values, 1e-12, c.name));
  });

  it('eigenvectors of simple eigenvalues match numpy.linalg.eigh up to sign to 1e-9; clusters span the same subspace', () => {
    cases.forEach((c, ci) => {
      const { n } = c;
      const { values, vectors } = symmetricEigenQL(c.a, n);
      const ref = reference[ci];
      const scale = Math.max(1, normInf(c.a, n));
      for (let k = 0; k < n; k++) {
        // Cluster of eigenvalues within 1e-8 ||A|| of values[k] (a subspace, not single vectors).
        const cluster: number[] = [];
        for (let j = 0; j < n; j++) if (Math.abs(ref.values[j] - values[k]) <= 1e-8 * scale) cluster.push(j);
        // Norm of the projection of our vector k onto the reference cluster's span: 1.
        let proj = 0;
        for (const j of cluster) {
          let dot = 0;
          for (let i = 0; i < n; i++) dot += vectors[i * n + k] * ref.vectors[i * n + j];
          proj += dot * dot;
        }
        expect(Math.abs(Math.sqrt(proj) - 1), `${c.name} vector ${k} (cluster ${cluster.length})`).toBeLessThanOrEqual(1e-9);
      }
    });
  });

  it('satisfies A V = V D and V^T V = I to 1e-13 n ||A||', () => {
    for (const c of cases) {
      const { n, a } = c;
      const { values, vectors } = symmetricEigenQL(a, n);
      const scale = Math.max(1, normInf(a, n));
      const { residual, orthogonality } = eigenResiduals(a, n, values, vectors);
      expect(residual, `${c.name} residual`).toBeLessThanOrEqual(1e-13 * n * scale);
      expect(orthogonality, `${c.name} orthogonality`).toBeLessThanOrEqual(1e-13 * n);
    }
  });

  it('returns ascending values, writes into caller buffers, reuses scratch with identical results, leaves the input untouched', () => {
    const c = cases.find((x) => x.n === 36)!;
    const copy = c.a.slice();
    const out = { values: new Float64Array(36), vectors: new Float64Array(36 * 36) };
    const s = symmetricEigenQLScratch(36);
    const first = symmetricEigenQL(c.a, 36, out, s);
    expect(first.values).toBe(out.values);
    expect(first.vectors).toBe(out.vectors);
    for (let k = 1; k < 36; k++) expect(first.values[k]).toBeGreaterThanOrEqual(first.values[k - 1]);
    const v1 = first.vectors.slice();
    const second = symmetricEigenQL(c.a, 36, undefined, s);
    expect([...second.vectors]).toEqual([...v1]);
    expect([...c.a]).toEqual([...copy]);
  });

  it('rejects bad sizes with a RangeError', () => {
    expect(() => symmetricEigenQL(new Float64Array(3), 2)).toThrow(RangeError);
  });
});
