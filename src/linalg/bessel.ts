/**
 * Bessel functions of the first kind J_0(z) ... J_K(z) for real z >= 0 by Miller's backward
 * recurrence J_{k-1} = (2k/z) J_k - J_{k+1}, normalised with J_0 + 2 sum J_{2k} = 1
 * (Abramowitz and Stegun, Handbook of Mathematical Functions, 9.1.27 and 9.1.46; the method is
 * described in sec. 9.12). Stable for all orders; accurate to a few ulp of max |J|.
 */
export function besselJSeries(z: number, kMax: number, out: Float64Array = new Float64Array(kMax + 1)): Float64Array {
  if (!(z >= 0) || !(kMax >= 0)) throw new RangeError(`besselJSeries: need z >= 0 and kMax >= 0 (got ${z}, ${kMax})`);
  if (z === 0) {
    out.fill(0);
    out[0] = 1;
    return out;
  }
  // Start well above both kMax and z.
  const start = 2 * Math.ceil((Math.max(kMax, z) + 30 + Math.sqrt(40 * Math.max(kMax, z))) / 2);
  let jp1 = 0;
  let j = 1e-300;
  let norm = 0;
  const tmp = new Float64Array(start + 1);
  tmp[start] = j;
  for (let k = start; k > 0; k--) {
    const jm1 = ((2 * k) / z) * j - jp1;
    jp1 = j;
    j = jm1;
    tmp[k - 1] = j;
    if (Math.abs(j) > 1e250) {
      // Rescale to avoid overflow.
      for (let q = k - 1; q <= start; q++) tmp[q] *= 1e-250;
      j *= 1e-250;
      jp1 *= 1e-250;
    }
  }
  norm = tmp[0];
  for (let k = 2; k <= start; k += 2) norm += 2 * tmp[k];
  for (let k = 0; k <= kMax; k++) out[k] = tmp[k] / norm;
  return out;
}
