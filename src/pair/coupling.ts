/**
 * Capacitive coupling of two transmons (README physics conventions sec. 2):
 *
 *     H_c = G n_A n_B,     g(Phi_A, Phi_B) = G |<0|n|1>_A(Phi_A)| |<0|n|1>_B(Phi_B)|.
 *
 * The layout gives g, the 01-10 exchange coupling with both transmons at Phi = 0 (maximum
 * frequency); G follows from it once, and g at any other fluxes from the charge matrix elements
 * there (g shrinks as the qubits tune down, roughly as (E_J,A E_J,B)^(1/8)).
 */
import type { Transmon } from '../transmon/transmon.js';

/** G = g / (|<0|n|1>_A| |<0|n|1>_B|), both matrix elements at Phi = 0. */
export function chargeCouplingFromExchange(gGHz: number, n01A: number, n01B: number): number {
  return gGHz / (Math.abs(n01A) * Math.abs(n01B));
}

/** g = G |<0|n|1>_A| |<0|n|1>_B|. */
export function exchangeFromChargeCoupling(gChargeGHz: number, n01A: number, n01B: number): number {
  return gChargeGHz * Math.abs(n01A) * Math.abs(n01B);
}

/** G for a pair from the layout's g (at Phi_A = Phi_B = 0). */
export function chargeCouplingForPair(a: Transmon, b: Transmon, gGHz: number): number {
  return chargeCouplingFromExchange(gGHz, a.chargeElement01(0), b.chargeElement01(0));
}

/** g(Phi_A, Phi_B) for a pair with charge coupling G. */
export function exchangeCouplingAt(a: Transmon, b: Transmon, gChargeGHz: number, fluxA: number, fluxB: number): number {
  return exchangeFromChargeCoupling(gChargeGHz, a.chargeElement01(fluxA), b.chargeElement01(fluxB));
}
