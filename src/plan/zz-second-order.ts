/**
 * Static ZZ of a coupled pair from second-order perturbation theory in G n_A n_B, with exact
 * transmon levels and charge matrix elements (4 levels each, counter-rotating terms included):
 *
 *     dE_ij = sum_{k != i, l != j} G^2 |<i|n|k>_A|^2 |<j|n|l>_B|^2 / (E^A_i + E^B_j - E^A_k - E^B_l)
 *     zeta  = dE_11 - dE_10 - dE_01 + dE_00
 *
 * The |10> <-> |01> terms cancel exactly between dE_10 and dE_01 and are left out (so the formula
 * stays finite at f01_A = f01_B). Also left out: the |10> <-> |03> and |01> <-> |30> terms, whose
 * poles (f01_A = E_3 - E_0 of B, and the mirror) are narrow resonances with a third level that
 * the planner blocks separately (src/plan/rules/idle-blockers.ts, "narrow ZZ resonances"); away
 * from them they are below 1e-3 of the total. What remains has exactly two poles:
 * f01_B = f12_A (11-20) and f01_A = f12_B (11-02). In the
 * RWA and with sqrt2-scaled matrix elements this reduces to the dispersive formula of
 * README physics conventions sec. 2, zeta ~ 2 g^2 [1/(Delta - alpha_B) - 1/(Delta + alpha_A)].
 *
 * This is the planner's fast estimate inside the parking search only; the planner's final check
 * and `fluxlane verify` use the exact dressed ZZ of CoupledPair (src/pair/pair.ts), and the search
 * calibrates this estimate against it edge by edge (src/plan/parking/assign.ts).
 * Test: test/plan/zz-second-order.test.ts (against CoupledPair and the dispersive formula).
 */
import type { TableState } from './qubit-table.js';

/** Second-order ZZ (GHz) of transmons in states a and b with charge coupling G (GHz). */
export function secondOrderZz(a: TableState, b: TableState, gChargeGHz: number): number {
  const g2 = gChargeGHz * gChargeGHz;
  // energies relative to each ground state
  const ea1 = a.f01, ea2 = a.e2, ea3 = a.e3;
  const eb1 = b.f01, eb2 = b.e2, eb3 = b.e3;
  const a01 = a.n01 * a.n01, a03 = a.n03 * a.n03, a12 = a.n12 * a.n12;
  const b01 = b.n01 * b.n01, b03 = b.n03 * b.n03, b12 = b.n12 * b.n12;
  // |00> -> |11>, |13>, |31>, |33>
  const d00 = a01 * b01 / (-ea1 - eb1) + a01 * b03 / (-ea1 - eb3) + a03 * b01 / (-ea3 - eb1) + a03 * b03 / (-ea3 - eb3);
  // |10> -> |01> (cancels), |03> (narrow resonance, left out), |21>, |23>
  const d10 = a12 * b01 / (ea1 - ea2 - eb1) + a12 * b03 / (ea1 - ea2 - eb3);
  // |01> -> |10> (cancels), |30> (narrow resonance, left out), |12>, |32>
  const d01 = a01 * b12 / (eb1 - ea1 - eb2) + a03 * b12 / (eb1 - ea3 - eb2);
  // |11> -> |00>, |02>, |20>, |22>
  const e11 = ea1 + eb1;
  const d11 = a01 * b01 / e11 + a01 * b12 / (e11 - eb2) + a12 * b01 / (e11 - ea2) + a12 * b12 / (e11 - ea2 - eb2);
  return g2 * (d11 - d10 - d01 + d00);
}

/**
 * The second-order terms left out of `secondOrderZz`: the narrow resonances of |11>, |10>, |01>
 * with a third, fourth or fifth level of one transmon and the ground state of the other
 * (|11> <-> |40>, |04>; |10> <-> |03>, |05>; |01> <-> |30>, |50>). Their sum with
 * `secondOrderZz` is the full second-order ZZ within 6 levels; the planner uses the sum to
 * calibrate against the exact ZZ, and blocks each resonance separately in the search.
 */
export function narrowResonanceZz(a: TableState, b: TableState, gChargeGHz: number): number {
  const g2 = gChargeGHz * gChargeGHz;
  const e11 = a.f01 + b.f01;
  const a01 = a.n01 * a.n01, a03 = a.n03 * a.n03, a05 = a.n05 * a.n05, a14 = a.n14 * a.n14;
  const b01 = b.n01 * b.n01, b03 = b.n03 * b.n03, b05 = b.n05 * b.n05, b14 = b.n14 * b.n14;
  const d11 = a14 * b01 / (e11 - a.e4) + a01 * b14 / (e11 - b.e4);
  const d10 = a01 * b03 / (a.f01 - b.e3) + a01 * b05 / (a.f01 - b.e5);
  const d01 = a03 * b01 / (b.f01 - a.e3) + a05 * b01 / (b.f01 - a.e5);
  return g2 * (d11 - d10 - d01);
}
