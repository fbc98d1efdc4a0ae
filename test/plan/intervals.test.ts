/**
 * The interval operations of src/plan/intervals.ts against their definitions on random sets:
 * unionOf is the sorted list of maximal disjoint intervals covering exactly the points the given
 * intervals cover (checked point by point at every endpoint and between them), leaves its input
 * as it was (order and objects: the parking search hands it remembered lists), and returns new
 * objects; subtract keeps exactly the domain points outside the interiors of the union's parts.
 */
import { describe, expect, it } from 'vitest';
import { subtract, unionOf, type Interval } from '../../src/plan/intervals.js';
import { Random } from '../../src/util/random.js';

const covered = (list: readonly Interval[], x: number) => list.some((i) => i.lo <= x && x <= i.hi);

function randomIntervals(rng: Random, n: number): Interval[] {
  return Array.from({ length: n }, () => {
    const lo = Math.round(rng.uniform() * 40) / 4;
    // some empty (lo > hi), some single points, some touching others
    const width = Math.round((rng.uniform() * 12 - 2) * 4) / 4;
    return { lo, hi: lo + width };
  });
}

describe('unionOf', () => {
  it('covers exactly the points the intervals cover, with sorted disjoint intervals, leaving its input as it was', () => {
    const rng = new Random(5);
    for (let trial = 0; trial < 300; trial++) {
      const input = randomIntervals(rng, 1 + rng.int(12));
      const before = input.map((i) => ({ ...i }));
      const order = [...input];
      const out = unionOf(input);
      expect(input).toEqual(before);
      input.forEach((x, k) => expect(x).toBe(order[k]));
      for (const o of out) expect(input.includes(o)).toBe(false);
      for (let k = 1; k < out.length; k++) expect(out[k].lo).toBeGreaterThan(out[k - 1].hi);
      const valid = input.filter((i) => i.lo <= i.hi);
      const points = [...valid.flatMap((i) => [i.lo, i.hi]), ...out.flatMap((i) => [i.lo, i.hi])].sort((a, b) => a - b);
      const probes = [...points, ...points.slice(1).map((x, k) => 0.5 * (x + points[k]))];
      for (const x of probes) expect(covered(out, x), `x = ${x}`).toBe(covered(valid, x));
    }
  });
});

describe('subtract', () => {
  it('keeps the domain points outside the interior of the blocked union', () => {
    const rng = new Random(9);
    for (let trial = 0; trial < 300; trial++) {
      const blocked = randomIntervals(rng, rng.int(8));
      const domain = { lo: 1, hi: 8.5 };
      const out = subtract(domain, blocked);
      // the union of the blocked intervals, open: its components' interiors (touching intervals
      // merge, so their common end is blocked)
      const parts = unionOf(blocked);
      const open = (x: number) => parts.some((b) => b.lo < x && x < b.hi);
      const points = [domain.lo, domain.hi, ...blocked.flatMap((b) => [b.lo, b.hi]), ...out.flatMap((i) => [i.lo, i.hi])].filter((x) => x >= domain.lo && x <= domain.hi).sort((a, b) => a - b);
      const probes = [...points, ...points.slice(1).map((x, k) => 0.5 * (x + points[k]))];
      for (const x of probes) expect(covered(out, x), `x = ${x}`).toBe(!open(x));
    }
  });
});
