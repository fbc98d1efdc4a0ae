/**
 * Chebyshev interpolation on [a, b] through the Chebyshev-Lobatto points (Trefethen,
 * "Approximation Theory and Approximation Practice", SIAM 2013, ch. 2-3):
 *
 *     x_j = (a + b)/2 + (b - a)/2 cos(pi j / n),   j = 0..n,
 *     p(x) = sum_k c_k T_k(t),  t = (2x - a - b)/(b - a),
 *     c_k = (2 / n) sum_j'' f_j cos(pi j k / n)   (halved at k = 0 and k = n; '' halves j = 0, n),
 *
 * derivative coefficients by the recurrence c'_{k-1} = c'_{k+1} + 2 k c_k (scaled by 2/(b-a)),
 * and the three-term recurrence of T_k for evaluation. For a function analytic in a Bernstein ellipse
 * of parameter rho the coefficients decay like rho^-k, so |c_k| for the last few k measures
 * the interpolation error. Costs: O(n^2) for the coefficients (n is small here), O(n) per
 * evaluation.
 */

/** The n + 1 Chebyshev-Lobatto points on [a, b], from b down to a (x_0 = b). */
export function chebyshevPoints(a: number, b: number, n: number): Float64Array {
  const x = new Float64Array(n + 1);
  for (let j = 0; j <= n; j++) x[j] = 0.5 * (a + b) + 0.5 * (b - a) * Math.cos((Math.PI * j) / n);
  if (n > 0) {
    x[0] = b;
    x[n] = a;
  }
  return x;
}

/**
 * Coefficients of the interpolant for `width` interleaved functions: values[j * width + q] is
 * function q at point j. Returns coeffs[k * width + q].
 */
export function chebyshevCoefficients(values: ArrayLike<number>, n: number, width: number): Float64Array {
  const c = new Float64Array((n + 1) * width);
  if (n === 0) {
    for (let q = 0; q < width; q++) c[q] = values[q];
    return c;
  }
  const cosTable = new Float64Array(2 * n);
  for (let m = 0; m < 2 * n; m++) cosTable[m] = Math.cos((Math.PI * m) / n);
  for (let k = 0; k <= n; k++) {
    const scale = (k === 0 || k === n ? 1 : 2) / n;
    for (let j = 0; j <= n; j++) {
      const w = (j === 0 || j === n ? 0.5 : 1) * cosTable[(j * k) % (2 * n)] * scale;
      if (w === 0) continue;
      const row = j * width;
      const out = k * width;
      for (let q = 0; q < width; q++) c[out + q] += w * values[row + q];
    }
  }
  return c;
}

/**
 * Only the coefficient rows `ks` of chebyshevCoefficients (the same sums, in the same order, so
 * the same numbers): coeffs[i * width + q] = c_{ks[i]} of function q. Cost O(|ks| n width), for
 * tail checks that need the last few coefficients, not all n + 1.
 */
export function chebyshevCoefficientRows(values: ArrayLike<number>, n: number, width: number, ks: readonly number[]): Float64Array {
  const c = new Float64Array(ks.length * width);
  if (n === 0) {
    ks.forEach((k, i) => {
      if (k === 0) for (let q = 0; q < width; q++) c[i * width + q] = values[q];
    });
    return c;
  }
  const cosTable = new Float64Array(2 * n);
  for (let m = 0; m < 2 * n; m++) cosTable[m] = Math.cos((Math.PI * m) / n);
  ks.forEach((k, i) => {
    if (!(k >= 0 && k <= n)) throw new RangeError(`chebyshevCoefficientRows: row ${k} outside 0..${n}`);
    const scale = (k === 0 || k === n ? 1 : 2) / n;
    const out = i * width;
    for (let j = 0; j <= n; j++) {
      const w = (j === 0 || j === n ? 0.5 : 1) * cosTable[(j * k) % (2 * n)] * scale;
      if (w === 0) continue;
      const row = j * width;
      for (let q = 0; q < width; q++) c[out + q] += w * values[row + q];
    }
  });
  return c;
}

/** Coefficients of the derivative d/dx (on [a, b]) of the series with coefficients c. */
export function chebyshevDerivative(c: ArrayLike<number>, n: number, width: number, a: number, b: number): Float64Array {
  const d = new Float64Array((n + 1) * width);
  const s = 2 / (b - a);
  for (let q = 0; q < width; q++) {
    let dk1 = 0; // d_{k+1}
    let dk2 = 0; // d_{k+2}
    for (let k = n; k >= 1; k--) {
      const dkm1 = dk2 + 2 * k * c[k * width + q];
      d[(k - 1) * width + q] = dkm1;
      dk2 = dk1;
      dk1 = dkm1;
    }
    d[q] *= 0.5;
    for (let k = 0; k <= n; k++) d[k * width + q] *= s;
  }
  return d;
}

/**
 * Evaluate all `width` series at x, writing out[q]: T_k(t) by the three-term recurrence
 * T_{k+1} = 2 t T_k - T_{k-1} (error ~k ulp for |t| <= 1), then the sums over k with q
 * innermost (contiguous; this is the frame tabulation's hot loop, width up to a few hundred).
 */
export function chebyshevEvaluate(c: ArrayLike<number>, n: number, width: number, a: number, b: number, x: number, out: Float64Array): Float64Array {
  const t = (2 * x - a - b) / (b - a);
  for (let q = 0; q < width; q++) out[q] = c[q];
  let tkm1 = 1;
  let tk = t;
  for (let k = 1; k <= n; k++) {
    const row = k * width;
    for (let q = 0; q < width; q++) out[q] += tk * c[row + q];
    const next = 2 * t * tk - tkm1;
    tkm1 = tk;
    tk = next;
  }
  return out;
}
