/**
 * Squeezing-aware ramp, designed through the width of a Gaussian ansatz of the mover's wave
 * function in the phase phi (time-dependent variational principle; in the harmonic limit the
 * width obeys the Ermakov equation and the design is invariant-based inverse engineering,
 * Chen, Ruschhaupt, Schmidt, del Campo, Guery-Odelin and Muga, Phys. Rev. Lett. 104, 063002
 * (2010)). For psi ~ exp(-phi^2 / (4 sigma^2) + i beta phi^2) in H = 4 E_C n^2 - E_J cos phi,
 * <cos phi> = exp(-sigma^2 / 2) and the width's equation of motion is (energies E/h in GHz,
 * time in ns)
 *
 *     d^2 sigma / dt^2 = (2 pi)^2 [ 16 E_C^2 / sigma^3 - 8 E_C E_J(t) sigma exp(-sigma^2 / 2) ],
 *
 * with the cosine potential's factor exp(-sigma^2/2) kept (the harmonic limit drops it). Its
 * static solution, sigma^4 exp(-sigma^2/2) = 2 E_C / E_J, is the ground-state width. We choose
 * sigma(t) from the parking width to the destination width along a degree-7 smoothstep (value
 * and three derivatives fixed at both ends, so the wave function starts and ends at rest, with
 * no breathing left) and invert the equation for E_J(t), then for the flux. A ramp too short
 * for the available E_J range is reported as infeasible.
 */
import { fluxForJosephsonEnergy } from '../../transmon/josephson.js';
import { RampInfeasible, tabulatedRamp, type RampFamily } from './family.js';

/** Ground-state width: sigma^4 exp(-sigma^2 / 2) = 2 E_C / E_J (Newton in ln sigma). */
export function gaussianWidth(ecGHz: number, ejGHz: number): number {
  const target = Math.log((2 * ecGHz) / ejGHz);
  let s = Math.pow((2 * ecGHz) / ejGHz, 0.25);
  for (let it = 0; it < 50; it++) {
    const f = 4 * Math.log(s) - 0.5 * s * s - target;
    const df = 4 / s - s;
    const step = f / df;
    s -= step;
    if (Math.abs(step) < 1e-15 * s) break;
  }
  return s;
}

/** Degree-7 smoothstep and its second derivative. */
export function smoothstep7(x: number): { v: number; d2: number } {
  const x2 = x * x;
  const x3 = x2 * x;
  const x4 = x3 * x;
  const x5 = x4 * x;
  const x6 = x5 * x;
  const x7 = x6 * x;
  return {
    v: 35 * x4 - 84 * x5 + 70 * x6 - 20 * x7,
    d2: 420 * x2 - 1680 * x3 + 2100 * x4 - 840 * x5,
  };
}

export const SQUEEZING_AWARE_GRID = 200;

export const squeezingAwareFamily: RampFamily = {
  name: 'squeezing-aware',
  summary: 'Gaussian-width (Ermakov with cosine correction) inverse engineering',
  source: 'Chen et al., Phys. Rev. Lett. 104, 063002 (2010), with the cosine-potential term',
  ramp: ({ ctx, parkFlux, destFlux, rampNs }) => {
    const q = ctx.mover;
    const ec = q.ecGHz;
    const s0 = gaussianWidth(ec, q.ejGHz(parkFlux));
    const s1 = gaussianWidth(ec, q.ejGHz(destFlux));
    const n = SQUEEZING_AWARE_GRID;
    const out = new Float64Array(n + 1);
    // E_J is even in the flux: stay on the side (sign) of the parking and destination fluxes
    const sign = (parkFlux !== 0 ? parkFlux : destFlux) < 0 ? -1 : 1;
    const twoPi2 = 4 * Math.PI * Math.PI;
    for (let k = 0; k <= n; k++) {
      if (k === 0) {
        out[k] = parkFlux;
        continue;
      }
      if (k === n) {
        out[k] = destFlux;
        continue;
      }
      const { v, d2 } = smoothstep7(k / n);
      const sigma = s0 + (s1 - s0) * v;
      const sdd = ((s1 - s0) * d2) / (rampNs * rampNs);
      const ej = (16 * ec * ec) / (sigma * sigma * sigma) - sdd / twoPi2;
      const ejt = ej / (8 * ec * sigma * Math.exp(-0.5 * sigma * sigma));
      const f = fluxForJosephsonEnergy(q.ejsGHz, q.asymmetry, ejt);
      if (!Number.isFinite(f)) {
        throw new RampInfeasible(`the squeezing-aware ramp of ${q.id} needs E_J = ${ejt.toFixed(3)} GHz, outside its range [${(q.asymmetry * q.ejsGHz).toFixed(3)}, ${q.ejsGHz.toFixed(3)}] GHz; use a longer ramp`);
      }
      out[k] = sign * f;
    }
    return tabulatedRamp(rampNs, out);
  },
};
