/**
 * Neighbourhoods on the chip graph: nearest neighbours of a qubit, and next-nearest-neighbour
 * pairs (two qubits that share at least one neighbour), the pairs that the idle collision rules
 * check for mediated exchange and drive crosstalk (README physics conventions, section 5).
 */

import { idOfNode, nodeKey, type ChipGraph } from './graph.js';

/** Neighbours of a qubit, in the order of the layout's qubit list. */
export function neighbours(graph: ChipGraph, id: string): string[] {
  const list = graph.neighbors(nodeKey(id));
  return list.sort((a, b) => graph.getNodeAttribute(a, 'index') - graph.getNodeAttribute(b, 'index')).map((k) => idOfNode(graph, k));
}

export interface NextNearestPair {
  /** The earlier qubit of the pair in layout order. */
  a: string;
  b: string;
  /** The qubits both are coupled to, in layout order. */
  via: string[];
  /** True when a and b are also coupled directly (a triangle). */
  coupled: boolean;
}

export interface NextNearestOptions {
  /** Keep pairs that are also nearest neighbours (triangles). Default false. */
  includeCoupled: boolean;
}

export const NEXT_NEAREST_DEFAULTS: Readonly<NextNearestOptions> = Object.freeze({ includeCoupled: false });

/**
 * Every unordered pair {a, b} of distinct qubits with a common neighbour, once, with the shared
 * neighbours. Sorted by (index of a, index of b). Cost: sum over qubits of degree^2.
 */
export function nextNearestPairs(graph: ChipGraph, options: Partial<NextNearestOptions> = {}): NextNearestPair[] {
  const { includeCoupled } = { ...NEXT_NEAREST_DEFAULTS, ...options };
  const index = (id: string) => graph.getNodeAttribute(nodeKey(id), 'index');
  const byPair = new Map<string, NextNearestPair>();
  const ordered = graph.nodes().map((k) => idOfNode(graph, k)).sort((x, y) => index(x) - index(y));
  for (const middle of ordered) {
    const around = neighbours(graph, middle);
    for (let i = 0; i < around.length; i++) {
      for (let j = i + 1; j < around.length; j++) {
        const [a, b] = [around[i], around[j]];
        const key = `${a}\u0000${b}`;
        let pair = byPair.get(key);
        if (!pair) {
          const coupled = graph.hasEdge(nodeKey(a), nodeKey(b));
          if (coupled && !includeCoupled) continue;
          pair = { a, b, via: [], coupled };
          byPair.set(key, pair);
        }
        pair.via.push(middle);
      }
    }
  }
  return [...byPair.values()].sort((p, q) => index(p.a) - index(q.a) || index(p.b) - index(q.b));
}
