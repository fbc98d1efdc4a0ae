/**
 * All eigenvalues (no vectors) of a dense real symmetric matrix: Householder reduction to
 * tridiagonal form (./symmetric-tridiagonal-reduction.ts) followed by implicit QL
 * (./tridiagonal-eigenvalues.ts). This is the textbook route (Golub and Van Loan, sec. 8.3;
 * EISPACK tred1 + tql1) and costs about 4/3 n^3 + 30 n^2 flops, several times less than
 * Jacobi with vectors; used where only energies are needed (static ZZ, dressed levels).
 *
 * Accuracy: a few ulp of ||A|| per eigenvalue. Output ascending in `out` (length >= n).
 * `scratch` (optional, reused across calls of the same n) avoids allocation in sweeps.
 */
import { symmetricTridiagonalReduction } from './symmetric-tridiagonal-reduction.js';
import { qlImplicit } from './tridiagonal-eigenvalues.js';

export interface SymmetricEigenvaluesScratch {
  n: number;
  d: Float64Array;
  e: Float64Array;
  work: Float64Array;
}

export function symmetricEigenvaluesScratch(n: number): SymmetricEigenvaluesScratch {
  return { n, d: new Float64Array(n), e: new Float64Array(n), work: new Float64Array(n * n + 2 * n) };
}

export function symmetricEigenvalues(
  a: ArrayLike<number>,
  n: number,
  out: Float64Array = new Float64Array(n),
  scratch: SymmetricEigenvaluesScratch = symmetricEigenvaluesScratch(n),
): Float64Array {
  if (!(n >= 1) || a.length < n * n || out.length < n) throw new RangeError(`symmetricEigenvalues: bad sizes (n=${n})`);
  if (scratch.n !== n) throw new RangeError(`symmetricEigenvalues: scratch is for n=${scratch.n}, not ${n}`);
  const { d, e, work } = scratch;
  symmetricTridiagonalReduction(a, n, d, e, work);
  e[n - 1] = 0;
  qlImplicit(d, e, n);
  // Insertion sort (QL leaves the values nearly ordered).
  for (let i = 0; i < n; i++) out[i] = d[i];
  for (let i = 1; i < n; i++) {
    const x = out[i];
    let j = i - 1;
    while (j >= 0 && out[j] > x) {
      out[j + 1] = out[j];
      j--;
    }
    out[j + 1] = x;
  }
  return out;
}
