/**
 * The spectators whose error a gate's budget reports (README physics conventions sec. 4): every
 * other neighbour of the mover, and on an 11-02 crossing (the partner reaches |2>) every other
 * neighbour of the partner. A qubit coupled to both is counted once, as the mover's. The planner
 * (src/plan/pulses.ts), `fluxlane verify` and `fluxlane simulate --plan` use this one list, each
 * spectator where the plan puts it during the gate.
 */
export interface BudgetSpectator<Q> {
  qubit: Q;
  /** The edge qubit it is coupled to. */
  coupledTo: 'mover' | 'partner';
}

export function budgetSpectatorList<Q>(neighbours: (q: Q) => Iterable<Q>, mover: Q, partner: Q, crossing: '11-20' | '11-02'): BudgetSpectator<Q>[] {
  const out: BudgetSpectator<Q>[] = [];
  const seen = new Set<Q>([mover, partner]);
  const add = (S: Q, coupledTo: 'mover' | 'partner') => {
    if (seen.has(S)) return;
    seen.add(S);
    out.push({ qubit: S, coupledTo });
  };
  for (const S of neighbours(mover)) add(S, 'mover');
  if (crossing === '11-02') for (const S of neighbours(partner)) add(S, 'partner');
  return out;
}
