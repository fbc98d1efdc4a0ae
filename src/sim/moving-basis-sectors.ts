/**
 * The moving product basis (./moving-basis.ts) propagated fast enough for production use: the
 * Hamiltonian's parity sectors apart, optionally cut to a highest total excitation, ramp samples
 * joined into Magnus steps, each exponential exact (a Hermitian eigen-decomposition warm-started
 * from the last step's). Used by the spectator budget's last-resort model
 * (src/budget/spectator-moving-basis.ts), where no dressed-manifold frame converges.
 */
import { applyEigenExponential } from '../linalg/complex.js';
import { hermitianEigen, type HermitianEigen } from '../linalg/hermitian-eigen.js';
import { symmetricEigen } from '../linalg/symmetric-eigen.js';
import { paritySectors, subMatrix } from '../pair/product-basis.js';
import { josephsonEnergy, josephsonEnergySlope } from '../transmon/josephson.js';
import type { MovingBasisModel } from './moving-basis.js';
import type { Trajectory } from './trajectory.js';

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
export function sectorDressed(mb: MovingBasisModel, sectors: readonly Int32Array[], u: number): { energies: Float64Array; vectors: Float64Array[] } {
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
 * the model truncated to the kept states (their components only are propagated). Tested against
 * propagateMovingBasis (test/budget/spectator-moving-basis.test.ts).
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
        // exp(-i M) on the sector's components: gathered, applied, scattered back
        for (let i = 0; i < m; i++) {
          s.xr[i] = re[col][idx[i]];
          s.xi[i] = im[col][idx[i]];
        }
        applyEigenExponential(vr, vi, w, m, s.xr, s.xi, s.yr, s.yi);
        for (let i = 0; i < m; i++) {
          re[col][idx[i]] = s.xr[i];
          im[col][idx[i]] = s.xi[i];
        }
      }
    }
  }
}
