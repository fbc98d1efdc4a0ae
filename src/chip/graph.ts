/**
 * The chip as an undirected graph (graphology): one node per qubit, keyed by its id (see
 * `nodeKey`), holding the QubitLayout; one edge per coupling, keyed `A-B` in the layout's order,
 * holding g. Node and edge order follow the layout file, so everything derived from the graph is
 * deterministic.
 *
 * graphology keeps each node's neighbours in plain objects indexed by node key, so a key such as
 * `constructor` or `__proto__` would be found on Object.prototype. Qubit ids that name a member
 * of Object.prototype are therefore keyed with a trailing NUL (`nodeKey`); read a node's id from
 * its `qubit.id` attribute (`idOfNode`), never from the key.
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

/** True when `id` names something every plain object inherits (`constructor`, `__proto__`, ...). */
export function isPrototypeName(id: string): boolean {
  return id === '__proto__' || Object.prototype.hasOwnProperty.call(Object.prototype, id);
}

/** The graph's node key of a qubit id: the id itself, or `id + "\u0000"` for prototype names. */
export function nodeKey(id: string): string {
  return isPrototypeName(id) ? `${id}\u0000` : id;
}

/** The qubit id of a node key. */
export function idOfNode(graph: ChipGraph, key: string): string {
  return graph.getNodeAttribute(key, 'qubit').id;
}

/** Build the graph of a validated layout (ids unique, couplings valid: guaranteed by the layout stage). */
export function buildChipGraph(layout: ChipLayout): ChipGraph {
  const graph: ChipGraph = new UndirectedGraph<QubitNode, CouplingEdge, ChipAttributes>({ allowSelfLoops: false, multi: false });
  graph.replaceAttributes({ chip: layout.chip, file: layout.file, rules: layout.rules });
  layout.qubits.forEach((qubit, index) => graph.addNode(nodeKey(qubit.id), { qubit, index }));
  for (const coupling of layout.couplings) {
    graph.addEdgeWithKey(edgeKey(coupling.a, coupling.b), nodeKey(coupling.a), nodeKey(coupling.b), { coupling, gGHz: coupling.gGHz });
  }
  return graph;
}

/** The QubitLayout of a node. */
export function qubitOf(graph: ChipGraph, id: string): QubitLayout {
  return graph.getNodeAttribute(nodeKey(id), 'qubit');
}

/** The edge between two qubits (either order), or undefined when they are not coupled. */
export function couplingBetween(graph: ChipGraph, a: string, b: string): CouplingEdge | undefined {
  if (!graph.hasNode(nodeKey(a)) || !graph.hasNode(nodeKey(b))) return undefined;
  const key = graph.edge(nodeKey(a), nodeKey(b));
  return key === undefined ? undefined : graph.getEdgeAttributes(key);
}
