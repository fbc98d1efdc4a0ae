/**
 * Quasi-static 1/f flux noise on a two-qubit gate (README physics conventions sec. 4).
 *
 * Over a gate of tens of ns the 1/f flux noise of each transmon is a static flux offset per
 * shot, Gaussian with sigma^2 = 2 A_Phi^2 ln(f_uv / f_ir) (src/transmon/coherence.ts,
 * quasiStaticFluxSigma, with the gate's duration). The lab applies the nominal gate's virtual-Z
 * phases and keeps its frame at the nominal idle frequencies, so one shot with offsets
 * (delta_A, delta_B) has the fidelity F(delta) = [Tr(M M^dag) + |Tr(V_0^dag M(delta))|^2] / 20
 * with the nominal V_0, and the channel averaged over the offsets has the average of F (F is
 * linear in the channel for a fixed V_0).
 *
 * The mover's offset shifts its whole trajectory, parking included (same flux line); the
 * partner's offset shifts its static flux (a frame of the model with that flux). The two offsets
 * are independent, and the error is quadratic in them to leading order, e(delta) ~ e_0 +
 * c_A delta_A^2 + c_B delta_B^2 + 2 c_AB delta_A delta_B, so the average excess is
 * c_A sigma_A^2 + c_B sigma_B^2: one Gauss-Hermite average per transmon (the cross term averages
 * to zero). With n = 3 nodes (0, +-sqrt(3) sigma) the average is exact up to fourth order in the
 * offset; test/budget/gate-flux-noise.test.ts checks it against 9-node and joint two-dimensional
 * quadratures and against an independent NumPy model.
 */
import { fidelityWithVirtualZ } from '../sim/gate-metrics.js';
import type { ManifoldFrame } from '../sim/manifold-frame.js';
import type { FramePropagationOptions } from '../sim/propagate-frame.js';
import { simulateGate } from '../sim/simulate-gate.js';
import type { Trajectory } from '../sim/trajectory.js';
import { gaussHermiteRule } from './gauss-hermite.js';

export interface GateFluxNoiseInput {
  /** The nominal model's frame (mover 0, partner 1, spectators 2...). */
  frame: ManifoldFrame;
  traj: Trajectory;
  targetPhase: number;
  /** Nominal virtual-Z phases (as they appear in V). */
  virtualZ: { a: number; b: number };
  /** Nominal dressed energies E_00, E_01, E_10 at parking (GHz): the lab frame. */
  labEnergies: readonly [number, number, number];
  /** Quasi-static offsets' standard deviations (Phi0); 0 skips a transmon. */
  moverSigma: number;
  partnerSigma: number;
  /** The frame of the same model with the partner's static flux shifted by `delta` (needed when partnerSigma > 0). */
  partnerFrame?: (delta: number) => ManifoldFrame;
  /** Gauss-Hermite nodes per transmon (default 3). */
  nodes?: number;
  /** Propagation options (default the simulator's). */
  propagation?: FramePropagationOptions;
  spectatorLevels?: number[];
}

export interface GateFluxNoise {
  /** Average infidelity excess from the mover's and the partner's offsets. */
  mover: number;
  partner: number;
  /** mover + partner. */
  total: number;
  /** 1 - F at zero offset with the nominal phases (the coherent error, for reference). */
  nominalError: number;
  simulations: number;
}

export function gateFluxNoise(input: GateFluxNoiseInput): GateFluxNoise {
  const rule = gaussHermiteRule(input.nodes ?? 3);
  const theta = input.targetPhase;
  let simulations = 0;
  const errorOf = (frame: ManifoldFrame, traj: Trajectory): number => {
    simulations++;
    const sim = simulateGate(frame, traj, {
      ...input.propagation,
      targetPhase: theta,
      estimate: false,
      labEnergies: input.labEnergies,
      spectatorLevels: input.spectatorLevels,
    });
    return 1 - fidelityWithVirtualZ(sim.m, input.virtualZ.a, input.virtualZ.b, theta);
  };
  const e0 = errorOf(input.frame, input.traj);
  const average = (sigma: number, at: (delta: number) => number): number => {
    if (!(sigma > 0)) return 0;
    let s = 0;
    for (let k = 0; k < rule.nodes.length; k++) s += rule.weights[k] * (rule.nodes[k] === 0 ? e0 : at(sigma * rule.nodes[k]));
    return s - e0;
  };
  const mover = average(input.moverSigma, (delta) => errorOf(input.frame, shiftTrajectory(input.traj, delta)));
  let partner = 0;
  if (input.partnerSigma > 0) {
    if (!input.partnerFrame) throw new RangeError('gateFluxNoise: partnerSigma > 0 needs partnerFrame');
    const frameOf = input.partnerFrame;
    partner = average(input.partnerSigma, (delta) => errorOf(frameOf(delta), input.traj));
  }
  return { mover, partner, total: mover + partner, nominalError: e0, simulations };
}

/** The trajectory with every flux sample shifted by delta (a static offset on the flux line). */
export function shiftTrajectory(traj: Trajectory, delta: number): Trajectory {
  const flux = new Float64Array(traj.flux.length);
  for (let k = 0; k < flux.length; k++) flux[k] = traj.flux[k] + delta;
  return { timeNs: traj.timeNs, flux };
}
