/**
 * The fixed-basis reference propagator: slow, simple, and the test oracle for the adiabatic-frame
 * scheme.
 *
 * Basis: the mover's lowest K eigenstates at the parking flux, product with the static
 * transmons' eigenstates. With u = E_J of the mover,
 *
 *     H(t) = H_park + (u(t) - u_park) Cfull,    Cfull = -cos(phi_0) (x) 1 (x) ...,
 *
 * exact for the model truncated to the basis (the fixed basis needs many mover levels, ~14, to
 * follow a large excursion). Time steps are uniform inside each trajectory segment; each step
 * uses the fourth-order commutator-free Magnus integrator of Blanes and Moan (Appl. Numer. Math.
 * 56, 1519 (2006)):
 *     x <- exp(-i h (a H1 + b H2)) exp(-i h (b H1 + a H2)) x,   a = 1/4 - sqrt3/6, b = 1/4 + sqrt3/6,
 * H1, H2 at the Gauss-Legendre nodes, and each exponential by the Chebyshev expansion
 * (src/linalg/chebyshev-propagator.ts) with mat-vecs that use the Kronecker structure.
 * Also exports the model's Hamiltonian pieces (for the QuTiP cross-check).
 */
import { transmonLevels } from '../transmon/levels.js';
import { chargeMatrix, cosPhiMatrix } from '../transmon/matrix-elements.js';
import { josephsonEnergy } from '../transmon/josephson.js';
import { symmetricEigen } from '../linalg/symmetric-eigen.js';
import { ChebyshevPropagator } from '../linalg/chebyshev-propagator.js';
import { paritySectors, productHamiltonian, productLevels, productSpace, subMatrix, type ProductSpace } from '../pair/product-basis.js';
import { DEFAULT_CHARGE_CUTOFF, type SimModel } from './model.js';
import type { Trajectory } from './trajectory.js';

export interface FixedBasisModel {
  space: ProductSpace;
  /** E_J of the mover at parking (GHz). */
  ejPark: number;
  /** Dense H_park (size x size). */
  hPark: Float64Array;
  /** Dense -cos(phi_0) (x) 1 (size x size). */
  cFull: Float64Array;
  /** Per transmon: energies and charge matrix; mover also cos phi. */
  energies: Float64Array[];
  charge: Float64Array[];
  cosMover: Float64Array;
  /** Dressed eigenstates of H_park: energies and vectors (columns), with bare labels. */
  dressedEnergies: Float64Array;
  dressedVectors: Float64Array;
  dressedLabels: number[][];
  /** Spectral bounds of H_park and the norm of Cfull. */
  hLo: number;
  hHi: number;
  cNorm: number;
}

export function fixedBasisModel(model: SimModel, parkFlux: number): FixedBasisModel {
  const nCut = model.chargeCutoff ?? DEFAULT_CHARGE_CUTOFF;
  const space = productSpace(model.transmons.map((t) => t.levels));
  const energies: Float64Array[] = [];
  const charge: Float64Array[] = [];
  let cosMover: Float64Array = new Float64Array(0);
  let ejPark = 0;
  model.transmons.forEach((t, i) => {
    const flux = i === 0 ? parkFlux : t.flux;
    const ej = josephsonEnergy(t.ejsGHz, t.asymmetry, flux);
    if (i === 0) ejPark = ej;
    const lv = transmonLevels(t.ecGHz, ej, { levels: t.levels, chargeCutoff: nCut, vectors: true });
    energies.push(lv.energies);
    charge.push(chargeMatrix(lv));
    if (i === 0) cosMover = cosPhiMatrix(lv);
  });
  const parts = energies.map((e, i) => ({ energies: e, charge: charge[i] }));
  const hPark = productHamiltonian(space, parts, model.couplings);
  const n = space.size;
  const cFull = new Float64Array(n * n);
  const k0 = space.dims[0];
  const s0 = space.strides[0];
  for (let p = 0; p < n; p++) {
    const m0 = Math.floor(p / s0) % k0;
    const rest = p - m0 * s0;
    for (let m = 0; m < k0; m++) cFull[p * n + rest + m * s0] = -cosMover[m0 * k0 + m];
  }
  // Dressed states per sector, labelled by energy order matched to bare order.
  const dressedEnergies = new Float64Array(n);
  const dressedVectors = new Float64Array(n * n);
  const dressedLabels: number[][] = new Array(n);
  const sectors = paritySectors(space);
  let col = 0;
  for (const idx of [sectors.even, sectors.odd]) {
    if (idx.length === 0) continue;
    const eig = symmetricEigen(subMatrix(hPark, n, idx), idx.length);
    const bare = Array.from(idx, (p) => ({ p, e: hPark[p * n + p] })).sort((a, b) => a.e - b.e || a.p - b.p);
    for (let k = 0; k < idx.length; k++) {
      const label = bare[k].p;
      dressedLabels[col] = productLevels(space, label);
      dressedEnergies[col] = eig.values[k];
      const r0 = Array.prototype.indexOf.call(idx, label) as number;
      const sign = eig.vectors[r0 * idx.length + k] < 0 ? -1 : 1;
      for (let r = 0; r < idx.length; r++) dressedVectors[idx[r] * n + col] = sign * eig.vectors[r * idx.length + k];
      col++;
    }
  }
  const hEig = symmetricEigen(hPark, n).values;
  const cEig = symmetricEigen(cFull, n).values;
  const cNorm = Math.max(Math.abs(cEig[0]), Math.abs(cEig[n - 1]));
  return { space, ejPark, hPark, cFull, energies, charge, cosMover, dressedEnergies, dressedVectors, dressedLabels, hLo: hEig[0], hHi: hEig[n - 1], cNorm };
}

/** Column of the dressed state labelled `levels`. */
export function fixedBasisStateColumn(fb: FixedBasisModel, levels: readonly number[]): number {
  const k = fb.dressedLabels.findIndex((l) => l.every((m, i) => m === levels[i]));
  if (k < 0) throw new RangeError(`fixed basis: no state labelled ${levels.join('')}`);
  return k;
}

export interface FixedBasisOptions {
  /** Uniform step inside each segment (ns). */
  stepNs?: number;
}

export const FIXED_BASIS_DEFAULTS = Object.freeze({ stepNs: 0.005 });

/**
 * Propagate the dressed states labelled `initial` through the trajectory; returns their final
 * state vectors in the fixed product basis (Schrodinger picture, no frame).
 */
export function propagateFixedBasis(
  model: SimModel,
  fb: FixedBasisModel,
  traj: Trajectory,
  initial: readonly (readonly number[])[],
  options: FixedBasisOptions = {},
): { re: Float64Array[]; im: Float64Array[] } {
  const o = { ...FIXED_BASIS_DEFAULTS, ...options };
  const n = fb.space.size;
  const t0 = model.transmons[0];
  const re = initial.map((lv) => {
    const c = fixedBasisStateColumn(fb, lv);
    const v = new Float64Array(n);
    for (let r = 0; r < n; r++) v[r] = fb.dressedVectors[r * n + c];
    return v;
  });
  const im = initial.map(() => new Float64Array(n));
  const cheb = new ChebyshevPropagator(n);
  let delta = 0;
  const h = fb.hPark;
  const cf = fb.cFull;
  const matvec = (x: Float64Array, y: Float64Array): void => {
    for (let r = 0; r < n; r++) {
      let s = 0;
      const row = r * n;
      for (let q = 0; q < n; q++) s += (h[row + q] + delta * cf[row + q]) * x[q];
      y[r] = s;
    }
  };
  const a = 0.25 - Math.sqrt(3) / 6;
  const b = 0.25 + Math.sqrt(3) / 6;
  const g1 = 0.5 - Math.sqrt(3) / 6;
  const g2 = 0.5 + Math.sqrt(3) / 6;
  const uOf = (x: number): number => josephsonEnergy(t0.ejsGHz, t0.asymmetry, x) - fb.ejPark;
  const TWO_PI = 2 * Math.PI;
  for (let k = 0; k + 1 < traj.timeNs.length; k++) {
    const dt = traj.timeNs[k + 1] - traj.timeNs[k];
    const x0 = traj.flux[k];
    const x1 = traj.flux[k + 1];
    const steps = x0 === x1 ? 1 : Math.max(1, Math.ceil(dt / o.stepNs));
    const hs = dt / steps;
    for (let q = 0; q < steps; q++) {
      const u1 = uOf(x0 + ((x1 - x0) * (q + g1)) / steps);
      const u2 = uOf(x0 + ((x1 - x0) * (q + g2)) / steps);
      // H = hPark + u Cfull; combos (b u1 + a u2) first, then (a u1 + b u2); each with weight 1/2 on hPark.
      for (const w of [b * u1 + a * u2, a * u1 + b * u2]) {
        // exp(-i hs (H_park/2 + w C)) = exp(-i (hs/2) (H_park + 2 w C))
        delta = 2 * w;
        const lo = fb.hLo - Math.abs(delta) * fb.cNorm;
        const hi = fb.hHi + Math.abs(delta) * fb.cNorm;
        for (let c = 0; c < re.length; c++) cheb.apply(matvec, lo, hi, TWO_PI * hs * 0.5, re[c], im[c]);
      }
    }
  }
  return { re, im };
}

/** The lab-frame computational block M (order 00, 01, 10, 11) of the fixed-basis propagation. */
export function fixedBasisBlock(model: SimModel, traj: Trajectory, options: FixedBasisOptions & { spectatorLevels?: number[] } = {}): { re: Float64Array; im: Float64Array } {
  const fb = fixedBasisModel(model, traj.flux[0]);
  const spect = options.spectatorLevels ?? new Array(Math.max(0, model.transmons.length - 2)).fill(0);
  const labels = [
    [0, 0],
    [0, 1],
    [1, 0],
    [1, 1],
  ].map((l) => [...l, ...spect]);
  const fr = propagateFixedBasis(model, fb, traj, labels, options);
  return fixedBasisLabBlock(fb, labels, fr.re, fr.im, traj.timeNs[traj.timeNs.length - 1] - traj.timeNs[0]);
}

/**
 * The lab-frame block M (README physics conventions sec. 3) from the final fixed-basis vectors of the four
 * computational inputs (`labels`, order 00, 01, 10, 11, spectator levels appended) after a
 * trajectory of duration T: projections on the dressed states at parking, rotated by the
 * lab-frame phases of the computational energies.
 */
export function fixedBasisLabBlock(fb: FixedBasisModel, labels: readonly (readonly number[])[], finalRe: ArrayLike<number>[], finalIm: ArrayLike<number>[], T: number): { re: Float64Array; im: Float64Array } {
  const n = fb.space.size;
  const col = labels.map((l) => fixedBasisStateColumn(fb, l));
  const e = col.map((c) => fb.dressedEnergies[c]);
  const re = new Float64Array(16);
  const im = new Float64Array(16);
  labels.forEach((lr, r) => {
    const ph = 2 * Math.PI * (e[0] + lr[0] * (e[2] - e[0]) + lr[1] * (e[1] - e[0])) * T;
    for (let c = 0; c < 4; c++) {
      let sr = 0;
      let si = 0;
      for (let q = 0; q < n; q++) {
        const v = fb.dressedVectors[q * n + col[r]];
        sr += v * finalRe[c][q];
        si += v * finalIm[c][q];
      }
      re[r * 4 + c] = Math.cos(ph) * sr - Math.sin(ph) * si;
      im[r * 4 + c] = Math.sin(ph) * sr + Math.cos(ph) * si;
    }
  });
  return { re, im };
}
