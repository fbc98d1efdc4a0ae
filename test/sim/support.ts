/**
 * A coupled pair used across the simulator tests (an invented example): mover A (E_C 0.20 GHz,
 * E_JS 25 GHz, d 0.3, f_max ~ 6.12 GHz) above partner B (E_C 0.21 GHz, E_JS 17 GHz, d 0.3,
 * f_max ~ 5.12 GHz, static at Phi = 0), g = 15 MHz at maximum frequency.
 */
import { transmonLevels } from '../../src/transmon/levels.js';
import { chargeMatrix } from '../../src/transmon/matrix-elements.js';
import { josephsonEnergy } from '../../src/transmon/josephson.js';
import type { SimModel, TransmonNoise } from '../../src/sim/model.js';
import type { Trajectory } from '../../src/sim/trajectory.js';

export const MOVER = { ecGHz: 0.2, ejsGHz: 25, asymmetry: 0.3 };
export const PARTNER = { ecGHz: 0.21, ejsGHz: 17, asymmetry: 0.3 };
export const G_EXCHANGE = 0.015;

export function f01(ec: number, ej: number): number {
  const l = transmonLevels(ec, ej, { levels: 2 });
  return l.energies[1] - l.energies[0];
}

export function anharmonicity(ec: number, ej: number): number {
  const l = transmonLevels(ec, ej, { levels: 3 });
  return l.energies[2] - 2 * l.energies[1] + l.energies[0];
}

function n01(ec: number, ej: number): number {
  const l = transmonLevels(ec, ej, { levels: 2, vectors: true });
  return Math.abs(chargeMatrix(l)[1]);
}

export const G_CHARGE = G_EXCHANGE / (n01(MOVER.ecGHz, MOVER.ejsGHz) * n01(PARTNER.ecGHz, PARTNER.ejsGHz));

export function pairModel(levelsA = 6, levelsB = 4, noise?: { a: TransmonNoise; b: TransmonNoise }): SimModel {
  return {
    transmons: [
      { ...MOVER, levels: levelsA, flux: 0, noise: noise?.a },
      { ...PARTNER, levels: levelsB, flux: 0, noise: noise?.b },
    ],
    couplings: [{ a: 0, b: 1, gCharge: G_CHARGE }],
  };
}

/** Mover flux where its bare f01 equals f01_B - alpha_A (the bare 11-20 resonance). */
export function crossingFlux(): number {
  const fB = f01(PARTNER.ecGHz, PARTNER.ejsGHz);
  const target = fB - anharmonicity(MOVER.ecGHz, MOVER.ejsGHz);
  let lo = 0;
  let hi = 0.5;
  for (let i = 0; i < 80; i++) {
    const m = 0.5 * (lo + hi);
    const e = josephsonEnergy(MOVER.ejsGHz, MOVER.asymmetry, m);
    const l = transmonLevels(MOVER.ecGHz, e, { levels: 3 });
    const fA = l.energies[1] - l.energies[0];
    if (fA > target) lo = m;
    else hi = m;
  }
  return 0.5 * (lo + hi);
}

/** Linear ramps to `flux` and back with a hold: times 0, r, r + hold, 2 r + hold. */
export function trapezoid(flux: number, rampNs: number, holdNs: number): Trajectory {
  return { timeNs: Float64Array.from([0, rampNs, rampNs + holdNs, 2 * rampNs + holdNs]), flux: Float64Array.from([0, flux, flux, 0]) };
}

/** Cosine ramps sampled every `dtNs` (samples joined linearly), hold in between. */
export function cosineRamps(flux: number, rampNs: number, holdNs: number, dtNs: number): Trajectory {
  const t: number[] = [];
  const x: number[] = [];
  const n = Math.round(rampNs / dtNs);
  for (let k = 0; k <= n; k++) {
    t.push(k * dtNs);
    x.push(flux * (0.5 - 0.5 * Math.cos((Math.PI * k) / n)));
  }
  if (holdNs > 0) {
    t.push(rampNs + holdNs);
    x.push(flux);
  }
  for (let k = 1; k <= n; k++) {
    t.push(rampNs + holdNs + k * dtNs);
    x.push(flux * (0.5 - 0.5 * Math.cos((Math.PI * (n - k)) / n)));
  }
  return { timeNs: Float64Array.from(t), flux: Float64Array.from(x) };
}

/** E_J range of a trajectory's samples (the mover's flux branch is monotonic between them). */
export function ejRange(traj: Trajectory): { ejLo: number; ejHi: number } {
  const e = Array.from(traj.flux, (x) => josephsonEnergy(MOVER.ejsGHz, MOVER.asymmetry, x));
  return { ejLo: Math.min(...e), ejHi: Math.max(...e) };
}

/** max |a_i - b_i| over two 4 x 4 complex blocks. */
export function blockDistance(a: { re: ArrayLike<number>; im: ArrayLike<number> }, b: { re: ArrayLike<number>; im: ArrayLike<number> }): number {
  let m = 0;
  for (let i = 0; i < 16; i++) {
    const dr = a.re[i] - b.re[i];
    const di = a.im[i] - b.im[i];
    m = Math.max(m, Math.sqrt(dr * dr + di * di));
  }
  return m;
}
