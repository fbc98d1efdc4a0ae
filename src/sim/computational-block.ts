/**
 * The two-qubit computational block of a simulated trajectory (../shared/physics.md sec. 3):
 * the dressed states |00>, |01>, |10>, |11> of mover A and partner B at the parking point (the
 * trajectory's first = last sample), with any spectators in fixed levels, propagated through
 * the trajectory in the dressed-manifold frame and reported in the lab frame
 *
 *     M = R(T) P^dag U(T) P,   R = diag(exp(+i 2 pi E_loc(ij) T)),
 *     E_loc(ij) = E_00 + i (E_10 - E_00) + j (E_01 - E_00)   (dressed energies at parking).
 *
 * Dressed states at parking: eigenvectors of the frame's manifold blocks of E(u_park), labelled
 * inside each block by matching the energy order to the order of the bare product energies
 * (levels keep their order as the coupling is switched on; src/pair/spectrum.ts uses the same
 * rule), with the component on their own bare state positive.
 */
import { symmetricEigen } from '../linalg/symmetric-eigen.js';
import { transmonLevels } from '../transmon/levels.js';
import { josephsonEnergy } from '../transmon/josephson.js';
import { DEFAULT_CHARGE_CUTOFF } from './model.js';
import { evaluateFrame, frameState, type ManifoldFrame } from './manifold-frame.js';
import { propagateInFrame, type FrameInitial, type FramePropagationOptions } from './propagate-frame.js';
import type { Block4 } from './gate-metrics.js';
import type { Trajectory } from './trajectory.js';

/** A dressed state at parking in frame coordinates. */
export interface DressedState {
  label: number[];
  sector: number;
  /** Real amplitudes in the sector's frame basis. */
  vector: Float64Array;
  /** Dressed energy (GHz, absolute). */
  energy: number;
}

/** Dressed eigenstates of every kept frame state at E_J = u (one per label). */
export function dressedStatesAt(frame: ManifoldFrame, u: number): DressedState[] {
  const out: DressedState[] = [];
  const model = frame.model;
  const nCut = model.chargeCutoff ?? DEFAULT_CHARGE_CUTOFF;
  const bareLevels = model.transmons.map((t, i) =>
    transmonLevels(t.ecGHz, i === 0 ? u : josephsonEnergy(t.ejsGHz, t.asymmetry, t.flux), { levels: t.levels, chargeCutoff: nCut }).energies,
  );
  const bare = (label: number[]): number => label.reduce((acc, m, i) => acc + bareLevels[i][m], 0);
  frame.sectors.forEach((sector, s) => {
    const d = sector.size;
    const e = new Float64Array(d * d);
    const a = new Float64Array(d * d);
    evaluateFrame(frame, sector, u, e, a);
    for (const blk of sector.blocks) {
      const m = blk.size;
      const sub = new Float64Array(m * m);
      for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) sub[i * m + j] = e[(blk.start + i) * d + blk.start + j];
      const ev = symmetricEigen(sub, m);
      const order = Array.from({ length: m }, (_, i) => i).sort((x, y) => bare(sector.labels[blk.start + x]) - bare(sector.labels[blk.start + y]) || x - y);
      order.forEach((local, rank) => {
        const vector = new Float64Array(d);
        const sign = ev.vectors[local * m + rank] < 0 ? -1 : 1;
        for (let j = 0; j < m; j++) vector[blk.start + j] = sign * ev.vectors[j * m + rank];
        out.push({ label: sector.labels[blk.start + local], sector: s, vector, energy: ev.values[rank] });
      });
    }
  });
  return out;
}

export interface ComputationalBlockResult {
  /** 4 x 4 lab-frame block, order 00, 01, 10, 11 (|AB>). */
  m: Block4;
  /** Dressed energies at parking (GHz, absolute) of 00, 01, 10, 11, 20, 02 (with spectators in their levels). */
  energies: Record<'00' | '01' | '10' | '11' | '20' | '02', number>;
  /** Final populations of the dressed 20 and 02 starting from 11. */
  populations: { '20': number; '02': number };
  /** Magnus steps taken. */
  steps: number;
}

const PAIR_LABELS = [
  [0, 0],
  [0, 1],
  [1, 0],
  [1, 1],
];

export function computationalBlock(
  frame: ManifoldFrame,
  traj: Trajectory,
  options: FramePropagationOptions & { spectatorLevels?: number[] } = {},
): ComputationalBlockResult {
  const model = frame.model;
  const mover = model.transmons[0];
  const uPark = josephsonEnergy(mover.ejsGHz, mover.asymmetry, traj.flux[0]);
  const spect = options.spectatorLevels ?? new Array(Math.max(0, model.transmons.length - 2)).fill(0);
  const full = (ab: number[]): number[] => [...ab, ...spect];
  const dressed = dressedStatesAt(frame, uPark);
  const find = (label: number[]): DressedState => {
    frameState(frame, label); // throws a clear error if the label is not kept
    const st = dressed.find((x) => x.label.every((m, i) => m === label[i]));
    if (!st) throw new RangeError(`computational block: no dressed state ${label.join('')}`);
    return st;
  };
  const comp = PAIR_LABELS.map((l) => find(full(l)));
  const leak20 = find(full([2, 0]));
  const leak02 = find(full([0, 2]));
  const initial: FrameInitial[] = comp.map((st) => ({ sector: st.sector, re: st.vector, im: new Float64Array(st.vector.length) }));
  const res = propagateInFrame(frame, traj, initial, options);
  const T = traj.timeNs[traj.timeNs.length - 1] - traj.timeNs[0];
  const e00 = comp[0].energy;
  const e01 = comp[1].energy;
  const e10 = comp[2].energy;
  const mre = new Float64Array(16);
  const mim = new Float64Array(16);
  for (let r = 0; r < 4; r++) {
    const [i, j] = PAIR_LABELS[r];
    const eLoc = e00 + i * (e10 - e00) + j * (e01 - e00);
    const ph = 2 * Math.PI * eLoc * T;
    const c = Math.cos(ph);
    const s = Math.sin(ph);
    for (let col = 0; col < 4; col++) {
      if (comp[r].sector !== comp[col].sector) continue;
      const [xr, xi] = dot(comp[r].vector, res.re[col], res.im[col]);
      mre[r * 4 + col] = c * xr - s * xi;
      mim[r * 4 + col] = s * xr + c * xi;
    }
  }
  const pop = (st: DressedState): number => {
    if (st.sector !== comp[3].sector) return 0;
    const [xr, xi] = dot(st.vector, res.re[3], res.im[3]);
    return xr * xr + xi * xi;
  };
  return {
    m: { re: mre, im: mim },
    energies: { '00': e00, '01': e01, '10': e10, '11': comp[3].energy, '20': leak20.energy, '02': leak02.energy },
    populations: { '20': pop(leak20), '02': pop(leak02) },
    steps: res.steps,
  };
}

function dot(v: Float64Array, re: Float64Array, im: Float64Array): [number, number] {
  let sr = 0;
  let si = 0;
  for (let k = 0; k < v.length; k++) {
    sr += v[k] * re[k];
    si += v[k] * im[k];
  }
  return [sr, si];
}
