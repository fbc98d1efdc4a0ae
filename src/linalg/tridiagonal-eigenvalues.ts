/**
 * Eigenvalues of a real symmetric tridiagonal matrix by the implicit QL algorithm with
 * Wilkinson shifts (Bowdler, Martin, Reinsch and Wilkinson, "The QR and QL algorithms for
 * symmetric matrices", Numer. Math. 11, 293 (1968); the EISPACK routine tql1).
 *
 *     T = tridiag(e, d, e),   d: n diagonal entries, e: n - 1 off-diagonal entries.
 *
 * Cost O(n^2) (about 2 QL sweeps per eigenvalue), no eigenvectors. Accuracy: each eigenvalue to
 * a few ulp of ||T||. Returns the eigenvalues in ascending order in `out` (length >= n).
 *
 * @throws RangeError if n < 1, the buffers are too short, or the iteration does not converge
 *         (never observed for finite input; 60 iterations per eigenvalue are allowed).
 */
export function tridiagonalEigenvalues(
  d: ArrayLike<number>,
  e: ArrayLike<number>,
  n: number,
  out: Float64Array = new Float64Array(n),
  work: Float64Array = new Float64Array(n),
): Float64Array {
  if (!(n >= 1) || d.length < n || e.length < n - 1 || out.length < n || work.length < n) {
    throw new RangeError(`tridiagonalEigenvalues: bad sizes (n=${n}, d=${d.length}, e=${e.length})`);
  }
  const w = out;
  const f = work; // f[i] = e[i], f[n-1] = 0
  for (let i = 0; i < n; i++) w[i] = d[i];
  for (let i = 0; i < n - 1; i++) f[i] = e[i];
  f[n - 1] = 0;
  qlImplicit(w, f, n);
  sortAscending(w, n);
  return w;
}

/**
 * In-place implicit QL on diagonal `w` and off-diagonal `f` (f[n-1] must be 0). On return `w`
 * holds the eigenvalues (unsorted) and `f` is destroyed.
 */
export function qlImplicit(w: Float64Array, f: Float64Array, n: number): void {
  for (let l = 0; l < n; l++) {
    let iter = 0;
    for (;;) {
      // Find a small subdiagonal element to split the matrix.
      let m = l;
      for (; m < n - 1; m++) {
        const dd = Math.abs(w[m]) + Math.abs(w[m + 1]);
        if (Math.abs(f[m]) <= Number.EPSILON * dd) break;
      }
      if (m === l) break;
      if (++iter > 60) throw new RangeError('tridiagonalEigenvalues: no convergence');
      // Wilkinson shift from the leading 2x2 block.
      let g = (w[l + 1] - w[l]) / (2 * f[l]);
      let r = Math.sqrt(g * g + 1);
      g = w[m] - w[l] + f[l] / (g + (g >= 0 ? r : -r));
      let s = 1;
      let c = 1;
      let p = 0;
      let i = m - 1;
      for (; i >= l; i--) {
        let ff = s * f[i];
        const b = c * f[i];
        r = Math.sqrt(ff * ff + g * g);
        f[i + 1] = r;
        if (r === 0) {
          // Underflow: deflate and restart.
          w[i + 1] -= p;
          f[m] = 0;
          break;
        }
        s = ff / r;
        c = g / r;
        g = w[i + 1] - p;
        r = (w[i] - g) * s + 2 * c * b;
        p = s * r;
        w[i + 1] = g + p;
        g = c * r - b;
        ff = 0;
      }
      if (r === 0 && i >= l) continue;
      w[l] -= p;
      f[l] = g;
      f[m] = 0;
    }
  }
}

function sortAscending(w: Float64Array, n: number): void {
  // Insertion sort: n is small and QL leaves the values nearly ordered.
  for (let i = 1; i < n; i++) {
    const v = w[i];
    let j = i - 1;
    while (j >= 0 && w[j] > v) {
      w[j + 1] = w[j];
      j--;
    }
    w[j + 1] = v;
  }
}
