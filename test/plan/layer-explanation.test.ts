/**
 * `fluxlane check` plans without the layers' kind-by-kind explanation (src/plan/plan.ts hooks
 * layerExplanation: false; the check does not report it). Leaving it out must change nothing else:
 * the edges, the layers, the fitting's choice, the budget and the findings are those of the full
 * plan (computed here both ways), and the explanation's counts are NaN, as planLayers leaves them
 * with explain: false. On chips where the layer fitting runs (Clove-17, Reef-49, a generated 4 x 4
 * chip) and where it stops early (Bowline-5: no spectator moved or layers at the lower bound).
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile, parseLayoutText } from '../../src/layout/load.js';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { planChip, type ChipPlan } from '../../src/plan/plan.js';
import { checkChip } from '../../src/plan/check.js';
import { buildChipGraph } from '../../src/chip/graph.js';

const chips = {
  'Clove-17': () => loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'),
  'Reef-49': () => loadLayoutFile('layouts/reef-49.yaml', 'layouts/reef-49.yaml'),
  'Bowline-5': () => loadLayoutFile('layouts/bowline-5.yaml', 'layouts/bowline-5.yaml'),
  'generated 4 x 4': () => parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 4, cols: 4, seed: 2 })), 'square-4x4.yaml'),
};

/** Everything of a plan but the layers' explanation. */
const view = (p: ChipPlan) => ({
  parking: Array.from(p.parking.parkingGHz),
  edges: p.edges,
  layerOf: p.layers.layerOf,
  layers: p.layers.layers,
  lowerBound: p.layers.lowerBound,
  conflicts: p.layers.conflicts,
  fitting: p.parking.stats.layerFitting,
  budget: p.budget,
  crowding: p.crowding,
  violations: p.violations,
  flags: p.flags,
  explanations: p.explanations,
});

describe('a plan without the layers\' explanation', () => {
  for (const [name, layout] of Object.entries(chips)) {
    it(`${name}: the same plan otherwise, the explanation's counts NaN`, () => {
      const full = planChip(layout());
      const lean = planChip(layout(), {}, { layerExplanation: false });
      expect(view(lean)).toEqual(view(full));
      expect(full.parking.stats.layerFitting === null).toBe(name === 'Bowline-5');
      for (const k of ['shared', 'spectator', 'close'] as const) {
        expect(Number.isFinite(full.layers.explanation[k])).toBe(true);
        expect(lean.layers.explanation[k]).toBeNaN();
      }
      // the check plans this way
      const l = layout();
      expect(checkChip(l, buildChipGraph(l)).plan.layers.explanation.shared).toBeNaN();
    });
  }
});
