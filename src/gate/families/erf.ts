/**
 * Flat-top pulse with error-function edges: the rise is erf-shaped in flux over the ramp time
 * (Gaussian-filtered step, the practical baseline of flux-pulse generation; the edge width is
 * sigma = rampNs / 4 so the rise spans +-2 sigma), renormalised to start and end exactly.
 */
import type { RampFamily } from './family.js';

/**
 * erf to ~1e-15: the Maclaurin series (Abramowitz and Stegun 7.1.5) for |x| < 2.5, where its
 * alternating terms cost at most ~3 digits, and the continued fraction of erfc (A&S 7.1.14,
 * evaluated by Lentz's method) beyond, where it converges in a few dozen terms.
 */
function erf(x: number): number {
  const ax = Math.abs(x);
  if (ax < 2.5) {
    // Maclaurin series
    let term = x;
    let sum = x;
    const x2 = x * x;
    for (let n = 1; n < 120; n++) {
      term *= -x2 / n;
      const add = term / (2 * n + 1);
      sum += add;
      if (Math.abs(add) < 1e-17 * Math.abs(sum)) break;
    }
    return (2 / Math.sqrt(Math.PI)) * sum;
  }
  // erfc by Lentz continued fraction: erfc(x) = exp(-x^2)/sqrt(pi) * 1/(x + 1/2/(x + 1/(x + 3/2/(x + ...))))
  let f = ax;
  let c = ax;
  let d = 0;
  for (let k = 1; k < 300; k++) {
    const a = k / 2;
    d = ax + a * d;
    d = d === 0 ? 1e-300 : 1 / d;
    c = ax + a / c;
    if (c === 0) c = 1e-300;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  const erfc = Math.exp(-ax * ax) / Math.sqrt(Math.PI) / f;
  return x > 0 ? 1 - erfc : erfc - 1;
}

export { erf };

export const ERF_EDGE_SIGMAS = 2;

export const erfFamily: RampFamily = {
  name: 'erf',
  summary: 'flat-top with error-function edges (sigma = ramp / 4)',
  source: 'Gaussian-filtered step (erf rise), common practice for flux pulses',
  ramp: ({ parkFlux, destFlux, rampNs }) => {
    const s = ERF_EDGE_SIGMAS;
    const e0 = erf(-s / Math.SQRT2);
    const e1 = erf(s / Math.SQRT2);
    return (t) => {
      if (t <= 0) return parkFlux;
      if (t >= rampNs) return destFlux;
      const x = (2 * s * t) / rampNs - s;
      const frac = (erf(x / Math.SQRT2) - e0) / (e1 - e0);
      return parkFlux + (destFlux - parkFlux) * frac;
    };
  },
};
