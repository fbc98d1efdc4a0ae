/**
 * The reference cycle's layer durations (src/plan/cycle-budget.ts): each layer lasts as long as
 * its longest counted slot, the slot of a layout edge being that of its first entry in the edge
 * list. Checked against that definition written out here (a search of the list per gate), for
 * the list in layout order, reversed, and with an entry repeated with another slot.
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { cycleBudget } from '../../src/plan/cycle-budget.js';
import type { EdgePlan } from '../../src/plan/interaction/plan-edge.js';
import { planChip } from '../../src/plan/plan.js';

const clove = planChip(loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'), {}, {});
const { ctx } = clove;

/** The layer durations by the definition: a search of `edges` for each gate of each layer. */
function layerNsByDefinition(edges: readonly EdgePlan[], slots: readonly number[]): number[] {
  return clove.layers.layers.map((list) => {
    let m = 0;
    for (const i of list) {
      const k = edges.findIndex((e) => e.edge === i);
      if (k >= 0 && Number.isFinite(slots[k])) m = Math.max(m, slots[k]);
    }
    return m;
  });
}

describe('cycleBudget layer durations', () => {
  it('are the longest slot of each layer, the first entry of an edge counting, whatever the order of the list', () => {
    const edges = clove.edges;
    const slots = clove.budget.slotsNs;
    const gates = clove.budget.gates;
    const zz = clove.parking.idle.zzGHz;
    expect(clove.layers.layers.length).toBeGreaterThan(1);
    const cases: { edges: EdgePlan[]; slots: number[]; gates: typeof gates }[] = [
      { edges: [...edges], slots: [...slots], gates: [...gates] },
      { edges: [...edges].reverse(), slots: [...slots].reverse(), gates: [...gates].reverse() },
      // the longest gate of the first layer listed again first with a slot 3 ns longer: it counts
      { edges: [edges[clove.layers.layers[0][0]], ...edges], slots: [slots[clove.layers.layers[0][0]] + 3, ...slots], gates: [null, ...gates] },
      // and listed again last: the first entry counts
      { edges: [...edges, edges[clove.layers.layers[0][0]]], slots: [...slots, 1e6], gates: [...gates, null] },
    ];
    for (const c of cases) {
      const cycle = cycleBudget(ctx, c.edges, clove.layers, clove.states, zz, c.gates, c.slots);
      expect(cycle.layerNs).toEqual(layerNsByDefinition(c.edges, c.slots));
    }
    // the repeated entry listed first with a longer slot never shortens its layer
    const first = cycleBudget(ctx, cases[2].edges, clove.layers, clove.states, zz, cases[2].gates, cases[2].slots).layerNs[0];
    const plain = cycleBudget(ctx, cases[0].edges, clove.layers, clove.states, zz, cases[0].gates, cases[0].slots).layerNs[0];
    expect(first).toBeGreaterThanOrEqual(plain);
  });
});
