/**
 * A spectator's three-transmon simulation without the dressed-manifold frame: the last model of
 * the spectator budget (./spectator-error.ts), for waveforms over which no frame converges.
 *
 * The frame follows each excitation manifold's dressed states over the mover's E_J range; a mover
 * tuned far from a high spectator brings its upper levels through sharp, weak crossings with the
 * spectator's states, and the frame's tracking then fails. The moving product basis
 * (src/sim/moving-basis.ts: the mover's instantaneous eigenstates, the static transmons' own
 * eigenstates; no dressed-state tracking, so nothing can fail to converge) integrates the same
 * Hamiltonian with fourth-order Magnus steps and exact exponentials. It is slower (a dense
 * Hermitian eigen-decomposition per step), which is why it is the fallback and not the default.
 *
 * Metrics as the frame's spectator simulation: the computational block with S in |0> and in |1>,
 * both in the lab frame of the computational energies with S in |0> (the lab calibrates without
 * the spectator excited, so the ZZ with S during and around the excursion counts as error); the
 * gate's virtual-Z phases fitted with S in |0>. The pair alone is simulated on the same basis and
 * step, so the difference is the spectator's share and not a difference of schemes.
 */
import { josephsonEnergy } from '../transmon/josephson.js';
import { gateMetrics, fidelityWithVirtualZ, leakage, type Block4 } from '../sim/gate-metrics.js';
import { MovingBasisModel } from '../sim/moving-basis.js';
import { hermitianEigen, type HermitianEigen } from '../linalg/hermitian-eigen.js';
import { josephsonEnergySlope } from '../transmon/josephson.js';
import { paritySectors, subMatrix } from '../pair/product-basis.js';
import { symmetricEigen } from '../linalg/symmetric-eigen.js';
import type { SimModel } from '../sim/model.js';
import type { Trajectory } from '../sim/trajectory.js';
import { trajectoryDuration } from '../sim/trajectory.js';

/**
 * Longest Magnus step of the fallback (ns): ramp samples are joined up to it (holds are one
 * exact step). On Reef-49's Q42-Q43 waveform (16.8 GS/s samples) the spectator's share at 0.1 ns
 * equals the one at 0.05 ns to 2e-7 relative and at 0.2 ns moves by 1.1 % (measured 2026-12-03).
 */
export const MOVING_BASIS_STEP_NS = 0.1;

const PAIR_LABELS = [
  [0, 0],
  [0, 1],
  [1, 0],
  [1, 1],
] as const;

export interface MovingBasisBlocks {
  /** Computational blocks (order 00, 01, 10, 11), one per requested spectator level set. */
  blocks: Block4[];
}

/**
 * Propagate the four computational states with each of `spectatorLevels` (e.g. [[0], [1]]; [[]]
 * for the pair alone) through `traj` in one run (each step's exponential shared by all columns),
 * and return the lab-frame blocks, all in the frame of the first level set's computational
 * energies.
 */
export function movingBasisSpectatorBlocks(model: SimModel, traj: Trajectory, spectatorLevels: readonly (readonly number[])[], stepNs = MOVING_BASIS_STEP_NS, maxExcitations = MOVING_BASIS_MAX_EXCITATIONS): Block4[] {
  const mb = new MovingBasisModel(model);
  const mover = model.transmons[0];
  const sectors = keptSectors(mb, maxExcitations);
  const dr = sectorDressed(mb, sectors, josephsonEnergy(mover.ejsGHz, mover.asymmetry, traj.flux[0]));
  const n = mb.space.size;
  const indexOf = (levels: readonly number[]): number => levels.reduce((acc, m, i) => acc + m * mb.space.strides[i], 0);
  const sets = spectatorLevels.map((sl) => PAIR_LABELS.map((l) => indexOf([...l, ...sl])));
  const re: Float64Array[] = [];
  const im: Float64Array[] = [];
  for (const idx of sets)
    for (const p of idx) {
      re.push(dr.vectors[p].slice());
      im.push(new Float64Array(n));
    }
  propagateMovingBasisJoined(mb, traj, re, im, stepNs, sectors);
  const T = trajectoryDuration(traj);
  const e = sets[0].map((p) => dr.energies[p]);
  return sets.map((idx, k) => {
    const mre = new Float64Array(16);
    const mim = new Float64Array(16);
    PAIR_LABELS.forEach(([i, j], r) => {
      const ph = 2 * Math.PI * (e[0] + i * (e[2] - e[0]) + j * (e[1] - e[0])) * T;
      const cph = Math.cos(ph);
      const sph = Math.sin(ph);
      const v = dr.vectors[idx[r]];
      for (let c = 0; c < 4; c++) {
        const col = 4 * k + c;
        let sr = 0;
        let si = 0;
        for (let q = 0; q < n; q++) {
          sr += v[q] * re[col][q];
          si += v[q] * im[col][q];
        }
        mre[r * 4 + c] = cph * sr - sph * si;
        mim[r * 4 + c] = sph * sr + cph * si;
      }
    });
    return { re: mre, im: mim };
  });
}

/**
 * Highest total excitation (sum of the product levels) kept in the fallback's basis. The
 * computational states reach 3 (|11> with the spectator in |1>); the charge coupling's
 * counter-rotating part joins manifolds two apart, so 5 keeps their leading correction; the
 * manifolds above shift the computational block at fourth order in g / (2 f01). On Reef-49's
 * Q42-Q43 waveform with Q35 the spectator's share with 5 equals the untruncated model's to
 * 1e-3 relative (test/budget/spectator-moving-basis.test.ts) at a quarter of its time.
 */
export const MOVING_BASIS_MAX_EXCITATIONS = 5;

/** The parity sectors of the product basis, each cut to states of at most maxExcitations (Infinity: all). */
export function keptSectors(mb: MovingBasisModel, maxExcitations: number): Int32Array[] {
  const keep = (p: number): boolean => mb.space.dims.reduce((acc, _, i) => acc + (Math.floor(p / mb.space.strides[i]) % mb.space.dims[i]), 0) <= maxExcitations;
  return Object.values(paritySectors(mb.space))
    .map((idx) => Int32Array.from(Array.from(idx).filter(keep)))
    .filter((idx) => idx.length > 0);
}

/**
 * Dressed eigenstates of the basis Hamiltonian at u inside the kept sectors, labelled by matching
 * each sector's energy order to its bare order (as src/sim/moving-basis.ts dressed). vectors[p]
 * is the dressed state labelled by product index p, as a full-length vector (zero outside its
 * sector).
 */
function sectorDressed(mb: MovingBasisModel, sectors: readonly Int32Array[], u: number): { energies: Float64Array; vectors: Float64Array[] } {
  const { h } = mb.at(u);
  const n = mb.space.size;
  const energies = new Float64Array(n);
  const vectors: Float64Array[] = new Array(n);
  for (const idx of sectors) {
    const m = idx.length;
    const eig = symmetricEigen(subMatrix(h, n, idx), m);
    const bare = Array.from(idx, (p, r) => ({ p, r, e: h[p * n + p] })).sort((a, b) => a.e - b.e || a.p - b.p);
    for (let k = 0; k < m; k++) {
      const { p, r: r0 } = bare[k];
      const sign = eig.vectors[r0 * m + k] < 0 ? -1 : 1;
      energies[p] = eig.values[k];
      const v = new Float64Array(n);
      for (let r = 0; r < m; r++) v[idx[r]] = sign * eig.vectors[r * m + k];
      vectors[p] = v;
    }
  }
  return { energies, vectors };
}

export interface MovingBasisSpectatorError {
  error: number;
  leakage: number;
  ground: number;
  excited: number;
}

/**
 * The spectator's share on the moving basis: `threeModel` has the spectator as transmon 2,
 * `pairModel` the same mover and partner (same levels) alone.
 */
export function movingBasisSpectatorError(threeModel: SimModel, pairModel: SimModel, traj: Trajectory, targetPhase: number, stepNs = MOVING_BASIS_STEP_NS, maxExcitations = MOVING_BASIS_MAX_EXCITATIONS): MovingBasisSpectatorError {
  const [g, x] = movingBasisSpectatorBlocks(threeModel, traj, [[0], [1]], stepNs, maxExcitations);
  const [alone] = movingBasisSpectatorBlocks(pairModel, traj, [[]], stepNs, maxExcitations);
  const mg = gateMetrics(g, targetPhase);
  const ma = gateMetrics(alone, targetPhase);
  const ground = 1 - mg.fidelity;
  const excited = 1 - fidelityWithVirtualZ(x, mg.virtualZ.a, mg.virtualZ.b, targetPhase);
  return {
    error: 0.5 * (ground + excited) - (1 - ma.fidelity),
    leakage: 0.5 * (leakage(g) + leakage(x)) - ma.leakage,
    ground,
    excited,
  };
}

/** One Magnus step over [t0, t1] of a piecewise-linear flux path, or a hold (constant flux). */
interface PathStep {
  t0: number;
  t1: number;
  hold: boolean;
}

/**
 * The propagation steps along a trajectory: each run of equal-flux samples is one hold step
 * (exact: H is constant there and the basis does not move); ramp samples are joined into steps of
 * at most stepNs (at least one segment each; the fourth-order Magnus nodes then fall on the
 * piecewise-linear path, whose kinks after the line filter are small).
 */
export function pathSteps(traj: Trajectory, stepNs: number): PathStep[] {
  const out: PathStep[] = [];
  const { timeNs: t, flux: x } = traj;
  let k = 0;
  while (k + 1 < t.length) {
    if (x[k + 1] === x[k]) {
      let e = k + 1;
      while (e + 1 < t.length && x[e + 1] === x[k]) e++;
      out.push({ t0: t[k], t1: t[e], hold: true });
      k = e;
      continue;
    }
    let e = k + 1;
    while (e + 1 < t.length && x[e + 1] !== x[e] && t[e + 1] - t[k] <= stepNs + 1e-12) e++;
    // a long single segment is cut into equal steps
    const pieces = Math.max(1, Math.ceil((t[e] - t[k]) / stepNs - 1e-9));
    for (let q = 0; q < pieces; q++) out.push({ t0: t[k] + ((t[e] - t[k]) * q) / pieces, t1: t[k] + ((t[e] - t[k]) * (q + 1)) / pieces, hold: false });
    k = e;
  }
  return out;
}

/** Flux and its time derivative on the piecewise-linear path at time tt (segment found from `hint`). */
function pathAt(traj: Trajectory, tt: number, hint: { k: number }): { x: number; v: number } {
  const { timeNs: t, flux: x } = traj;
  let k = Math.min(hint.k, t.length - 2);
  while (k > 0 && t[k] > tt) k--;
  while (k + 2 < t.length && t[k + 1] < tt) k++;
  hint.k = k;
  const dt = t[k + 1] - t[k];
  const v = (x[k + 1] - x[k]) / dt;
  return { x: x[k] + v * (tt - t[k]), v };
}

/**
 * The moving-basis propagation (src/sim/moving-basis.ts propagateMovingBasis: the same
 * fourth-order Magnus exponent with its commutator, an exact exponential per step), made fast
 * enough for a fallback: the Hamiltonian keeps the total parity of the product levels (the
 * charge coupling flips the parity of both transmons, the basis motion <m|d/du m'> joins mover
 * levels of one parity), so each step's exponent is decomposed per parity sector; ramp samples
 * are joined into steps of up to stepNs (pathSteps); each decomposition starts from the last one
 * of its sector. `sectors` may leave states out (keptSectors): the propagation is then that of
 * the model truncated to the kept states (their components only are propagated). Tested against propagateMovingBasis (test/budget/spectator-moving-basis.test.ts).
 */
export function propagateMovingBasisJoined(mb: MovingBasisModel, traj: Trajectory, re: Float64Array[], im: Float64Array[], stepNs: number, sectors: readonly Int32Array[] = keptSectors(mb, Infinity)): void {
  const mover = mb.model.transmons[0];
  const n = mb.space.size;
  const g1 = 0.5 - Math.sqrt(3) / 6;
  const g2 = 0.5 + Math.sqrt(3) / 6;
  const TWO_PI = 2 * Math.PI;
  const scratch = sectors.map((idx) => {
    const m = idx.length;
    return { idx, m, mr: new Float64Array(m * m), mi: new Float64Array(m * m), work: new Float64Array(4 * m * m), eig: null as HermitianEigen | null, xr: new Float64Array(m), xi: new Float64Array(m), yr: new Float64Array(m), yi: new Float64Array(m) };
  });
  const hint = { k: 0 };
  for (const st of pathSteps(traj, stepNs)) {
    const h = st.t1 - st.t0;
    let pa;
    let pb;
    let ra = 0;
    let rb = 0;
    if (st.hold) {
      const xh = pathAt(traj, st.t0, hint).x;
      pa = pb = mb.at(josephsonEnergy(mover.ejsGHz, mover.asymmetry, xh));
    } else {
      const a = pathAt(traj, st.t0 + g1 * h, hint);
      const b = pathAt(traj, st.t0 + g2 * h, hint);
      pa = mb.at(josephsonEnergy(mover.ejsGHz, mover.asymmetry, a.x));
      pb = mb.at(josephsonEnergy(mover.ejsGHz, mover.asymmetry, b.x));
      ra = a.v * josephsonEnergySlope(mover.ejsGHz, mover.asymmetry, a.x);
      rb = b.v * josephsonEnergySlope(mover.ejsGHz, mover.asymmetry, b.x);
    }
    const c = st.hold ? 0 : (Math.sqrt(3) * h * h) / 12;
    for (const s of scratch) {
      const { idx, m, mr, mi } = s;
      for (let i = 0; i < m; i++) {
        const ai = idx[i] * n;
        for (let j = 0; j < m; j++) {
          const bj = idx[j];
          // [H2, H1] = 4 pi^2 [h2, h1] - 2 pi i (r1 [h2, t1] + r2 [t2, h1]) - r1 r2 [t2, t1]
          let c1 = 0;
          let c2 = 0;
          let c3 = 0;
          if (c !== 0)
            for (let q = 0; q < m; q++) {
              const z = idx[q];
              const zb = z * n + bj;
              c1 += pb.h[ai + z] * pa.h[zb] - pa.h[ai + z] * pb.h[zb];
              c2 += ra * (pb.h[ai + z] * pa.t[zb] - pa.t[ai + z] * pb.h[zb]) + rb * (pb.t[ai + z] * pa.h[zb] - pa.h[ai + z] * pb.t[zb]);
              c3 += pb.t[ai + z] * pa.t[zb] - pa.t[ai + z] * pb.t[zb];
            }
          mr[i * m + j] = Math.PI * h * (pa.h[ai + bj] + pb.h[ai + bj]) - TWO_PI * c * c2;
          mi[i * m + j] = -0.5 * h * (ra * pa.t[ai + bj] + rb * pb.t[ai + bj]) - 4 * Math.PI * Math.PI * c * c1 + c * ra * rb * c3;
        }
      }
      const start = s.eig ? { re: s.eig.vectorsRe.slice(), im: s.eig.vectorsIm.slice() } : undefined;
      s.eig = hermitianEigen(mr, mi, m, { sort: false, work: s.work, start, out: s.eig ?? undefined });
      const { vectorsRe: vr, vectorsIm: vi, values: w } = s.eig;
      for (let col = 0; col < re.length; col++) {
        // y = V exp(-i w) V^H x on the sector's components
        for (let i = 0; i < m; i++) {
          s.xr[i] = re[col][idx[i]];
          s.xi[i] = im[col][idx[i]];
        }
        for (let k = 0; k < m; k++) {
          let sr = 0;
          let si = 0;
          for (let r = 0; r < m; r++) {
            const ar = vr[r * m + k];
            const ai = -vi[r * m + k];
            sr += ar * s.xr[r] - ai * s.xi[r];
            si += ar * s.xi[r] + ai * s.xr[r];
          }
          const cw = Math.cos(w[k]);
          const sw = -Math.sin(w[k]);
          s.yr[k] = cw * sr - sw * si;
          s.yi[k] = sw * sr + cw * si;
        }
        for (let r = 0; r < m; r++) {
          let sr = 0;
          let si = 0;
          for (let k = 0; k < m; k++) {
            const ar = vr[r * m + k];
            const ai = vi[r * m + k];
            sr += ar * s.yr[k] - ai * s.yi[k];
            si += ar * s.yi[k] + ai * s.yr[k];
          }
          re[col][idx[r]] = sr;
          im[col][idx[r]] = si;
        }
      }
    }
  }
}
