/**
 * Shared set-up of the spectator tests that hold spectatorError against the independent NumPy
 * three-transmon model (test/reference/spectator_gate.py): the pair's own coherent error on the
 * same waveform and model size (the baseline a spectator's share is measured from), and the
 * NumPy share for the same transmons, couplings, fluxes and waveform.
 */
import { PAIR_TOP_MANIFOLD, SPECTATOR_LEVELS, SPECTATOR_PROPAGATION, moverEjSpan } from '../../src/budget/spectator-error.js';
import { buildManifoldFrame } from '../../src/sim/manifold-frame.js';
import { edgeSimModel, type EdgeSpectator } from '../../src/sim/pair-model.js';
import { simulateGate } from '../../src/sim/simulate-gate.js';
import { gateMetrics } from '../../src/sim/gate-metrics.js';
import type { Trajectory } from '../../src/sim/trajectory.js';
import type { Transmon } from '../../src/transmon/transmon.js';
import { runPython } from '../support/python.js';

export interface PairIn {
  mover: Transmon;
  partner: Transmon;
  gGHz: number;
  partnerFlux: number;
}

/** The pair alone on `traj` (spectator model levels, default SPECTATOR_LEVELS; in-block frame, target pi): the baseline of a share. */
export function pairAloneBaseline(pair: PairIn, traj: Trajectory, levels: { moverLevels: number; partnerLevels: number } = SPECTATOR_LEVELS): { pairError: number; pairLeakage: number } {
  const [lo, hi] = moverEjSpan(pair.mover, traj);
  const frame = buildManifoldFrame(edgeSimModel({ ...pair, ...SPECTATOR_LEVELS, ...levels }), { ejLo: lo, ejHi: hi, keepExcitations: PAIR_TOP_MANIFOLD });
  const alone = gateMetrics(simulateGate(frame, traj, { ...SPECTATOR_PROPAGATION, targetPhase: Math.PI, estimate: false }).m, Math.PI);
  return { pairError: 1 - alone.fidelity, pairLeakage: alone.leakage };
}

/** Level counts and step of the NumPy model (mover eigenstates at parking and at the flux extreme, partner, spectator). */
export interface NumPyModelSize {
  KA: number;
  KAfar: number;
  KB: number;
  KS: number;
  dt: number;
}

/** The spectator's share (error, leakage) from test/reference/spectator_gate.py, target phase pi. */
export function numpySpectatorShare(pair: PairIn, spectator: EdgeSpectator, traj: Trajectory, size: NumPyModelSize): { error: number; leakage: number } {
  const t = (x: Transmon) => ({ ec: x.ecGHz, ejs: x.ejsGHz, d: x.asymmetry });
  const coupling = spectator.coupledTo === 'mover' ? { gAS: spectator.gGHz } : { gBS: spectator.gGHz };
  return runPython<{ error: number; leakage: number }>('spectator_gate.py', {
    mover: t(pair.mover), partner: t(pair.partner), spectator: t(spectator.transmon),
    gAB: pair.gGHz, ...coupling, partnerFlux: pair.partnerFlux, spectatorFlux: spectator.flux,
    time: Array.from(traj.timeNs), flux: Array.from(traj.flux), theta: Math.PI, ...size,
  }, { timeoutMs: 600_000 });
}
