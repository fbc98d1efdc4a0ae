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
 * Improve `start` by iterated greedy for at most `iterations` rounds (stopping at `lowerBound`).
 * Colours of the result are renumbered by first appearance in vertex order.
 */
export function iteratedGreedy(adjacency: readonly number[][], start: Int32Array, options: { iterations: number; seed: number; lowerBound: number }): Int32Array {
  const rng = new Random(options.seed);
  let best: Int32Array = Int32Array.from(start);
  let bestCount = colourCount(best);
  let cur: Int32Array = best;
  for (let it = 0; it < options.iterations && bestCount > options.lowerBound; it++) {
    const k = colourCount(cur);
    const classes: number[][] = Array.from({ length: k }, () => []);
    cur.forEach((c, v) => classes[c].push(v));
    const mode = it % 3;
    if (mode === 0) classes.sort((a, b) => b.length - a.length);
    else if (mode === 1) classes.reverse();
    else {
      for (let i = classes.length - 1; i > 0; i--) {
        const j = rng.int(i + 1);
        [classes[i], classes[j]] = [classes[j], classes[i]];
      }
    }
    cur = greedyColouring(adjacency, classes.flat());
    const count = colourCount(cur);
    if (count < bestCount) {
      best = cur;
      bestCount = count;
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
