/**
 * Counting on the chip graph: degree statistics and connected components (breadth-first search).
 * `connectedComponents.assign(graph)` writes each qubit's component number onto its node
 * (compute-then-assign, as graphology's own metrics do).
 */

import { idOfNode, nodeKey, type ChipGraph } from './graph.js';

export interface DegreeStats {
  min: number;
  mean: number;
  max: number;
  /** histogram[k] = number of qubits with k couplings. */
  histogram: number[];
}

export function degreeStats(graph: ChipGraph): DegreeStats {
  const degrees = graph.nodes().map((id) => graph.degree(id));
  if (degrees.length === 0) return { min: 0, mean: 0, max: 0, histogram: [] };
  let [min, max, sum] = [Infinity, 0, 0];
  for (const d of degrees) {
    min = Math.min(min, d);
    max = Math.max(max, d);
    sum += d;
  }
  const histogram = new Array<number>(max + 1).fill(0);
  for (const d of degrees) histogram[d]++;
  return { min, mean: sum / degrees.length, max, histogram };
}

/**
 * Connected components as lists of qubit ids. Components are ordered by their first qubit in
 * layout order, and each lists its qubits in layout order.
 */
export function connectedComponents(graph: ChipGraph): string[][] {
  const index = (id: string) => graph.getNodeAttribute(nodeKey(id), 'index');
  const seen = new Set<string>();
  const components: string[][] = [];
  const ordered = graph.nodes().map((k) => idOfNode(graph, k)).sort((a, b) => index(a) - index(b));
  for (const start of ordered) {
    if (seen.has(start)) continue;
    const members: string[] = [];
    const queue = [start];
    seen.add(start);
    for (let head = 0; head < queue.length; head++) {
      const id = queue[head];
      members.push(id);
      graph.forEachNeighbor(nodeKey(id), (key) => {
        const next = idOfNode(graph, key);
        if (!seen.has(next)) {
          seen.add(next);
          queue.push(next);
        }
      });
    }
    components.push(members.sort((a, b) => index(a) - index(b)));
  }
  return components;
}

/** Write `component` (0-based, in the order of connectedComponents) onto every node; returns the components. */
connectedComponents.assign = function assign(graph: ChipGraph): string[][] {
  const components = connectedComponents(graph);
  components.forEach((members, c) => {
    for (const id of members) graph.setNodeAttribute(nodeKey(id), 'component', c);
  });
  return components;
};
