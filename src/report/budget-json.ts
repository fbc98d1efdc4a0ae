/**
 * The error budget as plan.json fields (plain fractions; durations in s): edges[].budget (and
 * edges[].gate.budget for designed gates), qubits.<id>.idle, and the top-level cycle.
 */
import type { GateBudget } from '../plan/gate-budget.js';
import type { DesignBudget } from '../gate/design.js';
import type { CycleBudget, QubitIdleBudget } from '../plan/cycle-budget.js';
import { plain, toSeconds } from '../plan/format.js';

/** The gate stage's parts, in the JSON order every budget uses. */
function stageParts(b: Pick<GateBudget, 'coherent' | 't1' | 'whiteDephasing' | 'fluxNoise' | 'spectators'>): Record<string, number> {
  return { coherent: plain(b.coherent), t1: plain(b.t1), whiteDephasing: plain(b.whiteDephasing), fluxNoise: plain(b.fluxNoise), spectators: plain(b.spectators) };
}

function sharesJson(shares: GateBudget['spectatorShares']): Record<string, unknown>[] {
  return shares.map((s) => ({ qubit: s.qubit, error: plain(s.error), leakage: plain(s.leakage), reducedModel: s.reduced === 'none' ? null : s.reduced }));
}

export function gateBudgetJson(b: GateBudget): Record<string, unknown> {
  return {
    ...stageParts(b),
    sweptCrossings: plain(b.sweptCrossings),
    spectatorMoves: plain(b.spectatorMoves),
    total: plain(b.total),
    method: b.method,
    spectatorLeakage: b.spectatorLeakage === null ? null : plain(b.spectatorLeakage),
    spectatorShares: sharesJson(b.spectatorShares),
  };
}

export function idleBudgetJson(q: QubitIdleBudget): Record<string, unknown> {
  return { t1: plain(q.t1), dephasing: plain(q.dephasing), zz: plain(q.zz), thermal: plain(q.thermal), total: plain(q.total), idleTime: toSeconds(q.idleNs) };
}

export function cycleJson(c: CycleBudget): Record<string, unknown> {
  return { duration: toSeconds(c.durationNs), error: plain(c.error), gates: plain(c.gates), idles: plain(c.idles), layerDurations: c.layerNs.map(toSeconds), uncountedEdges: c.uncounted };
}

/**
 * The gate stage's part of a budget (`fluxlane gate`, no plan around it: no swept crossings or
 * spectator moves are known); total = the sum of the parts given.
 */
export function designBudgetJson(b: DesignBudget): Record<string, unknown> {
  const total = b.coherent + b.t1 + b.whiteDephasing + b.fluxNoise + b.spectators;
  return {
    ...stageParts(b),
    sweptCrossings: null,
    spectatorMoves: null,
    total: plain(total),
    method: 'simulated',
    fluxNoiseSplit: { mover: plain(b.fluxNoiseSplit.mover), partner: plain(b.fluxNoiseSplit.partner), moverSigma: plain(b.fluxNoiseSplit.moverSigma), partnerSigma: plain(b.fluxNoiseSplit.partnerSigma) },
    spectatorLeakage: plain(b.spectatorLeakage),
    spectatorShares: sharesJson(b.spectatorShares),
  };
}
