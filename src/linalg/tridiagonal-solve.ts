/**
 * Solve (T - shift I) x = b for a real symmetric tridiagonal T = tridiag(e, d, e) by Gaussian
 * elimination with partial pivoting (the LINPACK routine dgtsl; Golub and Van Loan, Matrix
 * Computations, 4th ed., sec. 4.3). Stable for indefinite systems; O(n).
 * Works on the index range [from, to) of d (and e[from .. to-2]); x and b may alias.
 * A zero pivot is replaced by a tiny number (eps * ||T||), so a singular system returns a
 * huge but finite solution (what inverse iteration wants).
 */
export function tridiagonalSolve(
  d: ArrayLike<number>,
  e: ArrayLike<number>,
  shift: number,
  b: ArrayLike<number>,
  x: Float64Array,
  from: number,
  to: number,
  work: Float64Array,
): Float64Array {
  const n = to - from;
  if (n <= 0) return x;
  if (work.length < 5 * n) throw new RangeError('tridiagonalSolve: work too short');
  const u0 = work.subarray(0, n);
  const u1 = work.subarray(n, 2 * n);
  const u2 = work.subarray(2 * n, 3 * n);
  const ml = work.subarray(3 * n, 4 * n);
  const piv = work.subarray(4 * n, 5 * n);
  let norm = 0;
  for (let i = from; i < to; i++) norm = Math.max(norm, Math.abs(d[i] - shift) + (i > from ? Math.abs(e[i - 1]) : 0) + (i < to - 1 ? Math.abs(e[i]) : 0));
  const tiny = Number.EPSILON * Math.max(norm, Number.MIN_VALUE);
  for (let i = 0; i < n; i++) x[from + i] = b[from + i];
  if (n === 1) {
    const p = d[from] - shift;
    x[from] /= p === 0 ? tiny : p;
    return x;
  }
  let diag = d[from] - shift;
  let sup = e[from];
  for (let i = 0; i < n - 1; i++) {
    const sub = e[from + i];
    const nextDiag = d[from + i + 1] - shift;
    const nextSup = i + 1 < n - 1 ? e[from + i + 1] : 0;
    if (Math.abs(diag) >= Math.abs(sub)) {
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
  const o = from;
  for (let i = 0; i < n - 1; i++) {
    if (piv[i] === 1) {
      const t = x[o + i];
      x[o + i] = x[o + i + 1];
      x[o + i + 1] = t - ml[i] * x[o + i];
    } else {
      x[o + i + 1] -= ml[i] * x[o + i];
    }
  }
  x[o + n - 1] /= u0[n - 1];
  x[o + n - 2] = (x[o + n - 2] - u1[n - 2] * x[o + n - 1]) / u0[n - 2];
  for (let i = n - 3; i >= 0; i--) x[o + i] = (x[o + i] - u1[i] * x[o + i + 1] - u2[i] * x[o + i + 2]) / u0[i];
  return x;
}
