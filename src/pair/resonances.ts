/**
 * Where a moving transmon meets its static partner (README physics conventions sec. 2): the mover's
 * flux and f01 at the bare-frequency resonances
 *
 *     01-10:  f01_mover = f01_partner
 *     11-20:  f12_mover = f01_partner    (f01_mover = f01_partner - alpha_mover; mover above by |alpha|)
 *     11-02:  f01_mover = f12_partner    (f01_mover = f01_partner + alpha_partner; mover below by |alpha|)
 *
 * Names are (mover, partner) ordered: "20" has the mover in |2>. alpha_mover is taken at the
 * crossing itself (the condition is solved self-consistently as f12_mover(Phi) = f01_partner).
 * Each crossing is solved on the mover's branch 0 <= Phi <= 1/2 (src/transmon/flux-for-frequency.ts)
 * and is null when it lies outside the mover's tunable range. The bare coupling of each crossing
 * comes with it, from the exact charge matrix elements:
 *     01-10: G |n01_m| |n01_p| (= g),  11-20: G |n12_m| |n01_p| (~ sqrt2 g),  11-02: G |n01_m| |n12_p|.
 */
import type { Transmon } from '../transmon/transmon.js';

export type ResonanceName = '01-10' | '11-20' | '11-02';
export const RESONANCE_NAMES: readonly ResonanceName[] = ['01-10', '11-20', '11-02'];

export interface Resonance {
  name: ResonanceName;
  /** Mover flux at the crossing, 0 <= Phi <= 1/2. */
  moverFlux: number;
  /** Mover f01 there (GHz). */
  moverF01GHz: number;
  /** Bare coupling between the two crossing states (GHz). */
  couplingGHz: number;
}

export type PairResonances = Record<ResonanceName, Resonance | null>;

/**
 * Resonances of `mover` against `partner` parked at `partnerFlux`; G is the charge coupling.
 * `names` limits the work to some of them (the others are null).
 */
export function pairResonances(mover: Transmon, partner: Transmon, partnerFlux: number, gChargeGHz: number, names: readonly ResonanceName[] = RESONANCE_NAMES): PairResonances {
  const p = partner.spectrum(partnerFlux);
  const nPartner = partner.chargeBasis(partnerFlux, 3).charge; // 3 x 3
  const p01 = Math.abs(nPartner[1]);
  const p12 = Math.abs(nPartner[5]);
  const at = (name: ResonanceName, flux: () => number | null, coupling: (n01: number, n12: number) => number): Resonance | null => {
    if (!names.includes(name)) return null;
    const x = flux();
    if (x === null) return null;
    const n = mover.chargeBasis(x, 3).charge;
    return { name, moverFlux: x, moverF01GHz: mover.f01(x), couplingGHz: gChargeGHz * coupling(Math.abs(n[1]), Math.abs(n[5])) };
  };
  return {
    '01-10': at('01-10', () => mover.fluxForF01OrNull(p.f01GHz), (m01) => m01 * p01),
    '11-20': at('11-20', () => mover.fluxForF12OrNull(p.f01GHz), (_m01, m12) => m12 * p01),
    '11-02': at('11-02', () => mover.fluxForF01OrNull(p.f12GHz), (m01) => m01 * p12),
  };
}
