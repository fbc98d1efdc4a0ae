/**
 * Linear ramp in flux: the baseline, a straight line from parking to destination (the first CZ
 * demonstrations used near-square flux pulses, DiCarlo et al., Nature 460, 240 (2009), from
 * memory). No adiabaticity control: leakage comes from the crossing's Landau-Zener physics and is
 * removed, if at all, by hold and destination tuning.
 */
import type { RampFamily } from './family.js';

export const linearFamily: RampFamily = {
  name: 'linear',
  summary: 'straight line in flux',
  source: 'baseline (linear interpolation)',
  ramp: ({ parkFlux, destFlux, rampNs }) => (t) => (t <= 0 ? parkFlux : t >= rampNs ? destFlux : parkFlux + ((destFlux - parkFlux) * t) / rampNs),
};
