/**
 * Eigenvector of a real symmetric tridiagonal matrix for an accurately known, isolated
 * eigenvalue by a twisted factorisation (Dhillon and Parlett, "Orthogonal eigenvectors and
 * relative gaps", SIAM J. Matrix Anal. Appl. 25, 858 (2004); Fernando, "On computing an
 * eigenvector of a tridiagonal matrix", SIAM J. Matrix Anal. Appl. 18, 1013 (1997);
 * the LAPACK routine dlar1v).
 *
 *     T - lambda I = L+ D+ L+^T (top down, pivots D+) = U- D- U-^T (bottom up, pivots D-),
 *     gamma_k = D+_k + D-_k - (d_k - lambda),   r = argmin |gamma_k|,
 *     x_r = 1,  x_i = -e_i x_{i+1} / D+_i (i < r),  x_{i+1} = -e_i x_i / D-_{i+1} (i >= r),  x /= |x|.
 *
 * One pass each way, O(n), no iteration: ~4x faster than inverse iteration for n ~ 20. The
 * residual is |gamma_r| / |x|, tiny when lambda is accurate to a few ulp and isolated by more
 * than ~1e-8 ||T|| (true for transmon parity blocks). Clusters need a different method.
 * Sign: as it comes out (callers fix their own convention). `dPlus`, `dMinus`: scratch (>= n).
 */
export function tridiagonalTwistedEigenvector(
  d: ArrayLike<number>,
  e: ArrayLike<number>,
  n: number,
  lambda: number,
  out: Float64Array = new Float64Array(n),
  dPlus: Float64Array = new Float64Array(n),
  dMinus: Float64Array = new Float64Array(n),
): Float64Array {
  if (!(n >= 1) || d.length < n || e.length < n - 1 || out.length < n || dPlus.length < n || dMinus.length < n) {
    throw new RangeError(`tridiagonalTwistedEigenvector: bad sizes (n=${n})`);
  }
  const x = out;
  if (n === 1) {
    x[0] = 1;
    return x;
  }
  // Pivots that vanish exactly are replaced by a tiny number (LAPACK's pivmin idea).
  let scale = 0;
  for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(d[i] - lambda));
  for (let i = 0; i < n - 1; i++) scale = Math.max(scale, Math.abs(e[i]));
  const tiny = Number.MIN_VALUE * 1e20 + Number.EPSILON * Number.EPSILON * scale;
  let q = d[0] - lambda;
  dPlus[0] = q === 0 ? tiny : q;
  for (let i = 1; i < n; i++) {
    const ei = e[i - 1];
    q = d[i] - lambda - (ei * ei) / dPlus[i - 1];
    dPlus[i] = q === 0 ? tiny : q;
  }
  q = d[n - 1] - lambda;
  dMinus[n - 1] = q === 0 ? tiny : q;
  for (let i = n - 2; i >= 0; i--) {
    const ei = e[i];
    q = d[i] - lambda - (ei * ei) / dMinus[i + 1];
    dMinus[i] = q === 0 ? tiny : q;
  }
  let r = 0;
  let best = Infinity;
  for (let k = 0; k < n; k++) {
    const g = Math.abs(dPlus[k] + dMinus[k] - (d[k] - lambda));
    if (g < best) {
      best = g;
      r = k;
    }
  }
  x[r] = 1;
  for (let i = r - 1; i >= 0; i--) x[i] = (-e[i] * x[i + 1]) / dPlus[i];
  for (let i = r; i < n - 1; i++) x[i + 1] = (-e[i] * x[i]) / dMinus[i + 1];
  let s = 0;
  for (let i = 0; i < n; i++) s += x[i] * x[i];
  s = 1 / Math.sqrt(s);
  for (let i = 0; i < n; i++) x[i] *= s;
  return x;
}
