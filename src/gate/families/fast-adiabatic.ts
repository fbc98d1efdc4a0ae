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
  coefficients.forEach((l, i) => {
    const n = i + 1;
    num += l * (1 - Math.cos(n * Math.PI * tau));
    den += l * (1 - Math.cos(n * Math.PI));
  });
  return num / den;
}

export const fastAdiabaticFamily: RampFamily = {
  name: 'fast-adiabatic',
  summary: 'Fourier series in the crossing mixing angle',
  source: 'Martinis and Geller, Phys. Rev. A 90, 022307 (2014)',
  ramp: ({ table, parkFlux, destFlux, rampNs }) => {
    const n = FAST_ADIABATIC_DEFAULTS.grid;
    const th0 = table.at(parkFlux).theta;
    const th1 = table.at(destFlux).theta;
    const out = new Float64Array(n + 1);
    for (let q = 0; q <= n; q++) {
      const th = th0 + (th1 - th0) * fourierShape(FAST_ADIABATIC_DEFAULTS.coefficients, q / n);
      out[q] = q === 0 ? parkFlux : q === n ? destFlux : table.fluxForTheta(th, parkFlux, destFlux);
    }
    return tabulatedRamp(rampNs, out);
  },
};
