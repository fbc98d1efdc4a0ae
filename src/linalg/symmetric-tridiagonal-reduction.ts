/**
 * Householder reduction of a dense real symmetric matrix to tridiagonal form, without
 * accumulating the transformation (Golub and Van Loan, Matrix Computations, 4th ed., Alg. 8.3.1;
 * the EISPACK routine tred1 does the same).
 *
 *     Q^T A Q = tridiag(e, d, e),   Q = H_0 H_1 ... H_{n-3},  H_k = I - beta_k v_k v_k^T.
 *
 * A is n x n, row-major, only read; `work` (length >= n*n + 2n) holds the rotated copy and two
 * vectors. The rank-2 update A' -= v w^T + w v^T is applied to full rows (contiguous memory,
 * twice the flops of a triangle but faster in JavaScript). Cost ~8/3 n^3 flops. Eigenvalues of
 * the result equal those of A to a few ulp of ||A|| (Householder reflections are backward
 * stable). Returns { d, e } (lengths n and n - 1).
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
  const nn = n * n;
  for (let i = 0; i < nn; i++) m[i] = a[i];
  const vOff = nn; // v at m[vOff + i]
  const pOff = nn + n; // p, then w, at m[pOff + i]
  for (let k = 0; k < n - 2; k++) {
    const k1 = k + 1;
    let sigma = 0;
    for (let i = k + 2; i < n; i++) {
      const x = m[i * n + k];
      sigma += x * x;
    }
    const x0 = m[k1 * n + k];
    if (sigma === 0) {
      e[k] = x0;
      continue;
    }
    const alpha = Math.sqrt(x0 * x0 + sigma);
    const sgn = x0 >= 0 ? 1 : -1;
    // v = x + sign(x0) alpha e_1 (no cancellation), beta = 2 / v^T v.
    const v0 = x0 + sgn * alpha;
    m[vOff + k1] = v0;
    for (let i = k + 2; i < n; i++) m[vOff + i] = m[i * n + k];
    const beta = 2 / (v0 * v0 + sigma);
    e[k] = -sgn * alpha;
    // p = beta A' v
    let pv = 0;
    for (let i = k1; i < n; i++) {
      const row = i * n;
      let acc = 0;
      for (let j = k1; j < n; j++) acc += m[row + j] * m[vOff + j];
      const pi = beta * acc;
      m[pOff + i] = pi;
      pv += pi * m[vOff + i];
    }
    // w = p - (beta p^T v / 2) v
    const c = 0.5 * beta * pv;
    for (let i = k1; i < n; i++) m[pOff + i] -= c * m[vOff + i];
    // A' -= v w^T + w v^T, full rows.
    for (let i = k1; i < n; i++) {
      const row = i * n;
      const vi = m[vOff + i];
      const wi = m[pOff + i];
      for (let j = k1; j < n; j++) m[row + j] -= vi * m[pOff + j] + wi * m[vOff + j];
    }
  }
  for (let i = 0; i < n; i++) d[i] = m[i * n + i];
  if (n >= 2) e[n - 2] = m[(n - 1) * n + n - 2];
  return { d, e };
}
