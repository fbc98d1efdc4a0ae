/**
 * The dressed-manifold frame of a mover-plus-static-transmons model: precomputed once per model
 * and range of the mover's Josephson energy, reused by every simulation inside that range
 * (work per pair, not per simulation: the frame is built once and reused by every simulation of the edge).
 *
 * Model (a Galerkin model on a moving basis, exact as the level cutoffs grow): the mover is kept
 * through its K_0 lowest instantaneous eigenstates |m(u)>, u = E_J of the mover, so that in the
 * product basis |p(u)> = |m(u)> (x) |k> (x) ... the Schrodinger equation reads
 *
 *     i dc/dt = [ 2 pi H_b(u) - i (du/dt) T(u) (x) 1 ] c,
 *     H_b = diag(E_m(u) + E_k + ...) + sum G_ij N_i(u) (x) N_j,   T_mm' = <m|d/du m'>,
 *
 * where T carries the distortion of the mover's wave function (squeezing; levels and wave-
 * function derivatives by src/transmon/level-derivatives.ts).
 *
 * Frame: H_b conserves the excitation-parity sector, and inside a sector the states of one
 * excitation manifold (total excitation number k) form a dressed subspace well separated from
 * the others. For each kept manifold (k <= keepExcitations) the frame basis is the Lowdin
 * (polar) orthonormalisation of the dressed subspace's projection onto the bare states of the
 * manifold (des Cloizeaux, Nucl. Phys. 20, 321 (1960); the "canonical" block diagonalisation):
 *
 *     Vt_k = V_k X_k (X_k^T X_k)^(-1/2),   X_k = V_k^T B_k,
 *
 * V_k the dressed eigenvectors of the manifold, B_k its bare states. Vt is gauge-free and smooth
 * in u (no eigenvector signs or labels to follow, no trouble at avoided crossings inside a
 * manifold), each frame state carries the bare label it continues from, and H_b is exactly
 * block diagonal in it: E(u) = Vt^T H_b Vt. The generator becomes
 *
 *     i da/dt = [ 2 pi E(u) - i (du/dt) A(u) ] a,    A = Vt^T dVt/du + Vt^T (T (x) 1) Vt,
 *
 * A real antisymmetric. Counter-rotating (inter-manifold) dressing is thus exact, and only du/dt
 * times the small A couples manifolds. Frame states of manifolds above keepExcitations are
 * dropped (they are reached only through A at higher order; test/sim shows convergence).
 *
 * Interpolation: Vt, E and X = Vt^T (T (x) 1) Vt are sampled at Chebyshev-Lobatto points in u
 * (doubling until the tail coefficients are below tolerance; they converge geometrically since
 * everything is analytic in u away from u = 0), dVt/du comes from the Chebyshev series, and E
 * and A are tabulated with exact derivatives on a fine uniform u grid for cubic Hermite
 * evaluation inside the time loop.
 */
import { symmetricEigen } from '../linalg/symmetric-eigen.js';
import { hermiteWeights } from '../linalg/cubic-hermite.js';
import { symmetricEigenQL, symmetricEigenQLScratch, type SymmetricEigenQLScratch } from '../linalg/symmetric-eigen-ql.js';
import { chebyshevCoefficientRows, chebyshevCoefficients, chebyshevDerivative, chebyshevEvaluate, chebyshevPoints } from '../linalg/chebyshev-series.js';
import { paritySectors, productHamiltonian, productLevels, productSpace, subMatrix, type ProductSpace, type TransmonPart } from '../pair/product-basis.js';
import { DEFAULT_CHARGE_CUTOFF, type SimModel } from './model.js';
import { keptMoverSample, staticTransmonParts } from './mover-sample.js';

/**
 * Sector size from which the dressed states come from Householder + QL (src/linalg/
 * symmetric-eigen-ql.ts) instead of Jacobi. The frame uses only the subspace each manifold's
 * eigenvectors span (Lowdin orthonormalisation below), which both give to ~1e-14. Measured on
 * the demo plans' sectors (both solvers on the same matrices, 2026-12-03): 37-38 states 1.8x,
 * 22-23 states 1.4-1.7x, 12 states 1.2x faster. Below 28 Jacobi stays: the pair frames' sectors
 * are smaller, and a change there moves every designed pulse at the designer's own tolerance
 * (~1e-6 in margins), for about 3 % of a plan's CPU.
 */
export const QL_FROM_SIZE = 28;

/**
 * Sector size from which the error budget's own frames (the spectators' three-transmon models, the
 * pair alone on their model size, the partner-offset frames of the flux-noise average:
 * src/budget/) use Householder + QL. They feed no search whose tolerance amplifies a change, so
 * the ~1e-14 by which the two solvers' subspaces differ stays ~1e-14 in the reported errors, and
 * their 12-23-state sectors are where QL is 1.2-1.7x faster (above).
 */
export const BUDGET_QL_FROM_SIZE = 8;

/**
 * Intervals of the jump operators' Hermite tables (their own grid; the frame's E and X tables keep
 * tableIntervals). The ladder and number operators in the frame vary slowly with E_J: on five
 * designed gates (Clove-17 D4-Z3, D5-X2, D1-X3 and Bowline-5 Q1-Q0, Q0-Q4; movers at their
 * sweet spots, partners at 5 GHz or 50 MHz below their sweet spots) the first-order T1 and white-dephasing terms and the Lindblad fidelity
 * with 8 intervals differ from those with 128 by at most 4e-12 relative (2026-12-03;
 * test/sim/decoherence.test.ts keeps 16 against 128 within 1e-9), and 16 intervals fill an
 * eighth of the table points of 128.
 */
export const NOISE_TABLE_INTERVALS = 16;

export interface ManifoldFrameOptions {
  /** Range of the mover's E_J (GHz) to cover. */
  ejLo: number;
  ejHi: number;
  /** Keep the frame states of manifolds with total excitation <= this. */
  keepExcitations?: number;
  /** Tolerance on the Chebyshev tail of Vt (dimensionless) and of E (GHz). */
  vectorTol?: number;
  energyTolGHz?: number;
  /** Looser tail tolerance for the frame states of manifolds above 2 (see tailRatio()). */
  highTol?: number;
  /** First and largest Chebyshev degree. */
  firstDegree?: number;
  maxDegree?: number;
  /** Intervals of the Hermite table. */
  tableIntervals?: number;
  /** Give up before maxDegree when the tail has stopped shrinking (see frameTailHopeless). */
  stopHopeless?: boolean;
  /** Also tabulate each transmon's ladder b and number b^dag b in the frame (for decoherence). */
  noiseOperators?: boolean;
  /** Sectors of at least this many states use Householder + QL, smaller ones Jacobi (default QL_FROM_SIZE). */
  qlFromSize?: number;
  /** Intervals of the jump operators' Hermite tables (at most tableIntervals; see NOISE_TABLE_INTERVALS). */
  noiseTableIntervals?: number;
  /**
   * Drop the mover's wave-function derivative T (a model that ignores the distortion of the
   * transmon with flux). Physically wrong; it exists to show the size of that error.
   */
  dropWavefunctionDerivative?: boolean;
}

export const MANIFOLD_FRAME_DEFAULTS = Object.freeze({
  keepExcitations: 4,
  vectorTol: 1e-11,
  energyTolGHz: 1e-11,
  highTol: 1e-4,
  firstDegree: 16,
  maxDegree: 256,
  tableIntervals: 128,
  stopHopeless: true,
  noiseOperators: false,
  qlFromSize: QL_FROM_SIZE,
  noiseTableIntervals: NOISE_TABLE_INTERVALS,
  dropWavefunctionDerivative: false,
});

export interface FrameBlock {
  /** Total excitation number of the manifold. */
  excitation: number;
  /** First frame state of the block and its size. */
  start: number;
  size: number;
}

export interface FrameSector {
  parity: number;
  /** Kept frame states (D). */
  size: number;
  /** Bare label (levels per transmon) of each frame state. */
  labels: number[][];
  /** Product index of each label. */
  labelIndex: Int32Array;
  blocks: FrameBlock[];
  /** block index of each frame state */
  blockOf: Int32Array;
  /** Table (tableIntervals + 1 points) of E (D x D, GHz) and dE/du, A (D x D, per GHz) and dA/du. */
  energy: Float64Array;
  energySlope: Float64Array;
  coupling: Float64Array;
  couplingSlope: Float64Array;
  /** per table interval: max |A| at its ends */
  maxCoupling: Float64Array;
}

/**
 * Jump-operator tables over both sectors: frame states ordered [sector 0 kept..., sector 1 kept...]
 * (Dt = D0 + D1). For transmon i: ladder b_i = sum_m sqrt(m) |m-1><m| and number b_i^dag b_i
 * in that transmon's instantaneous eigenbasis, expressed in the frame (real Dt x Dt).
 */
export interface NoiseTables {
  size: number;
  /** Intervals of the noise tables' own Hermite grid over [ejLo, ejHi] (noiseHermite) and its step. */
  intervals: number;
  step: number;
  /** offset of each sector in the combined ordering */
  offsets: number[];
  /** per transmon: table points x Dt x Dt (values and slopes) */
  ladder: Float64Array[];
  ladderSlope: Float64Array[];
  number: Float64Array[];
  numberSlope: Float64Array[];
}

export interface ManifoldFrame {
  model: SimModel;
  noise?: NoiseTables;
  space: ProductSpace;
  ejLo: number;
  ejHi: number;
  /** Chebyshev degree used. */
  degree: number;
  /** Table spacing in u (GHz). */
  tableStep: number;
  tableIntervals: number;
  sectors: FrameSector[];
}

/** Where a labelled frame state lives. */
export interface FrameState {
  sector: number;
  position: number;
}

interface SectorSetup {
  indices: Int32Array;
  /** For each kept frame state: row (position in `indices`) of its bare state. */
  keptRows: Int32Array;
  labels: number[][];
  blocks: FrameBlock[];
  /** rows (positions in `indices`) of the bare states of each block, in frame order */
  blockRows: Int32Array[];
  /**
   * For each row: the rows holding the same states of the other transmons with the mover in
   * level m (m = 0..K_0-1; -1 where that state is not in the sector), row-major rows x K_0: the
   * non-zeros of T (x) 1 (T conserves the mover's parity, so they stay in the sector).
   */
  moverRows: Int32Array;
  /** mover level of each row */
  moverLevel: Int32Array;
  /** Frame states [start, end) of the block of each frame state. */
  blockStart: Int32Array;
  blockEnd: Int32Array;
}

interface Sample {
  /** per sector: Vt (S x D), E (D x D), X (D x D) */
  vt: Float64Array[];
  e: Float64Array[];
  x: Float64Array[];
  /** per transmon (when requested): ladder and number operators in the frame, Dt x Dt */
  ladder?: Float64Array[];
  number?: Float64Array[];
}

export class ManifoldFrameBuilder {
  readonly space: ProductSpace;
  private readonly nCut: number;
  private readonly statics: TransmonPart[];
  private readonly setups: SectorSetup[];
  private readonly moverCouplings: SimModel['couplings'];

  constructor(readonly model: SimModel, keepExcitations: number = MANIFOLD_FRAME_DEFAULTS.keepExcitations) {
    if (model.transmons.length < 1) throw new RangeError('manifold frame: no transmons');
    this.nCut = model.chargeCutoff ?? DEFAULT_CHARGE_CUTOFF;
    this.space = productSpace(model.transmons.map((t) => t.levels));
    this.moverCouplings = model.couplings.filter((c) => c.a === 0 || c.b === 0);
    this.statics = staticTransmonParts(model, this.nCut);
    const { even, odd } = paritySectors(this.space);
    this.setups = [even, odd].map((indices) => {
      const byExc = new Map<number, number[]>();
      indices.forEach((p, row) => {
        const exc = productLevels(this.space, p).reduce((a, b) => a + b, 0);
        if (exc > keepExcitations) return;
        if (!byExc.has(exc)) byExc.set(exc, []);
        (byExc.get(exc) as number[]).push(row);
      });
      const blocks: FrameBlock[] = [];
      const blockRows: Int32Array[] = [];
      const keptRows: number[] = [];
      const labels: number[][] = [];
      for (const exc of [...byExc.keys()].sort((a, b) => a - b)) {
        const rows = byExc.get(exc) as number[];
        blocks.push({ excitation: exc, start: keptRows.length, size: rows.length });
        blockRows.push(Int32Array.from(rows));
        for (const r of rows) {
          keptRows.push(r);
          labels.push(productLevels(this.space, indices[r]));
        }
      }
      const k0 = this.space.dims[0];
      const stride0 = this.space.strides[0];
      const rowOf = new Map<number, number>();
      indices.forEach((p, r) => rowOf.set(p, r));
      const moverRows = new Int32Array(indices.length * k0).fill(-1);
      const moverLevel = new Int32Array(indices.length);
      indices.forEach((p, r) => {
        const m0 = Math.floor(p / stride0) % k0;
        moverLevel[r] = m0;
        const rest = p - m0 * stride0;
        for (let m = 0; m < k0; m++) moverRows[r * k0 + m] = rowOf.get(rest + m * stride0) ?? -1;
      });
      const d = keptRows.length;
      const blockStart = new Int32Array(d);
      const blockEnd = new Int32Array(d);
      for (const b of blocks)
        for (let q = 0; q < b.size; q++) {
          blockStart[b.start + q] = b.start;
          blockEnd[b.start + q] = b.start + b.size;
        }
      return { indices, keptRows: Int32Array.from(keptRows), labels, blocks, blockRows, moverRows, moverLevel, blockStart, blockEnd };
    });
  }

  private readonly qlScratches = new Map<number, SymmetricEigenQLScratch>();

  private qlScratch(size: number): SymmetricEigenQLScratch {
    let s = this.qlScratches.get(size);
    if (!s) {
      s = symmetricEigenQLScratch(size);
      this.qlScratches.set(size, s);
    }
    return s;
  }

  /** Frame quantities at one value of the mover's E_J. */
  sample(u: number, noise = false, qlFromSize = QL_FROM_SIZE): Sample {
    const t0 = this.model.transmons[0];
    const k0 = t0.levels;
    const { energies, charge, tm } = keptMoverSample(t0.ecGHz, u, k0, this.nCut);
    const parts = this.statics.slice();
    parts[0] = { energies, charge };
    const n = this.space.size;
    const h = productHamiltonian(this.space, parts, this.model.couplings);
    const out: Sample = { vt: [], e: [], x: [] };
    for (const setup of this.setups) {
      const idx = setup.indices;
      const size = idx.length;
      const d = setup.keptRows.length;
      const vt = new Float64Array(size * d);
      const block = subMatrix(h, n, idx);
      if (size > 0 && d > 0) {
        const eig = size >= qlFromSize ? symmetricEigenQL(block, size, undefined, this.qlScratch(size)) : symmetricEigen(block, size);
        const used = new Uint8Array(size);
        for (let bIdx = 0; bIdx < setup.blocks.length; bIdx++) {
          const blk = setup.blocks[bIdx];
          const rows = setup.blockRows[bIdx];
          const m = blk.size;
          // Dressed states of this manifold: the m eigenvectors with the largest weight on its bare states.
          const weight = new Float64Array(size);
          for (let c = 0; c < size; c++) {
            let w = 0;
            for (const r of rows) w += eig.vectors[r * size + c] * eig.vectors[r * size + c];
            weight[c] = used[c] ? -1 : w;
          }
          const chosen = Array.from({ length: size }, (_, c) => c)
            .sort((a, b) => weight[b] - weight[a])
            .slice(0, m)
            .sort((a, b) => a - b);
          for (const c of chosen) used[c] = 1;
          // X = V_k^T B_k (m x m): X[i][j] = component of dressed chosen[i] on bare rows[j]
          const xk = new Float64Array(m * m);
          for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) xk[i * m + j] = eig.vectors[rows[j] * size + chosen[i]];
          // (X^T X)^(-1/2)
          const xtx = new Float64Array(m * m);
          for (let i = 0; i < m; i++)
            for (let j = 0; j < m; j++) {
              let acc = 0;
              for (let q = 0; q < m; q++) acc += xk[q * m + i] * xk[q * m + j];
              xtx[i * m + j] = acc;
            }
          const ev = symmetricEigen(xtx, m);
          const inv = new Float64Array(m * m);
          for (let i = 0; i < m; i++)
            for (let j = 0; j < m; j++) {
              let acc = 0;
              for (let q = 0; q < m; q++) acc += (ev.vectors[i * m + q] * ev.vectors[j * m + q]) / Math.sqrt(ev.values[q]);
              inv[i * m + j] = acc;
            }
          // Y = X inv (m x m); Vt_k = V_k Y
          const y = new Float64Array(m * m);
          for (let i = 0; i < m; i++)
            for (let j = 0; j < m; j++) {
              let acc = 0;
              for (let q = 0; q < m; q++) acc += xk[i * m + q] * inv[q * m + j];
              y[i * m + j] = acc;
            }
          for (let r = 0; r < size; r++)
            for (let j = 0; j < m; j++) {
              let acc = 0;
              for (let i = 0; i < m; i++) acc += eig.vectors[r * size + chosen[i]] * y[i * m + j];
              vt[r * d + blk.start + j] = acc;
            }
        }
      }
      // E = Vt^T H Vt (block diagonal: only the in-block entries are formed, the others are 0 to
      // rounding), X = Vt^T (T (x) 1) Vt. HV = H Vt skips the block's zeros (H couples few
      // states); (T (x) 1) Vt has K_0 non-zeros per row (setup.moverRows).
      const e = new Float64Array(d * d);
      const xm = new Float64Array(d * d);
      const hv = new Float64Array(size * d);
      const tv = new Float64Array(size * d);
      for (let r = 0; r < size; r++) {
        const ro = r * d;
        for (let q = 0; q < size; q++) {
          const hrq = block[r * size + q];
          if (hrq === 0) continue;
          const qo = q * d;
          for (let b = 0; b < d; b++) hv[ro + b] += hrq * vt[qo + b];
        }
        const m0 = setup.moverLevel[r];
        for (let m = 0; m < k0; m++) {
          const rr = setup.moverRows[r * k0 + m];
          const t = tm[m0 * k0 + m];
          if (rr < 0 || t === 0) continue;
          const qo = rr * d;
          for (let b = 0; b < d; b++) tv[ro + b] += t * vt[qo + b];
        }
      }
      for (let r = 0; r < size; r++) {
        const ro = r * d;
        for (let a = 0; a < d; a++) {
          const va = vt[ro + a];
          if (va === 0) continue;
          const ao = a * d;
          for (let b = 0; b < d; b++) xm[ao + b] += va * tv[ro + b];
          for (let b = setup.blockStart[a]; b < setup.blockEnd[a]; b++) e[ao + b] += va * hv[ro + b];
        }
      }
      out.vt.push(vt);
      out.e.push(e);
      out.x.push(xm);
    }
    if (noise) this.noiseSample(out);
    return out;
  }

  /** Ladder and number operators of every transmon in the frame (both sectors). */
  private noiseSample(out: Sample): void {
    const sizes = this.setups.map((st) => st.keptRows.length);
    const offsets = [0, sizes[0]];
    const dt = sizes[0] + sizes[1];
    const t = this.model.transmons.length;
    out.ladder = [];
    out.number = [];
    for (let i = 0; i < t; i++) {
      const stride = this.space.strides[i];
      const k = this.space.dims[i];
      const lad = new Float64Array(dt * dt);
      const num = new Float64Array(dt * dt);
      for (let sb = 0; sb < 2; sb++) {
        const setupB = this.setups[sb];
        const sa = 1 - sb;
        const setupA = this.setups[sa];
        const rowOfA = new Map<number, number>();
        setupA.indices.forEach((p, r) => rowOfA.set(p, r));
        const vtA = out.vt[sa];
        const vtB = out.vt[sb];
        const dA = sizes[sa];
        const dB = sizes[sb];
        // ladder: column b (sector sb) -> rows a (sector sa)
        for (let r = 0; r < setupB.indices.length; r++) {
          const q = setupB.indices[r];
          const m = Math.floor(q / stride) % k;
          if (m === 0) continue;
          const rA = rowOfA.get(q - stride);
          if (rA === undefined) continue;
          const amp = Math.sqrt(m);
          for (let a = 0; a < dA; a++) {
            const va = vtA[rA * dA + a];
            if (va === 0) continue;
            for (let b = 0; b < dB; b++) lad[(offsets[sa] + a) * dt + offsets[sb] + b] += va * amp * vtB[r * dB + b];
          }
        }
        // number: within sector sb
        for (let r = 0; r < setupB.indices.length; r++) {
          const q = setupB.indices[r];
          const m = Math.floor(q / stride) % k;
          if (m === 0) continue;
          for (let a = 0; a < dB; a++) {
            const va = vtB[r * dB + a];
            if (va === 0) continue;
            for (let b = 0; b < dB; b++) num[(offsets[sb] + a) * dt + offsets[sb] + b] += m * va * vtB[r * dB + b];
          }
        }
      }
      out.ladder.push(lad);
      out.number.push(num);
    }
  }

  build(options: ManifoldFrameOptions): ManifoldFrame {
    const o = { ...MANIFOLD_FRAME_DEFAULTS, ...options };
    let lo = Math.min(o.ejLo, o.ejHi);
    let hi = Math.max(o.ejLo, o.ejHi);
    if (!(lo > 0)) throw new RangeError(`manifold frame: E_J range must be positive (got ${lo})`);
    if (hi - lo < 1e-9 * hi) {
      const pad = 1e-6 * hi;
      lo -= pad;
      hi += pad;
    }
    // Chebyshev sampling with doubling.
    let degree = o.firstDegree;
    let points = chebyshevPoints(lo, hi, degree);
    const noise = o.noiseOperators;
    let samples = Array.from(points, (u) => this.sample(u, noise, o.qlFromSize));
    const tails: number[] = [];
    for (;;) {
      const tail = this.tailRatio(samples, degree, o);
      tails.push(tail);
      if (tail <= 1) break;
      if (2 * degree > o.maxDegree || (o.stopHopeless && frameTailHopeless(tails, degree, o.maxDegree))) throw new RangeError(`manifold frame: no convergence at Chebyshev degree ${degree} (the dressed manifolds are not smooth over E_J in [${lo}, ${hi}] GHz; fewer levels or a smaller excursion may help)`);
      const next = chebyshevPoints(lo, hi, 2 * degree);
      const merged: Sample[] = new Array(2 * degree + 1);
      for (let j = 0; j <= 2 * degree; j++) merged[j] = j % 2 === 0 ? samples[j / 2] : this.sample(next[j], noise, o.qlFromSize);
      degree *= 2;
      points = next;
      samples = merged;
    }
    const nT = o.tableIntervals;
    const step = (hi - lo) / nT;
    const sectors = this.setups.map((setup, s) => this.tabulate(setup, s, samples, degree, lo, hi, nT, o.dropWavefunctionDerivative));
    const frame: ManifoldFrame = { model: this.model, space: this.space, ejLo: lo, ejHi: hi, degree, tableStep: step, tableIntervals: nT, sectors };
    if (noise) frame.noise = this.tabulateNoise(samples, degree, lo, hi, Math.min(nT, o.noiseTableIntervals));
    return frame;
  }

  private tabulateNoise(samples: Sample[], degree: number, lo: number, hi: number, nT: number): NoiseTables {
    const sizes = this.setups.map((st) => st.keptRows.length);
    const dt = sizes[0] + sizes[1];
    const w = dt * dt;
    // Only the entries that are non-zero at some sample are interpolated (a ladder operator
    // connects the two sectors and a number operator keeps them, so most of the Dt x Dt entries
    // are zero at every sample). Each entry's series is computed on its own, so the kept entries
    // are the same numbers as with all of them and the others are exactly 0, as before.
    const table = (field: 'ladder' | 'number', i: number): [Float64Array, Float64Array] => {
      const cols: number[] = [];
      for (let q = 0; q < w; q++) {
        for (const smp of samples) {
          if ((smp[field] as Float64Array[])[i][q] !== 0) {
            cols.push(q);
            break;
          }
        }
      }
      const nc = cols.length;
      const vals = new Float64Array((degree + 1) * nc);
      samples.forEach((smp, j) => {
        const src = (smp[field] as Float64Array[])[i];
        for (let c = 0; c < nc; c++) vals[j * nc + c] = src[cols[c]];
      });
      const c = chebyshevCoefficients(vals, degree, nc);
      const dc = chebyshevDerivative(c, degree, nc, lo, hi);
      const v = new Float64Array((nT + 1) * w);
      const sl = new Float64Array((nT + 1) * w);
      const tmp = new Float64Array(nc);
      for (let k = 0; k <= nT; k++) {
        const u = k === nT ? hi : lo + ((hi - lo) * k) / nT;
        chebyshevEvaluate(c, degree, nc, lo, hi, u, tmp);
        for (let q = 0; q < nc; q++) v[k * w + cols[q]] = tmp[q];
        chebyshevEvaluate(dc, degree, nc, lo, hi, u, tmp);
        for (let q = 0; q < nc; q++) sl[k * w + cols[q]] = tmp[q];
      }
      return [v, sl];
    };
    const ladder: Float64Array[] = [];
    const ladderSlope: Float64Array[] = [];
    const number: Float64Array[] = [];
    const numberSlope: Float64Array[] = [];
    for (let i = 0; i < this.model.transmons.length; i++) {
      const [l, ls] = table('ladder', i);
      const [n, ns] = table('number', i);
      ladder.push(l);
      ladderSlope.push(ls);
      number.push(n);
      numberSlope.push(ns);
    }
    return { size: dt, intervals: nT, step: (hi - lo) / nT, offsets: [0, sizes[0]], ladder, ladderSlope, number, numberSlope };
  }

  /**
   * Chebyshev tails small enough? The largest ratio of a last-two coefficient to its tolerance
   * (only those two coefficient rows are computed); the frame has converged when it is <= 1.
   * Columns (frame states) of the computational and leakage
   * manifolds (excitation <= 2) must meet vectorTol / energyTolGHz; those of higher manifolds
   * (the squeezing partners, reached only at second order) a looser highTol: their dressed
   * subspace can be slightly ill-defined where a state of a dropped manifold crosses them (a
   * narrow, high-order avoided crossing), which leaves a plateau in their coefficients that no
   * degree removes: ~1e-6 on most edges, 3e-5 on Reef-49 Q9-Q10 (E_J 7.6-16.7 GHz, f01 3.3-4.95 GHz), where the
   * frame still agrees with the moving-basis integration to 3e-6 (test/sim/propagate-frame.test.ts).
   */
  private tailRatio(samples: Sample[], degree: number, o: Required<ManifoldFrameOptions>): number {
    let worst = 0;
    for (let s = 0; s < this.setups.length; s++) {
      const setup = this.setups[s];
      const d = setup.keptRows.length;
      const size = setup.indices.length;
      if (d === 0) continue;
      const excitation = new Int32Array(d);
      for (const b of setup.blocks) for (let q = 0; q < b.size; q++) excitation[b.start + q] = b.excitation;
      const check = (field: 'vt' | 'e', width: number, columnOf: (q: number) => number, tol: number): void => {
        const vals = new Float64Array((degree + 1) * width);
        samples.forEach((smp, j) => vals.set(smp[field][s], j * width));
        const c = chebyshevCoefficientRows(vals, degree, width, [degree - 1, degree]);
        for (let q = 0; q < 2 * width; q++) {
          const limit = excitation[columnOf(q % width)] <= 2 ? tol : Math.max(tol, o.highTol);
          const r = Math.abs(c[q]) / limit;
          if (r > worst) worst = r;
        }
      };
      check('vt', size * d, (q) => q % d, o.vectorTol);
      check('e', d * d, (q) => Math.max(Math.floor(q / d), q % d), o.energyTolGHz);
    }
    return worst;
  }

  private tabulate(setup: SectorSetup, s: number, samples: Sample[], degree: number, lo: number, hi: number, nT: number, dropT: boolean): FrameSector {
    const d = setup.keptRows.length;
    const size = setup.indices.length;
    const nPts = degree + 1;
    const gather = (field: 'vt' | 'e' | 'x', width: number): Float64Array => {
      const vals = new Float64Array(nPts * width);
      samples.forEach((smp, j) => vals.set(smp[field][s], j * width));
      return vals;
    };
    const vtVals = gather('vt', size * d);
    const vtC = chebyshevCoefficients(vtVals, degree, size * d);
    const vtD = chebyshevDerivative(vtC, degree, size * d, lo, hi);
    const dvt = new Float64Array(size * d);
    // A at the Chebyshev points: Vt^T dVt/du + X, antisymmetrised.
    const aVals = new Float64Array(nPts * d * d);
    const points = chebyshevPoints(lo, hi, degree);
    for (let j = 0; j < nPts; j++) {
      chebyshevEvaluate(vtD, degree, size * d, lo, hi, points[j], dvt);
      const vt = samples[j].vt[s];
      const x = samples[j].x[s];
      for (let a = 0; a < d; a++)
        for (let b = 0; b < d; b++) {
          let acc = 0;
          for (let r = 0; r < size; r++) acc += vt[r * d + a] * dvt[r * d + b];
          aVals[(j * d + a) * d + b] = acc + (dropT ? 0 : x[a * d + b]);
        }
      for (let a = 0; a < d; a++) {
        aVals[(j * d + a) * d + a] = 0;
        for (let b = a + 1; b < d; b++) {
          const avg = 0.5 * (aVals[(j * d + a) * d + b] - aVals[(j * d + b) * d + a]);
          aVals[(j * d + a) * d + b] = avg;
          aVals[(j * d + b) * d + a] = -avg;
        }
      }
    }
    const eVals = gather('e', d * d);
    // Exact block structure and symmetry.
    const blockOf = new Int32Array(d);
    setup.blocks.forEach((b, i) => {
      for (let q = 0; q < b.size; q++) blockOf[b.start + q] = i;
    });
    for (let j = 0; j < nPts; j++)
      for (let a = 0; a < d; a++)
        for (let b = a; b < d; b++) {
          const v = blockOf[a] === blockOf[b] ? 0.5 * (eVals[(j * d + a) * d + b] + eVals[(j * d + b) * d + a]) : 0;
          eVals[(j * d + a) * d + b] = v;
          eVals[(j * d + b) * d + a] = v;
        }
    // Only the independent entries are tabulated: E's in-block upper triangle, A's strict upper
    // triangle (E is block diagonal and symmetric, A antisymmetric), then mirrored.
    const w = d * d;
    const eCols: number[] = [];
    const aCols: number[] = [];
    for (let a = 0; a < d; a++)
      for (let b = a; b < d; b++) {
        if (blockOf[a] === blockOf[b]) eCols.push(a * d + b);
        if (b > a) aCols.push(a * d + b);
      }
    const compress = (vals: Float64Array, cols: number[]): Float64Array => {
      const out = new Float64Array(nPts * cols.length);
      for (let j = 0; j < nPts; j++) for (let c = 0; c < cols.length; c++) out[j * cols.length + c] = vals[j * w + cols[c]];
      return out;
    };
    const ne = eCols.length;
    const na = aCols.length;
    const eC = chebyshevCoefficients(compress(eVals, eCols), degree, ne);
    const eD = chebyshevDerivative(eC, degree, ne, lo, hi);
    const aC = chebyshevCoefficients(compress(aVals, aCols), degree, na);
    const aD = chebyshevDerivative(aC, degree, na, lo, hi);
    const energy = new Float64Array((nT + 1) * w);
    const energySlope = new Float64Array((nT + 1) * w);
    const coupling = new Float64Array((nT + 1) * w);
    const couplingSlope = new Float64Array((nT + 1) * w);
    const tmpE = new Float64Array(ne);
    const tmpA = new Float64Array(na);
    const scatter = (src: Float64Array, cols: number[], dst: Float64Array, at: number, sign: number): void => {
      for (let c = 0; c < cols.length; c++) {
        const q = cols[c];
        const a = Math.floor(q / d);
        const b = q - a * d;
        dst[at + q] = src[c];
        dst[at + b * d + a] = sign * src[c];
      }
    };
    for (let i = 0; i <= nT; i++) {
      const u = i === nT ? hi : lo + ((hi - lo) * i) / nT;
      scatter(chebyshevEvaluate(eC, degree, ne, lo, hi, u, tmpE), eCols, energy, i * w, 1);
      scatter(chebyshevEvaluate(eD, degree, ne, lo, hi, u, tmpE), eCols, energySlope, i * w, 1);
      scatter(chebyshevEvaluate(aC, degree, na, lo, hi, u, tmpA), aCols, coupling, i * w, -1);
      scatter(chebyshevEvaluate(aD, degree, na, lo, hi, u, tmpA), aCols, couplingSlope, i * w, -1);
    }
    const maxCoupling = new Float64Array(nT);
    for (let i = 0; i < nT; i++) {
      let m = 0;
      for (let q = 0; q < w; q++) m = Math.max(m, Math.abs(coupling[i * w + q]), Math.abs(coupling[(i + 1) * w + q]));
      maxCoupling[i] = m;
    }
    const labelIndex = Int32Array.from(setup.keptRows, (r) => setup.indices[r]);
    return { parity: s, size: d, labels: setup.labels, labelIndex, blocks: setup.blocks, blockOf, energy, energySlope, coupling, couplingSlope, maxCoupling };
  }
}

/**
 * Give up before the largest degree (each doubling doubles the samples, so a frame that fails at
 * degree 256 costs eight times one that fails at 32). A frame that converges does so
 * geometrically (the dressed manifolds are analytic in u: coefficients fall like rho^-N,
 * Trefethen, "Approximation Theory and Approximation Practice", ch. 8), so the tail is
 * extrapolated from the last doubling at that rate, exp(-kappa N) with kappa from tail(N/2) /
 * tail(N); if even then it stays above its tolerance at the largest reachable degree, the frame is
 * given up (the caller takes its fallback model, as for a frame that fails at maxDegree). Frames
 * that never converge (a sharp crossing with a dropped manifold inside the range) plateau or fall
 * as a power law (about 0.5 per doubling, ~1/N). The rule applied to the tails logged while
 * planning the four demos (2026-12-03): their 53 non-converging frames stop at degree 32 (46), 64
 * (5) or 128 (2); none of the 873 converging ones stops (they lose a factor 20-300 per doubling). `tails`: the tail ratios (last
 * two coefficients over their tolerance) at degrees firstDegree, 2 firstDegree, ..., `degree`.
 */
export function frameTailHopeless(tails: readonly number[], degree: number, maxDegree: number): boolean {
  if (tails.length < 2) return false;
  const last = tails[tails.length - 1];
  const prev = tails[tails.length - 2];
  if (!(last > 1)) return false;
  let top = degree;
  while (2 * top <= maxDegree) top *= 2;
  const kappa = last < prev ? Math.log(prev / last) / (degree / 2) : 0;
  return last * Math.exp(-kappa * (top - degree)) > 1;
}

export function buildManifoldFrame(model: SimModel, options: ManifoldFrameOptions): ManifoldFrame {
  // (The builder's keepExcitations fixes the frame's state set; the rest are build options.)
  return new ManifoldFrameBuilder(model, options.keepExcitations ?? MANIFOLD_FRAME_DEFAULTS.keepExcitations).build(options);
}

/** Locate the frame state labelled `levels`. */
export function frameState(frame: ManifoldFrame, levels: readonly number[]): FrameState {
  const p = levels.reduce((acc, m, i) => acc + m * frame.space.strides[i], 0);
  for (let s = 0; s < frame.sectors.length; s++) {
    const pos = frame.sectors[s].labelIndex.indexOf(p);
    if (pos >= 0) return { sector: s, position: pos };
  }
  throw new RangeError(`manifold frame: no kept state labelled ${levels.join('')}`);
}

/** Table interval of u (clamped). */
export function tableInterval(frame: ManifoldFrame, u: number): number {
  const i = Math.floor((u - frame.ejLo) / frame.tableStep);
  return i < 0 ? 0 : i >= frame.tableIntervals ? frame.tableIntervals - 1 : i;
}

const HERMITE_WEIGHTS = new Float64Array(4);

/**
 * The table interval of u (clamped) and the cubic Hermite weights there (src/linalg/cubic-hermite.ts
 * hermiteWeights: value, slope, value, slope of the interval's two ends) into `out`; every
 * reader of the frame's tables interpolates with these.
 */
export function frameHermite(frame: ManifoldFrame, u: number, out: Float64Array): number {
  return gridHermite(frame.ejLo, frame.tableStep, frame.tableIntervals, u, out);
}

/** The interval of u (clamped) on a grid of `intervals` steps `h` from `lo`, and the cubic Hermite weights there (into out). */
function gridHermite(lo: number, h: number, intervals: number, u: number, out: Float64Array): number {
  const k = Math.floor((u - lo) / h);
  const i = k < 0 ? 0 : k >= intervals ? intervals - 1 : k;
  hermiteWeights((u - (lo + i * h)) / h, h, out);
  return i;
}

/**
 * E (GHz) and A (per GHz of E_J) of a sector at u, by cubic Hermite on the table; `outE` and
 * `outA` are D x D.
 */
export function evaluateFrame(frame: ManifoldFrame, sector: FrameSector, u: number, outE: Float64Array, outA: Float64Array): void {
  const i = frameHermite(frame, u, HERMITE_WEIGHTS);
  const h00 = HERMITE_WEIGHTS[0];
  const h10 = HERMITE_WEIGHTS[1];
  const h01 = HERMITE_WEIGHTS[2];
  const h11 = HERMITE_WEIGHTS[3];
  const w = sector.size * sector.size;
  const p0 = i * w;
  const p1 = p0 + w;
  const e = sector.energy;
  const es = sector.energySlope;
  const a = sector.coupling;
  const as = sector.couplingSlope;
  for (let q = 0; q < w; q++) {
    outE[q] = h00 * e[p0 + q] + h10 * es[p0 + q] + h01 * e[p1 + q] + h11 * es[p1 + q];
    outA[q] = h00 * a[p0 + q] + h10 * as[p0 + q] + h01 * a[p1 + q] + h11 * as[p1 + q];
  }
}

/**
 * evaluateFrame restricted to the entries inside the manifold blocks (E is block diagonal; A's
 * in-block part), and to the blocks flagged in `active` when given (one flag per block): the
 * same numbers there, the other entries of outE / outA left as they were. For propagation that
 * never couples blocks (holds, the in-block scheme), which reads nothing else.
 */
export function evaluateFrameInBlocks(frame: ManifoldFrame, sector: FrameSector, u: number, outE: Float64Array, outA: Float64Array, active?: Uint8Array): void {
  const i = frameHermite(frame, u, HERMITE_WEIGHTS);
  const h00 = HERMITE_WEIGHTS[0];
  const h10 = HERMITE_WEIGHTS[1];
  const h01 = HERMITE_WEIGHTS[2];
  const h11 = HERMITE_WEIGHTS[3];
  const d = sector.size;
  const p0 = i * d * d;
  const p1 = p0 + d * d;
  const e = sector.energy;
  const es = sector.energySlope;
  const a = sector.coupling;
  const as = sector.couplingSlope;
  const blocks = sector.blocks;
  for (let bi = 0; bi < blocks.length; bi++) {
    if (active && active[bi] === 0) continue;
    const lo = blocks[bi].start;
    const hi = lo + blocks[bi].size;
    for (let r = lo; r < hi; r++)
      for (let q = r * d + lo; q < r * d + hi; q++) {
        outE[q] = h00 * e[p0 + q] + h10 * es[p0 + q] + h01 * e[p1 + q] + h11 * es[p1 + q];
        outA[q] = h00 * a[p0 + q] + h10 * as[p0 + q] + h01 * a[p1 + q] + h11 * as[p1 + q];
      }
  }
}

/** Interpolate a noise table (values, slopes; Dt x Dt per point) at u into out. */
export function evaluateNoiseTable(frame: ManifoldFrame, values: Float64Array, slopes: Float64Array, u: number, out: Float64Array): Float64Array {
  const i = noiseHermite(frame, u, HERMITE_WEIGHTS);
  const h00 = HERMITE_WEIGHTS[0];
  const h10 = HERMITE_WEIGHTS[1];
  const h01 = HERMITE_WEIGHTS[2];
  const h11 = HERMITE_WEIGHTS[3];
  const w = out.length;
  const p0 = i * w;
  const p1 = p0 + w;
  for (let q = 0; q < w; q++) out[q] = h00 * values[p0 + q] + h10 * slopes[p0 + q] + h01 * values[p1 + q] + h11 * slopes[p1 + q];
  return out;
}

/**
 * The noise tables' interval of u (clamped) and the cubic Hermite weights there, on their own grid
 * (NoiseTables.intervals over [ejLo, ejHi]); the frame's grid when they share it.
 */
export function noiseHermite(frame: ManifoldFrame, u: number, out: Float64Array): number {
  return gridHermite(frame.ejLo, frame.noise!.step, frame.noise!.intervals, u, out);
}

/** Largest |A| over table intervals covering [uLo, uHi]. */
export function maxCouplingBetween(frame: ManifoldFrame, sector: FrameSector, uLo: number, uHi: number): number {
  const i0 = tableInterval(frame, Math.min(uLo, uHi));
  const i1 = tableInterval(frame, Math.max(uLo, uHi));
  let m = 0;
  for (let i = i0; i <= i1; i++) if (sector.maxCoupling[i] > m) m = sector.maxCoupling[i];
  return m;
}
