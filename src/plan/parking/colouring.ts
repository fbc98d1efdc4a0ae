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

/** DSATUR colour of every node of `graph` (colour 0, 1, ...), in the graph's node order for ties. */
export function dsaturColouring(graph: UndirectedGraph): Map<string, number> {
  const nodes = graph.nodes();
  const order = new Map(nodes.map((n, k) => [n, k]));
  const colour = new Map<string, number>();
  const seen = new Map<string, Set<number>>(nodes.map((n) => [n, new Set<number>()]));
  const uncolouredDegree = new Map<string, number>(nodes.map((n) => [n, graph.degree(n)]));
  for (let step = 0; step < nodes.length; step++) {
    let best: string | undefined;
    for (const n of nodes) {
      if (colour.has(n)) continue;
      if (best === undefined) {
        best = n;
        continue;
      }
      const s = seen.get(n)!.size - seen.get(best)!.size;
      const d = uncolouredDegree.get(n)! - uncolouredDegree.get(best)!;
      if (s > 0 || (s === 0 && (d > 0 || (d === 0 && order.get(n)! < order.get(best)!)))) best = n;
    }
    const node = best!;
    const used = seen.get(node)!;
    let c = 0;
    while (used.has(c)) c++;
    colour.set(node, c);
    graph.forEachNeighbor(node, (m) => {
      seen.get(m)!.add(c);
      uncolouredDegree.set(m, uncolouredDegree.get(m)! - 1);
    });
  }
  return colour;
}

/** Frequency group of each qubit (by index). */
export function frequencyGroupsOf(ctx: PlanContext): number[] {
  const colours = dsaturColouring(idleConflictGraph(ctx));
  return ctx.ids.map((id) => colours.get(nodeKey(id))!);
}
