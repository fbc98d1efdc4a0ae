/**
 * `fixed` mode: the nominal plan is kept, and a drawn chip is checked against it the way
 * `fluxlane verify` checks a plan (src/plan/verify.ts), with the planner's own rule evaluations
 * (evaluateIdle, evaluateGate, gatesConflict: src/plan/rules/idle-evaluate.ts,
 * src/plan/rules/cz-evaluate.ts, src/plan/layers.ts):
 *
 * - each qubit is retuned (its flux changes) to the plan's parking frequency, and fails the
 *   `window` rule when its drawn tunable range no longer reaches it, or only below its planning
 *   range (E_J / E_C < 30);
 * - each edge keeps its mover, its crossing (11-20 or 11-02), its ramp time and its spectators'
 *   temporary frequencies; its interaction point is that crossing on the drawn chip (a CZ is
 *   calibrated where its crossing is, which moves with the drawn anharmonicities), and it fails
 *   `cz-range` when the crossing is out of reach or too close to the end of the mover's range;
 * - a designed gate's pulse is not kept (it is re-tuned on the fabricated chip): every CZ is
 *   checked with the plan's ramp time, as verify checks a plan without pulses;
 * - gates keep their layers, and gates of one layer must not conflict;
 * - the error budget's rules (gate-error with every gate estimated, idle-error over the
 *   reference cycle): src/plan/verify-budget.ts on the drawn chip, as verify.
 *
 * Fast paths, each exact where it decides (test/yield/fixed-evaluate.test.ts compares every
 * finding with verifyPlan on the same drawn chip written as a layout):
 * - spectra from the reduced table (src/transmon/reduced-spectrum.ts) instead of eigen solves;
 * - static ZZ: the planner's second-order estimate (src/plan/zz-second-order.ts, narrow
 *   resonances included) times the nominal plan's per-edge calibration against the exact ZZ
 *   (measured within 1.4e-4 relative of the exact ZZ on drawn 10 x 10 chips at 2-10 % spread:
 *   in fixed mode the qubits sit at the same frequencies, only E_C and G move); where that
 *   estimate exceeds `zzExactAbove` (85 %) of the limit the exact dressed ZZ (CoupledPair) is
 *   computed and used instead;
 * - layer conflicts: only pairs of same-layer gates that share a qubit or whose moved qubits are
 *   coupled or next-nearest neighbours can conflict (src/plan/layers.ts), so only those pairs are
 *   tested.
 */
import type { PlanContext } from '../plan/context.js';
import { calibratedZzScale } from '../plan/crowding.js';
import type { ExactQubitState } from '../plan/exact-state.js';
import { fromHz, ghz } from '../plan/format.js';
import type { EdgePlan, ParkedSpectator } from '../plan/interaction/plan-edge.js';
import { movedConflict, movedQubits, type MovedQubit } from '../plan/layers.js';
import type { PlanInput } from '../plan/plan-read.js';
import { emptyTableState } from '../plan/qubit-table.js';
import { evaluateGate, type Crossing, type DuringGate, type GateEvaluation, type GateScenario } from '../plan/rules/cz-evaluate.js';
import type { Finding } from '../plan/rules/findings.js';
import { evaluateIdle, exactStates, exactZz } from '../plan/rules/idle-evaluate.js';
import { tuningRoomShortfall } from '../plan/rules/tuning-room.js';
import { narrowResonanceZz, secondOrderZz } from '../plan/zz-second-order.js';
import { pairResonances } from '../pair/resonances.js';
import { emptyReducedState, type ReducedSpectrum } from '../transmon/reduced-spectrum.js';
import type { Transmon } from '../transmon/transmon.js';
import type { NominalChip } from './chip-model.js';
import type { DrawnChip } from './draw.js';
import { sampledContext } from './sampled-context.js';
import { recomputeBudget, type EdgeGateSource } from '../plan/verify-budget.js';
import { budgetFindings } from '../plan/plan-budget.js';
import { cycleBudget } from '../plan/cycle-budget.js';
import { spectrumMemo } from '../plan/exact-memo.js';
import type { LayerPlan } from '../plan/layers.js';
import type { SampledSpectrum } from './sampled-spectrum.js';

export interface FixedOptions {
  /** The exact ZZ is computed where |estimate| exceeds this fraction of zzLimit. */
  zzExactAbove: number;
  /**
   * false: the CZ rules' findings come without messages (evaluateGate's `messages: false`), and
   * so do the cz-range and budget findings (every other field as usual); FixedEvaluation.messageOf
   * writes one on demand. A yield run needs one message per failing chip (its outcome's reason)
   * among hundreds of findings.
   */
  messages: boolean;
  /** For tests: called with each gate the rules evaluate (its scenario and evaluation, and the drawn chip's states at parking). */
  onGate?: (gate: { ctx: PlanContext; scenario: GateScenario; evaluation: GateEvaluation; moverFlux: number; states: readonly ExactQubitState[] }) => void;
}

export const FIXED_DEFAULTS: Readonly<FixedOptions> = Object.freeze({ zzExactAbove: 0.85, messages: true });

/**
 * A qubit whose idle error (with the estimated ZZ) lies within this fraction of its ZZ part of
 * idleErrorLimit gets the exact ZZ of its pairs. The ZZ part is quadratic in the ZZ, whose
 * calibrated estimate is within 1.4e-4 relative of the exact one (above), so the part is good to
 * ~3e-4 relative: 1e-2 leaves a margin of 30 before an estimate could flip the verdict.
 */
const IDLE_EXACT_BAND = 1e-2;

export interface FixedEdge {
  /** Layout edge index. */
  edge: number;
  mover: number;
  partner: number;
  crossing: Crossing;
  rampNs: number;
  /** Spectators moved for the gate: qubit index and temporary frequency (GHz), by index. */
  spectators: { qubit: number; fGHz: number; /** index of (qubit, fGHz) in FixedPlan.spectatorPoints */ point: number }[];
  layer: number;
}

/** The nominal plan in indices and GHz, with what the evaluation precomputes from it. */
export interface FixedPlan {
  parkingGHz: Float64Array;
  /** By layout edge index. */
  edges: FixedEdge[];
  /** Same-layer gate pairs (layout edge indices) that can conflict. */
  conflictCandidates: [number, number][];
  /** Nominal per-edge factor of the second-order ZZ estimate (exact / estimate at the plan's parking). */
  zzScale: Float64Array;
  /** The plan's layers as recomputeBudget orders them (src/plan/verify-budget.ts). */
  layers: LayerPlan;
  /** The distinct (qubit, frequency) points spectators are moved to; a drawn chip's state at each is found once. */
  spectatorPoints: { qubit: number; fGHz: number }[];
}

/** The plan (as `fluxlane verify` reads it) in the form the evaluation uses. */
export function fixedPlan(chip: NominalChip, plan: PlanInput): FixedPlan {
  const ctx = chip.ctx;
  const parkingGHz = Float64Array.from(ctx.ids, (q) => fromHz(plan.qubits.get(q)!.parkingFrequency));
  const byPair = new Map(ctx.edges.map((e) => [pairKey(ctx.ids[e.a], ctx.ids[e.b]), e.index]));
  const edges: FixedEdge[] = new Array(ctx.edges.length);
  for (const pe of plan.edges) {
    const k = byPair.get(pairKey(pe.qubits[0], pe.qubits[1]))!;
    const e = ctx.edges[k];
    const mover = ctx.index.get(pe.mover)!;
    edges[k] = {
      edge: k,
      mover,
      partner: mover === e.a ? e.b : e.a,
      crossing: pe.crossing,
      rampNs: pe.rampTime * 1e9,
      spectators: [...pe.spectatorParking.entries()]
        .map(([s, fHz]) => ({ qubit: ctx.index.get(s)!, fGHz: fromHz(fHz), point: -1 }))
        .sort((a, b) => a.qubit - b.qubit),
      layer: pe.layer,
    };
  }
  const states = exactStates(ctx, parkingGHz);
  const zzScale = calibratedZzScale(ctx, parkingGHz, exactZz(ctx, states));
  // the distinct spectator points (a 10 x 10 plan moves spectators 484 times to 51 points)
  const spectatorPoints: { qubit: number; fGHz: number }[] = [];
  const pointOf = new Map<number, Map<number, number>>();
  for (const e of edges) {
    if (!e) continue;
    for (const sp of e.spectators) {
      let m = pointOf.get(sp.qubit);
      if (!m) pointOf.set(sp.qubit, (m = new Map()));
      let k = m.get(sp.fGHz);
      if (k === undefined) {
        k = spectatorPoints.length;
        m.set(sp.fGHz, k);
        spectatorPoints.push({ qubit: sp.qubit, fGHz: sp.fGHz });
      }
      sp.point = k;
    }
  }
  return { parkingGHz, edges, conflictCandidates: conflictCandidates(ctx, edges), zzScale, layers: budgetLayers(edges), spectatorPoints };
}

/** The layers by number, in order, each with its edges in layout order (as recomputeBudget builds them). */
function budgetLayers(edges: readonly FixedEdge[]): LayerPlan {
  const named = [...new Set(edges.map((e) => e.layer).filter((l) => Number.isInteger(l) && l >= 0))].sort((a, b) => a - b);
  const position = new Map(named.map((l, k) => [l, k]));
  const layers: number[][] = named.map(() => []);
  for (const e of edges) {
    const k = position.get(e.layer);
    if (k !== undefined) layers[k].push(e.edge);
  }
  return { layers } as LayerPlan;
}

/** Pairs of gates in one layer that share a qubit or whose moved qubits are coupled or next-nearest. */
function conflictCandidates(ctx: PlanContext, edges: readonly FixedEdge[]): [number, number][] {
  const touched = edges.map((e) => [e.mover, e.partner, ...e.spectators.map((s) => s.qubit)]);
  const moved = edges.map((e) => [e.mover, ...e.spectators.map((s) => s.qubit)]);
  const near = (x: number, y: number) => x === y || ctx.edgeBetween(x, y) >= 0 || ctx.nextNearestOf[x].some((p) => {
    const pair = ctx.nextNearest[p];
    return (pair.a === x ? pair.b : pair.a) === y;
  });
  const byLayer = new Map<number, number[]>();
  for (const e of edges) byLayer.set(e.layer, [...(byLayer.get(e.layer) ?? []), e.edge]);
  const out: [number, number][] = [];
  for (const layer of [...byLayer.keys()].sort((a, b) => a - b)) {
    const members = byLayer.get(layer)!;
    for (let i = 0; i < members.length; i++) {
      for (let j = i + 1; j < members.length; j++) {
        const [a, b] = [members[i], members[j]];
        const shares = touched[a].some((q) => touched[b].includes(q));
        const close = moved[a].some((x) => moved[b].some((y) => near(x, y)));
        if (shares || close) out.push([a, b]);
      }
    }
  }
  return out;
}

export interface FixedEvaluation {
  /** Every rule broken, in evaluation order. */
  violations: Finding[];
  /** Edges whose static ZZ needed the exact computation. */
  exactZzEdges: number;
  /**
   * The message of finding `f` of `violations`: its own, or (messages off) the one evaluateGate
   * writes for it when its gate is evaluated again with messages (the same findings in the same
   * order), the one budgetFindings writes for it with messages, or a cz-range finding's written
   * then. Valid until the next evaluation with the same `reuse`.
   */
  messageOf(f: Finding): string;
}

/** Check drawn chip `drawn` against the nominal plan (see the banner). */
export function evaluateFixed(
  chip: NominalChip,
  plan: FixedPlan,
  drawn: DrawnChip,
  table: ReducedSpectrum,
  options: Partial<FixedOptions> = {},
  reuse?: (SampledSpectrum | undefined)[],
): FixedEvaluation {
  const o = { ...FIXED_DEFAULTS, ...options };
  const ctx = sampledContext(chip, drawn, table, reuse);
  const n = ctx.n;
  const parking = plan.parkingGHz;
  // Exact-state stand-ins at the parking frequencies (null out of the tunable range).
  const reached: (ExactQubitState | null)[] = new Array(n);
  const states: ExactQubitState[] = new Array(n);
  const tableStates = ctx.tables.map(() => emptyTableState());
  for (let i = 0; i < n; i++) {
    const t = ctx.transmons[i];
    const f = parking[i];
    const inRange = f >= t.fMinGHz - 1e-9 && f <= t.fMaxGHz + 1e-9;
    const s = stateAt(ctx, table, i, Math.min(t.fMaxGHz, Math.max(t.fMinGHz, f)));
    states[i] = s;
    reached[i] = inRange ? s : null;
    ctx.tables[i].at(s.f01GHz, tableStates[i]);
  }
  // Static ZZ: calibrated estimate, exact near the limit.
  const limit = ctx.rules.zzLimitGHz;
  const zz = new Float64Array(ctx.edges.length);
  const zzExact = new Uint8Array(ctx.edges.length);
  let exactZzEdges = 0;
  for (const e of ctx.edges) {
    const a = reached[e.a];
    const b = reached[e.b];
    if (!a || !b) {
      zz[e.index] = NaN;
      continue;
    }
    const sa = tableStates[e.a];
    const sb = tableStates[e.b];
    const est = plan.zzScale[e.index] * (secondOrderZz(sa, sb, e.gChargeGHz) + narrowResonanceZz(sa, sb, e.gChargeGHz));
    if (Math.abs(est) > o.zzExactAbove * limit || !Number.isFinite(est)) {
      zz[e.index] = ctx.pair(e.index).zz(a.flux, b.flux);
      zzExact[e.index] = 1;
      exactZzEdges++;
    } else zz[e.index] = est;
  }
  const idle = evaluateIdle(ctx, parking, { states: reached, zzGHz: zz });
  const violations: Finding[] = [...idle.violations];
  const during: DuringGate[] = states.map((s) => ({ f01GHz: s.f01GHz, f12GHz: s.f12GHz }));
  const edgePlans: EdgePlan[] = new Array(ctx.edges.length);
  const budgetScenarios: (GateScenario | null)[] = new Array(ctx.edges.length).fill(null);
  // (per spectator point, what a gate parking a spectator there reads: one object per point and
  // chip, shared by the gates that park there; the rule evaluation, the budget and the layer
  // rules only read them)
  const pointDuring: (DuringGate | undefined)[] = new Array(plan.spectatorPoints.length);
  const pointInfo: (ParkedSpectator | undefined)[] = new Array(plan.spectatorPoints.length);
  // (messages off: each CZ finding's gate and place in that gate's findings, by its index in
  // `violations`: arrays, not a Map keyed by the findings, whose identity hashes cost more)
  const originGate: GateScenario[] = [];
  const originPlace: number[] = [];
  // (messages off: the message of each cz-range finding, written on demand, by its index)
  const later: (() => string)[] = [];
  // (each gate's evaluation also sums its estimate's spectator term, handed to the budget below)
  // and its swept-crossing term (the swept crossings themselves are not listed)
  const gateOptions = { messages: o.messages, spectatorError: true, sweptError: true };
  const spectatorErrors = new Float64Array(ctx.edges.length);
  const sweptErrors = new Float64Array(ctx.edges.length);
  for (const fe of plan.edges) {
    const { mover, partner } = fe;
    const edge = ctx.edges[fe.edge];
    const key = edge.key;
    const res = crossingOf(ctx, table, fe, states[partner]);
    const range = ctx.ranges[mover];
    const short = res && res.moverF01GHz >= range.lo - 1e-9 ? tuningRoomShortfall(range, states[mover].f01GHz, res.moverF01GHz, res.couplingGHz) : 0;
    if (!res || res.moverF01GHz < range.lo - 1e-9 || short > 0) {
      const message = () => `${ctx.ids[mover]} cannot reach the ${fe.crossing} crossing with ${ctx.ids[partner]} parked at ${ghz(parking[partner])}${short > 0 ? ` with room to tune past it (less than one splitting inside its planning range)` : ''}`;
      if (!o.messages) later[violations.length] = message;
      violations.push({ rule: 'cz-range', qubits: [ctx.ids[mover], ctx.ids[partner]], value: res?.moverF01GHz ?? null, threshold: null, edge: key, message: o.messages ? message() : '' });
      edgePlans[fe.edge] = stubPlan(fe.edge, mover, partner, fe.crossing);
      continue;
    }
    const to = res.moverF01GHz;
    const parked = new Map<number, DuringGate>();
    const parkedInfo: ParkedSpectator[] = [];
    for (const sp of fe.spectators) {
      const q = sp.qubit;
      const t = ctx.transmons[q];
      if (!(sp.fGHz >= ctx.ranges[q].lo - 1e-9 && sp.fGHz <= t.fMaxGHz + 1e-9)) {
        const message = () => `${ctx.ids[q]}: spectator parking ${ghz(sp.fGHz)} for ${key} is outside its planning range`;
        if (!o.messages) later[violations.length] = message;
        violations.push({ rule: 'cz-range', qubits: [ctx.ids[q]], value: sp.fGHz, threshold: null, edge: key, message: o.messages ? message() : '' });
        continue;
      }
      let info = pointInfo[sp.point];
      if (!info) {
        const st = stateAt(ctx, table, q, Math.min(sp.fGHz, t.fMaxGHz));
        pointDuring[sp.point] = { f01GHz: st.f01GHz, f12GHz: st.f12GHz };
        info = pointInfo[sp.point] = { qubit: q, fGHz: st.f01GHz, flux: st.flux, f12GHz: st.f12GHz, reason: '' };
      }
      parked.set(q, pointDuring[sp.point]!);
      parkedInfo.push(info);
    }
    const scenario: GateScenario = {
      edge: fe.edge, mover, partner, crossing: fe.crossing,
      fromGHz: parking[mover], toGHz: to, moverF12AtToGHz: res.moverF12GHz,
      crossingCouplingGHz: res.couplingGHz, rampNs: fe.rampNs, spectatorRampNs: fe.rampNs, parking: during, parked,
    };
    const ev = evaluateGate(ctx, scenario, gateOptions);
    // (the findings keep evaluateGate's `blame`, which no one here reads)
    for (let j = 0; j < ev.findings.length; j++) {
      const f = ev.findings[j];
      if (!o.messages) {
        originGate[violations.length] = scenario;
        originPlace[violations.length] = j;
      }
      violations.push(f);
    }
    // (the plan built whole: the same fields and values as a stub with these set)
    const plan: EdgePlan = {
      edge: fe.edge, mover, partner, crossing: fe.crossing, feasible: ev.findings.length === 0, crossingGHz: to, interactionGHz: to,
      moverInteractionFlux: res.moverFlux, moverF12AtInteractionGHz: res.moverF12GHz, crossingCouplingGHz: res.couplingGHz,
      speedLimitNs: NaN, gAtInteractionGHz: NaN, durationNs: ev.durationNs, rampNs: fe.rampNs, parked: parkedInfo, swept: ev.swept,
      findings: NO_FINDINGS, score: Infinity, reason: '', options: NO_OPTIONS,
    };
    edgePlans[fe.edge] = plan;
    budgetScenarios[fe.edge] = scenario;
    spectatorErrors[fe.edge] = ev.spectatorError!;
    sweptErrors[fe.edge] = ev.sweptError!;
    o.onGate?.({ ctx, scenario, evaluation: ev, moverFlux: res.moverFlux, states });
  }
  // Layers: gates sharing one must not conflict (only the pairs that can).
  const f12 = states.map((s) => s.f12GHz);
  const moved: (MovedQubit[] | undefined)[] = new Array(ctx.edges.length);
  const movedOf = (k: number) => (moved[k] ??= movedQubits(ctx, edgePlans[k], f12, parking));
  for (const [a, b] of plan.conflictCandidates) {
    if (candidatesConflict(ctx, edgePlans[a], movedOf(a), edgePlans[b], movedOf(b))) {
      violations.push({ rule: 'layer-conflict', qubits: [ctx.ids[edgePlans[a].mover], ctx.ids[edgePlans[b].mover]], value: null, threshold: null, edge: ctx.edges[a].key,
        message: `layer ${plan.edges[a].layer}: the gates on ${ctx.edges[a].key} and ${ctx.edges[b].key} share a qubit or a crossing and cannot run at the same time` });
    }
  }
  // The error budget's rules, as verify computes them for a plan without pulses (every gate
  // estimated: the pulse is re-tuned on the fabricated chip; src/plan/verify-budget.ts).
  const budgetStates = states.map((s, i) => ({ ...s, df01dFluxGHz: spectrumMemo(ctx, i, s.flux).df01dFluxGHz }));
  const sources: EdgeGateSource[] = edgePlans.map((e, k) => (budgetScenarios[k] ? { kind: 'estimated', scenario: budgetScenarios[k]!, slotNs: e.durationNs, spectators: spectatorErrors[k], swept: sweptErrors[k] } : { kind: 'none' }));
  const layerOf: number[] = [];
  for (const fe of plan.edges) layerOf[fe.edge] = fe.layer;
  let budget = recomputeBudget(ctx, edgePlans, sources, layerOf, budgetStates, zz);
  // A qubit whose idle error the estimate's error could carry across its ceiling is decided with
  // the exact ZZ of its pairs; elsewhere the verdict is the exact one and the reported idle error
  // is within ~3e-4 of the ZZ part of the exact value.
  let refined = false;
  budget.cycle.qubits.forEach((q, i) => {
    if (!(Math.abs(q.total - ctx.rules.idleErrorLimit) <= IDLE_EXACT_BAND * q.zz)) return;
    for (const k of ctx.edgesOf[i]) {
      const e = ctx.edges[k];
      const a = reached[e.a];
      const b = reached[e.b];
      if (!a || !b || zzExact[k]) continue;
      zz[k] = ctx.pair(k).zz(a.flux, b.flux);
      zzExact[k] = 1;
      exactZzEdges++;
      refined = true;
    }
  });
  // (the gate budgets do not depend on the static ZZ: only the cycle is recomputed, as
  // recomputeBudget would with the same layers)
  if (refined) budget = { ...budget, cycle: cycleBudget(ctx, edgePlans, plan.layers, budgetStates, zz, budget.gates, budget.slotsNs) };
  // (messages off: the budget's findings without messages; messageOf writes one by evaluating
  // the same budget's findings again with messages, the same findings in the same order)
  const budgetFrom = violations.length;
  const budgetOut = budgetFindings(ctx, edgePlans, budgetStates, budget, o.messages);
  for (let j = 0; j < budgetOut.length; j++) violations.push(budgetOut[j]);
  // In evaluation order (idle rules, then edge by edge in layout order, then layers, then the
  // budget): the same findings as verify gives, which sorts them for people
  // (src/plan/rules/findings.ts sortFindings).
  const messageOf = (f: Finding): string => {
    const k = o.messages ? -1 : violations.indexOf(f);
    if (k >= budgetFrom) {
      const again = budgetFindings(ctx, edgePlans, budgetStates, budget)[k - budgetFrom];
      if (again?.rule !== f.rule) throw new Error(`evaluateFixed: the ${f.rule} finding on ${f.edge ?? f.qubits.join(', ')} was not found again`);
      return again.message;
    }
    if (k >= 0 && later[k] !== undefined) return later[k]();
    if (k < 0 || originGate[k] === undefined) return f.message;
    const again = evaluateGate(ctx, originGate[k]).findings[originPlace[k]];
    if (again?.rule !== f.rule) throw new Error(`evaluateFixed: the ${f.rule} finding on ${f.edge} was not found again`);
    return again.message;
  };
  return { violations, exactZzEdges, messageOf };
}

/**
 * gatesConflict (src/plan/layers.ts, rules a-c) of two gates, the same answer without its sets:
 * a spectator both gates park at the very same f01 is shared and keeps them apart by none of the
 * rules; any other qubit both occupy (mover, partner, parked spectator) is rule (a); then rules
 * (b) and (c) on each pair of moved qubits neither of which is shared (movedConflict). A gate
 * occupies a handful of qubits, so loops over its lists cost less than the sets (tested against
 * gatesConflict in test/yield/fixed-evaluate.test.ts).
 */
export function candidatesConflict(ctx: PlanContext, g1: EdgePlan, m1: readonly MovedQubit[], g2: EdgePlan, m2: readonly MovedQubit[]): boolean {
  const p1 = g1.parked;
  const p2 = g2.parked;
  // (a): a qubit of g2's (mover, partner, parked) that g1 occupies too and is not shared
  if ((occupies(g1, g2.mover) && !sharedSpectator(p1, p2, g2.mover)) || (occupies(g1, g2.partner) && !sharedSpectator(p1, p2, g2.partner))) return true;
  for (let j = 0; j < p2.length; j++) {
    const q = p2[j].qubit;
    if (occupies(g1, q) && !sharedSpectator(p1, p2, q)) return true;
  }
  // (b), (c)
  for (let i = 0; i < m1.length; i++) {
    const x = m1[i];
    if (sharedSpectator(p1, p2, x.qubit)) continue;
    for (let j = 0; j < m2.length; j++) {
      const y = m2[j];
      if (!sharedSpectator(p1, p2, y.qubit) && movedConflict(ctx, x, y)) return true;
    }
  }
  return false;
}

/** Both gates park spectator q at the very same f01 (layers.ts sharedSpectators). */
function sharedSpectator(p1: readonly ParkedSpectator[], p2: readonly ParkedSpectator[], q: number): boolean {
  for (let i = 0; i < p1.length; i++) {
    if (p1[i].qubit !== q) continue;
    for (let j = 0; j < p2.length; j++) if (p2[j].qubit === q && p2[j].fGHz === p1[i].fGHz) return true;
  }
  return false;
}

/** Gate g occupies qubit q: its mover, partner or a parked spectator (layers.ts touchedQubits). */
function occupies(g: EdgePlan, q: number): boolean {
  if (q === g.mover || q === g.partner) return true;
  const p = g.parked;
  for (let i = 0; i < p.length; i++) if (p[i].qubit === q) return true;
  return false;
}

/** Scratch of the reduced table's look-ups (read before the next look-up; single-threaded use). */
const SCRATCH_STATE = emptyReducedState();
const SCRATCH_PARTNER = emptyReducedState();

/** f01 (= fGHz), flux and f12 of qubit i at f01 = fGHz inside its tunable range. */
function stateAt(ctx: PlanContext, table: ReducedSpectrum, i: number, fGHz: number): ExactQubitState {
  const t = ctx.transmons[i];
  const rTop = t.ejsGHz / t.ecGHz;
  const rBottom = Math.max(t.asymmetry * rTop, table.rMin);
  const r = rTop <= table.rMax ? table.rFor('e1', fGHz / t.ecGHz, rBottom, rTop) : null;
  if (r === null) return exactState(t, fGHz);
  const s = table.at(r, SCRATCH_STATE);
  return {
    f01GHz: fGHz,
    flux: fluxOf(t, r / rTop),
    f12GHz: t.ecGHz * (s.e2 - s.e1),
    anharmonicityGHz: t.ecGHz * (s.e2 - 2 * s.e1),
    df01dFluxGHz: NaN,
    t1Ns: NaN,
    tphiNs: NaN,
    t2Ns: NaN,
    sigmaGHz: NaN,
  };
}

function exactState(t: Transmon, fGHz: number): ExactQubitState {
  const flux = t.fluxForF01(fGHz);
  const sp = t.spectrum(flux);
  return { f01GHz: fGHz, flux, f12GHz: sp.f12GHz, anharmonicityGHz: sp.anharmonicityGHz, df01dFluxGHz: NaN, t1Ns: NaN, tphiNs: NaN, t2Ns: NaN, sigmaGHz: NaN };
}

function fluxOf(t: Transmon, s: number): number {
  const d = t.asymmetry;
  const x = Math.min(1, Math.max(d, s));
  const c2 = Math.min(1, Math.max(0, (x * x - d * d) / (1 - d * d)));
  return Math.acos(Math.sqrt(c2)) / Math.PI;
}

interface CrossingPoint {
  moverFlux: number;
  moverF01GHz: number;
  moverF12GHz: number;
  couplingGHz: number;
}

/**
 * The edge's crossing on the drawn chip with the partner at `partner` (src/pair/resonances.ts):
 * 11-20 where the mover's f12 meets the partner's f01, 11-02 where its f01 meets the partner's
 * f12, on the mover's whole tunable branch; null out of reach. From the reduced table; the exact
 * solve where the mover's range leaves the table.
 */
function crossingOf(ctx: PlanContext, table: ReducedSpectrum, fe: FixedEdge, partner: ExactQubitState): CrossingPoint | null {
  const tm = ctx.transmons[fe.mover];
  const tp = ctx.transmons[fe.partner];
  const G = ctx.edges[fe.edge].gChargeGHz;
  const rTop = tm.ejsGHz / tm.ecGHz;
  const rBottom = tm.asymmetry * rTop;
  const rp = partnerRatio(tp, table, partner);
  if (rBottom < table.rMin || rTop > table.rMax || rp === null) {
    const res = pairResonances(tm, tp, partner.flux, G)[fe.crossing];
    if (!res) return null;
    return { moverFlux: res.moverFlux, moverF01GHz: res.moverF01GHz, moverF12GHz: tm.spectrum(res.moverFlux).f12GHz, couplingGHz: res.couplingGHz };
  }
  const p = table.at(rp, SCRATCH_PARTNER);
  const pf01 = tp.ecGHz * p.e1;
  const pf12 = tp.ecGHz * (p.e2 - p.e1);
  const ec = tm.ecGHz;
  // The exact inverse maps accept their targets within the tunable range up to round-off.
  const slack = 1e-12 * Math.max(1, pf01) / ec;
  const r = fe.crossing === '11-20' ? table.rFor('e12', pf01 / ec, rBottom, rTop, slack) : table.rFor('e1', pf12 / ec, rBottom, rTop, slack);
  if (r === null) return null;
  const m = table.at(r, SCRATCH_STATE);
  const coupling = fe.crossing === '11-20' ? G * m.n12 * p.n01 : G * m.n01 * p.n12;
  return { moverFlux: fluxOf(tm, r / rTop), moverF01GHz: ec * m.e1, moverF12GHz: ec * (m.e2 - m.e1), couplingGHz: coupling };
}

/** E_J / E_C of the partner where it parks (null when that leaves the reduced table). */
function partnerRatio(t: Transmon, table: ReducedSpectrum, s: ExactQubitState): number | null {
  const d = t.asymmetry;
  const c = Math.cos(Math.PI * s.flux);
  const sn = Math.sin(Math.PI * s.flux);
  const r = (t.ejsGHz * Math.sqrt(c * c + d * d * sn * sn)) / t.ecGHz;
  return table.covers(r) ? r : null;
}

function pairKey(a: string, b: string): string {
  return a < b ? `${a}\u0000${b}` : `${b}\u0000${a}`;
}

/** The empty lists of a drawn chip's edge plans (never added to: the budget and the layer rules only read them). */
const NO_FINDINGS = Object.freeze([]) as unknown as EdgePlan['findings'];
const NO_OPTIONS = Object.freeze([]) as unknown as EdgePlan['options'];

function stubPlan(edge: number, mover: number, partner: number, crossing: Crossing): EdgePlan {
  return {
    edge, mover, partner, crossing, feasible: false, crossingGHz: NaN, interactionGHz: NaN, moverInteractionFlux: NaN, moverF12AtInteractionGHz: NaN,
    crossingCouplingGHz: NaN, speedLimitNs: NaN, gAtInteractionGHz: NaN, durationNs: NaN, rampNs: NaN, parked: [], swept: [], findings: [],
    score: Infinity, reason: '', options: [],
  };
}
