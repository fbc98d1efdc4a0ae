/**
 * The chip as an undirected graph (graphology): one node per qubit, keyed by its id, holding the
 * QubitLayout; one edge per coupling, keyed `A-B` in the layout's order, holding g. Node and edge
 * order follow the layout file, so everything derived from the graph is deterministic.
 */

import { UndirectedGraph } from 'graphology';
import type { ChipLayout, CouplingLayout, QubitLayout, Rules } from '../layout/types.js';

export interface QubitNode {
  qubit: QubitLayout;
  /** Position of the qubit in the layout's list (0-based). */
  index: number;
  /** Connected component (set by `connectedComponents.assign`). */
  component?: number;
}

export interface CouplingEdge {
  coupling: CouplingLayout;
  /** 01-10 exchange coupling at maximum frequency (GHz), as in the layout. */
  gGHz: number;
}

export interface ChipAttributes {
  chip: string;
  file: string;
  rules: Rules;
}

export type ChipGraph = UndirectedGraph<QubitNode, CouplingEdge, ChipAttributes>;

/** Edge key of a coupling: `A-B` as written in the layout. */
export function edgeKey(a: string, b: string): string {
  return `${a}-${b}`;
}

/** Build the graph of a validated layout (ids unique, couplings valid: guaranteed by the layout stage). */
export function buildChipGraph(layout: ChipLayout): ChipGraph {
  const graph: ChipGraph = new UndirectedGraph<QubitNode, CouplingEdge, ChipAttributes>({ allowSelfLoops: false, multi: false });
  graph.replaceAttributes({ chip: layout.chip, file: layout.file, rules: layout.rules });
  layout.qubits.forEach((qubit, index) => graph.addNode(qubit.id, { qubit, index }));
  for (const coupling of layout.couplings) {
    graph.addEdgeWithKey(edgeKey(coupling.a, coupling.b), coupling.a, coupling.b, { coupling, gGHz: coupling.gGHz });
  }
  return graph;
}

/** The QubitLayout of a node. */
export function qubitOf(graph: ChipGraph, id: string): QubitLayout {
  return graph.getNodeAttribute(id, 'qubit');
}

/** The edge between two qubits (either order), or undefined when they are not coupled. */
export function couplingBetween(graph: ChipGraph, a: string, b: string): CouplingEdge | undefined {
  if (!graph.hasNode(a) || !graph.hasNode(b)) return undefined;
  const key = graph.edge(a, b);
  return key === undefined ? undefined : graph.getEdgeAttributes(key);
}
