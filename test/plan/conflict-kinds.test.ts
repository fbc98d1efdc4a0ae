/**
 * conflictKinds (src/plan/layers.ts) against its definition worked out directly: every pair of
 * gates is a candidate when the two occupy a common qubit or one moves a qubit that is a
 * neighbour or next-nearest neighbour of a qubit the other occupies; a candidate pair is a
 * conflict of the kind conflictKind gives (its rules are checked against gatesConflict in
 * ./layers.test.ts). The enumeration's order (which the layer colourings do not depend on, but the
 * cache remembers) is checked too: the pairs of each qubit's occupants first, then each gate's
 * near pairs, each pair where it is first met.
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile, parseLayoutText } from '../../src/layout/load.js';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { planChip } from '../../src/plan/plan.js';
import { conflictKind, conflictKinds, movedQubits, nearLists, touchedQubits, type ConflictKind } from '../../src/plan/layers.js';

const chips = {
  'Clove-17': () => loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'),
  'generated 8 x 8': () => parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 8, cols: 8, seed: 2 })), 'square-8x8.yaml'),
};

describe('conflictKinds', () => {
  for (const [name, layout] of Object.entries(chips)) {
    it(`${name}: the conflicts of the definition, every pair tested, in the enumeration's order`, () => {
      const plan = planChip(layout());
      const { ctx } = plan;
      const f12 = plan.states.map((s) => s.f12GHz);
      const ghz = plan.parking.parkingGHz;
      const plans = plan.edges;
      const m = plans.length;
      const moved = plans.map((p) => movedQubits(ctx, p, f12, ghz));
      const touched = plans.map((p) => new Set(touchedQubits(p)));
      const near = nearLists(ctx);
      const nearTouched = (x: number, b: number) => Array.from(near[x]).some((r) => touched[b].has(r));
      // every pair, by the definition
      const want = new Map<number, ConflictKind>();
      for (let a = 0; a < m; a++) {
        for (let b = a + 1; b < m; b++) {
          const candidate = [...touched[a]].some((q) => touched[b].has(q)) || moved[a].some((x) => nearTouched(x.qubit, b)) || moved[b].some((y) => nearTouched(y.qubit, a));
          if (!candidate) continue;
          const kind = conflictKind(ctx, plans[a], moved[a], plans[b], moved[b]);
          if (kind) want.set(a * m + b, kind);
        }
      }
      const got = conflictKinds(ctx, plans, f12, ghz);
      const sorted = (x: ReadonlyMap<number, ConflictKind>) => [...x].sort((p, q) => p[0] - q[0]);
      expect(sorted(got)).toEqual(sorted(want));
      expect(want.size).toBeGreaterThan(0);
      // the order: each qubit's occupants pairwise, then each gate's moved qubits' near occupants
      const order: number[] = [];
      const seen = new Set<number>();
      const meet = (k1: number, k2: number) => {
        if (k1 === k2) return;
        const key = Math.min(k1, k2) * m + Math.max(k1, k2);
        if (seen.has(key)) return;
        seen.add(key);
        if (want.has(key)) order.push(key);
      };
      const occupants: number[][] = Array.from({ length: ctx.n }, () => []);
      plans.forEach((p, k) => touchedQubits(p).forEach((q) => occupants[q].push(k)));
      for (const list of occupants) for (let i = 0; i < list.length; i++) for (let j = i + 1; j < list.length; j++) meet(list[i], list[j]);
      for (let k1 = 0; k1 < m; k1++) for (const x of moved[k1]) for (const r of near[x.qubit]) for (const k2 of occupants[r]) meet(k1, k2);
      expect([...got.keys()]).toEqual(order);
      // the pairs met kept in a set (beyond SEEN_BITMAP_PLANS plans) instead of the bit array: the same map, in the same order
      expect([...conflictKinds(ctx, plans, f12, ghz, undefined, 0)]).toEqual([...got]);
    });
  }
});
