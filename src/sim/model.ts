/**
 * The physical model the simulator solves (README physics conventions sec. 2 and 4):
 *
 *     H(t) = H_0(E_J(Phi(t))) + sum_{i>0} H_i + sum_(i,j) G_ij n_i n_j,
 *     H_i = 4 E_C,i n_i^2 - E_J,i cos(phi_i)   (charge basis |n| <= N, n_g = 0),
 *
 * transmon 0 is the mover (its flux follows the trajectory), the others are static at their
 * fluxes and kept through their lowest K_i eigenstates. Energies in GHz (E/h), time in ns.
 */
import type { ChargeCoupling } from '../pair/product-basis.js';

/** Decoherence of one transmon (sec. 4): T1 and the pure-dephasing rate as a function of flux. */
export interface TransmonNoise {
  /** Energy relaxation time, ns (Infinity for none). */
  t1Ns: number;
  /** 1 / T_phi at a flux, 1/ns (white part plus flux noise; see src/transmon/coherence.ts). */
  dephasingRate: (flux: number) => number;
}

export interface SimTransmon {
  ecGHz: number;
  ejsGHz: number;
  asymmetry: number;
  /** Eigenstates kept in the product basis (K). */
  levels: number;
  /** Flux of a static transmon (Phi0); ignored for the mover (index 0). */
  flux: number;
  noise?: TransmonNoise;
}

export interface SimModel {
  /** transmons[0] is the mover. */
  transmons: SimTransmon[];
  /** Charge-charge couplings G n_a n_b between transmon indices. */
  couplings: ChargeCoupling[];
  /** Charge cutoff N of each transmon's charge basis (default 20). */
  chargeCutoff?: number;
}

export const DEFAULT_CHARGE_CUTOFF = 20;
