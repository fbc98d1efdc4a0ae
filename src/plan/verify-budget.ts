/**
 * The error budget as `fluxlane verify` recomputes it (README physics conventions sec. 4), from
 * the layout, the plan's choices and its waveform files, never from the numbers the plan states:
 *
 *   - a designed gate (a waveform the plan names, designed with noise): the gate stage's terms on
 *     the waveform re-simulated (src/budget/waveform-budget.ts: coherent, T1, white dephasing,
 *     quasi-static flux noise; each budget spectator as a third transmon where the plan puts it),
 *     plus the planner's swept-crossing and spectator-move terms (src/plan/gate-budget.ts);
 *   - a designed gate without noise: the planner's estimate over the waveform's slot;
 *   - an edge without a designed gate: the planner's estimate over the duration model's slot;
 *   - the reference cycle and every qubit's idle budget from those slots and the plan's layers
 *     (src/plan/cycle-budget.ts);
 * then the budget rules (gate-error, spectator-leakage, idle-error) on them. The recomputation runs
 * the same functions as the planner on independently recomputed inputs, so a plan whose files and
 * choices are as the planner wrote them reproduces its stated budget to rounding.
 */
import type { PlanContext } from './context.js';
import type { ExactQubitState } from './exact-state.js';
import type { EdgePlan } from './interaction/plan-edge.js';
import { edgePlanOf, estimateEdgeBudget } from './interaction/plan-edge.js';
import type { GateScenario } from './rules/cz-evaluate.js';
import { estimatedGateBudget, gateBudgetFromStage, type GateBudget, type StageBudget } from './gate-budget.js';
import { cycleBudget, type CycleBudget } from './cycle-budget.js';
import type { LayerPlan } from './layers.js';
import type { Trajectory } from '../sim/trajectory.js';

/** What verify knows of one edge's gate. */
export type EdgeGateSource =
  /** A designed gate with noise: the stage's terms recomputed on its waveform (lazily). */
  | { kind: 'designed'; waveform: Trajectory; slotNs: number; stage: () => StageBudget }
  /**
   * An estimate over a slot (no design, or a design without noise); `spectators`: the estimate's
   * spectator term when the scenario's evaluation summed it (GateEvaluation.spectatorError);
   * `swept`: the swept-crossing term when it summed that (GateEvaluation.sweptError; the edge's
   * swept list is then empty).
   */
  | { kind: 'estimated'; scenario: GateScenario; slotNs: number; spectators?: number; swept?: number }
  /** No gate to count (an infeasible design, an unreachable crossing). */
  | { kind: 'none' };

export interface RecomputedBudget {
  /** By layout edge index (aligned with `edges`). */
  gates: (GateBudget | null)[];
  slotsNs: number[];
  cycle: CycleBudget;
}

export function recomputeBudget(
  ctx: PlanContext,
  edges: readonly EdgePlan[],
  sources: readonly EdgeGateSource[],
  layerOf: readonly number[],
  states: readonly ExactQubitState[],
  zzGHz: Float64Array,
): RecomputedBudget {
  const slotsNs: number[] = [];
  const gates = edges.map((e, k) => {
    const src = sources[k];
    if (src.kind === 'none') {
      slotsNs.push(NaN);
      return null;
    }
    slotsNs.push(src.slotNs);
    if (src.kind === 'designed') return gateBudgetFromStage(ctx, e, states, src.stage(), src.waveform, src.slotNs);
    // (the plan over the slot: a copy only when its duration is another; estimatedGateBudget reads it and keeps nothing of it)
    const over = Object.is(e.durationNs, src.slotNs) ? e : edgePlanOf({ ...e, durationNs: src.slotNs });
    return estimatedGateBudget(ctx, over, states, estimateEdgeBudget({ ctx, states }, src.scenario, e.moverInteractionFlux, src.slotNs, src.spectators), src.swept);
  });
  // the layers the plan names, in order (an index out of line, e.g. 1e9, is a layer-index
  // finding of its own; the cycle counts the layers that exist, never an array that long)
  const named = [...new Set(layerOf.filter((l) => Number.isInteger(l) && l >= 0))].sort((a, b) => a - b);
  const position = new Map(named.map((l, k) => [l, k]));
  const layers: LayerPlan['layers'] = named.map(() => []);
  edges.forEach((e) => {
    const l = layerOf[e.edge];
    const k = position.get(l);
    if (k !== undefined) layers[k].push(e.edge);
  });
  const cycle = cycleBudget(ctx, edges, { layers } as LayerPlan, states, zzGHz, gates, slotsNs);
  return { gates, slotsNs, cycle };
}
