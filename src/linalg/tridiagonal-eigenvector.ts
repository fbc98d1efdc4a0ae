/**
 * Eigenvector of a real symmetric tridiagonal matrix for a known eigenvalue, by inverse
 * iteration with a partially pivoted tridiagonal LU factorisation (Wilkinson, "The Algebraic
 * Eigenvalue Problem", 1965, ch. 9; the LAPACK routine dstein follows the same idea).
 *
 *     (T - lambda I) x_{k+1} = x_k,   x normalised to unit 2-norm.
 *
 * Cost O(n) per iteration; two iterations reach machine precision when lambda is accurate and
 * separated from the other eigenvalues by more than ~1e-8 ||T|| (true for transmon levels).
 * Clustered eigenvalues need re-orthogonalisation, which this kernel does not do.
 * The sign is left as it comes out; callers fix their own sign convention.
 */
export function tridiagonalEigenvector(
  d: ArrayLike<number>,
  e: ArrayLike<number>,
  n: number,
  lambda: number,
  out: Float64Array = new Float64Array(n),
  work: Float64Array = new Float64Array(5 * n),
): Float64Array {
  if (!(n >= 1) || out.length < n || work.length < 5 * n) {
    throw new RangeError(`tridiagonalEigenvector: bad sizes (n=${n})`);
  }
  if (n === 1) {
    out[0] = 1;
    return out;
  }
  // Factor P (T - lambda I) = L U with U upper triangular with two superdiagonals (u0, u1, u2)
  // and L unit lower bidiagonal (multipliers ml), pivots recorded in piv (0 or 1 per step).
  const u0 = work.subarray(0, n);
  const u1 = work.subarray(n, 2 * n);
  const u2 = work.subarray(2 * n, 3 * n);
  const ml = work.subarray(3 * n, 4 * n);
  const piv = work.subarray(4 * n, 5 * n);
  // Perturb lambda slightly so T - lambda I is not exactly singular.
  let norm = 0;
  for (let i = 0; i < n; i++) norm = Math.max(norm, Math.abs(d[i]) + (i > 0 ? Math.abs(e[i - 1]) : 0) + (i < n - 1 ? Math.abs(e[i]) : 0));
  const tiny = Number.EPSILON * norm;
  let diag = d[0] - lambda;
  let sup = e[0];
  for (let i = 0; i < n - 1; i++) {
    const sub = e[i];
    const nextDiag = d[i + 1] - lambda;
    const nextSup = i + 1 < n - 1 ? e[i + 1] : 0;
    if (Math.abs(diag) >= Math.abs(sub)) {
      // No interchange.
      piv[i] = 0;
      const pivot = diag === 0 ? tiny : diag;
      const m = sub / pivot;
      ml[i] = m;
      u0[i] = pivot;
      u1[i] = sup;
      u2[i] = 0;
      diag = nextDiag - m * sup;
      sup = nextSup;
    } else {
      // Interchange rows i and i+1.
      piv[i] = 1;
      const m = diag / sub;
      ml[i] = m;
      u0[i] = sub;
      u1[i] = nextDiag;
      u2[i] = nextSup;
      diag = sup - m * nextDiag;
      sup = -m * nextSup;
    }
  }
  u0[n - 1] = diag === 0 ? tiny : diag;
  for (let i = 0; i < n; i++) if (Math.abs(u0[i]) < tiny) u0[i] = u0[i] < 0 ? -tiny : tiny;

  const x = out;
  for (let i = 0; i < n; i++) x[i] = 1 / Math.sqrt(n);
  for (let it = 0; it < 3; it++) {
    // Forward: apply P and L^-1.
    for (let i = 0; i < n - 1; i++) {
      if (piv[i] === 1) {
        const t = x[i];
        x[i] = x[i + 1];
        x[i + 1] = t - ml[i] * x[i];
      } else {
        x[i + 1] -= ml[i] * x[i];
      }
    }
    // Back substitution with U.
    x[n - 1] /= u0[n - 1];
    if (n >= 2) x[n - 2] = (x[n - 2] - u1[n - 2] * x[n - 1]) / u0[n - 2];
    for (let i = n - 3; i >= 0; i--) x[i] = (x[i] - u1[i] * x[i + 1] - u2[i] * x[i + 2]) / u0[i];
    let s = 0;
    for (let i = 0; i < n; i++) s += x[i] * x[i];
    s = 1 / Math.sqrt(s);
    for (let i = 0; i < n; i++) x[i] *= s;
  }
  return x;
}
