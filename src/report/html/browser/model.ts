/**
 * Lookups over the report document that several views share: qubits and edges by id, the edges
 * of a qubit, the spectator moves that concern a qubit, and the frequency span of the chip.
 */
import type { ReportDocument, ReportEdge, ReportQubit } from '../document.js';

export interface ReportModel {
  doc: ReportDocument;
  qubit: Map<string, ReportQubit>;
  edge: Map<string, ReportEdge>;
  /** Edges touching a qubit (as one of its two qubits). */
  edgesOf: Map<string, ReportEdge[]>;
  /** Edges during which a qubit is moved out of the way. */
  movedIn: Map<string, ReportEdge[]>;
  /** Parking frequencies' span (GHz). */
  parkingSpan: [number, number];
  /** Everything the landscape draws (GHz). */
  frequencySpan: [number, number];
}

export function buildModel(doc: ReportDocument): ReportModel {
  const qubit = new Map(doc.qubits.map((q) => [q.id, q]));
  const edge = new Map(doc.edges.map((e) => [e.key, e]));
  const edgesOf = new Map<string, ReportEdge[]>(doc.qubits.map((q) => [q.id, []]));
  const movedIn = new Map<string, ReportEdge[]>(doc.qubits.map((q) => [q.id, []]));
  for (const e of doc.edges) {
    for (const q of e.qubits) edgesOf.get(q)?.push(e);
    for (const m of e.spectatorMoves) movedIn.get(m.qubit)?.push(e);
  }
  const parking = doc.qubits.map((q) => q.parkingGHz).filter((x): x is number => x !== null && Number.isFinite(x));
  const parkingSpan: [number, number] = parking.length > 0 ? [Math.min(...parking), Math.max(...parking)] : [4, 7];
  let lo = Infinity;
  let hi = -Infinity;
  const take = (x: number | null | undefined) => {
    if (typeof x === 'number' && Number.isFinite(x)) {
      lo = Math.min(lo, x);
      hi = Math.max(hi, x);
    }
  };
  for (const q of doc.qubits) {
    take(q.tunableGHz[0]);
    take(q.tunableGHz[1]);
    take(q.readoutGHz);
    take(q.f12GHz);
    for (const d of q.defects) take(d.atGHz);
  }
  if (!(hi > lo)) {
    lo = parkingSpan[0] - 0.5;
    hi = parkingSpan[1] + 0.5;
  }
  const pad = 0.03 * (hi - lo);
  return { doc, qubit, edge, edgesOf, movedIn, parkingSpan, frequencySpan: [lo - pad, hi + pad] };
}

/** Edges whose map line should stand out for a selection (all when nothing is selected). */
export function highlightedEdges(model: ReportModel, selected: { kind: string; id?: string; key?: string; index?: number } | null): Set<string> | null {
  if (!selected) return null;
  if (selected.kind === 'qubit' && selected.id) return new Set((model.edgesOf.get(selected.id) ?? []).map((e) => e.key));
  if (selected.kind === 'edge' && selected.key) return new Set([selected.key]);
  if (selected.kind === 'layer' && selected.index !== undefined) {
    const layer = model.doc.layers.find((l) => l.index === selected.index);
    return new Set(layer ? layer.edges : []);
  }
  return null;
}
