/**
 * Decoherence of a simulated gate (README physics conventions sec. 4).
 *
 * Model: per transmon i, Lindblad operators sqrt(1/T1_i) b_i and sqrt(2/T_phi,i(Phi)) b_i^dag b_i
 * with b_i = sum_m sqrt(m) |m-1><m| in that transmon's instantaneous eigenbasis (harmonic-ladder
 * approximation: the matrix elements of a real transmon's charge operator deviate from sqrt(m) by
 * a few per cent; documented in the README), expressed in the dressed-manifold frame
 * (src/sim/manifold-frame.ts, noiseOperators). T_phi of the mover follows its flux along the
 * trajectory (white part plus 1/f flux noise, src/transmon/coherence.ts); static transmons keep
 * the value at their flux.
 *
 * Two results:
 *  - lindbladChannel: the Lindblad equation drho/dt = -i[H, rho] + sum_j D[L_j] rho integrated
 *    by Strang splitting (half a dissipator step, the exact coherent step of the frame
 *    propagator, half a dissipator step, the halves of consecutive steps merged; dissipator
 *    steps by explicit Euler, whose error is (gamma h)^2 per step) on all kept frame states, for
 *    the 10 operator inputs |k><l|, k <= l, of the computational states (the others are their
 *    adjoints). Restricting it to fewer states (noiseExcitations) is possible but biased: amplitude
 *    that leaves the restricted set during a step and would come back is lost every step.
 *    The sector structure (the Lindblad equation keeps sector(bra) xor sector(ket)) is used to skip
 *    zero blocks. Step 0.2 ns agrees with 0.02 ns to 1e-8 in the fidelity (test/sim/qutip.test.ts
 *    compares with QuTiP's mesolve to 1e-5; measured 3e-7).
 *  - firstOrderInfidelity: the weak-noise estimate from the coherent trajectory alone,
 *        1 - F_pro = (1/d^2) int dt sum_j [ d sum_k ||L_j psi_k||^2 - |sum_k <psi_k|L_j|psi_k>|^2 ],
 *        1 - F_avg = d/(d+1) (1 - F_pro),   d = 4,
 *    exact to first order in gamma T (it follows from expanding the process fidelity of the
 *    noisy channel about the unitary; for an idle it reduces to (2/5) t sum_q (1/T1 + 1/T_phi)).
 *    It sees |20> populated during the hold (decaying at 2/T1 and dephasing 4x faster).
 */
import type { SimModel } from './model.js';

/** Jump rates (1/ns) of transmon i at flux x (the mover's flux for i = 0). */
export function jumpRates(model: SimModel, i: number, moverFlux: number): { relax: number; dephase: number } {
  const t = model.transmons[i];
  if (!t.noise) return { relax: 0, dephase: 0 };
  const relax = Number.isFinite(t.noise.t1Ns) && t.noise.t1Ns > 0 ? 1 / t.noise.t1Ns : 0;
  const dephase = t.noise.dephasingRate(i === 0 ? moverFlux : t.flux);
  return { relax, dephase };
}

/** d/(d+1) (1 - F_pro) for d = 4 */
export function averageFromProcessInfidelity(processInfidelity: number): number {
  return (4 / 5) * processInfidelity;
}
