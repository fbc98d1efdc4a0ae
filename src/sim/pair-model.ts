/**
 * The simulator's model for one edge of a chip, from the transmon stage's `Transmon` objects
 * (README physics conventions secs. 2, 4, 6): the mover (transmon 0), its static partner (1) and any
 * spectators (2, ...), each coupled capacitively with G from the layout's g (both transmons at
 * Phi = 0: g = G |<0|n|1>_a| |<0|n|1>_b|).
 *
 * Decoherence: T1 and the white dephasing time tphi from the layout (Markovian); 1/f flux noise
 * is quasi-static and handled outside the Lindblad model (src/budget/gate-flux-noise.ts).
 */
import { chargeCouplingFromExchange } from '../pair/coupling.js';
import type { Transmon } from '../transmon/transmon.js';
import { InputError } from '../util/errors.js';
import type { SimModel, SimTransmon, TransmonNoise } from './model.js';
import type { Trajectory } from './trajectory.js';

export interface EdgeSpectator {
  transmon: Transmon;
  /** Which edge qubit it couples to. */
  coupledTo: 'mover' | 'partner';
  /** Layout g of that coupling (GHz). */
  gGHz: number;
  /** Its (static) flux during the gate. */
  flux: number;
}

export interface EdgeModelInput {
  mover: Transmon;
  partner: Transmon;
  /** Layout g of the edge (GHz, both at Phi = 0). */
  gGHz: number;
  partnerFlux: number;
  moverLevels?: number;
  partnerLevels?: number;
  spectatorLevels?: number;
  /** Attach T1 and T_phi(Phi) (needs coherence data in the layout). */
  noise?: boolean;
  spectators?: EdgeSpectator[];
}

export const EDGE_MODEL_DEFAULTS = Object.freeze({ moverLevels: 6, partnerLevels: 4, spectatorLevels: 3 });

/**
 * The Markovian noise of a transmon: T1 and the white dephasing rate 1/tphi. 1/f flux noise is
 * not a rate on gate time scales; it enters as a quasi-static flux offset averaged over its
 * distribution (src/budget/gate-flux-noise.ts).
 */
function noiseOf(q: Transmon): TransmonNoise | undefined {
  const spec = q.coherenceSpec;
  if (!spec) return undefined;
  const white = spec.tphiNs !== undefined && spec.tphiNs > 0 ? 1 / spec.tphiNs : 0;
  return { t1Ns: spec.t1Ns, dephasingRate: () => white };
}

function simTransmon(q: Transmon, levels: number, flux: number, noise: boolean): SimTransmon {
  return { ecGHz: q.ecGHz, ejsGHz: q.ejsGHz, asymmetry: q.asymmetry, levels, flux, noise: noise ? noiseOf(q) : undefined };
}

export function edgeSimModel(input: EdgeModelInput): SimModel {
  const o = { ...EDGE_MODEL_DEFAULTS, ...input };
  const transmons = [simTransmon(o.mover, o.moverLevels, 0, !!o.noise), simTransmon(o.partner, o.partnerLevels, o.partnerFlux, !!o.noise)];
  const g = (a: Transmon, b: Transmon, gGHz: number): number => chargeCouplingFromExchange(gGHz, a.chargeElement01(0), b.chargeElement01(0));
  const couplings = [{ a: 0, b: 1, gCharge: g(o.mover, o.partner, o.gGHz) }];
  (o.spectators ?? []).forEach((s, k) => {
    transmons.push(simTransmon(s.transmon, o.spectatorLevels, s.flux, !!o.noise));
    const other = s.coupledTo === 'mover' ? 0 : 1;
    couplings.push({ a: other, b: 2 + k, gCharge: g(s.coupledTo === 'mover' ? o.mover : o.partner, s.transmon, s.gGHz) });
  });
  const chargeCutoff = Math.max(o.mover.chargeCutoff, o.partner.chargeCutoff, ...(o.spectators ?? []).map((s) => s.transmon.chargeCutoff));
  return { transmons, couplings, chargeCutoff };
}

/** Smallest transmon-regime E_J/E_C the simulator accepts along a trajectory. */
export const MIN_EJ_OVER_EC = 20;

/**
 * Range of the mover's E_J over a piecewise-linear flux trajectory (E_J is monotonic in |Phi| on
 * [0, 1/2], so the samples bound it unless a segment crosses Phi = 0). Throws an InputError when
 * the mover leaves the transmon regime.
 */
export function moverEjRange(mover: Transmon, traj: Trajectory, file?: string): { ejLo: number; ejHi: number } {
  let lo = Infinity;
  let hi = -Infinity;
  for (let k = 0; k < traj.flux.length; k++) {
    const e = mover.ejGHz(traj.flux[k]);
    lo = Math.min(lo, e);
    hi = Math.max(hi, e);
    if (k > 0 && Math.sign(traj.flux[k]) !== Math.sign(traj.flux[k - 1]) && traj.flux[k] !== 0 && traj.flux[k - 1] !== 0) hi = Math.max(hi, mover.ejsGHz);
  }
  if (lo / mover.ecGHz < MIN_EJ_OVER_EC) {
    throw new InputError({
      file,
      message: `expected the trajectory to keep ${mover.id} a transmon (E_J/E_C >= ${MIN_EJ_OVER_EC}), found E_J/E_C = ${(lo / mover.ecGHz).toFixed(2)} at its smallest`,
    });
  }
  return { ejLo: lo, ejHi: hi };
}
