/**
 * The k lowest eigenvalues of a real symmetric tridiagonal matrix T = tridiag(e, d, e).
 *
 * Method: for eigenvalue j, Newton's iteration on det(T - x I) from a caller's guess, with
 * d/dx ln|det| from the pivot recurrence of the LDL^T factorisation
 *     q_0 = d_0 - x,  q_i = d_i - x - e_{i-1}^2 / q_{i-1},   q_i' = -1 + e_{i-1}^2 q_{i-1}' / q_{i-1}^2,
 * then a Sturm-count check that the root is the j-th eigenvalue (count(x) = number of negative
 * pivots = number of eigenvalues below x; Barth, Martin and Wilkinson, Numer. Math. 9, 386
 * (1967)): count(x - tol) = j. (Newton stops only where d/dx ln|det| is large, i.e. at an
 * eigenvalue, so this one count identifies which one it is.) If there is no guess, Newton fails, or the check fails, the eigenvalue is found by
 * plain bisection on the Sturm count (as LAPACK dstebz). Either way the result is exact to a
 * few ulp of ||T||.
 *
 * Cost: O(n) per Newton step, usually 3-5 steps per eigenvalue from a guess within a fraction
 * of the level spacing; bisection costs about 55 Sturm counts per eigenvalue.
 * Returns ascending values in `out` (length >= k).
 */
export function tridiagonalLowestEigenvalues(
  d: ArrayLike<number>,
  e: ArrayLike<number>,
  n: number,
  k: number,
  out: Float64Array = new Float64Array(k),
  guesses?: ArrayLike<number>,
): Float64Array {
  if (!(n >= 1) || !(k >= 1) || k > n || d.length < n || e.length < n - 1 || out.length < k) {
    throw new RangeError(`tridiagonalLowestEigenvalues: bad sizes (n=${n}, k=${k})`);
  }
  let lo = Infinity;
  let hi = -Infinity;
  let maxOff2 = 0;
  const e2 = squaredScratch(n);
  for (let i = 0; i < n; i++) {
    const r = (i > 0 ? Math.abs(e[i - 1]) : 0) + (i < n - 1 ? Math.abs(e[i]) : 0);
    lo = Math.min(lo, d[i] - r);
    hi = Math.max(hi, d[i] + r);
    if (i < n - 1) {
      const x = e[i] * e[i];
      e2[i] = x;
      if (x > maxOff2) maxOff2 = x;
    }
  }
  const norm = Math.max(Math.abs(lo), Math.abs(hi), Number.MIN_VALUE);
  const pivmin = Math.max(Number.MIN_VALUE, 2.3e-308 * Math.max(1, maxOff2));
  const tol = 4 * Number.EPSILON * norm;
  lo -= tol;
  hi += tol;
  let left = lo;
  for (let j = 0; j < k; j++) {
    let x = NaN;
    if (guesses !== undefined && Number.isFinite(guesses[j])) {
      x = newton(d, e2, n, guesses[j], pivmin, tol);
      if (!(x > left) || sturmCountSquared(d, e2, n, x - tol, pivmin) !== j) x = NaN;
    }
    if (Number.isNaN(x)) x = bisect(d, e2, n, j, left, hi, pivmin, tol);
    out[j] = x;
    left = x - tol;
  }
  return out;
}

let squared = new Float64Array(64);

/** Module scratch for the squared off-diagonal (grown on demand; single-threaded use). */
function squaredScratch(n: number): Float64Array {
  if (squared.length < n) squared = new Float64Array(2 * n);
  return squared;
}

/** Newton on ln|det(T - x I)|; `e2` holds the squared off-diagonal. */
function newton(d: ArrayLike<number>, e2: Float64Array, n: number, x0: number, pivmin: number, tol: number): number {
  let x = x0;
  for (let it = 0; it < 30; it++) {
    let q = d[0] - x;
    if (Math.abs(q) < pivmin) q = pivmin;
    let dq = -1;
    let inv = 1 / q;
    let s = dq * inv;
    for (let i = 1; i < n; i++) {
      const ee = e2[i - 1];
      const qn = d[i] - x - ee * inv;
      dq = -1 + ee * dq * inv * inv;
      q = Math.abs(qn) < pivmin ? pivmin : qn;
      inv = 1 / q;
      s += dq * inv;
    }
    if (!Number.isFinite(s) || s === 0) return NaN;
    const step = -1 / s;
    x += step;
    if (Math.abs(step) <= tol) return x;
  }
  return NaN;
}

function bisect(d: ArrayLike<number>, e2: Float64Array, n: number, j: number, a0: number, b0: number, pivmin: number, tol: number): number {
  let a = a0;
  let b = b0;
  while (b - a > tol) {
    const mid = 0.5 * (a + b);
    if (mid === a || mid === b) break;
    if (sturmCountSquared(d, e2, n, mid, pivmin) > j) b = mid;
    else a = mid;
  }
  return 0.5 * (a + b);
}

/** As sturmCount, with the squared off-diagonal precomputed. */
function sturmCountSquared(d: ArrayLike<number>, e2: Float64Array, n: number, x: number, pivmin: number): number {
  let count = 0;
  let q = d[0] - x;
  if (Math.abs(q) < pivmin) q = -pivmin;
  if (q < 0) count++;
  for (let i = 1; i < n; i++) {
    q = d[i] - x - e2[i - 1] / q;
    if (Math.abs(q) < pivmin) q = -pivmin;
    if (q < 0) count++;
  }
  return count;
}

/** Number of eigenvalues of T below x (negative pivots of T - x I). */
export function sturmCount(d: ArrayLike<number>, e: ArrayLike<number>, n: number, x: number, pivmin: number): number {
  let count = 0;
  let q = d[0] - x;
  if (Math.abs(q) < pivmin) q = -pivmin;
  if (q < 0) count++;
  for (let i = 1; i < n; i++) {
    q = d[i] - x - (e[i - 1] * e[i - 1]) / q;
    if (Math.abs(q) < pivmin) q = -pivmin;
    if (q < 0) count++;
  }
  return count;
}
