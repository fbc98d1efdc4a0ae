/**
 * The simulator's model in its plain moving product basis (no frame, no interpolation): the
 * reference the dressed-manifold frame is checked against, and the form handed to QuTiP in the
 * cross-check tests.
 *
 * Basis |p(u)> = |m(u)> (x) |k> (x) ..., u = E_J of the mover, K_0 instantaneous mover levels.
 * Schrodinger equation (rad/ns):
 *
 *     i dc/dt = [ 2 pi H_b(u) - i (du/dt) T(u) (x) 1 ] c,
 *     H_b = diag(E_m(u) + E_k + ...) + sum G_ij N_i (x) N_j,   T_mm' = <m|d/du m'>.
 *
 * `propagateMovingBasis` integrates it with the fourth-order Magnus method and an exact
 * exponential per step (dense Hermitian eigen-decomposition): simple and slow, for tests.
 */
import { applyEigenExponential } from '../linalg/complex.js';
import { hermitianEigen } from '../linalg/hermitian-eigen.js';
import { symmetricEigen } from '../linalg/symmetric-eigen.js';
import { josephsonEnergy, josephsonEnergySlope } from '../transmon/josephson.js';
import { paritySectors, productHamiltonian, productLevels, productSpace, subMatrix, type ProductSpace, type TransmonPart } from '../pair/product-basis.js';
import { DEFAULT_CHARGE_CUTOFF, type SimModel } from './model.js';
import type { Trajectory } from './trajectory.js';
import { moverSample, staticTransmonParts } from './mover-sample.js';

export interface MovingBasisPoint {
  /** H_b (size x size, GHz). */
  h: Float64Array;
  /** T (x) 1 (size x size, per GHz of E_J; antisymmetric). */
  t: Float64Array;
}

export class MovingBasisModel {
  readonly space: ProductSpace;
  private readonly nCut: number;
  private readonly statics: TransmonPart[];

  constructor(readonly model: SimModel) {
    this.nCut = model.chargeCutoff ?? DEFAULT_CHARGE_CUTOFF;
    this.space = productSpace(model.transmons.map((t) => t.levels));
    this.statics = staticTransmonParts(model, this.nCut);
  }

  at(u: number): MovingBasisPoint {
    const t0 = this.model.transmons[0];
    const k0 = t0.levels;
    const { energies, charge, tm } = moverSample(t0.ecGHz, u, k0, this.nCut);
    const parts = this.statics.slice();
    parts[0] = { energies, charge };
    const h = productHamiltonian(this.space, parts, this.model.couplings);
    const n = this.space.size;
    const t = new Float64Array(n * n);
    const s0 = this.space.strides[0];
    for (let p = 0; p < n; p++) {
      const m0 = Math.floor(p / s0) % k0;
      const rest = p - m0 * s0;
      for (let m = 0; m < k0; m++) t[p * n + rest + m * s0] = tm[m0 * k0 + m];
    }
    // exact antisymmetry
    for (let p = 0; p < n; p++)
      for (let q = p; q < n; q++) {
        const a = 0.5 * (t[p * n + q] - t[q * n + p]);
        t[p * n + q] = a;
        t[q * n + p] = -a;
      }
    return { h, t };
  }

  /**
   * Dressed eigenstates of H_b at u, labelled per parity sector by matching the energy order to
   * the bare order (the same rule as everywhere in fluxlane). Columns of `vectors` (size x size).
   */
  dressed(u: number): { energies: Float64Array; vectors: Float64Array; labels: number[][] } {
    const { h } = this.at(u);
    const n = this.space.size;
    const energies = new Float64Array(n);
    const vectors = new Float64Array(n * n);
    const labels: number[][] = new Array(n);
    const { even, odd } = paritySectors(this.space);
    for (const idx of [even, odd]) {
      if (idx.length === 0) continue;
      const eig = symmetricEigen(subMatrix(h, n, idx), idx.length);
      const bare = Array.from(idx, (p) => ({ p, e: h[p * n + p] })).sort((a, b) => a.e - b.e || a.p - b.p);
      for (let k = 0; k < idx.length; k++) {
        const p = bare[k].p;
        const r0 = Array.prototype.indexOf.call(idx, p) as number;
        const sign = eig.vectors[r0 * idx.length + k] < 0 ? -1 : 1;
        energies[p] = eig.values[k];
        labels[p] = productLevels(this.space, p);
        for (let r = 0; r < idx.length; r++) vectors[idx[r] * n + p] = sign * eig.vectors[r * idx.length + k];
      }
    }
    return { energies, vectors, labels };
  }
}

/**
 * Propagate product-basis state vectors (columns re/im, size each) through a trajectory with
 * uniform Magnus steps of at most stepNs per segment (holds in one exact step).
 */
export function propagateMovingBasis(mb: MovingBasisModel, traj: Trajectory, re: Float64Array[], im: Float64Array[], stepNs: number): void {
  const model = mb.model;
  const mover = model.transmons[0];
  const n = mb.space.size;
  const g1 = 0.5 - Math.sqrt(3) / 6;
  const g2 = 0.5 + Math.sqrt(3) / 6;
  const mr = new Float64Array(n * n);
  const mi = new Float64Array(n * n);
  const tr = new Float64Array(n);
  const ti = new Float64Array(n);
  const TWO_PI = 2 * Math.PI;
  for (let k = 0; k + 1 < traj.timeNs.length; k++) {
    const dt = traj.timeNs[k + 1] - traj.timeNs[k];
    const x0 = traj.flux[k];
    const x1 = traj.flux[k + 1];
    const steps = x0 === x1 ? 1 : Math.max(1, Math.ceil(dt / stepNs - 1e-9));
    const h = dt / steps;
    const v = (x1 - x0) / dt;
    for (let q = 0; q < steps; q++) {
      const xa = x0 + v * (q + g1) * h;
      const xb = x0 + v * (q + g2) * h;
      const pa = mb.at(josephsonEnergy(mover.ejsGHz, mover.asymmetry, xa));
      const pb = mb.at(josephsonEnergy(mover.ejsGHz, mover.asymmetry, xb));
      const ra = v * josephsonEnergySlope(mover.ejsGHz, mover.asymmetry, xa);
      const rb = v * josephsonEnergySlope(mover.ejsGHz, mover.asymmetry, xb);
      // H_k = 2 pi h_k - i r_k t_k ; M = (h/2)(H1 + H2) - i c [H2, H1]
      const c = (Math.sqrt(3) * h * h) / 12;
      for (let a = 0; a < n; a++)
        for (let b = 0; b < n; b++) {
          // [H2, H1] = 4 pi^2 [h2, h1] - 2 pi i (r1 [h2, t1] + r2 [t2, h1]) - r1 r2 [t2, t1]
          let c1 = 0;
          let c2 = 0;
          let c3 = 0;
          for (let z = 0; z < n; z++) {
            c1 += pb.h[a * n + z] * pa.h[z * n + b] - pa.h[a * n + z] * pb.h[z * n + b];
            c2 += ra * (pb.h[a * n + z] * pa.t[z * n + b] - pa.t[a * n + z] * pb.h[z * n + b]) + rb * (pb.t[a * n + z] * pa.h[z * n + b] - pa.h[a * n + z] * pb.t[z * n + b]);
            c3 += pb.t[a * n + z] * pa.t[z * n + b] - pa.t[a * n + z] * pb.t[z * n + b];
          }
          // -i c [H2,H1] = -i c 4pi^2 c1 - 2 pi c c2 + i c ra rb c3
          mr[a * n + b] = Math.PI * h * (pa.h[a * n + b] + pb.h[a * n + b]) - TWO_PI * c * c2;
          mi[a * n + b] = -0.5 * h * (ra * pa.t[a * n + b] + rb * pb.t[a * n + b]) - 4 * Math.PI * Math.PI * c * c1 + c * ra * rb * c3;
        }
      const eig = hermitianEigen(mr, mi, n, { sort: false });
      for (let col = 0; col < re.length; col++) applyEigenExponential(eig.vectorsRe, eig.vectorsIm, eig.values, n, re[col], im[col], tr, ti);
    }
  }
}

/** The lab-frame computational block M (order 00, 01, 10, 11) from the moving-basis reference. */
export function movingBasisBlock(model: SimModel, traj: Trajectory, stepNs: number, spectatorLevels?: number[]): { re: Float64Array; im: Float64Array } {
  const mb = new MovingBasisModel(model);
  const mover = model.transmons[0];
  const dr = mb.dressed(josephsonEnergy(mover.ejsGHz, mover.asymmetry, traj.flux[0]));
  const n = mb.space.size;
  const spect = spectatorLevels ?? new Array(Math.max(0, model.transmons.length - 2)).fill(0);
  const labels = [
    [0, 0],
    [0, 1],
    [1, 0],
    [1, 1],
  ];
  const idx = labels.map((l) => [...l, ...spect].reduce((acc, m, i) => acc + m * mb.space.strides[i], 0));
  const re = idx.map((p) => {
    const v = new Float64Array(n);
    for (let q = 0; q < n; q++) v[q] = dr.vectors[q * n + p];
    return v;
  });
  const im = idx.map(() => new Float64Array(n));
  propagateMovingBasis(mb, traj, re, im, stepNs);
  const T = traj.timeNs[traj.timeNs.length - 1] - traj.timeNs[0];
  const e = idx.map((p) => dr.energies[p]);
  const mre = new Float64Array(16);
  const mim = new Float64Array(16);
  labels.forEach(([i, j], r) => {
    const ph = 2 * Math.PI * (e[0] + i * (e[2] - e[0]) + j * (e[1] - e[0])) * T;
    for (let c = 0; c < 4; c++) {
      let sr = 0;
      let si = 0;
      for (let q = 0; q < n; q++) {
        const v = dr.vectors[q * n + idx[r]];
        sr += v * re[c][q];
        si += v * im[c][q];
      }
      mre[r * 4 + c] = Math.cos(ph) * sr - Math.sin(ph) * si;
      mim[r * 4 + c] = Math.sin(ph) * sr + Math.cos(ph) * si;
    }
  });
  return { re: mre, im: mim };
}
