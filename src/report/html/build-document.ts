/**
 * Builds the chip report's document (./document.ts) from a plan document (the content of
 * plan.json: SI units, schema in shared/plan.schema.json), the layout it was planned from and
 * the waveforms of its designed gates. `fluxlane report LAYOUT` (the plan just computed),
 * `fluxlane report PLAN.json` (read back) and `fluxlane plan -o DIR` all come through here with
 * the same inputs, so they give the same page.
 *
 * The plan document is read field by field and tolerantly: a plan edited by hand, or written
 * before a field existed, gives `null` for what it lacks and the page says "not known". Fields of
 * the error budget (`edges[].gate.budget`, `qubits.<id>.idle`, top-level `cycle`) are read when
 * present. The layout adds what plan.json does not hold: positions, defects, readout resonators,
 * and each transmon's tunable range; the mover's f01 along its waveform is computed here with its
 * Transmon (README physics conventions sec. 1), so the page does no physics.
 *
 * Waveforms are reduced for large chips: at most `maxPointsPerGate` samples each and about
 * `waveformPointBudget` in all (./downsample.ts, largest-triangle-three-buckets), which keeps a
 * 1,000-qubit report far below 10 MB.
 */
import type { ChipLayout, QubitLayout } from '../../layout/types.js';
import { Transmon } from '../../transmon/transmon.js';
import { COLLISION_RULES } from '../../plan/rules/catalogue.js';
import { largestTriangleThreeBuckets } from './downsample.js';
import {
  GATE_BUDGET_PARTS,
  IDLE_BUDGET_PARTS,
  REPORT_FORMAT,
  REPORT_VERSION,
  type ErrorSource,
  type GateBudget,
  type IdleBudget,
  type ReportCycle,
  type ReportDocument,
  type ReportEdge,
  type ReportExplanation,
  type ReportFinding,
  type ReportGate,
  type ReportLayer,
  type ReportQubit,
  type ReportWaveform,
} from './document.js';

/** A designed gate's flux waveform (samples joined piecewise-linearly). */
export interface GateWaveform {
  timeNs: ArrayLike<number>;
  flux: ArrayLike<number>;
}

export interface ReportInputs {
  /** The plan document (plan.json's content). */
  plan: Record<string, unknown>;
  layout: ChipLayout;
  /** Waveforms by edge key `A-B` (the plan's `qubits` joined by `-`). */
  waveforms: ReadonlyMap<string, GateWaveform>;
  /** Why a designed gate has no waveform, by edge key (e.g. its file is missing). */
  missingWaveforms?: ReadonlyMap<string, string>;
}

export const REPORT_DEFAULTS = Object.freeze({
  /** Samples kept per waveform at most. */
  maxPointsPerGate: 1200,
  /** ... and at least (when the budget would give fewer). */
  minPointsPerGate: 48,
  /** Samples kept over all waveforms, about (a 1,000-qubit chip's ~2,000 gates get the minimum). */
  waveformPointBudget: 100_000,
});

export type ReportOptions = Partial<typeof REPORT_DEFAULTS>;

/** The model's cautions, shown on every report. */
export const REPORT_CAUTIONS: readonly string[] = Object.freeze([
  'Every number in this report is a model estimate: a transmon Hamiltonian with charge couplings, a decoherence model and threshold rules. Real chips have stray couplings, defects that move, flux crosstalk and line distortions the model does not hold.',
  'Verify parking points, pulses and fidelities on the hardware before relying on them.',
  'Respect the flux-line current limits of your wiring and attenuation chain: fluxlane does not know them and does not check them. Check every waveform against them before sending it to a chip.',
  'Fabrication spread moves every frequency: read margins in units of the expected spread.',
]);

type Json = Record<string, unknown>;

const isObject = (v: unknown): v is Json => typeof v === 'object' && v !== null && !Array.isArray(v);
const finite = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);
const text = (v: unknown): string | null => (typeof v === 'string' ? v : null);

/** `x` to `digits` significant digits (compact JSON; the page prints fewer). */
export function roundSignificant(x: number, digits: number): number {
  if (x === 0 || !Number.isFinite(x)) return x;
  return Number(x.toPrecision(digits));
}

const scaled = (v: unknown, factor: number, digits: number): number | null => {
  const x = finite(v);
  return x === null ? null : roundSignificant(x * factor, digits);
};
const ghz = (v: unknown) => scaled(v, 1e-9, 8);
const mhz = (v: unknown) => scaled(v, 1e-6, 6);
const khz = (v: unknown) => scaled(v, 1e-3, 6);
const nsOf = (v: unknown) => scaled(v, 1e9, 7);
const usOf = (v: unknown) => scaled(v, 1e6, 6);
const plain = (v: unknown, digits = 6) => scaled(v, 1, digits);

function pair(v: unknown, f: (x: unknown) => number | null): [number, number] | null {
  if (!Array.isArray(v) || v.length !== 2) return null;
  const a = f(v[0]);
  const b = f(v[1]);
  return a === null || b === null ? null : [a, b];
}

function gateBudget(v: unknown): GateBudget | null {
  if (!isObject(v)) return null;
  const total = finite(v.total);
  if (total === null) return null;
  const out = { total: roundSignificant(total, 5) } as GateBudget;
  for (const k of GATE_BUDGET_PARTS) out[k] = plain(v[k], 5);
  return out;
}

function idleBudget(v: unknown): IdleBudget | null {
  if (!isObject(v)) return null;
  const total = finite(v.total);
  if (total === null) return null;
  const out = { total: roundSignificant(total, 5) } as IdleBudget;
  for (const k of IDLE_BUDGET_PARTS) out[k] = plain(v[k], 5);
  return out;
}

function finding(v: unknown): ReportFinding | null {
  if (!isObject(v)) return null;
  return {
    rule: text(v.rule) ?? 'unknown',
    qubits: Array.isArray(v.qubits) ? v.qubits.filter((q): q is string => typeof q === 'string') : [],
    edge: text(v.edge),
    message: text(v.message) ?? '',
  };
}

function explanation(v: unknown): ReportExplanation | null {
  if (!isObject(v)) return null;
  return {
    kind: text(v.kind) ?? '',
    qubits: Array.isArray(v.qubits) ? v.qubits.filter((q): q is string => typeof q === 'string') : [],
    message: text(v.message) ?? '',
    lines: Array.isArray(v.lines) ? v.lines.filter((q): q is string => typeof q === 'string') : [],
  };
}

/**
 * The predicted error of an edge and where it comes from: the error budget's total, else
 * 1 - fidelity with decoherence, else 1 - coherent fidelity (from the plan's unrounded numbers),
 * else the planner's estimate (no pulse designed: the edge's estimated budget, else the chosen
 * option's score).
 */
export function predictedError(
  gate: { budgetTotal?: number | null; fidelityNoisy?: number | null; fidelity?: number | null } | null,
  plannerEstimate: number | null,
): { value: number; source: ErrorSource } | null {
  if (gate?.budgetTotal != null) return { value: roundSignificant(gate.budgetTotal, 5), source: 'budget' };
  if (gate?.fidelityNoisy != null) return { value: roundSignificant(1 - gate.fidelityNoisy, 5), source: 'noisy' };
  if (gate?.fidelity != null) return { value: roundSignificant(1 - gate.fidelity, 5), source: 'coherent' };
  if (plannerEstimate !== null) return { value: roundSignificant(plannerEstimate, 5), source: 'planner' };
  return null;
}

function gateOf(v: unknown): ReportGate | null {
  if (!isObject(v)) return null;
  const vz = isObject(v.virtualZ) && finite(v.virtualZ.a) !== null && finite(v.virtualZ.b) !== null
    ? { a: plain(v.virtualZ.a)!, b: plain(v.virtualZ.b)! }
    : null;
  return {
    family: text(v.family),
    rampNs: nsOf(v.rampTime),
    holdNs: nsOf(v.holdTime),
    durationNs: nsOf(v.duration),
    conditionalPhase: plain(v.conditionalPhase, 8),
    leakage: plain(v.leakage, 4),
    fidelity: plain(v.fidelity, 8),
    fidelityNoisy: plain(v.fidelityNoisy, 8),
    decoherenceEstimate: plain(v.decoherenceEstimate, 5),
    virtualZ: vz,
    crossingOffsetMHz: mhz(v.crossingOffset),
    feasible: typeof v.feasible === 'boolean' ? v.feasible : null,
    reason: text(v.reason),
    budget: gateBudget(v.budget),
  };
}

/** How many samples each waveform keeps, for `count` waveforms. */
export function pointsPerGate(count: number, options: ReportOptions = {}): number {
  const o = { ...REPORT_DEFAULTS, ...options };
  if (count <= 0) return o.maxPointsPerGate;
  return Math.max(o.minPointsPerGate, Math.min(o.maxPointsPerGate, Math.floor(o.waveformPointBudget / count)));
}

/** A waveform reduced to at most `points` samples, with the mover's f01 at each. */
export function reportWaveform(w: GateWaveform, mover: Transmon, points: number): ReportWaveform {
  const keep = largestTriangleThreeBuckets(w.timeNs, w.flux, points);
  const timeNs: number[] = [];
  const flux: number[] = [];
  const f01GHz: number[] = [];
  for (const k of keep) {
    timeNs.push(roundSignificant(w.timeNs[k], 6));
    flux.push(roundSignificant(w.flux[k], 7));
    f01GHz.push(roundSignificant(mover.f01(w.flux[k]), 7));
  }
  return { timeNs, flux, f01GHz, originalSamples: w.timeNs.length };
}

/** The report document of a plan. */
export function buildReportDocument(inputs: ReportInputs, options: ReportOptions = {}): ReportDocument {
  const { plan, layout } = inputs;
  const byId = new Map<string, QubitLayout>(layout.qubits.map((q) => [q.id, q]));
  const transmons = new Map<string, Transmon>();
  const transmonOf = (id: string): Transmon => {
    let t = transmons.get(id);
    if (!t) {
      const q = byId.get(id);
      if (!q) throw new RangeError(`report: qubit ${id} of the plan is not in ${layout.file}`);
      t = Transmon.fromLayout(q);
      transmons.set(id, t);
    }
    return t;
  };

  const violations = (Array.isArray(plan.violations) ? plan.violations : []).map(finding).filter((f): f is ReportFinding => f !== null);
  const flags = (Array.isArray(plan.flags) ? plan.flags : []).map(finding).filter((f): f is ReportFinding => f !== null);
  const explanations = (Array.isArray(plan.explanations) ? plan.explanations : []).map(explanation).filter((x): x is ReportExplanation => x !== null);
  const count = (list: ReportFinding[], key: (f: ReportFinding) => string[]): Map<string, number> => {
    const m = new Map<string, number>();
    for (const f of list) for (const k of new Set(key(f))) m.set(k, (m.get(k) ?? 0) + 1);
    return m;
  };
  const violationsByQubit = count(violations, (f) => f.qubits);
  const flagsByQubit = count(flags, (f) => f.qubits);
  const violationsByEdge = count(violations, (f) => (f.edge ? [f.edge] : []));

  // Qubits, in layout order.
  const planQubits = isObject(plan.qubits) ? plan.qubits : {};
  const qubits: ReportQubit[] = layout.qubits.map((q) => {
    const p = isObject(planQubits[q.id]) ? (planQubits[q.id] as Json) : {};
    const t = transmonOf(q.id);
    const nearest = isObject(p.nearest) && typeof p.nearest.rule === 'string' ? { rule: p.nearest.rule, other: text(p.nearest.other) } : null;
    return {
      id: q.id,
      pos: [q.pos[0], q.pos[1]],
      group: finite(p.group),
      fixed: p.fixed === true,
      parkingGHz: ghz(p.parkingFrequency),
      parkingFlux: plain(p.parkingFlux, 7),
      f12GHz: ghz(p.f12),
      anharmonicityMHz: mhz(p.anharmonicity),
      tunableGHz: [roundSignificant(t.fMinGHz, 8), roundSignificant(t.fMaxGHz, 8)],
      planningGHz: pair(p.range, ghz),
      windowGHz: pair(p.window, ghz) ?? (q.windowGHz ? [q.windowGHz[0], q.windowGHz[1]] : null),
      t1Us: usOf(p.t1) ?? roundSignificant(q.t1Ns * 1e-3, 6),
      t2Us: usOf(p.t2),
      tphiUs: usOf(p.tphi),
      marginMHz: mhz(p.margin),
      marginSpreads: plain(p.marginSpreads, 4),
      idleMarginMHz: mhz(p.idleMargin),
      czMarginMHz: mhz(p.czMargin),
      nearest,
      fabricationSpreadMHz: mhz(p.fabricationSpread),
      usableFraction: plain(p.usableFraction, 4),
      defects: q.tls.map((d) => ({ atGHz: d.atGHz, widthGHz: d.widthGHz })),
      readoutGHz: q.readoutGHz ?? null,
      note: q.note ?? null,
      idle: idleBudget(p.idle),
      violations: violationsByQubit.get(q.id) ?? 0,
      flags: flagsByQubit.get(q.id) ?? 0,
    };
  });

  // Edges, in plan order; waveforms reduced to a shared budget.
  const planEdges = (Array.isArray(plan.edges) ? plan.edges : []).filter(isObject);
  const keyOf = (e: Json): string => (Array.isArray(e.qubits) ? e.qubits.map(String).join('-') : '');
  const withWaveform = planEdges.filter((e) => inputs.waveforms.has(keyOf(e))).length;
  const points = pointsPerGate(withWaveform, options);
  let reduced = 0;
  const edges: ReportEdge[] = planEdges.map((e) => {
    const key = keyOf(e);
    const qs = (Array.isArray(e.qubits) ? e.qubits.map(String) : ['', '']) as [string, string];
    const mover = text(e.mover);
    const gate = gateOf(e.gate);
    const options = Array.isArray(e.options) ? e.options.filter(isObject) : [];
    const chosen = options.find((o) => o.mover === e.mover && o.crossing === e.crossing);
    const spectatorMoves = isObject(e.spectatorParking)
      ? Object.entries(e.spectatorParking)
          .map(([qubit, f]) => ({ qubit, toGHz: ghz(f) }))
          .filter((m): m is { qubit: string; toGHz: number } => m.toGHz !== null)
      : [];
    const swept = (Array.isArray(e.sweptCrossings) ? e.sweptCrossings : []).filter(isObject).map((c) => ({
      rule: text(c.rule) ?? '',
      moving: text(c.moving) ?? '',
      other: text(c.other),
      atGHz: ghz(c.at),
      transfer: plain(c.transfer, 4),
    }));
    const w = inputs.waveforms.get(key);
    let waveform: ReportWaveform | null = null;
    if (w && mover !== null && byId.has(mover)) {
      waveform = reportWaveform(w, transmonOf(mover), points);
      if (waveform.timeNs.length < waveform.originalSamples) reduced++;
    }
    const partner = text(e.partner) ?? (mover === null ? null : qs[0] === mover ? qs[1] : qs[0]);
    return {
      key,
      qubits: qs,
      mover,
      partner,
      crossing: text(e.crossing),
      interactionGHz: ghz(e.interactionFrequency),
      crossingGHz: ghz(e.crossingFrequency),
      gMHz: mhz(e.g),
      layer: finite(e.layer),
      durationNs: nsOf(e.slotDuration ?? e.duration) ?? gate?.durationNs ?? null,
      rampNs: nsOf(e.rampTime),
      zzKHz: khz(e.zz),
      feasible: e.feasible !== false,
      reason: text(e.reason),
      spectatorMoves,
      swept,
      gate,
      error: predictedError(
        isObject(e.gate) ? { budgetTotal: gate?.budget?.total ?? null, fidelityNoisy: finite(e.gate.fidelityNoisy), fidelity: finite(e.gate.fidelity) } : null,
        // before pulse design: the plan's estimated budget for the edge, else the chosen option's score
        (isObject(e.budget) ? finite(e.budget.total) : null) ?? (chosen ? finite(chosen.estimatedError) : null),
      ),
      waveform,
      waveformNote: inputs.missingWaveforms?.get(key) ?? null,
      violations: violationsByEdge.get(key) ?? 0,
    };
  });

  // Layers: which gates run together; each takes as long as its longest gate.
  const durationOf = new Map(edges.map((e) => [e.key, e.durationNs]));
  const layers: ReportLayer[] = (Array.isArray(plan.layers) ? plan.layers : []).filter(isObject).map((l, k) => {
    const keys = (Array.isArray(l.edges) ? l.edges : []).map((q) => (Array.isArray(q) ? q.map(String).join('-') : String(q)));
    const durations = keys.map((key) => durationOf.get(key) ?? null);
    const known = durations.filter((d): d is number => d !== null);
    return { index: finite(l.index) ?? k, edges: keys, durationNs: known.length > 0 ? Math.max(...known) : null };
  });
  const layeredNs = layers.length > 0 && layers.every((l) => l.durationNs !== null)
    ? roundSignificant(layers.reduce((s, l) => s + (l.durationNs as number), 0), 8)
    : null;

  const cycle: ReportCycle | null = isObject(plan.cycle)
    ? { durationNs: nsOf(plan.cycle.duration), error: plain(plan.cycle.error, 5), gates: plain(plan.cycle.gates, 5), idles: plain(plan.cycle.idles, 5) }
    : null;

  const named = new Set<string>([...violations, ...flags].map((f) => f.rule));
  for (const x of Array.isArray(plan.explanations) ? plan.explanations.filter(isObject) : []) {
    if (Array.isArray(x.rules)) for (const r of x.rules) if (typeof r === 'string') named.add(r);
  }
  const rules = COLLISION_RULES.filter((r) => named.has(r.name)).map((r) => ({ name: r.name, doc: r.doc, source: r.source }));

  const bands = isObject(plan.crowding) && Array.isArray(plan.crowding.bands) ? plan.crowding.bands.filter(isObject) : [];
  const layerSummary = isObject(plan.layerSummary) ? plan.layerSummary : {};
  const doc: ReportDocument = {
    format: REPORT_FORMAT,
    version: REPORT_VERSION,
    chip: text(plan.chip) ?? layout.chip,
    description: layout.description ?? null,
    layoutFile: text(plan.layout) ?? layout.file,
    seed: finite(plan.seed),
    ok: plan.ok === true || (plan.ok === undefined && violations.length === 0),
    pulses: plan.pulses === true,
    note: text(plan.note),
    cautions: [...REPORT_CAUTIONS],
    qubits,
    edges,
    layers,
    layerLowerBound: finite(layerSummary.lowerBound),
    layeredNs,
    cycle,
    violations,
    flags,
    explanations,
    rules,
    crowdedBands: bands.map((b) => ({
      fromGHz: ghz(b.from) ?? 0,
      toGHz: ghz(b.to) ?? 0,
      qubits: Array.isArray(b.qubits) ? b.qubits.map(String) : [],
      flagged: Array.isArray(b.flagged) ? b.flagged.map(String) : [],
    })),
    waveformNote: reduced > 0 ? `Waveforms drawn from at most ${points} of their samples each (largest-triangle downsampling); the waveform files hold every sample.` : null,
  };
  return doc;
}
