/**
 * Graph colouring by iterated greedy (Culberson and Luo, "Exploring the k-colorable landscape with
 * iterated greedy", DIMACS Series 26 (1996)): start from a colouring (DSATUR here), then repeatedly
 * list the vertices colour class by colour class, in a new order of the classes (largest first,
 * reversed, or shuffled), and colour greedily in that order. Greedy colouring in an order that
 * keeps each old class together never needs more colours than before, so the count only falls.
 * Seeded (src/util/random.ts): the same graph and seed give the same colouring.
 *
 * The graph is given as adjacency lists over vertices 0..n-1.
 */
import { Random } from '../util/random.js';

/** Greedy colouring in `order`: each vertex takes the lowest colour its coloured neighbours do not use. */
export function greedyColouring(adjacency: readonly number[][], order: readonly number[]): Int32Array {
  const colour = new Int32Array(adjacency.length).fill(-1);
  const mark = new Int32Array(adjacency.length + 1).fill(-1);
  for (const v of order) {
    for (const w of adjacency[v]) if (colour[w] >= 0) mark[colour[w]] = v;
    let c = 0;
    while (mark[c] === v) c++;
    colour[v] = c;
  }
  return colour;
}

export function colourCount(colour: Int32Array): number {
  let m = -1;
  for (const c of colour) if (c > m) m = c;
  return m + 1;
}

/**
 * Rounds in a row without a colouring of fewer colours after which iterated greedy stops (when the
 * caller gives no `patience`). Counted on the conflict graphs of Clove-17, Reef-49 and the
 * generated 10 x 10 and 16 x 16 chips (`check`, every colouring of the plan and its layer fitting,
 * 200 rounds each): of 28 colourings one found fewer colours, in its second round, and none later.
 */
export const ITERATED_GREEDY_PATIENCE = 50;

/**
 * Improve `start` by iterated greedy for at most `iterations` rounds (stopping at `lowerBound`, or
 * after `patience` rounds in a row without fewer colours than the best so far).
 * Colours of the result are renumbered by first appearance in vertex order.
 *
 * Each round lists the vertices class by class (each class in vertex order; classes ordered
 * largest first with ties in colour order, reversed, or shuffled with the seeded generator) and
 * colours greedily in that order. Done on flat arrays (adjacency in compressed rows, one
 * colour-stamp buffer for every round): the same colourings as greedyColouring over the flattened
 * lists of classes (tested), without building them.
 */
export function iteratedGreedy(adjacency: readonly number[][], start: Int32Array, options: { iterations: number; seed: number; lowerBound: number; patience?: number }): Int32Array {
  const patience = options.patience ?? ITERATED_GREEDY_PATIENCE;
  const rng = new Random(options.seed);
  const n = adjacency.length;
  const rowStart = new Int32Array(n + 1);
  for (let v = 0; v < n; v++) rowStart[v + 1] = rowStart[v] + adjacency[v].length;
  const targets = new Int32Array(rowStart[n]);
  for (let v = 0; v < n; v++) targets.set(adjacency[v], rowStart[v]);
  // mark[c] === stamp: colour c is used by a coloured neighbour of the vertex being coloured (a new stamp per vertex visit)
  const mark = new Int32Array(n + 1);
  let stamp = 0;
  const order = new Int32Array(n);
  let best: Int32Array = Int32Array.from(start);
  let bestCount = colourCount(best);
  let cur: Int32Array = best;
  let bestAt = -1;
  for (let it = 0; it < options.iterations && bestCount > options.lowerBound && it - bestAt <= patience; it++) {
    const k = colourCount(cur);
    const size = new Int32Array(k);
    for (let v = 0; v < n; v++) size[cur[v]]++;
    const classes: number[] = Array.from({ length: k }, (_, c) => c);
    const mode = it % 3;
    if (mode === 0) classes.sort((a, b) => size[b] - size[a]);
    else if (mode === 1) classes.reverse();
    else {
      for (let i = classes.length - 1; i > 0; i--) {
        const j = rng.int(i + 1);
        [classes[i], classes[j]] = [classes[j], classes[i]];
      }
    }
    const at = new Int32Array(k);
    let pos = 0;
    for (const c of classes) {
      at[c] = pos;
      pos += size[c];
    }
    for (let v = 0; v < n; v++) order[at[cur[v]]++] = v;
    const next = new Int32Array(n).fill(-1);
    for (let p = 0; p < n; p++) {
      const v = order[p];
      stamp++;
      for (let q = rowStart[v]; q < rowStart[v + 1]; q++) {
        const c = next[targets[q]];
        if (c >= 0) mark[c] = stamp;
      }
      let c = 0;
      while (mark[c] === stamp) c++;
      next[v] = c;
    }
    cur = next;
    const count = colourCount(cur);
    if (count < bestCount) {
      best = cur;
      bestCount = count;
      bestAt = it;
    }
  }
  return renumber(best);
}

function renumber(colour: Int32Array): Int32Array {
  const map = new Map<number, number>();
  const out = new Int32Array(colour.length);
  colour.forEach((c, v) => {
    if (!map.has(c)) map.set(c, map.size);
    out[v] = map.get(c)!;
  });
  return out;
}
