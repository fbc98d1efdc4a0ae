/**
 * Everything the planner's stages share about one chip, built once: the resolved transmons, their
 * tabulated spectra (src/plan/qubit-table.ts; from the reduced spectrum on large chips: ./reduced-levels.ts), neighbour lists by index, next-nearest pairs with
 * their shared neighbours, each coupling's charge coupling G, each qubit's parking domain
 * (window intersected with the planning range) and fixed `park` values, and the exact coupled
 * pairs (CoupledPair, built on first use). Indices follow the layout's qubit order.
 */
import type { ChipLayout, QubitLayout, Rules } from '../layout/types.js';
import { buildChipGraph, type ChipGraph } from '../chip/graph.js';
import { nextNearestPairs } from '../chip/neighbourhood.js';
import { Transmon } from '../transmon/transmon.js';
import { chargeCouplingFromExchange } from '../pair/coupling.js';
import { CoupledPair, type BasisSlot } from '../pair/pair.js';
import { QubitTable, type QubitTableOptions, type SpectrumTable } from './qubit-table.js';
import { reducedQubitTable } from './reduced-levels.js';
import { sharedReducedSpectrum } from '../transmon/reduced-spectrum.js';
import type { Interval } from './intervals.js';

export interface PlanEdge {
  index: number;
  /** Qubit indices in the layout's order of the coupling. */
  a: number;
  b: number;
  /** `A-B` as written in the layout. */
  key: string;
  /** Layout g (both qubits at maximum frequency). */
  gGHz: number;
  /** Charge coupling G of G n_A n_B. */
  gChargeGHz: number;
}

export interface NextNearest {
  a: number;
  b: number;
  /** Shared neighbours (indices). */
  via: number[];
}

export interface PlanContext {
  layout: ChipLayout;
  graph: ChipGraph;
  rules: Rules;
  n: number;
  ids: string[];
  qubits: QubitLayout[];
  index: Map<string, number>;
  transmons: Transmon[];
  tables: SpectrumTable[];
  /** Neighbours of each qubit (indices, ascending). */
  neighbours: number[][];
  edges: PlanEdge[];
  /** Edge indices touching each qubit. */
  edgesOf: number[][];
  /** Per qubit, the edge to each of its neighbours (aligned with neighbours[i]). */
  neighbourEdges: Int32Array[];
  nextNearest: NextNearest[];
  /** Next-nearest pair indices of each qubit. */
  nextNearestOf: number[][];
  /** Window intersected with the planning range; null when they do not overlap. */
  domains: (Interval | null)[];
  /** Planning range [fLow, fMax] of each qubit (src/plan/qubit-table.ts). */
  ranges: Interval[];
  /** Fixed parking frequency (`park:`), when given. */
  fixed: (number | undefined)[];
  /** Edge index between two qubits, or -1. */
  edgeBetween(i: number, j: number): number;
  /** The exact coupled pair of an edge (A = the edge's `a`), built on first use. */
  pair(edge: number): CoupledPair;
}

/** Chips of at least this many qubits fill their QubitTables from the reduced spectrum (./reduced-levels.ts). */
export const REDUCED_TABLES_FROM = 128;

export interface ContextOptions {
  table?: Partial<QubitTableOptions>;
  /** Called once per qubit while the spectra are tabulated (progress bars). */
  onQubit?: () => void;
  /** The transmons, when the caller has them already (default: resolved from the layout). */
  transmons?: Transmon[];
  /** Another spectrum table per qubit (default: a QubitTable, from the reduced spectrum from REDUCED_TABLES_FROM qubits on). */
  tableFor?: (transmon: Transmon, index: number) => SpectrumTable;
}

export function buildPlanContext(layout: ChipLayout, options: ContextOptions = {}, graph: ChipGraph = buildChipGraph(layout)): PlanContext {
  const n = layout.qubits.length;
  const ids = layout.qubits.map((q) => q.id);
  const index = new Map(ids.map((id, i) => [id, i]));
  const transmons = options.transmons ?? layout.qubits.map((q) => Transmon.fromLayout(q, { coherence: { averagingTimeNs: layout.rules.noiseAveragingTimeNs } }));
  // Large chips read their tables' grid values from the reduced spectrum (built once, ~40 ms);
  // small ones solve their 32 points per qubit directly (cheaper than building that table).
  const reduced = n >= REDUCED_TABLES_FROM ? sharedReducedSpectrum() : null;
  const tables = transmons.map((t, i) => {
    const table = options.tableFor ? options.tableFor(t, i) : reduced ? reducedQubitTable(t, reduced, options.table) : new QubitTable(t, options.table);
    options.onQubit?.();
    return table;
  });
  const neighbours: number[][] = Array.from({ length: n }, () => []);
  const edgesOf: number[][] = Array.from({ length: n }, () => []);
  const edgeMap = new Map<number, number>();
  const n01Top = new Float64Array(n).fill(NaN);
  const n01AtTop = (i: number): number => (Number.isNaN(n01Top[i]) ? (n01Top[i] = transmons[i].chargeElement01(0)) : n01Top[i]);
  const edges: PlanEdge[] = layout.couplings.map((c, k) => {
    const a = index.get(c.a)!;
    const b = index.get(c.b)!;
    neighbours[a].push(b);
    neighbours[b].push(a);
    edgesOf[a].push(k);
    edgesOf[b].push(k);
    edgeMap.set(a * n + b, k);
    edgeMap.set(b * n + a, k);
    // (chargeCouplingForPair's arithmetic, with each transmon's |<0|n|1>| at Phi = 0 found once)
    return { index: k, a, b, key: `${c.a}-${c.b}`, gGHz: c.gGHz, gChargeGHz: chargeCouplingFromExchange(c.gGHz, n01AtTop(a), n01AtTop(b)) };
  });
  for (const list of neighbours) list.sort((x, y) => x - y);
  // (edgeBetween scans these few entries instead of hashing: it is asked millions of times on a
  // large chip, by the layer conflicts and the gate evaluations)
  const neighbourEdges = neighbours.map((ns, i) => Int32Array.from(ns, (j) => edgeMap.get(i * n + j)!));
  const nextNearest: NextNearest[] = nextNearestPairs(graph).map((p) => ({
    a: index.get(p.a)!,
    b: index.get(p.b)!,
    via: p.via.map((v) => index.get(v)!),
  }));
  const nextNearestOf: number[][] = Array.from({ length: n }, () => []);
  nextNearest.forEach((p, k) => {
    nextNearestOf[p.a].push(k);
    nextNearestOf[p.b].push(k);
  });
  const ranges = tables.map((t, i) => ({ lo: t.fLowGHz, hi: Math.min(t.fMaxGHz, transmons[i].fMaxGHz) }));
  const domains = layout.qubits.map((q, i) => {
    const r = ranges[i];
    const lo = Math.max(r.lo, q.windowGHz ? q.windowGHz[0] : -Infinity);
    const hi = Math.min(r.hi, q.windowGHz ? q.windowGHz[1] : Infinity);
    return lo <= hi ? { lo, hi } : null;
  });
  const fixed = layout.qubits.map((q) => q.parkGHz);
  const pairs = new Map<number, CoupledPair>();
  // (each qubit's last eigenbasis, shared by its pairs: the parking calibration asks every pair
  // of a qubit at the same flux)
  const basisSlots: BasisSlot[] = transmons.map(() => ({}));
  return {
    layout,
    graph,
    rules: layout.rules,
    n,
    ids,
    qubits: layout.qubits,
    index,
    transmons,
    tables,
    neighbours,
    edges,
    edgesOf,
    neighbourEdges,
    nextNearest,
    nextNearestOf,
    domains,
    ranges,
    fixed,
    edgeBetween: (i, j) => {
      const ns = neighbours[i];
      if (ns === undefined) return -1;
      const es = neighbourEdges[i];
      for (let k = 0; k < ns.length; k++) if (ns[k] === j) return es[k];
      return -1;
    },
    pair(edge: number): CoupledPair {
      let p = pairs.get(edge);
      if (!p) {
        const e = edges[edge];
        p = new CoupledPair(transmons[e.a], transmons[e.b], e.gGHz, { gChargeGHz: e.gChargeGHz, slotA: basisSlots[e.a], slotB: basisSlots[e.b] });
        pairs.set(edge, p);
      }
      return p;
    },
  };
}

/** The other end of an edge. */
export function otherEnd(edge: PlanEdge, i: number): number {
  return edge.a === i ? edge.b : edge.a;
}
