/**
 * Flat-top pulse with error-function edges: the rise is erf-shaped in flux over the ramp time
 * (Gaussian-filtered step, the practical baseline of flux-pulse generation; the edge width is
 * sigma = rampNs / 4 so the rise spans +-2 sigma), renormalised to start and end exactly.
 */
import type { RampFamily } from './family.js';
import { erf } from '../../util/erf.js';

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
