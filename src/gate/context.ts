/**
 * What a ramp family and the tuner need to know about one edge's CZ (README physics conventions
 * secs. 2 and 6): the mover, its static partner at its parking flux, the charge coupling, and
 * which avoided crossing the gate uses (11-20: the mover goes to |2>, above the partner by
 * |alpha_mover|; 11-02: the partner's |2>, mover below by |alpha_partner|).
 */
import type { Transmon } from '../transmon/transmon.js';

export type CrossingName = '11-20' | '11-02';

export interface EdgeContext {
  mover: Transmon;
  partner: Transmon;
  partnerFlux: number;
  /** Charge coupling G (GHz). */
  gChargeGHz: number;
  crossing: CrossingName;
  moverParkFlux: number;
}

/**
 * The crossing as a two-level system in bare frequencies, along the mover's flux:
 *   11-20: Delta = E_20 - E_11 = f12_mover - f01_partner,  J = G |n12_mover| |n01_partner|,
 *   11-02: Delta = E_02 - E_11 = f12_partner - f01_mover,  J = G |n01_mover| |n12_partner|.
 * Gap sqrt(Delta^2 + 4 J^2), mixing angle theta = atan2(2 J, Delta) in (0, pi): theta -> 0 far on
 * the parking side, pi/2 at the crossing.
 */
export interface TwoLevelPoint {
  deltaGHz: number;
  jGHz: number;
  theta: number;
  gapGHz: number;
}

export function twoLevelAt(ctx: EdgeContext, moverFlux: number): TwoLevelPoint {
  return twoLevelModel(ctx)(moverFlux);
}

/** twoLevelAt as a function of the mover flux, with the partner's (static) part computed once. */
export function twoLevelModel(ctx: EdgeContext): (moverFlux: number) => TwoLevelPoint {
  const p = ctx.partner.spectrum(ctx.partnerFlux);
  const np = ctx.partner.chargeBasis(ctx.partnerFlux, 3).charge;
  // orient so that the parking side has Delta > 0
  const parkDelta = ctx.crossing === '11-20' ? ctx.mover.spectrum(ctx.moverParkFlux).f12GHz - p.f01GHz : p.f12GHz - ctx.mover.f01(ctx.moverParkFlux);
  const sign = parkDelta < 0 ? -1 : 1;
  return (moverFlux) => {
    // one diagonalisation gives the mover's levels 0-2 and their charge elements
    const b = ctx.mover.chargeBasis(moverFlux, 3);
    const nm = b.charge;
    let delta: number;
    let j: number;
    if (ctx.crossing === '11-20') {
      delta = b.energies[2] - b.energies[1] - p.f01GHz;
      j = ctx.gChargeGHz * Math.abs(nm[5]) * Math.abs(np[1]);
    } else {
      delta = p.f12GHz - (b.energies[1] - b.energies[0]);
      j = ctx.gChargeGHz * Math.abs(nm[1]) * Math.abs(np[5]);
    }
    delta *= sign;
    return { deltaGHz: delta, jGHz: j, theta: Math.atan2(2 * j, delta), gapGHz: Math.sqrt(delta * delta + 4 * j * j) };
  };
}
