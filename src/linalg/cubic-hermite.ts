/**
 * Cubic Hermite interpolation on one cell and the slopes that feed it (the tables of
 * src/sim/manifold-frame.ts, src/plan/qubit-table.ts and src/transmon/reduced-spectrum.ts).
 *
 * On a cell of width h with local coordinate t in [0, 1], end values y0, y1 and end derivatives
 * y0', y1' (per unit of the variable):
 *
 *     p(t) = h00(t) y0 + h h10(t) y0' + h01(t) y1 + h h11(t) y1',
 *     h00 = 2t^3 - 3t^2 + 1,  h10 = t^3 - 2t^2 + t,  h01 = -2t^3 + 3t^2,  h11 = t^3 - t^2
 *
 * (the cubic Hermite basis; de Boor, "A Practical Guide to Splines", ch. IV; SciPy's
 * CubicHermiteSpline is the same interpolant, test/linalg/cubic-hermite.test.ts). Its error is
 * O(h^4) for smooth data with exact derivatives.
 */

/** p(t) from end values and end slopes already scaled by the cell width (d0 = h y0', d1 = h y1'). */
export function hermite(y0: number, y1: number, d0: number, d1: number, t: number): number {
  const t2 = t * t;
  const t3 = t2 * t;
  return (2 * t3 - 3 * t2 + 1) * y0 + (t3 - 2 * t2 + t) * d0 + (-2 * t3 + 3 * t2) * y1 + (t3 - t2) * d1;
}

/** dp/dt (per unit of t; divide by h for the derivative in the variable), same arguments as hermite. */
export function hermiteSlope(y0: number, y1: number, d0: number, d1: number, t: number): number {
  const t2 = t * t;
  return (6 * t2 - 6 * t) * y0 + (3 * t2 - 4 * t + 1) * d0 + (-6 * t2 + 6 * t) * y1 + (3 * t2 - 2 * t) * d1;
}

/**
 * The t in [0, 1] where p(t) = target on a cell whose interpolant increases (p(0) <= target <=
 * p(1); arguments as for hermite): safeguarded Newton from t0 (Numerical Recipes, 3rd ed., sec.
 * 9.4: a step that leaves the bracket [a, b] of the sign change is replaced by bisection). Stops
 * when p(t) equals the target, when a step is shorter than `tol`, or after `maxIterations`
 * evaluations. A Newton step shorter than `tol` ends the solve even when it rounds onto the
 * bracket's end, which is then t itself (bisecting there threw the converged t away and started
 * again: test/linalg/cubic-hermite.test.ts). `stats.iterations`, when given, gets the number of
 * evaluations.
 */
export function hermiteInverse(y0: number, y1: number, d0: number, d1: number, target: number, t0: number, tol: number, maxIterations: number, stats?: { iterations: number }): number {
  let a = 0;
  let b = 1;
  let t = t0;
  let it = 0;
  while (it < maxIterations) {
    it++;
    const r = hermite(y0, y1, d0, d1, t) - target;
    if (r === 0) break;
    if (r > 0) b = t;
    else a = t;
    const s = hermiteSlope(y0, y1, d0, d1, t);
    // (Number.NaN, never the global NaN: DEVELOPERS.md, "Numbers in hot code"; here the global
    // cost a heap number per Newton step, ~65 bytes per inversion)
    const newton = s > 0 ? t - r / s : Number.NaN;
    if (Math.abs(newton - t) < tol) {
      if (newton > a && newton < b) t = newton;
      break;
    }
    const next = newton > a && newton < b ? newton : 0.5 * (a + b);
    const done = Math.abs(next - t) < tol;
    t = next;
    if (done) break;
  }
  if (stats) stats.iterations = it;
  return t;
}

/**
 * The four weights at t of a cell of width h, for tables of many functions interpolated at one
 * point: p = w[0] y0 + w[1] y0' + w[2] y1 + w[3] y1' with the unscaled derivatives (w[1] and
 * w[3] carry the factor h). Writes into `out` (length >= 4) and returns it.
 */
export function hermiteWeights(t: number, h: number, out: Float64Array): Float64Array {
  const t2 = t * t;
  const t3 = t2 * t;
  out[0] = 2 * t3 - 3 * t2 + 1;
  out[1] = (t3 - 2 * t2 + t) * h;
  out[2] = -2 * t3 + 3 * t2;
  out[3] = (t3 - t2) * h;
  return out;
}

/**
 * Slopes of m samples v[offset .. offset + m) on a uniform grid of spacing h: fourth-order
 * central differences inside, fourth-order one-sided stencils at the two points next to each
 * end (Fornberg, Math. Comp. 51, 699 (1988) weights; exact for polynomials up to degree 4).
 * Fewer than 5 samples: second-order differences (zero slopes for h = 0 or a single sample).
 */
export function finiteDifferenceSlopes(v: Float64Array, out: Float64Array, offset: number, m: number, h: number): void {
  if (h === 0 || m < 5) {
    for (let k = 0; k < m; k++) out[offset + k] = 0;
    if (h > 0 && m >= 2) for (let k = 0; k < m; k++) out[offset + k] = (v[offset + Math.min(k + 1, m - 1)] - v[offset + Math.max(k - 1, 0)]) / (h * (Math.min(k + 1, m - 1) - Math.max(k - 1, 0)));
    return;
  }
  const y = (k: number) => v[offset + k];
  for (let k = 0; k < m; k++) {
    let d: number;
    if (k >= 2 && k <= m - 3) d = (y(k - 2) - 8 * y(k - 1) + 8 * y(k + 1) - y(k + 2)) / (12 * h);
    else if (k < 2) d = (-25 * y(k) + 48 * y(k + 1) - 36 * y(k + 2) + 16 * y(k + 3) - 3 * y(k + 4)) / (12 * h);
    else d = (25 * y(k) - 48 * y(k - 1) + 36 * y(k - 2) - 16 * y(k - 3) + 3 * y(k - 4)) / (12 * h);
    out[offset + k] = d;
  }
}
