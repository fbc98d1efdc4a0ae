/**
 * Complex helpers on split storage (real and imaginary parts in separate Float64Arrays,
 * row-major), the layout every complex kernel here uses.
 *
 *   applyEigenExponential:  x <- V exp(-i diag(w)) V^H x   for a unitary V (an eigen-decomposition
 *                           of a Hermitian M = V diag(w) V^H, so the result is exp(-i M) x),
 *                           on the sub-block [offset, offset + n) of x. O(n^2); no allocation.
 *   complexMatVec:          y = A x.
 */

export function applyEigenExponential(
  vr: ArrayLike<number>,
  vi: ArrayLike<number>,
  w: ArrayLike<number>,
  n: number,
  re: Float64Array,
  im: Float64Array,
  scratchRe: Float64Array,
  scratchIm: Float64Array,
  offset = 0,
): void {
  for (let k = 0; k < n; k++) {
    let sr = 0;
    let si = 0;
    for (let r = 0; r < n; r++) {
      const ar = vr[r * n + k];
      const ai = -vi[r * n + k];
      const xr = re[offset + r];
      const xi = im[offset + r];
      sr += ar * xr - ai * xi;
      si += ar * xi + ai * xr;
    }
    const cw = Math.cos(w[k]);
    const sw = -Math.sin(w[k]);
    scratchRe[k] = cw * sr - sw * si;
    scratchIm[k] = sw * sr + cw * si;
  }
  for (let r = 0; r < n; r++) {
    let sr = 0;
    let si = 0;
    for (let k = 0; k < n; k++) {
      const ar = vr[r * n + k];
      const ai = vi[r * n + k];
      sr += ar * scratchRe[k] - ai * scratchIm[k];
      si += ar * scratchIm[k] + ai * scratchRe[k];
    }
    re[offset + r] = sr;
    im[offset + r] = si;
  }
}

/** y = A x for complex A (n x m) and x (m); y (n) must not alias x. */
export function complexMatVec(
  ar: ArrayLike<number>,
  ai: ArrayLike<number>,
  n: number,
  m: number,
  xr: ArrayLike<number>,
  xi: ArrayLike<number>,
  yr: Float64Array,
  yi: Float64Array,
): void {
  for (let r = 0; r < n; r++) {
    let sr = 0;
    let si = 0;
    for (let c = 0; c < m; c++) {
      const a1 = ar[r * m + c];
      const a2 = ai[r * m + c];
      sr += a1 * xr[c] - a2 * xi[c];
      si += a1 * xi[c] + a2 * xr[c];
    }
    yr[r] = sr;
    yi[r] = si;
  }
}
