/**
 * The error a spectator adds to a two-qubit gate, from a three-transmon simulation
 * (README physics conventions secs. 3 and 5).
 *
 * A spectator S is a neighbour of a moving qubit that sits still during the gate (at its parking
 * frequency, or where the plan moved it for the gate). It is simulated as a third transmon, in
 * its ground state and in its first excited state (a data qubit is in either, or in a
 * superposition; the average over the two is the error of a random spectator state). The lab
 * calibrates the gate's virtual-Z phases and its frame with the spectator in its ground state, so:
 *   - S in |0>: the gate's fidelity with its own best virtual-Z phases (what calibration with the
 *     spectator present achieves);
 *   - S in |1>: the fidelity with those phases and the same lab frame: the conditional phase the
 *     mover picks up against S (the ZZ of the excursion), and any transfer into S (the 01-10,
 *     11-20 and 11-02 type crossings of mover and spectator), count as error.
 * The spectator's error is the average of the two infidelities minus the pair's own coherent
 * infidelity (the same waveform without S), and its leakage the same difference of leakages.
 * Model: mover 4 levels (the mover's |2> meets the spectator through its 2-3 transition), partner 3,
 * spectator 3 (src/sim/pair-model.ts; SPECTATOR_LEVELS), in-block propagation
 * (every spectator crossing lies inside one excitation manifold; tested against the full scheme).
 * The two spectator states share one propagation (src/sim/simulate-gate.ts simulateSpectatorStates:
 * each step is prepared once for the eight columns; the same numbers as two simulations).
 */
import { fidelityWithVirtualZ, gateMetrics, leakage } from '../sim/gate-metrics.js';
import { BUDGET_QL_FROM_SIZE, buildManifoldFrame, type ManifoldFrame } from '../sim/manifold-frame.js';
import { edgeSimModel, type EdgeSpectator } from '../sim/pair-model.js';
import type { FramePropagationOptions } from '../sim/propagate-frame.js';
import { simulateGate, simulateSpectatorStates } from '../sim/simulate-gate.js';
import type { Trajectory } from '../sim/trajectory.js';
import type { Transmon } from '../transmon/transmon.js';
import { movingBasisSpectatorError } from './spectator-moving-basis.js';

export interface SpectatorErrorInput {
  mover: Transmon;
  partner: Transmon;
  /** Layout g of the edge (GHz). */
  gGHz: number;
  partnerFlux: number;
  spectator: EdgeSpectator;
  traj: Trajectory;
  targetPhase: number;
  /** The pair's own coherent infidelity and leakage on this waveform (without S). */
  pairError: number;
  pairLeakage: number;
  propagation?: FramePropagationOptions;
  /** Levels kept (default SPECTATOR_LEVELS: mover 4, partner 3, spectator 3); the pair baseline must use the same. */
  levels?: { moverLevels?: number; partnerLevels?: number; spectatorLevels?: number };
  /** Intervals of the frame's Hermite tables (default SPECTATOR_TABLE_INTERVALS). */
  tableIntervals?: number;
}

export interface SpectatorError {
  /** Added average infidelity (S averaged over |0> and |1>), >= 0 up to numerical noise. */
  error: number;
  /** Added leakage out of the computational states (averaged over S). */
  leakage: number;
  /** Infidelities with S in |0> and |1>. */
  ground: number;
  excited: number;
  /**
   * The model simulated: 'none' the full one; 'manifolds' three excitation manifolds kept (only
   * with a propagation scheme that couples manifolds: in-block propagation never reaches the
   * fourth, so its frame keeps three from the start and that is the full model);
   * 'mover-levels' also fewer mover levels (see spectatorFrame); 'moving-basis' no frame
   * converged and the full model ran on the moving product basis (movingBasisFallback);
   * 'estimate' only in a plan written before that fallback existed (the admixture estimate, read
   * back by `plan --from`).
   */
  reduced: 'none' | 'manifolds' | 'mover-levels' | 'moving-basis' | 'estimate';
}

/**
 * Propagation of the spectator runs (and of the pair alone they are measured against): in-block,
 * ramp segments joined into Magnus steps of up to 0.4 ns (the frame propagator's default is 0.2).
 * On Clove-17 D4-Z3 with Z1 at f23 + 0.12 and f23 - 0.24 GHz (errors 5.2e-2 and 2.6e-3) the share at
 * 0.4 ns agrees with one at 0.05 ns (E_J steps of 0.0625 GHz) to 4e-6 and 1e-6 relative, at 0.2 ns
 * to 1.2e-5 and 1e-6 (measured 2026-12-03); the joined steps' E_J limit (JOIN_MAX_EJ_GHZ) and the
 * rotation limit (maxAngle) still apply.
 */
export const SPECTATOR_PROPAGATION = Object.freeze({ scheme: 'in-block' as const, joinRamps: true, maxStepNs: 0.4 });

/**
 * Highest excitation manifold of the pair's computational states (|11>): with in-block
 * propagation the pair alone needs no frame states above it (higher manifolds are never reached).
 */
export const PAIR_TOP_MANIFOLD = 2;

/**
 * Default model size. The mover's 2-3 transition meets spectators during the hold, so the mover
 * keeps |3>. With in-block propagation the computational states reach three excitations (|11>
 * with S in |1>), so a fifth mover level (|4>) would only dress them through counter-rotating
 * terms. Measured against the independent NumPy model (test/reference/spectator_gate.py, 10 mover
 * levels in the charge basis) on Clove-17 D4-Z3 with Z1 at f23 + 0.12, f23 - 0.12 and f23 - 0.24
 * GHz (errors 5.2e-2, 1.2e-2 and 2.6e-3; 2026-12-03): 4 mover levels are within 0.11-0.19 % of it
 * in the error (leakage 0.4-0.9 %), 5 within 0.005-0.02 % (0.09-0.3 %); on the four demos' plans
 * the shares of 4 and 5 levels differ by at most 1.8 % (0.5 % for shares above 1e-4), the gates'
 * budget totals by at most 0.33 %, and the spectator frames are about a third smaller (fewer of
 * them fail to converge): Reef-49's 77 designs took 0.885 of their CPU time (gate by gate in turns).
 */
export const SPECTATOR_LEVELS = Object.freeze({ moverLevels: 4, partnerLevels: 3, spectatorLevels: 3 });

/** Smallest and largest E_J of the mover along a trajectory (its samples bound the piecewise-linear path). */
export function moverEjSpan(mover: Transmon, traj: Trajectory): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const x of traj.flux) {
    const u = mover.ejGHz(x);
    if (u < lo) lo = u;
    if (u > hi) hi = u;
  }
  return [lo, hi];
}

export function spectatorError(input: SpectatorErrorInput): SpectatorError {
  const { mover, partner, traj } = input;
  const [lo, hi] = moverEjSpan(mover, traj);
  const built = spectatorFrame(input, lo, hi);
  if (!built) return movingBasisFallback(input);
  const { frame, reduced, moverLevels, partnerLevels } = built;
  const prop = { ...SPECTATOR_PROPAGATION, ...input.propagation };
  // S in |0> and in |1> in one propagation (each step prepared once for both), |1> in |0>'s lab frame
  const [g, x] = simulateSpectatorStates(frame, traj, [[0], [1]], prop);
  const metrics = gateMetrics(g.m, input.targetPhase);
  const ground = 1 - metrics.fidelity;
  const excited = 1 - fidelityWithVirtualZ(x.m, metrics.virtualZ.a, metrics.virtualZ.b, input.targetPhase);
  // the pair's own error on the same model size (the caller's baseline when the model was not reduced)
  let pairError = input.pairError;
  let pairLeakage = input.pairLeakage;
  const given = { ...SPECTATOR_LEVELS, ...input.levels };
  if (moverLevels !== given.moverLevels || partnerLevels !== given.partnerLevels) {
    const pairModel = edgeSimModel({ mover, partner, gGHz: input.gGHz, partnerFlux: input.partnerFlux, ...SPECTATOR_LEVELS, ...input.levels, moverLevels, partnerLevels });
    const alone = gateMetrics(simulateGate(buildManifoldFrame(pairModel, { ejLo: lo, ejHi: hi, keepExcitations: inBlock(input) ? PAIR_TOP_MANIFOLD : 3, qlFromSize: BUDGET_QL_FROM_SIZE }), traj, { ...prop, targetPhase: input.targetPhase, estimate: false }).m, input.targetPhase);
    pairError = 1 - alone.fidelity;
    pairLeakage = alone.leakage;
  }
  return {
    error: 0.5 * (ground + excited) - pairError,
    leakage: 0.5 * (leakage(g.m) + leakage(x.m)) - pairLeakage,
    ground,
    excited,
    reduced,
  };
}

/**
 * The frame of a three-transmon model. With a spectator in |1> the computational block and its
 * leakage reach three excitations, so the frame keeps manifolds up to 4 for a scheme that couples
 * manifolds, and up to 3 for in-block propagation (the default: no coupling between manifolds, so
 * nothing reaches the fourth; the same numbers, test/sim/spectator-states.test.ts). A mover
 * tuned low brings its upper levels (|3>, |4>) down among the two-excitation states of a high
 * spectator; their crossings are weak (counter-rotating terms) but sharp, and the dressed
 * manifolds are then not smooth over the mover's E_J range. The frame then keeps three manifolds,
 * then gives the partner REDUCED_MODEL_PARTNER_LEVELS levels, then the mover one level more
 * (both larger models, reported as the full one), then drops the mover's upper levels one by one (down
 * to 3: |2> stays, every 11-20 and 11-02 type condition with the spectator stays in the model;
 * the mover's 2-3 transition goes), with the partner kept to REDUCED_MODEL_PARTNER_LEVELS levels
 * in those reduced models; where
 * none of them converges either (the partner's upper levels bring crossings of their own), the
 * same reduced models with the partner's own level count; null when none converges (the caller
 * then runs the full model on the moving basis). `reduced` says which kind of model was simulated.
 */
function spectatorFrame(input: SpectatorErrorInput, ejLo: number, ejHi: number): { frame: ManifoldFrame; reduced: SpectatorError['reduced']; moverLevels: number; partnerLevels: number } | null {
  const { mover, partner } = input;
  const full = input.levels?.moverLevels ?? SPECTATOR_LEVELS.moverLevels;
  const partnerFull = input.levels?.partnerLevels ?? SPECTATOR_LEVELS.partnerLevels;
  const partnerReduced = Math.max(partnerFull, REDUCED_MODEL_PARTNER_LEVELS);
  const modelOf = (moverLevels: number, partnerLevels: number) =>
    edgeSimModel({ mover, partner, gGHz: input.gGHz, partnerFlux: input.partnerFlux, spectators: [input.spectator], ...SPECTATOR_LEVELS, ...input.levels, moverLevels, partnerLevels });
  // In-block propagation never couples manifolds, so the manifolds above the computational
  // states' highest (3: |11> with S in |1>) are never reached and need not be in the frame.
  const attempts: [number, number, number, SpectatorError['reduced']][] = inBlock(input) ? [[full, partnerFull, 3, 'none']] : [[full, partnerFull, 4, 'none'], [full, partnerFull, 3, 'manifolds']];
  // the mover's levels kept, the partner's upper levels added (they move the crossings; more levels, so not a reduced model)
  if (partnerReduced !== partnerFull) attempts.push([full, partnerReduced, 3, inBlock(input) ? 'none' : 'manifolds']);
  // one mover level more (the model before SPECTATOR_LEVELS dropped |4>: on Reef-49's plan two spectators converge only with it)
  attempts.push([full + 1, partnerFull, 3, inBlock(input) ? 'none' : 'manifolds']);
  for (let m = full - 1; m >= 3; m--) attempts.push([m, partnerReduced, 3, 'mover-levels']);
  if (partnerReduced !== partnerFull) for (let m = full - 1; m >= 3; m--) attempts.push([m, partnerFull, 3, 'mover-levels']);
  for (const [moverLevels, partnerLevels, keepExcitations, reduced] of attempts) {
    try {
      const tableIntervals = input.tableIntervals ?? SPECTATOR_TABLE_INTERVALS;
      return { frame: buildManifoldFrame(modelOf(moverLevels, partnerLevels), { ejLo, ejHi, keepExcitations, tableIntervals, qlFromSize: BUDGET_QL_FROM_SIZE }), reduced, moverLevels, partnerLevels };
    } catch (err) {
      if (!(err instanceof RangeError) || !/no convergence/.test(err.message)) throw err;
    }
  }
  return null;
}

/**
 * Intervals of the three-transmon frames' cubic Hermite tables (src/sim/manifold-frame.ts; its
 * default is 128): with 32 the error and leakage of Clove-17 D4-Z3's spectator Z1 agree with the
 * 128-interval tables to < 1e-8 of the error (measured 2026-12-03: 4e-10 to 5e-9 relative at five
 * spectator frequencies, leakage within 1e-10; test/budget/spectator-error.test.ts), and the
 * frame builds about a quarter faster.
 */
export const SPECTATOR_TABLE_INTERVALS = 32;

/**
 * Partner levels of the reduced models (fallback only; the full model keeps SPECTATOR_LEVELS'
 * 3). On an 11-02 gate the partner's |2> is in the interaction and its |3> and |4> shift it;
 * with 3 partner levels the reduced models put the spectator's share of Reef-49's Q4-Q5 (S Q6)
 * and Q1-Q2 (S Q3) at 3.3e-4 and 6.4e-4, with 5 levels at 1.04e-4 and 2.30e-4, the values of an
 * independent NumPy simulation with a 5-level partner and a 12-state mover basis
 * (test/tools/direct_gate_error.py: 1.04e-4 and 2.30e-4). Measured 2026-12-03; the test against
 * a NumPy three-transmon model is test/budget/spectator-fallback.test.ts.
 */
export const REDUCED_MODEL_PARTNER_LEVELS = 5;

/** The propagation is in-block (the default, SPECTATOR_PROPAGATION): no coupling between excitation manifolds. */
function inBlock(input: SpectatorErrorInput): boolean {
  return (input.propagation?.scheme ?? SPECTATOR_PROPAGATION.scheme) === 'in-block';
}

/**
 * Where no frame of the three-transmon model converges (a mover tuned far from a high spectator:
 * sharp crossings of its upper levels with the spectator's states), the full model (the default
 * level counts) on the moving product basis (./spectator-moving-basis.ts), which tracks no
 * dressed states and cannot fail to converge; slower, so only here.
 */
function movingBasisFallback(input: SpectatorErrorInput): SpectatorError {
  const { mover, partner } = input;
  // the partner to REDUCED_MODEL_PARTNER_LEVELS levels, as the reduced models (its |3> shifts the 11-02 crossing)
  const given = { ...SPECTATOR_LEVELS, ...input.levels };
  const levels = { ...given, partnerLevels: Math.max(given.partnerLevels, REDUCED_MODEL_PARTNER_LEVELS) };
  const three = edgeSimModel({ mover, partner, gGHz: input.gGHz, partnerFlux: input.partnerFlux, spectators: [input.spectator], ...levels });
  const pair = edgeSimModel({ mover, partner, gGHz: input.gGHz, partnerFlux: input.partnerFlux, ...levels });
  const r = movingBasisSpectatorError(three, pair, input.traj, input.targetPhase);
  return { ...r, reduced: 'moving-basis' };
}

/**
 * A spectator's error per unit of summed admixture, the planner's estimate before pulse design
 * (src/plan/rules/spectator-admixture.ts; three-transmon simulations of Clove-17: median about
 * 0.5, 0.14-1.0).
 */
export const SPECTATOR_ERROR_PER_ADMIXTURE = 0.5;
