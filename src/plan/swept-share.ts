/**
 * The share of a gate's computational states (with a spectator in |0> or |1> equally) that a
 * crossing passed by a moving qubit can transfer (./gate-budget.ts, swept-crossing term): 1/2 for
 * the mover's 01-01 exchange with its partner and for a defect, 1/4 for a crossing with a
 * spectator or of 11-20 / 11-02 type (a transfer p of one input state costs p/4 of the average
 * fidelity, d = 4). By the crossing's rule, the moving and the met qubit, and the gate's pair.
 */
import type { RuleName } from './rules/catalogue.js';

export function sweptShareOf(rule: RuleName, moving: number, other: number, mover: number, partner: number): number {
  const withPair = other === partner || other === mover;
  switch (rule) {
    case 'cz-swept-01-01':
      return moving === mover && withPair ? 0.5 : 0.25;
    case 'cz-swept-tls':
      return 0.5;
    default:
      return 0.25;
  }
}
