/**
 * Householder reduction of a dense real symmetric matrix to tridiagonal form, without
 * accumulating the transformation (Golub and Van Loan, Matrix Computations, 4th ed., Alg. 8.3.1;
 * the EISPACK routine tred1 does the same).
 *
 *     Q^T A Q = tridiag(e, d, e),   Q = H_0 H_1 ... H_{n-3},  H_k = I - beta_k v_k v_k^T.
 *
 * A is n x n, row-major, only read; `work` (length >= n*n + 2n) holds the rotated copy.
 * Cost 4/3 n^3 flops. Eigenvalues of the result equal those of A to a few ulp of ||A||
 * (Householder reflections are backward stable). Returns { d, e } (lengths n and n - 1).
 */
export function symmetricTridiagonalReduction(
  a: ArrayLike<number>,
  n: number,
  d: Float64Array = new Float64Array(n),
  e: Float64Array = new Float64Array(Math.max(n - 1, 1)),
  work: Float64Array = new Float64Array(n * n + 2 * n),
): { d: Float64Array; e: Float64Array } {
  if (!(n >= 1) || a.length < n * n || d.length < n || e.length < n - 1 || work.length < n * n + 2 * n) {
    throw new RangeError(`symmetricTridiagonalReduction: bad sizes (n=${n})`);
  }
  const m = work;
  for (let i = 0; i < n * n; i++) m[i] = a[i];
  const v = work.subarray(n * n, n * n + n);
  const p = work.subarray(n * n + n, n * n + 2 * n);
  for (let k = 0; k < n - 2; k++) {
    // x = m[k+1..n-1, k]
    let sigma = 0;
    for (let i = k + 2; i < n; i++) sigma += m[i * n + k] * m[i * n + k];
    const x0 = m[(k + 1) * n + k];
    if (sigma === 0) {
      e[k] = x0;
      continue;
    }
    const alpha = Math.sqrt(x0 * x0 + sigma);
    // v = x - (-sign(x0) alpha) e1 = x + sign(x0) alpha e1, stable choice.
    const s = x0 >= 0 ? 1 : -1;
    v[k + 1] = x0 + s * alpha;
    for (let i = k + 2; i < n; i++) v[i] = m[i * n + k];
    const vtv = v[k + 1] * v[k + 1] + sigma;
    const beta = 2 / vtv;
    e[k] = -s * alpha;
    // p = beta A' v on the trailing block rows/cols k+1..n-1.
    let pv = 0;
    for (let i = k + 1; i < n; i++) {
      let acc = 0;
      const row = i * n;
      for (let j = k + 1; j < n; j++) acc += m[row + j] * v[j];
      p[i] = beta * acc;
      pv += p[i] * v[i];
    }
    // w = p - (beta p^T v / 2) v  (stored in p)
    const c = 0.5 * beta * pv;
    for (let i = k + 1; i < n; i++) p[i] -= c * v[i];
    // A' -= v w^T + w v^T
    for (let i = k + 1; i < n; i++) {
      const row = i * n;
      const vi = v[i];
      const wi = p[i];
      for (let j = k + 1; j <= i; j++) {
        const x = m[row + j] - vi * p[j] - wi * v[j];
        m[row + j] = x;
        m[j * n + i] = x;
      }
    }
  }
  for (let i = 0; i < n; i++) d[i] = m[i * n + i];
  if (n >= 2) e[n - 2] = m[(n - 1) * n + n - 2];
  return { d, e };
}
