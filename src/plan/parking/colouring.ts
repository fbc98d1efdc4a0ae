/**
 * Frequency groups: a colouring of the chip's idle-conflict graph (qubits joined when they are
 * coupled or share a neighbour, i.e. the pairs the 01-01, 01-12, ZZ and next-01-01 rules
 * compare) with DSATUR (Brelaz, Commun. ACM 22, 251 (1979)): repeatedly colour the uncoloured
 * qubit whose neighbours already use the most distinct colours (ties: more uncoloured neighbours,
 * then layout order) with the lowest colour none of them uses. Qubits of one group are never
 * compared by a pair rule, so a group can share a frequency band; the parking search places the
 * groups one after the other, the group with the highest frequencies first.
 *
 * The graph is a graphology UndirectedGraph (nodes: qubit ids, keyed through nodeKey so that ids
 * such as `constructor` stay off Object.prototype) so it can be inspected or drawn.
 */
import { UndirectedGraph } from 'graphology';
import { nodeKey } from '../../chip/graph.js';
import type { PlanContext } from '../context.js';

/** The idle-conflict graph of the chip (nodes in layout order). */
export function idleConflictGraph(ctx: PlanContext): UndirectedGraph {
  const g = new UndirectedGraph();
  for (const id of ctx.ids) g.addNode(nodeKey(id));
  for (const e of ctx.edges) g.mergeEdge(nodeKey(ctx.ids[e.a]), nodeKey(ctx.ids[e.b]));
  for (const p of ctx.nextNearest) g.mergeEdge(nodeKey(ctx.ids[p.a]), nodeKey(ctx.ids[p.b]));
  return g;
}

/**
 * DSATUR colour of every node of `graph` (colour 0, 1, ...), in the graph's node order for ties.
 * The uncoloured node to colour next is the one with the most distinct colours among its
 * neighbours, then the most uncoloured neighbours, then the first in node order; a heap with
 * lazy entries finds it in O(log n) (the same choice, step by step, as scanning every node).
 */
export function dsaturColouring(graph: UndirectedGraph): Map<string, number> {
  const nodes = graph.nodes();
  const index = new Map(nodes.map((node, k) => [node, k]));
  const colourOf = dsaturOfAdjacency(nodes.map((node) => graph.neighbors(node).map((m) => index.get(m)!)));
  return new Map(nodes.map((node, k) => [node, colourOf[k]]));
}

/**
 * DSATUR on adjacency lists over vertices 0..n-1 (each edge listed at both ends, no loops or
 * repeats): the colour of each vertex, ties to the lower index. The choice at each step does not
 * depend on the order of a vertex's list, so this is dsaturColouring of the graph with these
 * edges and nodes in index order (tested), without building a graph.
 */
export function dsaturOfAdjacency(neighbours: readonly (readonly number[])[]): Int32Array {
  const n = neighbours.length;
  const colourOf = new Int32Array(n).fill(-1);
  const seen: Set<number>[] = Array.from({ length: n }, () => new Set<number>());
  const uncolouredDegree = Int32Array.from(neighbours, (list) => list.length);
  const heap = new LazyMaxHeap();
  for (let k = 0; k < n; k++) heap.push(0, uncolouredDegree[k], k);
  for (let step = 0; step < n; step++) {
    let k = -1;
    while (k < 0) {
      const [sat, deg, node] = heap.pop();
      if (colourOf[node] < 0 && sat === seen[node].size && deg === uncolouredDegree[node]) k = node;
    }
    const used = seen[k];
    let c = 0;
    while (used.has(c)) c++;
    colourOf[k] = c;
    for (const m of neighbours[k]) {
      seen[m].add(c);
      uncolouredDegree[m]--;
      if (colourOf[m] < 0) heap.push(seen[m].size, uncolouredDegree[m], m);
    }
  }
  return colourOf;
}

/** Max-heap of (saturation, degree, node) by saturation, then degree, then the lower node index. */
class LazyMaxHeap {
  private readonly sat: number[] = [];
  private readonly deg: number[] = [];
  private readonly node: number[] = [];

  private before(i: number, j: number): boolean {
    return this.sat[i] > this.sat[j] || (this.sat[i] === this.sat[j] && (this.deg[i] > this.deg[j] || (this.deg[i] === this.deg[j] && this.node[i] < this.node[j])));
  }

  private swap(i: number, j: number): void {
    [this.sat[i], this.sat[j]] = [this.sat[j], this.sat[i]];
    [this.deg[i], this.deg[j]] = [this.deg[j], this.deg[i]];
    [this.node[i], this.node[j]] = [this.node[j], this.node[i]];
  }

  push(sat: number, deg: number, node: number): void {
    this.sat.push(sat);
    this.deg.push(deg);
    this.node.push(node);
    let k = this.node.length - 1;
    while (k > 0) {
      const p = (k - 1) >> 1;
      if (!this.before(k, p)) break;
      this.swap(k, p);
      k = p;
    }
  }

  pop(): [number, number, number] {
    const top: [number, number, number] = [this.sat[0], this.deg[0], this.node[0]];
    const last = this.node.length - 1;
    this.swap(0, last);
    this.sat.pop();
    this.deg.pop();
    this.node.pop();
    let k = 0;
    for (;;) {
      const l = 2 * k + 1;
      const r = l + 1;
      let m = k;
      if (l < this.node.length && this.before(l, m)) m = l;
      if (r < this.node.length && this.before(r, m)) m = r;
      if (m === k) break;
      this.swap(k, m);
      k = m;
    }
    return top;
  }
}

/** Frequency group of each qubit (by index). */
export function frequencyGroupsOf(ctx: PlanContext): number[] {
  const colours = dsaturColouring(idleConflictGraph(ctx));
  return ctx.ids.map((id) => colours.get(nodeKey(id))!);
}
