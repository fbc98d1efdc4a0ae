/**
 * The chip report's document: everything the report page draws, as plain JSON data embedded in
 * the page (src/report/html/page.ts) and read by its script (src/report/html/browser/). Built by
 * src/report/html/build-document.ts from a plan document (what plan.json holds) and the layout,
 * the same way whether the plan was just computed or read back from a file.
 *
 * This file holds types and constants only (no imports): the Node side and the browser side both
 * compile against it. Units are the ones in each name (GHz, MHz, kHz, ns, us; flux in Phi0);
 * `null` means "not known" (a field absent from the plan, or a quantity that does not exist).
 */

/** Id of the `<script type="application/json">` element that carries the document. */
export const REPORT_DATA_ELEMENT_ID = 'fluxlane-report-data';

export const REPORT_FORMAT = 'fluxlane-report';
export const REPORT_VERSION = 1;

/** Average gate infidelities of an edge's error budget, by cause (total = their sum). */
export interface GateBudget {
  coherent: number | null;
  t1: number | null;
  whiteDephasing: number | null;
  fluxNoise: number | null;
  spectators: number | null;
  sweptCrossings: number | null;
  spectatorMoves: number | null;
  total: number;
}

/** The parts of a gate budget, in the order the split bar draws them. */
export const GATE_BUDGET_PARTS = ['coherent', 't1', 'whiteDephasing', 'fluxNoise', 'spectators', 'sweptCrossings', 'spectatorMoves'] as const;

/** A qubit's idle error budget (per the plan's reference idle), by cause. */
export interface IdleBudget {
  t1: number | null;
  dephasing: number | null;
  zz: number | null;
  thermal: number | null;
  total: number;
}

export const IDLE_BUDGET_PARTS = ['t1', 'dephasing', 'zz', 'thermal'] as const;

export interface ReportDefect {
  atGHz: number;
  /** Half-width of the band to keep clear (the layout's `width`). */
  widthGHz: number;
}

export interface ReportQubit {
  id: string;
  /** The layout's `pos` (its own length unit; drawn with equal x and y scales). */
  pos: [number, number];
  group: number | null;
  fixed: boolean;
  parkingGHz: number | null;
  parkingFlux: number | null;
  f12GHz: number | null;
  anharmonicityMHz: number | null;
  /** [f01 at Phi = 1/2, f01 at Phi = 0] of the transmon. */
  tunableGHz: [number, number];
  /** The planner's range (down to E_J/E_C = 30). */
  planningGHz: [number, number] | null;
  windowGHz: [number, number] | null;
  t1Us: number | null;
  t2Us: number | null;
  tphiUs: number | null;
  marginMHz: number | null;
  marginSpreads: number | null;
  idleMarginMHz: number | null;
  czMarginMHz: number | null;
  nearest: { rule: string; other: string | null } | null;
  fabricationSpreadMHz: number | null;
  usableFraction: number | null;
  defects: ReportDefect[];
  readoutGHz: number | null;
  note: string | null;
  idle: IdleBudget | null;
  /** Counts of findings naming this qubit. */
  violations: number;
  flags: number;
}

export interface ReportSpectatorMove {
  qubit: string;
  toGHz: number;
}

export interface ReportSweptCrossing {
  rule: string;
  moving: string;
  other: string | null;
  atGHz: number | null;
  transfer: number | null;
}

/** The source of an edge's predicted error, best first. */
export type ErrorSource = 'budget' | 'noisy' | 'coherent' | 'planner';

export interface ReportGate {
  family: string | null;
  rampNs: number | null;
  holdNs: number | null;
  durationNs: number | null;
  conditionalPhase: number | null;
  leakage: number | null;
  fidelity: number | null;
  fidelityNoisy: number | null;
  decoherenceEstimate: number | null;
  virtualZ: { a: number; b: number } | null;
  crossingOffsetMHz: number | null;
  feasible: boolean | null;
  reason: string | null;
  budget: GateBudget | null;
}

export interface ReportWaveform {
  /** Sample times (ns), flux (Phi0) and the mover's f01 there (GHz, from its transmon). */
  timeNs: number[];
  flux: number[];
  f01GHz: number[];
  /** Samples in the plan's waveform, before any downsampling for the page. */
  originalSamples: number;
}

export interface ReportEdge {
  /** `A-B` as in the plan (layout order of the coupling). */
  key: string;
  qubits: [string, string];
  mover: string | null;
  partner: string | null;
  crossing: string | null;
  interactionGHz: number | null;
  crossingGHz: number | null;
  gMHz: number | null;
  layer: number | null;
  /** The gate's duration in the plan (spectator moves included). */
  durationNs: number | null;
  rampNs: number | null;
  zzKHz: number | null;
  feasible: boolean;
  reason: string | null;
  spectatorMoves: ReportSpectatorMove[];
  swept: ReportSweptCrossing[];
  gate: ReportGate | null;
  /** Predicted error: the budget's total, else 1 - noisy fidelity, else 1 - fidelity, else the planner's estimate. */
  error: { value: number; source: ErrorSource } | null;
  waveform: ReportWaveform | null;
  /** Why there is no waveform for a designed gate (e.g. its file was not found). */
  waveformNote: string | null;
  violations: number;
}

export interface ReportLayer {
  index: number;
  edges: string[];
  /** Its longest gate (null when no gate has a duration). */
  durationNs: number | null;
}

export interface ReportFinding {
  rule: string;
  qubits: string[];
  edge: string | null;
  message: string;
}

export interface ReportExplanation {
  kind: string;
  qubits: string[];
  message: string;
  lines: string[];
}

export interface ReportRule {
  name: string;
  doc: string;
  source: string;
}

export interface ReportCycle {
  durationNs: number | null;
  error: number | null;
  gates: number | null;
  idles: number | null;
}

export interface ReportDocument {
  format: typeof REPORT_FORMAT;
  version: typeof REPORT_VERSION;
  chip: string;
  description: string | null;
  /** The layout file as the plan names it. */
  layoutFile: string;
  seed: number | null;
  ok: boolean;
  pulses: boolean;
  /** The plan's own note. */
  note: string | null;
  cautions: string[];
  qubits: ReportQubit[];
  edges: ReportEdge[];
  layers: ReportLayer[];
  layerLowerBound: number | null;
  /** Sum of the layers' durations (null when unknown). */
  layeredNs: number | null;
  cycle: ReportCycle | null;
  violations: ReportFinding[];
  flags: ReportFinding[];
  explanations: ReportExplanation[];
  /** What each rule that appears among the findings means. */
  rules: ReportRule[];
  crowdedBands: { fromGHz: number; toGHz: number; qubits: string[]; flagged: string[] }[];
  /** How the waveforms were reduced for the page, when they were. */
  waveformNote: string | null;
}
