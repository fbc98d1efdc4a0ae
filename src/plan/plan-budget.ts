/**
 * The plan's error budget: each edge's gate budget (designed, or estimated before pulse design;
 * src/plan/gate-budget.ts), each qubit's idle budget and the reference cycle
 * (src/plan/cycle-budget.ts), and the findings of the rules on them (gate-error,
 * spectator-leakage, idle-error; thresholds gateErrorLimit, spectatorLeakageLimit, idleErrorLimit).
 */
import type { ChipPlan } from './plan.js';
import type { PlanContext } from './context.js';
import type { ExactQubitState } from './exact-state.js';
import type { EdgePlan } from './interaction/plan-edge.js';
import { edgePlanOf, estimateEdgeBudget, parkingOf } from './interaction/plan-edge.js';
import type { DuringGate, GateScenario } from './rules/cz-evaluate.js';
import type { Finding } from './rules/findings.js';
import { designedGateBudget, estimatedGateBudget, type GateBudget } from './gate-budget.js';
import { cycleBudget, slotDurationNs, type CycleBudget } from './cycle-budget.js';
import { ghz, prob } from './format.js';

export interface PlanBudget {
  /** Per edge (by edge index in plan.edges); null when the edge has no gate. */
  gates: (GateBudget | null)[];
  /** Slot of each edge (ns; NaN when none). */
  slotsNs: number[];
  cycle: CycleBudget;
}

/**
 * The gate scenario of a planned edge (as src/plan/interaction/plan-edge.ts evaluated it).
 * `parking`: every qubit at parking as the states give it (default: built anew; planBudget
 * passes one list, parkingOf, for all its edges instead of one per edge).
 */
export function scenarioOf(plan: Pick<ChipPlan, 'states'>, e: EdgePlan, parking: readonly DuringGate[] = plan.states.map((s) => ({ f01GHz: s.f01GHz, f12GHz: s.f12GHz }))): GateScenario {
  const parked = new Map<number, DuringGate>(e.parked.map((p) => [p.qubit, { f01GHz: p.fGHz, f12GHz: p.f12GHz }]));
  return {
    edge: e.edge, mover: e.mover, partner: e.partner, crossing: e.crossing,
    fromGHz: plan.states[e.mover].f01GHz, toGHz: e.interactionGHz, moverF12AtToGHz: e.moverF12AtInteractionGHz,
    crossingCouplingGHz: e.crossingCouplingGHz, rampNs: e.rampNs, parking, parked,
  };
}

/**
 * Estimated gate budgets (and slots) of edge plans without a design, remembered by plan object:
 * planChip's layer fitting asks for the cycle of several candidate lists that share most plan
 * objects, then for the plan's own budget. Valid while the context and the states stay the same
 * (an estimate reads the plan, the states and the context only): one memo per such stretch.
 */
export type EstimateMemo = WeakMap<EdgePlan, { budget: GateBudget | null; slot: number }>;

export function planBudget(plan: Pick<ChipPlan, 'ctx' | 'options' | 'parking' | 'states' | 'edges' | 'layers' | 'gates'>, estimates?: EstimateMemo): PlanBudget {
  const { ctx } = plan;
  const ec = { ctx, options: plan.options, blockers: plan.parking.state.blockers, states: plan.states };
  const slotsNs: number[] = [];
  // (one parking list for every edge's scenario: it was built anew, one object per qubit, per edge)
  let parking: readonly DuringGate[] | null = null;
  const parkingList = () => (parking ??= parkingOf(plan.states));
  const gates = plan.edges.map((e, k) => {
    const design = plan.gates?.[k]?.design;
    if (design && (design.budget || !design.feasible)) {
      const slot = design.feasible ? slotDurationNs(ctx, e, design.durationNs) : NaN;
      slotsNs.push(slot);
      return designedGateBudget(ctx, e, plan.states, design, slot);
    }
    // a design without a budget (designed without noise, or kept from a plan that had none)
    // is counted with the estimate on its planned edge, over the design's slot
    if (design) {
      const slot = slotDurationNs(ctx, e, design.durationNs);
      slotsNs.push(slot);
      return estimatedGateBudget(ctx, edgePlanOf({ ...e, durationNs: slot }), plan.states, estimateEdgeBudget(ec, scenarioOf(plan, e, parkingList()), e.moverInteractionFlux, slot));
    }
    const hit = estimates?.get(e);
    if (hit) {
      slotsNs.push(hit.slot);
      return hit.budget;
    }
    if (!Number.isFinite(e.interactionGHz) || !Number.isFinite(e.moverInteractionFlux)) {
      slotsNs.push(NaN);
      estimates?.set(e, { budget: null, slot: NaN });
      return null;
    }
    const slot = slotDurationNs(ctx, e);
    slotsNs.push(slot);
    const est = estimateEdgeBudget(ec, scenarioOf(plan, e, parkingList()), e.moverInteractionFlux, e.durationNs);
    const budget = estimatedGateBudget(ctx, e, plan.states, est);
    estimates?.set(e, { budget, slot });
    return budget;
  });
  const cycle = cycleBudget(ctx, plan.edges, plan.layers, plan.states, plan.parking.idle.zzGHz, gates, slotsNs);
  return { gates, slotsNs, cycle };
}

/**
 * Findings of the budget rules on a plan (budget.gates aligned with `edges`). `messages` false:
 * the messages are left empty (every other field as usual; the same findings in the same order),
 * for callers that need the message of few of them (a yield run: one per failing chip) and
 * write it by calling again with messages.
 */
export function budgetFindings(ctx: PlanContext, edges: readonly EdgePlan[], states: readonly ExactQubitState[], budget: Pick<PlanBudget, 'gates' | 'cycle'>, messages = true): Finding[] {
  const m = messages;
  const r = ctx.rules;
  const id = ctx.ids;
  const out: Finding[] = [];
  budget.gates.forEach((b, k) => {
    if (!b) return;
    const e = edges[k];
    const key = ctx.edges[e.edge].key;
    if (b.total > r.gateErrorLimit && !m) out.push({ rule: 'gate-error', qubits: [id[e.mover], id[e.partner]], value: b.total, threshold: r.gateErrorLimit, edge: key, message: '' });
    else if (b.total > r.gateErrorLimit) {
      const parts: [string, number][] = [
        ['coherent', b.coherent], ['T1', b.t1], ['white dephasing', b.whiteDephasing], ['flux noise', b.fluxNoise],
        ['spectators', b.spectators], ['swept crossings', b.sweptCrossings], ['spectator moves', b.spectatorMoves],
      ];
      parts.sort((x, y) => y[1] - x[1]);
      const spect = b.spectatorShares.length > 0 ? ` (${[...b.spectatorShares].sort((x, y) => y.error - x.error).slice(0, 3).map((s) => `${s.qubit} ${prob(s.error)}`).join(', ')})` : '';
      out.push({ rule: 'gate-error', qubits: [id[e.mover], id[e.partner]], value: b.total, threshold: r.gateErrorLimit, edge: key,
        message: `the ${b.method} error of the CZ on ${key} is ${prob(b.total)} > ${prob(r.gateErrorLimit)}; largest terms ${parts.slice(0, 2).map(([n, v]) => `${n} ${prob(v)}`).join(', ')}${parts[0][0] === 'spectators' ? spect : ''}` });
    }
    if (b.spectatorLeakage !== null && b.spectatorLeakage > r.spectatorLeakageLimit) {
      const worst = [...b.spectatorShares].sort((x, y) => y.leakage - x.leakage);
      out.push({ rule: 'spectator-leakage', qubits: [id[e.mover], ...worst.filter((s) => s.leakage > 0).slice(0, 3).map((s) => s.qubit)], value: b.spectatorLeakage, threshold: r.spectatorLeakageLimit, edge: key,
        message: `the spectators of the CZ on ${key} add leakage ${prob(b.spectatorLeakage)} > ${prob(r.spectatorLeakageLimit)} (${worst.slice(0, 3).map((s) => `${s.qubit} ${prob(s.leakage)}`).join(', ')}; three-transmon simulations)` });
    }
  });
  budget.cycle.qubits.forEach((q, i) => {
    if (!(q.total > r.idleErrorLimit)) return;
    if (!m) {
      out.push({ rule: 'idle-error', qubits: [id[i]], value: q.total, threshold: r.idleErrorLimit, message: '' });
      return;
    }
    const s = states[i];
    const parts: [string, number][] = [['T1', q.t1], ['dephasing', q.dephasing], ['ZZ', q.zz], ['thermal', q.thermal]];
    parts.sort((x, y) => y[1] - x[1]);
    out.push({ rule: 'idle-error', qubits: [id[i]], value: q.total, threshold: r.idleErrorLimit,
      message: `${id[i]} parked at ${ghz(s.f01GHz)} (flux ${s.flux.toFixed(4)}) loses ${prob(q.total)} idling ${(q.idleNs / 1000).toFixed(2)} us of the cycle > ${prob(r.idleErrorLimit)}; largest ${parts[0][0]} ${prob(parts[0][1])}${parts[0][0] === 'dephasing' && Math.abs(s.df01dFluxGHz) > 0.05 ? ` (off its sweet spot: df01/dPhi = ${s.df01dFluxGHz.toFixed(2)} GHz/Phi0)` : ''}` });
  });
  return out;
}
