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
import { keptSectors, propagateMovingBasisJoined, sectorDressed } from '../sim/moving-basis-sectors.js';
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

/**
 * Propagate the four computational states with each of `spectatorLevels` (e.g. [[0], [1]]; [[]]
 * for the pair alone) through `traj` in one run (each step's exponential shared by all columns),
 * and return the lab-frame blocks, all in the frame of the first level set's computational
 * energies.
 */
/**
 * Highest total excitation (sum of the product levels) kept in the fallback's basis. The
 * computational states reach 3 (|11> with the spectator in |1>); the charge coupling's
 * counter-rotating part joins manifolds two apart, so 5 keeps their leading correction; the
 * manifolds above shift the computational block at fourth order in g / (2 f01). On Reef-49's
 * Q42-Q43 waveform with Q35 the spectator's share with 5 equals the untruncated model's to
 * 1e-3 relative (test/budget/spectator-moving-basis.test.ts), in a third of its time with a
 * 5-level partner (0.9 against 2.8 s of CPU, measured 2026-12-03).
 */
export const MOVING_BASIS_MAX_EXCITATIONS = 5;

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

