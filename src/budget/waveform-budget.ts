/**
 * The gate stage's part of a designed CZ's error budget, from its waveform (README physics
 * conventions sec. 4). One place computes it for every command that reports it: the designer
 * (src/gate/design.ts), `fluxlane simulate --noise` and `fluxlane verify` (which re-simulates a
 * plan's waveform files), so the three agree by construction and verify recomputes what the
 * plan claims from the samples alone.
 *
 *   coherent        1 - F of the waveform without noise (leakage and the rest)
 *   t1              first-order T1 term on the trajectory (src/sim/decoherence.ts)
 *   whiteDephasing  first-order white-dephasing term (the layout's tphi, Markovian)
 *   fluxNoise       quasi-static 1/f offsets of mover and partner averaged by Gauss-Hermite
 *                   quadrature with the nominal virtual-Z phases (./gate-flux-noise.ts), sigma
 *                   for the waveform's duration (src/transmon/coherence.ts)
 *   fidelityNoisy   the Markovian fidelity (Lindblad, or coherent fidelity less the first-order
 *                   estimate) less fluxNoise: quasi-static noise is not a rate, so it is added
 *                   to, not folded into, the Markovian channel
 *   spectators      each listed spectator simulated as a third transmon in |0> and |1>
 *                   (./spectator-error.ts) against the pair alone on the same model size
 */
import type { ManifoldFrame } from '../sim/manifold-frame.js';
import { BUDGET_QL_FROM_SIZE, buildManifoldFrame } from '../sim/manifold-frame.js';
import { gateMetrics } from '../sim/gate-metrics.js';
import { edgeSimModel, type EdgeSpectator } from '../sim/pair-model.js';
import { simulateGate, type GateSimulation } from '../sim/simulate-gate.js';
import type { Trajectory } from '../sim/trajectory.js';
import { trajectoryDuration } from '../sim/trajectory.js';
import type { Transmon } from '../transmon/transmon.js';
import { quasiStaticFluxSigma } from '../transmon/coherence.js';
import { gateFluxNoise } from './gate-flux-noise.js';
import { moverEjSpan, PAIR_TOP_MANIFOLD, REDUCED_MODEL_PARTNER_LEVELS, SPECTATOR_LEVELS, SPECTATOR_PROPAGATION, spectatorError, type SpectatorError } from './spectator-error.js';

export { moverEjSpan };

export interface WaveformPair {
  mover: Transmon;
  partner: Transmon;
  /** Layout g of the edge (GHz). */
  gGHz: number;
  partnerFlux: number;
  traj: Trajectory;
  targetPhase: number;
}

export interface WaveformNoiseInput extends WaveformPair {
  /** The nominal model's frame, built with noise operators (spectators of the model included). */
  frame: ManifoldFrame;
  /** Spectators simulated inside the model (the designer's `spectators`); the partner's shifted frames carry them too. */
  modelSpectators?: readonly EdgeSpectator[];
  /** The waveform simulated with the first-order estimate (and the Lindblad result for 'lindblad'). */
  simulation: GateSimulation;
  method: 'lindblad' | 'estimate';
  /**
   * Optional store of frames by key (src/gate/design.ts keeps one per design call): the
   * partner-offset frames are looked up under `partner <delta>` (the key needs nothing else when
   * the store belongs to one edge model and nominal frame), so the ramp times a design tries
   * share them.
   */
  frameCache?: (key: string, build: () => ManifoldFrame) => ManifoldFrame;
}

export interface WaveformNoiseBudget {
  coherent: number;
  t1: number;
  whiteDephasing: number;
  fluxNoise: number;
  fluxNoiseSplit: { mover: number; partner: number; moverSigma: number; partnerSigma: number };
  /** Markovian fidelity less fluxNoise. */
  fidelityNoisy: number;
  /** Gate simulations the flux-noise average ran. */
  simulations: number;
}

/**
 * Propagation of the flux-noise average: in-block (the offsets' excess agrees with the full scheme
 * to < 1 %, test/budget/gate-flux-noise.test.ts), ramp segments joined into Magnus steps of up to
 * 0.4 ns (the frame propagator's default is 0.2; on Hitch-30's plan the 31 gates' flux-noise
 * terms at 0.4 and 0.2 ns agree to 3.7e-4 relative, measured 2026-12-03).
 */
export const FLUX_NOISE_PROPAGATION = Object.freeze({ scheme: 'in-block' as const, joinRamps: true, maxStepNs: 0.4 });

/** Quasi-static flux-offset spread of a transmon over an operation of t ns (0 without flux-noise data). */
export function quasiStaticSigmaOf(q: Transmon, tNs: number): number {
  return q.coherenceSpec?.fluxNoisePhi0 ? quasiStaticFluxSigma(q.coherenceSpec.fluxNoisePhi0, tNs, q.averagingTimeNs) : 0;
}

export function waveformNoiseBudget(input: WaveformNoiseInput): WaveformNoiseBudget {
  const { frame, traj, simulation: s, mover, partner } = input;
  const T = trajectoryDuration(traj);
  const moverSigma = quasiStaticSigmaOf(mover, T);
  const partnerSigma = quasiStaticSigmaOf(partner, T);
  const spectators = input.modelSpectators ? [...input.modelSpectators] : undefined;
  const fn = gateFluxNoise({
    frame, traj, targetPhase: input.targetPhase, virtualZ: s.virtualZ,
    labEnergies: [s.energies['00'], s.energies['01'], s.energies['10']],
    moverSigma, partnerSigma,
    partnerFrame: (delta) => {
      // in-block propagation: the computational states (spectators in |0>) stay in manifolds <= 2
      const build = () => buildManifoldFrame(edgeSimModel({ mover, partner, gGHz: input.gGHz, partnerFlux: input.partnerFlux + delta, spectators }), { ejLo: frame.ejLo, ejHi: frame.ejHi, keepExcitations: PAIR_TOP_MANIFOLD, qlFromSize: BUDGET_QL_FROM_SIZE });
      return input.frameCache ? input.frameCache(`partner ${delta}`, build) : build();
    },
    propagation: FLUX_NOISE_PROPAGATION,
  });
  const fluxNoise = Math.max(0, fn.total);
  const markovian = input.method === 'lindblad' ? (s.noisy?.fidelity ?? NaN) : s.fidelity - s.decoherenceEstimate;
  return {
    coherent: Math.max(0, 1 - s.fidelity),
    t1: s.decoherenceSplit.t1,
    whiteDephasing: s.decoherenceSplit.dephasing,
    fluxNoise,
    fluxNoiseSplit: { mover: fn.mover, partner: fn.partner, moverSigma, partnerSigma },
    fidelityNoisy: markovian - fluxNoise,
    simulations: fn.simulations,
  };
}

/** One spectator's share of a gate's error budget. */
export interface SpectatorShare {
  qubit: string;
  /** Added average infidelity. */
  error: number;
  /** Added leakage. */
  leakage: number;
  /** The three-transmon model was reduced to converge (./spectator-error.ts spectatorFrame); 'none' when not. */
  reduced: SpectatorError['reduced'];
}

export interface SpectatorBudget {
  spectators: number;
  spectatorLeakage: number;
  spectatorShares: SpectatorShare[];
  simulations: number;
}


/**
 * Level counts of the spectator budget's three-transmon models for this waveform: SPECTATOR_LEVELS,
 * with the partner kept to REDUCED_MODEL_PARTNER_LEVELS (5) when the gate is an 11-02 one (the
 * mover's f01 meets the partner's f12): the partner's |2> is then in the interaction and its |3>
 * and |4> shift it, and with 3 partner levels the spectator shares of Reef-49's Q1-Q2 (Q3 and Q9)
 * came out 2.8 and 3.7 times those of the direct simulation with a 5-level partner (6.4e-4 and
 * 2.0e-4 against 2.3e-4 and 5.4e-5, test/tools/direct_gate_error.py, 2026-12-03). Which crossing:
 * at the waveform's far point, the nearer of |f01_mover - f12_partner| and |f12_mover - f01_partner|.
 */
export function spectatorModelLevels(pair: WaveformPair): { moverLevels: number; partnerLevels: number; spectatorLevels: number } {
  const { mover, partner, traj } = pair;
  const park = mover.ejGHz(traj.flux[0]);
  let far = traj.flux[0];
  for (const x of traj.flux) if (Math.abs(mover.ejGHz(x) - park) > Math.abs(mover.ejGHz(far) - park)) far = x;
  const m = mover.spectrum(far);
  const p = partner.spectrum(pair.partnerFlux);
  const elevenOhTwo = Math.abs(m.f01GHz - p.f12GHz) < Math.abs(m.f12GHz - p.f01GHz);
  return { ...SPECTATOR_LEVELS, partnerLevels: elevenOhTwo ? Math.max(SPECTATOR_LEVELS.partnerLevels, REDUCED_MODEL_PARTNER_LEVELS) : SPECTATOR_LEVELS.partnerLevels };
}

/**
 * The spectators' share of a waveform's budget: each listed spectator simulated on the waveform as
 * a third transmon (./spectator-error.ts), against the pair alone on the same model size and scheme.
 */
export function spectatorBudget(pair: WaveformPair, list: readonly EdgeSpectator[]): SpectatorBudget {
  if (list.length === 0) return { spectators: 0, spectatorLeakage: 0, spectatorShares: [], simulations: 0 };
  const { mover, partner, gGHz, partnerFlux, traj, targetPhase } = pair;
  const levels = spectatorModelLevels(pair);
  const pairModel = edgeSimModel({ mover, partner, gGHz, partnerFlux, ...levels });
  const [ejLo, ejHi] = moverEjSpan(mover, traj);
  const alone = simulateGate(buildManifoldFrame(pairModel, { ejLo, ejHi, keepExcitations: PAIR_TOP_MANIFOLD, qlFromSize: BUDGET_QL_FROM_SIZE }), traj, { ...SPECTATOR_PROPAGATION, targetPhase, estimate: false });
  const pairMetrics = gateMetrics(alone.m, targetPhase);
  const shares = list.map((sp) => {
    const r = spectatorError({
      mover, partner, gGHz, partnerFlux, spectator: sp, traj, targetPhase,
      pairError: 1 - pairMetrics.fidelity, pairLeakage: pairMetrics.leakage, levels,
    });
    return { qubit: sp.transmon.id, error: Math.max(0, r.error), leakage: Math.max(0, r.leakage), reduced: r.reduced };
  });
  return {
    spectators: shares.reduce((a, x) => a + x.error, 0),
    spectatorLeakage: shares.reduce((a, x) => a + x.leakage, 0),
    spectatorShares: shares,
    simulations: 1 + 2 * shares.length,
  };
}
