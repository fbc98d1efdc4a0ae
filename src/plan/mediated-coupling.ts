/**
 * Exchange coupling between two qubits i and k that are not coupled directly but share one or
 * more neighbours S (next-nearest neighbours). Eliminating each mediator to second order in the
 * dispersive regime (Schrieffer-Wolff; the same result as the coupler-mediated exchange of Yan et
 * al., Phys. Rev. Applied 10, 054062 (2018), Eq. 3, without a direct term) gives
 *
 *     g_ik = sum_S (g_iS g_kS / 2) (1 / (f_i - f_S) + 1 / (f_k - f_S))          (GHz)
 *
 * with the exchange couplings g at the qubits' current frequencies. Where i and k cross
 * (f_i = f_k) this is sum_S g_iS g_kS / (f_i - f_S). The planner uses it for the Landau-Zener
 * transfer when a CZ mover sweeps through a next-nearest neighbour's frequency, and documents it
 * in the README. Valid while |f - f_S| >> g; test/plan/mediated-coupling.test.ts checks it
 * against the exact splitting of the single-excitation three-mode problem (NumPy eigh).
 */

export interface Mediator {
  /** Coupling of i to the mediator (GHz). */
  giGHz: number;
  /** Coupling of k to the mediator (GHz). */
  gkGHz: number;
  /** The mediator's f01 (GHz). */
  fGHz: number;
}

/** g_ik for qubits at fi, fk through the mediators (GHz, signed). */
export function mediatedExchange(fiGHz: number, fkGHz: number, mediators: readonly Mediator[]): number {
  let g = 0;
  for (const s of mediators) {
    const di = fiGHz - s.fGHz;
    const dk = fkGHz - s.fGHz;
    if (di === 0 || dk === 0) return Infinity;
    g += 0.5 * s.giGHz * s.gkGHz * (1 / di + 1 / dk);
  }
  return g;
}
