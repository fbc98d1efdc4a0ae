/**
 * Fast-adiabatic ramp in the crossing's mixing angle (Martinis and Geller, Phys. Rev. A 90,
 * 022307 (2014)): theta = atan2(2 J, Delta) of the crossing's two-level model follows a short
 * Fourier series,
 *
 *     theta(tau) = theta_park + (theta_dest - theta_park) s(tau),
 *     s(tau) = sum_n l_n (1 - cos(n pi tau)) / sum_n l_n (1 - cos(n pi)),   tau = t / rampNs,
 *
 * (the first half of their symmetric pulse in 2 pi n t / t_p; even terms vanish at both ends and
 * shape the middle), and the flux is the one giving that theta. Coefficients default to
 * (1, 0, -0.1): a mild third harmonic that spends a little more time near the crossing (our
 * choice; any that keep s monotonic work).
 */
import { tabulatedRamp, type RampFamily } from './family.js';

export const FAST_ADIABATIC_DEFAULTS = Object.freeze({ coefficients: [1, 0, -0.1], grid: 200 });

export function fourierShape(coefficients: readonly number[], tau: number): number {
  let num = 0;
  let den = 0;
  for (let i = 0; i < coefficients.length; i++) {
    const n = i + 1;
    num += coefficients[i] * (1 - Math.cos(n * Math.PI * tau));
    den += coefficients[i] * (1 - Math.cos(n * Math.PI));
  }
  return num / den;
}

export const fastAdiabaticFamily: RampFamily = {
  name: 'fast-adiabatic',
  summary: 'Fourier series in the crossing mixing angle',
  source: 'Martinis and Geller, Phys. Rev. A 90, 022307 (2014)',
  ramp: ({ table, parkFlux, destFlux, rampNs }) => {
    const n = FAST_ADIABATIC_DEFAULTS.grid;
    const th0 = table.theta(parkFlux);
    const th1 = table.theta(destFlux);
    // theta(flux) on a fine grid between parking and destination (monotonic there), inverted by
    // interpolation and polished with two secant steps on the table
    const m = 4 * n;
    const fx = new Float64Array(m + 1);
    const ft = new Float64Array(m + 1);
    for (let k = 0; k <= m; k++) {
      fx[k] = parkFlux + ((destFlux - parkFlux) * k) / m;
      ft[k] = table.theta(fx[k]);
    }
    const rising = th1 >= th0;
    const out = new Float64Array(n + 1);
    let k = 0;
    for (let q = 0; q <= n; q++) {
      if (q === 0 || q === n) {
        out[q] = q === 0 ? parkFlux : destFlux;
        continue;
      }
      const th = th0 + (th1 - th0) * fourierShape(FAST_ADIABATIC_DEFAULTS.coefficients, q / n);
      while (k < m - 1 && (rising ? ft[k + 1] < th : ft[k + 1] > th)) k++;
      let a = fx[k];
      let b = fx[k + 1];
      let ta = ft[k] - th;
      let tb = ft[k + 1] - th;
      let x = tb === ta ? a : a - (ta * (b - a)) / (tb - ta);
      for (let it = 0; it < 2; it++) {
        const tx = table.theta(x) - th;
        if (tx === 0) break;
        if (Math.sign(tx) === Math.sign(ta)) {
          a = x;
          ta = tx;
        } else {
          b = x;
          tb = tx;
        }
        x = tb === ta ? x : a - (ta * (b - a)) / (tb - ta);
      }
      out[q] = x;
    }
    return tabulatedRamp(rampNs, out);
  },
};
