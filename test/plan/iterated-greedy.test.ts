/**
 * Iterated greedy colouring (src/plan/iterated-greedy.ts; Culberson and Luo, DIMACS Series 26
 * (1996)). Checked against:
 * - the definition itself, written out plainly here (lists of colour classes, flattened, greedy
 *   colouring in that order, stopping after `patience` rounds without fewer colours; the form the
 *   module had before its flat-array rewrite): the same
 *   colouring for the same graph, start and seed, on seeded random graphs;
 * - graph facts (textbook, e.g. Diestel, Graph Theory, ch. 5): every result is a proper colouring;
 *   the count never exceeds the start's (Culberson and Luo's invariant); an odd cycle needs 3
 *   colours and an even one at least 2 (a local search may stay at 3 there: from the classes
 *   {0,3,6,9}, {1,4,7,10}, {2,5,8,11} of a 12-cycle every class order gives 3 again).
 */
import { describe, expect, it } from 'vitest';
import { colourCount, greedyColouring, iteratedGreedy, ITERATED_GREEDY_PATIENCE } from '../../src/plan/iterated-greedy.js';
import { Random } from '../../src/util/random.js';

/** The definition, step by step (lists of classes). */
function reference(adjacency: number[][], start: Int32Array, o: { iterations: number; seed: number; lowerBound: number; patience?: number }): Int32Array {
  const rng = new Random(o.seed);
  let best: Int32Array = Int32Array.from(start);
  let bestCount = colourCount(best);
  let cur: Int32Array = best;
  // rounds in a row without fewer colours than the best (the start counts as round -1)
  let without = 0;
  const patience = o.patience ?? ITERATED_GREEDY_PATIENCE;
  for (let it = 0; it < o.iterations && bestCount > o.lowerBound && without < patience; it++) {
    without++;
    const classes: number[][] = Array.from({ length: colourCount(cur) }, () => []);
    cur.forEach((c, v) => classes[c].push(v));
    if (it % 3 === 0) classes.sort((a, b) => b.length - a.length);
    else if (it % 3 === 1) classes.reverse();
    else {
      for (let i = classes.length - 1; i > 0; i--) {
        const j = rng.int(i + 1);
        [classes[i], classes[j]] = [classes[j], classes[i]];
      }
    }
    cur = greedyColouring(adjacency, classes.flat());
    if (colourCount(cur) < bestCount) {
      best = cur;
      bestCount = colourCount(cur);
      without = 0;
    }
  }
  const map = new Map<number, number>();
  return Int32Array.from(best, (c) => {
    if (!map.has(c)) map.set(c, map.size);
    return map.get(c)!;
  });
}

function randomGraph(rng: Random, n: number, p: number): number[][] {
  const adj: number[][] = Array.from({ length: n }, () => []);
  for (let a = 0; a < n; a++) {
    for (let b = a + 1; b < n; b++) {
      if (rng.uniform() < p) {
        adj[a].push(b);
        adj[b].push(a);
      }
    }
  }
  return adj;
}

const proper = (adj: number[][], c: Int32Array) => adj.every((list, v) => list.every((w) => c[w] !== c[v]));

describe('iteratedGreedy', () => {
  it('gives the colouring of the plain definition (with its patience), a proper one never above the start, on random graphs', () => {
    const rng = new Random(21);
    for (let g = 0; g < 40; g++) {
      const n = 5 + rng.int(60);
      const adj = randomGraph(rng, n, 0.05 + 0.3 * rng.uniform());
      // a poor start: vertex order, and for some graphs colours with gaps (a start may skip colours)
      const start = greedyColouring(adj, Array.from({ length: n }, (_, v) => v));
      if (g % 4 === 0) start.forEach((c, v) => (start[v] = 2 * c));
      // (a third of them with a short patience, the others with the default, 50 rounds)
      const o = { iterations: 1 + rng.int(80), seed: 1 + rng.int(1000), lowerBound: rng.int(3), patience: g % 3 === 0 ? 1 + rng.int(5) : undefined };
      const got = iteratedGreedy(adj, start, o);
      expect(got).toEqual(reference(adj, start, o));
      expect(proper(adj, got)).toBe(true);
      expect(colourCount(got)).toBeLessThanOrEqual(colourCount(start));
    }
  });

  it('on cycles: 3 colours on an odd one, 2 or 3 (never above the start) on an even one', () => {
    const cycle = (n: number) => Array.from({ length: n }, (_, v) => [(v + n - 1) % n, (v + 1) % n]);
    const even = cycle(12);
    const start = Int32Array.from({ length: 12 }, (_, v) => v % 3);
    expect(proper(even, start)).toBe(true);
    const e = iteratedGreedy(even, start, { iterations: 50, seed: 1, lowerBound: 2 });
    expect(proper(even, e)).toBe(true);
    expect(colourCount(e)).toBe(3);
    // from the start 0,1,0,1,...,0,2 (a 2-colouring spoilt at one vertex) greedy in class order finds 2
    const spoilt = Int32Array.from({ length: 12 }, (_, v) => (v === 11 ? 2 : v % 2));
    expect(colourCount(iteratedGreedy(even, spoilt, { iterations: 50, seed: 1, lowerBound: 2 }))).toBe(2);
    const odd = cycle(7);
    const oddStart = greedyColouring(odd, [0, 1, 2, 3, 4, 5, 6]);
    const c = iteratedGreedy(odd, oddStart, { iterations: 50, seed: 1, lowerBound: 2 });
    expect(colourCount(c)).toBe(3);
    expect(proper(odd, c)).toBe(true);
  });
});
