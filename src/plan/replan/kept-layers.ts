/**
 * Layers when re-planning: kept gates stay in their earlier layer (in edge order, as long as they
 * conflict with nothing already there, src/plan/layers.ts gatesConflict); every other gate goes
 * into the first layer where it conflicts with nothing, a new one at the end if none.
 */
import type { PlanContext } from '../context.js';
import type { EdgePlan } from '../interaction/plan-edge.js';
import { gatesConflict, movedQubits, planLayers, type LayerPlan } from '../layers.js';

export function keptLayers(ctx: PlanContext, plans: readonly EdgePlan[], parkingF12: readonly number[], parkingGHz: ArrayLike<number>, earlier: readonly (number | undefined)[], conflicts: number): LayerPlan {
  const moved = plans.map((p) => movedQubits(ctx, p, parkingF12, parkingGHz));
  const members: number[][] = [];
  const layerOf: number[] = plans.map(() => -1);
  const fits = (k: number, layer: number) => (members[layer] ?? []).every((j) => !gatesConflict(ctx, plans[k], moved[k], plans[j], moved[j]));
  const put = (k: number, layer: number) => {
    while (members.length <= layer) members.push([]);
    members[layer].push(k);
    layerOf[k] = layer;
  };
  plans.forEach((_, k) => {
    const l = earlier[k];
    if (l !== undefined && fits(k, l)) put(k, l);
  });
  plans.forEach((_, k) => {
    if (layerOf[k] >= 0) return;
    let l = 0;
    while (l < members.length && !fits(k, l)) l++;
    put(k, l);
  });
  // drop layers left empty (an earlier layer whose gates all moved), keeping the order
  const used = members.map((m, l) => (m.length > 0 ? l : -1)).filter((l) => l >= 0);
  const renumber = new Map(used.map((l, i) => [l, i]));
  const layers = used.map((l) => members[l].map((k) => plans[k].edge).sort((a, b) => a - b));
  const lowerBound = ctx.edgesOf.reduce((m, list) => Math.max(m, list.length), 0);
  // the explanation is that of a fresh layering of the same gates (what their conflicts need)
  const explanation = planLayers(ctx, plans, parkingF12, parkingGHz).explanation;
  return { layerOf: layerOf.map((l) => renumber.get(l)!), layers, lowerBound, conflicts, explanation };
}
