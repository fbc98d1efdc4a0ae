/**
 * Parallel layers (src/plan/layers.ts): gates that share a qubit (mover, partner, or a parked
 * spectator unless both park it at the same point) or whose excursions cross never share a layer; the count is at least the chip's
 * largest degree (the gates on one qubit pairwise conflict: graph theory, Vizing's bound), and a
 * star reaches it exactly.
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { planChip } from '../../src/plan/plan.js';
import { gatesConflict, movedQubits, sharedSpectators, touchedQubits } from '../../src/plan/layers.js';

describe('planLayers', () => {
  it('on the Bowline-5 star every gate touches the centre: 4 layers, lower bound 4', () => {
    const plan = planChip(loadLayoutFile('layouts/bowline-5.yaml', 'layouts/bowline-5.yaml'));
    expect(plan.layers.lowerBound).toBe(4);
    expect(plan.layers.layers).toHaveLength(4);
    expect(plan.layers.layers.every((l) => l.length === 1)).toBe(true);
  });

  it('on Clove-17 no two gates of a layer share a qubit or conflict, and the count respects the bound', () => {
    const plan = planChip(loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'));
    const f12 = plan.states.map((s) => s.f12GHz);
    const moved = plan.edges.map((e) => movedQubits(plan.ctx, e, f12, plan.parking.parkingGHz));
    expect(plan.layers.layers.length).toBeGreaterThanOrEqual(plan.layers.lowerBound);
    expect(plan.layers.lowerBound).toBe(4);
    let pairs = 0;
    for (const layer of plan.layers.layers) {
      for (let i = 0; i < layer.length; i++) {
        for (let j = i + 1; j < layer.length; j++) {
          const [a, b] = [layer[i], layer[j]];
          // a qubit both gates touch is only ever a spectator both park at the very same point
          const ta = new Set(touchedQubits(plan.edges[a]));
          const shared = sharedSpectators(plan.edges[a], plan.edges[b]);
          expect(touchedQubits(plan.edges[b]).filter((q) => ta.has(q) && !shared.has(q))).toEqual([]);
          for (const q of shared) expect([plan.edges[a].mover, plan.edges[a].partner, plan.edges[b].mover, plan.edges[b].partner]).not.toContain(q);
          expect(gatesConflict(plan.ctx, plan.edges[a], moved[a], plan.edges[b], moved[b])).toBe(false);
          pairs++;
        }
      }
    }
    expect(pairs).toBeGreaterThan(0);
    // Every edge has exactly one layer.
    expect(plan.layers.layers.flat().sort((x, y) => x - y)).toEqual(plan.edges.map((_, k) => k));
  });
});
