/**
 * Eigenvector of a real symmetric tridiagonal matrix for a known eigenvalue, by inverse
 * iteration (Wilkinson, "The Algebraic Eigenvalue Problem", 1965, ch. 9; the LAPACK routine
 * dstein follows the same idea):
 *
 *     (T - lambda I) x_{k+1} = x_k,   x normalised to unit 2-norm,
 *
 * with the partially pivoted solver of src/linalg/tridiagonal-solve.ts. Cost O(n) per
 * iteration; three iterations reach machine precision when lambda is accurate and separated
 * from the other eigenvalues by more than ~1e-8 ||T|| (true for transmon levels). Clustered
 * eigenvalues would need re-orthogonalisation, which this kernel does not do.
 * The sign is left as it comes out; callers fix their own sign convention.
 */
import { tridiagonalSolve } from './tridiagonal-solve.js';

export function tridiagonalEigenvector(
  d: ArrayLike<number>,
  e: ArrayLike<number>,
  n: number,
  lambda: number,
  out: Float64Array = new Float64Array(n),
  work: Float64Array = new Float64Array(5 * n),
): Float64Array {
  if (!(n >= 1) || out.length < n || work.length < 5 * n) throw new RangeError(`tridiagonalEigenvector: bad sizes (n=${n})`);
  if (n === 1) {
    out[0] = 1;
    return out;
  }
  const x = out;
  for (let i = 0; i < n; i++) x[i] = 1 / Math.sqrt(n);
  for (let it = 0; it < 3; it++) {
    tridiagonalSolve(d, e, lambda, x, x, 0, n, work);
    let s = 0;
    for (let i = 0; i < n; i++) s += x[i] * x[i];
    s = 1 / Math.sqrt(s);
    for (let i = 0; i < n; i++) x[i] *= s;
  }
  return x;
}
