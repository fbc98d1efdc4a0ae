/**
 * The plan context's edgeBetween (src/plan/context.ts) against its definition: the index of the
 * layout's coupling between qubits i and j (either order), -1 when there is none or an index is
 * outside the chip, for every pair of two demos and a generated chip.
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile, parseLayoutText } from '../../src/layout/load.js';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { buildPlanContext } from '../../src/plan/context.js';
import type { ChipLayout } from '../../src/layout/types.js';

const chips: Record<string, () => ChipLayout> = {
  'Clove-17': () => loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'),
  'Hitch-30': () => loadLayoutFile('layouts/hitch-30.yaml', 'layouts/hitch-30.yaml'),
  'generated heavy-hex 3 x 3': () => parseLayoutText(layoutToYaml(generateLayout({ kind: 'heavy-hex', rows: 3, cols: 3, seed: 2 })), 'hh.yaml'),
};

describe('edgeBetween', () => {
  for (const [name, layout] of Object.entries(chips)) {
    it(`${name}: the coupling between each pair of qubits, by the layout's list`, () => {
      const l = layout();
      const ctx = buildPlanContext(l);
      const index = new Map(l.qubits.map((q, i) => [q.id, i]));
      const want = new Map<string, number>();
      l.couplings.forEach((c, k) => {
        const a = index.get(c.a)!;
        const b = index.get(c.b)!;
        want.set(`${a},${b}`, k);
        want.set(`${b},${a}`, k);
      });
      let found = 0;
      for (let i = -1; i <= ctx.n; i++) {
        for (let j = -1; j <= ctx.n; j++) {
          const k = want.get(`${i},${j}`) ?? -1;
          expect(ctx.edgeBetween(i, j), `${i}, ${j}`).toBe(k);
          if (k >= 0) found++;
        }
      }
      expect(found).toBe(2 * l.couplings.length);
      // the per-neighbour edges it scans (the parking cost reads them too)
      ctx.neighbours.forEach((ns, i) => ns.forEach((j, q) => expect(ctx.neighbourEdges[i][q]).toBe(want.get(`${i},${j}`))));
    });
  }
});
