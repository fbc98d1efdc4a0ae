/**
 * The CZ rules of ./catalogue.ts (scope `cz`) evaluated for one gate scenario: mover A moving from
 * its parking frequency to the interaction frequency (and back) against partner B at parking, the
 * other qubits at their parking frequencies except the spectators parked out of the way for this
 * gate (each moved before the mover ramps and back after it).
 *
 *   at the interaction point (to = f_int): the spectator admixtures (g_c / Delta)^2 of the
 *     excited qubit's transitions against each spectator's (./spectator-admixture.ts:
 *     cz-spectator-01-01, -11-20, -11-02, and with |2> populated -21-12, -21-30; S = every other
 *     neighbour of A, and on an 11-02 crossing also of the partner B, which then reaches |2>)
 *     cz-excursion        |flux(to) - flux(from)| <= maxFluxExcursion
 *     cz-next-01-01       |to - f01_K|          (K = qubits sharing a neighbour with A)
 *     cz-tls              |to - f_TLS| - width  cz-readout  distance of the swept band to f_r
 *   along the sweep (every crossing strictly between parking and the interaction point):
 *     cz-swept-01-01 / -11-20 / -11-02 with every coupled qubit (the partner included, except the
 *     crossing that is the gate itself), cz-swept-next-01-01 with next-nearest neighbours
 *     (mediated coupling, src/plan/mediated-coupling.ts), cz-swept-tls (g = width / 2); each
 *     with the Landau-Zener transfer 1 - exp(-4 pi^2 g^2 / v), v = |to - from| / rampNs, g at the
 *     crossing from the tabulated charge matrix elements (g = G |n_ik| |n_jl|).
 *   for each parked spectator P at its temporary frequency: cz-parked-01-01, -01-12,
 *     -next-01-01, -tls, -readout against the others (the mover excepted), and its own sweep from
 *     parking with the same cz-swept rules (the mover still at parking then).
 *   cz-duration: the shared duration model (./cz-duration.ts): 1 / (2 g_c) + the line's settling
 *                and the sample grid (+ the spectator moves) <= maxGate.
 *
 * Each finding names, in `blame`, the qubit whose temporary move could clear it (a spectator or
 * next-nearest neighbour), or none (the partner, a defect, the resonator: only another mover or
 * crossing helps). Frequencies at the interaction point and of parked spectators are exact
 * (transmon stage); crossing positions along a sweep come from the tabulated spectra (error below
 * 1 kHz, src/plan/qubit-table.ts).
 */
import { fluxForF01Memo } from '../exact-memo.js';
import type { PlanContext } from '../context.js';
import { ghz, mhz, prob, band, ns } from '../format.js';
import { landauZenerTransfer } from '../landau-zener.js';
import { sweptShareOf } from '../swept-share.js';
import { mediatedExchange, type Mediator } from '../mediated-coupling.js';
import { emptyTableState } from '../qubit-table.js';
import type { RuleName } from './catalogue.js';
import type { Finding } from './findings.js';
import { admixtureChecksBeyond, lastAdmixtureSum, SPECTATOR_ERROR_PER_ADMIXTURE } from './spectator-admixture.js';
import { shortestGateNs, slotNs } from './cz-duration.js';

export type Crossing = '11-20' | '11-02';

/** f01 and f12 of a qubit during the gate (exact). */
export interface DuringGate {
  f01GHz: number;
  f12GHz: number;
}

export interface GateScenario {
  edge: number;
  mover: number;
  partner: number;
  crossing: Crossing;
  /** Mover parking frequency. */
  fromGHz: number;
  /** Interaction frequency (the mover's f01 at the crossing). */
  toGHz: number;
  /** Mover f12 at the interaction frequency (exact). */
  moverF12AtToGHz: number;
  /** Bare coupling of the crossing (GHz). */
  crossingCouplingGHz: number;
  /** Ramp time of the mover (sets its sweep rate). */
  rampNs: number;
  /** Ramp time of each parked spectator's move (default rampNs). */
  spectatorRampNs?: number;
  /** Every qubit at parking (exact f01, f12). */
  parking: readonly DuringGate[];
  /** Spectators moved for this gate: qubit -> temporary f01/f12 (exact). */
  parked: ReadonlyMap<number, DuringGate>;
}

export interface SweptCrossing {
  rule: RuleName;
  /** The qubit sweeping and the one it meets (-1 for a defect). */
  moving: number;
  other: number;
  /** The moving qubit's f01 at the crossing (GHz). */
  atGHz: number;
  couplingGHz: number;
  rateGHzPerNs: number;
  transfer: number;
}

export interface CzFinding extends Finding {
  /** The qubit whose temporary move could clear this finding, or -1. */
  blame: number;
}

export interface GateEvaluation {
  findings: CzFinding[];
  swept: SweptCrossing[];
  durationNs: number;
  /**
   * With EvaluateOptions.spectatorError (and no screen): the spectator term of the gate's error
   * estimate, the very number estimateEdgeBudget computes for the scenario
   * (src/plan/interaction/plan-edge.ts spectatorErrorOf), summed here from the table states the
   * admixture checks look up anyway, in the same order.
   */
  spectatorError?: number;
  /**
   * With EvaluateOptions.sweptError (and no screen): the swept-crossing term of the gate's budget,
   * the very number sweptCrossingError (src/plan/gate-budget.ts) gives for the swept crossings
   * this evaluation would list, summed as each is found, in the same order; `swept` is then empty.
   */
  sweptError?: number;
}

const scratchA = emptyTableState();
const scratchB = emptyTableState();

/**
 * The parked spectators of the evaluation under way by qubit (evaluateGate writes s.parked into
 * it and empties it again when it returns or throws): an array look-up in `during`, which the
 * rules ask tens of times per spectator, instead of a Map's.
 */
let parkedNow: (DuringGate | undefined)[] = [];

/** During-gate f01/f12 of qubit q (s.parked.get(q) ?? s.parking[q], s the evaluation under way). */
function during(s: GateScenario, q: number): DuringGate {
  return parkedNow[q] ?? s.parking[q];
}

export interface EvaluateOptions {
  /**
   * false: the findings' messages are left empty (every other field as usual). For evaluations
   * whose findings are only tested (the screening of spectator points, the layer fitting's
   * re-evaluations): the messages cost more than the rules.
   */
  messages?: boolean;
  /**
   * Reuse across evaluations that differ only in where one parked spectator stands (the
   * screening of that spectator's candidate points): see SpectatorScreen.
   */
  screen?: SpectatorScreen;
  /** Also sum the spectator term of the gate's error estimate (GateEvaluation.spectatorError; not with a screen). */
  spectatorError?: boolean;
  /**
   * Sum the budget's swept-crossing term instead of listing the swept crossings
   * (GateEvaluation.sweptError; not with a screen): a drawn chip's gates pass thousands of
   * crossings, each an object, where its budget needs only their sum.
   */
  sweptError?: boolean;
}

/**
 * The outputs (findings and swept crossings) of the parts of a gate's evaluation that do not read
 * where spectator P stands, remembered on the first evaluation and replayed in later ones, in
 * their places: the same findings and swept crossings, in the same order, as evaluating again.
 * An evaluation is cut into units (one per spectator check, per next-nearest check, per
 * neighbour, next-nearest pair or defect list of a sweep, per parked spectator's check of one
 * neighbour, ...); a unit reads P's point only when P is the neighbour, the next-nearest
 * neighbour or a mediator it looks at, or P's own block (its checks and its sweep), and only such
 * units are evaluated again. Valid while nothing of the scenario changes but P's point (P parked
 * in every evaluation; one instance per screening: src/plan/interaction/plan-edge.ts).
 */
export class SpectatorScreen {
  /** Unit counter of the evaluation under way. */
  unit = 0;
  private readonly findings: (CzFinding[] | undefined)[] = [];
  private readonly swept: (SweptCrossing[] | undefined)[] = [];

  constructor(readonly P: number) {}

  /** Append unit u's remembered output; false when it has none yet. */
  replay(u: number, findings: CzFinding[], swept: SweptCrossing[]): boolean {
    const f = this.findings[u];
    if (f === undefined) return false;
    for (let k = 0; k < f.length; k++) findings.push(f[k]);
    const w = this.swept[u]!;
    for (let k = 0; k < w.length; k++) swept.push(w[k]);
    return true;
  }

  /** Remember unit u's output: what it appended after positions f0 and s0. */
  record(u: number, findings: readonly CzFinding[], f0: number, swept: readonly SweptCrossing[], s0: number): void {
    this.findings[u] = findings.slice(f0);
    this.swept[u] = swept.slice(s0);
  }
}

export function evaluateGate(ctx: PlanContext, s: GateScenario, options: EvaluateOptions = {}): GateEvaluation {
  if (parkedNow.length < ctx.n) parkedNow = new Array<DuringGate | undefined>(ctx.n).fill(undefined);
  // (forEach with module-level callbacks: no iterator results or entry arrays per evaluation)
  s.parked.forEach(parkSpectator);
  try {
    return evaluateGateWithParked(ctx, s, options);
  } finally {
    s.parked.forEach(unparkSpectator);
  }
}

function parkSpectator(d: DuringGate, q: number): void {
  parkedNow[q] = d;
}

function unparkSpectator(_d: DuringGate, q: number): void {
  parkedNow[q] = undefined;
}

/** evaluateGate once parkedNow holds s.parked. */
function evaluateGateWithParked(ctx: PlanContext, s: GateScenario, options: EvaluateOptions): GateEvaluation {
  const m = options.messages !== false;
  const r = ctx.rules;
  const id = ctx.ids;
  const A = s.mover;
  const findings: CzFinding[] = [];
  const swept: SweptCrossing[] = [];
  const edgeKey = ctx.edges[s.edge].key;
  const add = findingAdder(findings, edgeKey);
  const to = s.toGHz;
  // (reuse across a spectator's candidate points: only while that spectator is parked, and never the mover or partner)
  const sc = options.screen && s.parked.has(options.screen.P) && options.screen.P !== A && options.screen.P !== s.partner ? options.screen : undefined;
  if (sc) sc.unit = 0;
  // Spectator admixtures at the gate (./spectator-admixture.ts): the mover's other neighbours
  // against the mover at the interaction point (|2> reached on an 11-20 crossing), and on an
  // 11-02 crossing the partner's other neighbours against the partner in |2>.
  // (and, when asked, the estimate's spectator term as spectatorErrorOf sums it: mover side, then partner side)
  const term = options.spectatorError === true && !sc;
  const tally: SweptTally | null = options.sweptError === true && !sc ? { mover: A, partner: s.partner, sum: 0 } : null;
  let spectatorError = spectatorChecks(ctx, s, add, m, A, to, s.crossing === '11-20', s.partner, 'at the interaction point', sc, findings, swept, term, 0);
  if (s.crossing === '11-02') spectatorError = spectatorChecks(ctx, s, add, m, s.partner, s.parking[s.partner].f01GHz, true, A, 'in |2> at parking', sc, findings, swept, term, spectatorError);
  // The flux excursion (the flux line's current limit).
  let u = sc ? sc.unit++ : -1;
  if (!(sc && sc.replay(u, findings, swept))) {
    const f0 = findings.length;
    const xFrom = fluxForF01Memo(ctx, A, s.fromGHz);
    const xTo = fluxForF01Memo(ctx, A, to);
    if (xFrom !== null && xTo !== null && Math.abs(xTo - xFrom) > r.maxFluxExcursion) {
      add({ rule: 'cz-excursion', qubits: [id[A]], value: Math.abs(xTo - xFrom), threshold: r.maxFluxExcursion,
        message: m ? `${id[A]} moves ${Math.abs(xTo - xFrom).toFixed(3)} Phi0 from parking (${ghz(s.fromGHz)}) to the interaction point (${ghz(to)}) for the CZ on ${edgeKey}; the limit is ${r.maxFluxExcursion} Phi0` : '', blame: -1 });
    }
    if (sc) sc.record(u, findings, f0, swept, swept.length);
  }
  for (const p of ctx.nextNearestOf[A]) {
    const pair = ctx.nextNearest[p];
    const K = pair.a === A ? pair.b : pair.a;
    // (a unit of its own: it reads K's point)
    u = sc ? sc.unit++ : -1;
    const reuse = sc !== undefined && K !== sc.P;
    if (reuse && sc.replay(u, findings, swept)) continue;
    const f0 = findings.length;
    const fk = during(s, K).f01GHz;
    const v = Math.abs(to - fk);
    if (v < r.detuningNext0101GHz) {
      add({ rule: 'cz-next-01-01', qubits: [id[A], id[K]], value: v, threshold: r.detuningNext0101GHz,
        message: m ? `${id[A]} at ${ghz(to)} is ${mhz(v)} from next-nearest ${id[K]} (${ghz(fk)}); needs ${mhz(r.detuningNext0101GHz)} during the CZ on ${edgeKey}` : '', blame: K });
    }
    if (reuse) sc.record(u, findings, f0, swept, swept.length);
  }
  for (const d of ctx.qubits[A].tls) {
    const v = Math.abs(to - d.atGHz) - d.widthGHz;
    if (v < r.tlsClearanceGHz) {
      add({ rule: 'cz-tls', qubits: [id[A]], value: v, threshold: r.tlsClearanceGHz,
        message: m ? `${id[A]} at the interaction point ${ghz(to)} is ${mhz(v)} beyond the edge of its defect at ${ghz(d.atGHz)}; needs ${mhz(r.tlsClearanceGHz)}` : '', blame: -1 });
    }
  }
  const lo = Math.min(s.fromGHz, to);
  const hi = Math.max(s.fromGHz, to);
  const readout = ctx.qubits[A].readoutGHz;
  if (readout !== undefined) {
    const v = readout >= lo && readout <= hi ? 0 : Math.min(Math.abs(readout - lo), Math.abs(readout - hi));
    if (v < r.readoutDetuningGHz) {
      add({ rule: 'cz-readout', qubits: [id[A]], value: v, threshold: r.readoutDetuningGHz,
        message: m ? `${id[A]} sweeps ${band(lo, hi)}, ${mhz(v)} from its readout resonator at ${ghz(readout)}; needs ${mhz(r.readoutDetuningGHz)}` : '', blame: -1 });
    }
  }
  // The mover's sweep (spectators already in place).
  const moverRate = (hi - lo) / s.rampNs;
  // (the mover's f12 at both ends, for the 11-20 screen: where it parks, or from its table; at the
  // interaction point from its table, which the spectator checks above have just asked there)
  const f12From = s.parking[A].f01GHz === s.fromGHz ? s.parking[A].f12GHz : ctx.tables[A].at(s.fromGHz, scratchA).f12;
  const f12To = ctx.tables[A].at(to, scratchA).f12;
  sweep(ctx, s, A, s.fromGHz, to, moverRate, (q) => during(s, q), true, swept, add, m, sc, findings, f12From, f12To, tally);
  // Parked spectators: their temporary point and their own sweep (the mover at parking then).
  const parkedCount = parkedByQubit(s.parked);
  for (let pk = 0; pk < parkedCount; pk++) {
    const P = PARKED_QUBITS[pk];
    const d = PARKED_POINTS[pk];
    // (the screened spectator's own block reads its point throughout: one unit, never remembered)
    const own = sc !== undefined && P === sc.P;
    if (own) sc.unit++;
    const psc = own ? undefined : sc;
    const f = d.f01GHz;
    for (const X of ctx.neighbours[P]) {
      u = psc ? psc.unit++ : -1;
      if (X === A) continue;
      const reuse = psc !== undefined && X !== psc.P;
      if (reuse && psc.replay(u, findings, swept)) continue;
      const f0 = findings.length;
      const x = during(s, X);
      const d01 = Math.abs(f - x.f01GHz);
      if (d01 < r.detuning0101GHz) add({ rule: 'cz-parked-01-01', qubits: [id[P], id[X]], value: d01, threshold: r.detuning0101GHz, message: m ? `${id[P]} parked at ${ghz(f)} for the CZ on ${edgeKey} is ${mhz(d01)} from ${id[X]} (${ghz(x.f01GHz)}); needs ${mhz(r.detuning0101GHz)}` : '', blame: P });
      const d1 = Math.abs(f - x.f12GHz);
      const d2 = Math.abs(d.f12GHz - x.f01GHz);
      const d12 = Math.min(d1, d2);
      if (d12 < r.detuning0112GHz) add({ rule: 'cz-parked-01-12', qubits: [id[P], id[X]], value: d12, threshold: r.detuning0112GHz, message: m ? `${id[P]} parked at ${ghz(f)} for the CZ on ${edgeKey} is ${mhz(d12)} from an 11-20/11-02 crossing with ${id[X]}; needs ${mhz(r.detuning0112GHz)}` : '', blame: P });
      if (reuse) psc.record(u, findings, f0, swept, swept.length);
    }
    for (const p of ctx.nextNearestOf[P]) {
      const pair = ctx.nextNearest[p];
      const K = pair.a === P ? pair.b : pair.a;
      u = psc ? psc.unit++ : -1;
      if (K === A) continue;
      const reuse = psc !== undefined && K !== psc.P;
      if (reuse && psc.replay(u, findings, swept)) continue;
      const f0 = findings.length;
      const fk = during(s, K).f01GHz;
      const v = Math.abs(f - fk);
      if (v < r.detuningNext0101GHz) add({ rule: 'cz-parked-next-01-01', qubits: [id[P], id[K]], value: v, threshold: r.detuningNext0101GHz, message: m ? `${id[P]} parked at ${ghz(f)} for the CZ on ${edgeKey} is ${mhz(v)} from next-nearest ${id[K]} (${ghz(fk)}); needs ${mhz(r.detuningNext0101GHz)}` : '', blame: P });
      if (reuse) psc.record(u, findings, f0, swept, swept.length);
    }
    for (const t of ctx.qubits[P].tls) {
      const v = Math.abs(f - t.atGHz) - t.widthGHz;
      if (v < r.tlsClearanceGHz) add({ rule: 'cz-parked-tls', qubits: [id[P]], value: v, threshold: r.tlsClearanceGHz, message: m ? `${id[P]} parked at ${ghz(f)} is ${mhz(v)} beyond the edge of its defect at ${ghz(t.atGHz)}` : '', blame: P });
    }
    const rd = ctx.qubits[P].readoutGHz;
    if (rd !== undefined && Math.abs(f - rd) < r.readoutDetuningGHz) {
      add({ rule: 'cz-parked-readout', qubits: [id[P]], value: Math.abs(f - rd), threshold: r.readoutDetuningGHz, message: m ? `${id[P]} parked at ${ghz(f)} is ${mhz(Math.abs(f - rd))} from its readout resonator` : '', blame: P });
    }
    const from = s.parking[P].f01GHz;
    const rate = Math.abs(f - from) / (s.spectatorRampNs ?? s.rampNs);
    sweep(ctx, s, P, from, f, rate, (q) => (q === A ? s.parking[A] : during(s, q)), false, swept, add, m, psc, findings, s.parking[P].f12GHz, d.f12GHz, tally);
  }
  // the shared duration model (./cz-duration.ts): the speed limit with the line's settling and
  // the sample grid, plus the spectator moves
  const durationNs = gateSlotNs(ctx, s);
  if (!(durationNs <= r.maxGateNs)) {
    add({ rule: 'cz-duration', qubits: [id[A], id[s.partner]], value: durationNs, threshold: r.maxGateNs,
      message: m ? `the shortest CZ on ${edgeKey} at the ${s.crossing} crossing takes ${ns(durationNs)} (1/(2 g_c) with g_c = ${mhz(s.crossingCouplingGHz, 2)}, plus the flux line's settling and the sample grid${s.parked.size > 0 ? ' and the spectator moves' : ''}); the limit is ${ns(r.maxGateNs)}` : '', blame: -1 });
  }
  const ev: GateEvaluation = { findings, swept, durationNs };
  if (term) ev.spectatorError = spectatorError;
  if (tally) ev.sweptError = tally.sum;
  return ev;
}

/**
 * The parked spectators in ascending qubit order, written to PARKED_QUBITS and PARKED_POINTS
 * (returns how many): filled by insertion, each entry moved past the larger qubits before it (the
 * keys are distinct, so this is the order any sort gives). Module-level lists, not an array of
 * entries per evaluation: evaluations never nest, and the loop that reads them runs before the
 * next one starts.
 */
function parkedByQubit(parked: ReadonlyMap<number, DuringGate>): number {
  parkedFilled = 0;
  parked.forEach(placeParked);
  return parkedFilled;
}

const PARKED_QUBITS: number[] = [];
const PARKED_POINTS: DuringGate[] = [];
let parkedFilled = 0;

/** One entry of parkedByQubit's lists, moved past the larger qubits before it (a module-level callback: no closure per evaluation). */
function placeParked(d: DuringGate, q: number): void {
  let k = parkedFilled++;
  while (k > 0 && PARKED_QUBITS[k - 1] > q) {
    PARKED_QUBITS[k] = PARKED_QUBITS[k - 1];
    PARKED_POINTS[k] = PARKED_POINTS[k - 1];
    k--;
  }
  PARKED_QUBITS[k] = q;
  PARKED_POINTS[k] = d;
}

/** The slot of a gate scenario by the shared duration model (./cz-duration.ts): evaluateGate's durationNs. */
export function gateSlotNs(ctx: PlanContext, s: GateScenario): number {
  const r = ctx.rules;
  return slotNs(shortestGateNs(s.crossingCouplingGHz, r), s.parked.size > 0, s.spectatorRampNs ?? s.rampNs, r);
}

/** The findings collector of one evaluation (each finding tagged with the edge key). */
function findingAdder(findings: CzFinding[], edgeKey: string): (f: Omit<CzFinding, 'edge'>) => void {
  // (the finding literal is fresh: tagged in place, its keys in the same order as a spread copy's)
  return (f) => {
    (f as CzFinding).edge = edgeKey;
    findings.push(f as CzFinding);
  };
}

/** The admixture checks of excited qubit E (f01 = fE) against each of its neighbours but `skip` (their during-gate f01). */
function spectatorChecks(
  ctx: PlanContext, s: GateScenario, add: (f: Omit<CzFinding, 'edge'>) => void, m: boolean, E: number, fE: number, withLevel2: boolean, skip: number, where: string,
  sc: SpectatorScreen | undefined, findings: CzFinding[], swept: SweptCrossing[],
  /** Add each neighbour's spectator term to `sum` (spectatorErrorOf's sum) and return it. */
  term: boolean, sum: number,
): number {
  const id = ctx.ids;
  const limit = ctx.rules.spectatorAdmixture;
  const edgeKey = ctx.edges[s.edge].key;
  for (const S of ctx.neighbours[E]) {
    // (one unit per neighbour: it reads S's point)
    const u = sc ? sc.unit++ : -1;
    if (S === skip) continue;
    const reuse = sc !== undefined && S !== sc.P;
    if (reuse && sc.replay(u, findings, swept)) continue;
    const f0 = findings.length;
    const d = during(s, S);
    const G = ctx.edges[ctx.edgeBetween(E, S)].gChargeGHz;
    for (const c of admixtureChecksBeyond(ctx, E, fE, S, d.f01GHz, G, withLevel2, limit)) {
      add({ rule: c.rule, qubits: [id[E], id[S]], value: c.admixture, threshold: limit,
        message: m ? `${id[E]} ${c.excitedTransition} ${ghz(c.excitedGHz)} ${where} is ${mhz(c.distanceGHz)} from spectator ${id[S]} ${c.spectatorTransition} ${ghz(c.spectatorGHz)} (g_c = ${mhz(c.couplingGHz, 2)}): admixture ${prob(c.admixture)} > ${prob(limit)} during the CZ on ${edgeKey}` : '',
        details: { distanceGHz: c.distanceGHz, couplingGHz: c.couplingGHz }, blame: S });
    }
    if (term) sum += SPECTATOR_ERROR_PER_ADMIXTURE * lastAdmixtureSum(ctx, E, fE, S, d.f01GHz, G, withLevel2);
    if (reuse) sc.record(u, findings, f0, swept, swept.length);
  }
  return sum;
}

/**
 * Every crossing qubit Q passes sweeping from `from` to `to` (open interval), with its transfer.
 * `isMover`: Q is the gate's mover (its crossing with the partner at `to` is the gate itself).
 */
function sweep(
  ctx: PlanContext,
  s: GateScenario,
  Q: number,
  from: number,
  to: number,
  rate: number,
  freqOf: (q: number) => DuringGate,
  isMover: boolean,
  swept: SweptCrossing[],
  add: (f: Omit<CzFinding, 'edge'>) => void,
  messages: boolean,
  /** Reuse of the units that do not read the screened spectator's point (undefined: none). */
  sc: SpectatorScreen | undefined,
  findings: CzFinding[],
  /** Q's f12 where it sweeps from and to (NaN: unknown), for the 11-20 screen (crossing1120Outside). */
  f12From: number,
  f12To: number,
  /** Sum the swept-crossing term here instead of listing the crossings in `swept` (null: list them). */
  tally: SweptTally | null,
): void {
  const lo = Math.min(from, to);
  const hi = Math.max(from, to);
  if (!(hi - lo > 1e-9)) return;
  const f12Lo = Math.min(f12From, f12To);
  const f12Hi = Math.max(f12From, f12To);
  // (no closures made per call or per neighbour here: this loop runs millions of times on a
  // large chip; a crossing's kind names it in a message, built only for a finding)
  // (one record for every sweep, filled anew: sweeps never nest, and recordCrossing reads it only
  // while its sweep runs)
  const sw = SWEEP;
  sw.ctx = ctx;
  sw.Q = Q;
  sw.lo = lo;
  sw.hi = hi;
  sw.rate = rate;
  sw.swept = swept;
  sw.add = add;
  sw.messages = messages;
  sw.tally = tally;
  const memo = crossingMemoOf(ctx);
  const nq = ctx.neighbours[Q];
  for (let k = 0; k < nq.length; k++) {
    const X = nq[k];
    // (one unit per neighbour: it reads X's point)
    const u = sc ? sc.unit++ : -1;
    const reuse = sc !== undefined && X !== sc.P;
    if (reuse && sc.replay(u, findings, swept)) continue;
    const f0 = findings.length;
    const s0 = swept.length;
    const x = freqOf(X);
    const blame = isMover && X === s.partner ? -1 : isMover ? X : Q;
    // the crossings with X where it stands and their couplings (remembered: X usually stands at its parking)
    const c = memo.neighbour(ctx, Q, k, x.f01GHz, x.f12GHz);
    if (insideSweep(x.f01GHz, lo, hi)) recordCrossing(sw, 'cz-swept-01-01', X, x.f01GHz, c.g0101, blame, CROSSING_0101);
    const skip1120 = isMover && X === s.partner && s.crossing === '11-20';
    const skip1102 = isMover && X === s.partner && s.crossing === '11-02';
    if (!skip1120 && !crossing1120Outside(x.f01GHz, f12Lo, f12Hi)) {
      const f1120 = c.f1120;
      if (!Number.isNaN(f1120) && insideSweep(f1120, lo, hi)) recordCrossing(sw, 'cz-swept-11-20', X, f1120, c.g1120, blame, CROSSING_1120);
    }
    if (!skip1102 && insideSweep(x.f12GHz, lo, hi)) recordCrossing(sw, 'cz-swept-11-02', X, x.f12GHz, c.g1102, blame, CROSSING_1102);
    if (reuse) sc.record(u, findings, f0, swept, s0);
  }
  const nn = ctx.nextNearestOf[Q];
  for (let j = 0; j < nn.length; j++) {
    const pair = ctx.nextNearest[nn[j]];
    const K = pair.a === Q ? pair.b : pair.a;
    // (one unit per next-nearest pair: it reads K's point and, for a crossing, the mediators')
    const u = sc ? sc.unit++ : -1;
    const reuse = sc !== undefined && K !== sc.P && !pair.via.includes(sc.P);
    if (reuse && sc.replay(u, findings, swept)) continue;
    const f0 = findings.length;
    const s0 = swept.length;
    const fk = freqOf(K).f01GHz;
    if (insideSweep(fk, lo, hi)) {
      const g = memo.nextNearest(ctx, Q, j, K, fk, pair.via, freqOf);
      recordCrossing(sw, 'cz-swept-next-01-01', K, fk, g, isMover ? K : Q, CROSSING_NEXT, pair.via);
    }
    if (reuse) sc.record(u, findings, f0, swept, s0);
  }
  for (const t of ctx.qubits[Q].tls) {
    if (!insideSweep(t.atGHz, lo, hi)) continue;
    recordCrossing(sw, 'cz-swept-tls', -1, t.atGHz, t.widthGHz / 2, -1, CROSSING_TLS);
  }
}

/** What recordCrossing needs of the sweep it is called from. */
interface SweepRecord {
  ctx: PlanContext;
  Q: number;
  lo: number;
  hi: number;
  rate: number;
  swept: SweptCrossing[];
  add: (f: Omit<CzFinding, 'edge'>) => void;
  messages: boolean;
  tally: SweptTally | null;
}

const SWEEP: SweepRecord = { ctx: undefined as unknown as PlanContext, Q: 0, lo: 0, hi: 0, rate: 0, swept: [], add: () => undefined, messages: false, tally: null };

/** The gate's mover and partner and the swept-crossing term summed so far (EvaluateOptions.sweptError). */
interface SweptTally {
  mover: number;
  partner: number;
  sum: number;
}

/** What a swept crossing is, for its message (codes, not closures: a sweep records thousands of crossings and a message is written for few). */
type CrossingKind = 0 | 1 | 2 | 3 | 4;
const CROSSING_0101 = 0;
const CROSSING_1120 = 1;
const CROSSING_1102 = 2;
const CROSSING_NEXT = 3;
const CROSSING_TLS = 4;

/** The crossing's name in a message (`other`: the qubit met; `via`: the mediators of a next-nearest one). */
function crossingName(id: readonly string[], kind: CrossingKind, other: number, via: readonly number[] | undefined): string {
  switch (kind) {
    case CROSSING_0101:
      return `${id[other]} f01 (01-10 crossing)`;
    case CROSSING_1120:
      return `the 11-20 crossing with ${id[other]}`;
    case CROSSING_1102:
      return `the 11-02 crossing with ${id[other]}`;
    case CROSSING_NEXT:
      return `next-nearest ${id[other]} (via ${via!.map((v) => id[v]).join(', ')})`;
    default:
      return 'its defect';
  }
}

/** A crossing strictly inside the swept band (lo, hi), 1 Hz margins. */
function insideSweep(f: number, lo: number, hi: number): boolean {
  return f > lo + 1e-9 && f < hi - 1e-9;
}

/**
 * Margin (GHz) of the 11-20 screen: far above the tables' own error against the transmon (below
 * 1e-6 GHz, src/plan/qubit-table.ts; the reduced table ~1e-9) and the round-off of the inverse map.
 */
const SCREEN_1120_MARGIN_GHZ = 1e-4;

/**
 * True when sweeping qubit Q cannot pass its 11-20 crossing with a neighbour at f01 = x: Q's f12
 * rises with its f01 along its whole branch (every level spacing of a transmon grows with E_J),
 * so a crossing strictly inside the swept band needs x between Q's f12 at the two ends
 * (f12Lo, f12Hi), up to the tables' error, covered by the margin. False (no screen) when an end's
 * f12 is unknown (NaN) or x is NaN. Sweeps then look up the crossing (a table inversion) only for
 * the neighbours this leaves (tested against the look-up: test/plan/rules/cz-evaluate.test.ts).
 */
export function crossing1120Outside(x: number, f12Lo: number, f12Hi: number): boolean {
  return x < f12Lo - SCREEN_1120_MARGIN_GHZ || x > f12Hi + SCREEN_1120_MARGIN_GHZ;
}

/** Record a crossing the sweep passes, with its Landau-Zener transfer; a finding when the transfer breaks the limit. */
function recordCrossing(sw: SweepRecord, rule: RuleName, other: number, at: number, g: number, blame: number, what: CrossingKind, via?: readonly number[]): void {
  const { ctx, Q, lo, hi, rate } = sw;
  const m = sw.messages;
  const id = ctx.ids;
  const limit = ctx.rules.sweptTransferLimit;
  const transfer = landauZenerTransfer(g, rate);
  const t = sw.tally;
  // (sweptCrossingError's term of this crossing, added in the order the list would hold it)
  if (t) t.sum += 2 * sweptShareOf(rule, Q, other, t.mover, t.partner) * transfer;
  else sw.swept.push({ rule, moving: Q, other, atGHz: at, couplingGHz: g, rateGHzPerNs: rate, transfer });
  if (transfer > limit) {
    sw.add({ rule, qubits: other >= 0 ? [id[Q], id[other]] : [id[Q]], value: transfer, threshold: limit,
      message: m ? `${id[Q]} sweeping ${band(lo, hi)} passes ${crossingName(id, what, other, via)} at ${ghz(at)} (g = ${mhz(g, 2)}, ${(rate * 1e3).toFixed(0)} MHz/ns): transfer ${prob(transfer)} > ${prob(limit)}` : '',
      details: { atGHz: at, couplingGHz: g, rateHzPerS: rate * 1e18 },
      blame });
  }
}

/**
 * The crossings of a sweeping qubit Q with neighbour X standing at (f01, f12), as sweep uses them.
 * The 11-20 crossing's position is found at once (sweep tests whether it lies in the swept
 * band); each coupling on first use, as neighbourCrossings computed it (the same table look-ups
 * and the same products in the same order, so the same doubles): a sweep needs the coupling of a
 * crossing only when the crossing lies inside its band, and most of a neighbour's crossings do
 * not. Each look-up answers as a fresh one would (the tables' memos return what computing again
 * gives), so the order in which couplings are asked for changes no value (tested).
 */
class NeighbourCrossings {
  private f1120Value = NaN;
  private readonly G: number;
  /** X's |<0|n|1>| and |<1|n|2>| at f01 (NaN until a coupling needs them). */
  private n01x = NaN;
  private n12x = NaN;
  private g0101Value = NaN;
  private g1120Value = NaN;
  private g1102Value = NaN;
  /** Bits: 1 g0101, 2 g1120, 4 g1102, 8 X's elements found, 16 f1120 found. */
  private known = 0;

  constructor(
    private readonly ctx: PlanContext,
    private readonly Q: number,
    private readonly X: number,
    private readonly f01: number,
    private readonly f12: number,
  ) {
    this.G = ctx.edges[ctx.edgeBetween(Q, X)].gChargeGHz;
  }

  /** Q's f01 where its f12 meets X's f01 (NaN: outside Q's table); found on first use (a sweep screens most neighbours out first). */
  get f1120(): number {
    if (!(this.known & 16)) {
      const f = this.ctx.tables[this.Q].f01ForF12(this.f01);
      this.f1120Value = f === null ? NaN : f;
      this.known |= 16;
    }
    return this.f1120Value;
  }

  private partnerElements(): void {
    if (this.known & 8) return;
    const sx = this.ctx.tables[this.X].at(this.f01, scratchB);
    this.n01x = sx.n01;
    this.n12x = sx.n12;
    this.known |= 8;
  }

  /** Coupling of the 01-01 crossing (at X's f01). */
  get g0101(): number {
    if (!(this.known & 1)) {
      this.partnerElements();
      this.g0101Value = this.G * this.ctx.tables[this.Q].at(this.f01, scratchA).n01 * this.n01x;
      this.known |= 1;
    }
    return this.g0101Value;
  }

  /** Coupling of the 11-20 crossing (at f1120; NaN when there is none). */
  get g1120(): number {
    if (!(this.known & 2)) {
      this.partnerElements();
      this.g1120Value = Number.isNaN(this.f1120) ? NaN : this.G * this.ctx.tables[this.Q].at(this.f1120, scratchA).n12 * this.n01x;
      this.known |= 2;
    }
    return this.g1120Value;
  }

  /** Coupling of the 11-02 crossing (at X's f12). */
  get g1102(): number {
    if (!(this.known & 4)) {
      this.partnerElements();
      this.g1102Value = this.G * this.ctx.tables[this.Q].at(this.f12, scratchA).n01 * this.n12x;
      this.known |= 4;
    }
    return this.g1102Value;
  }
}

/** The crossings of Q with X at (f01, f12) from the tables (each coupling computed when first read). */
function neighbourCrossings(ctx: PlanContext, Q: number, X: number, f01: number, f12: number): NeighbourCrossings {
  return new NeighbourCrossings(ctx, Q, X, f01, f12);
}

/** The mediated coupling of Q with next-nearest K at fk through `via` where freqOf has them (what sweep computed inline before). */
function nextNearestCoupling(ctx: PlanContext, Q: number, K: number, fk: number, via: readonly number[], freqOf: (q: number) => DuringGate): number {
  const nq = ctx.tables[Q].at(fk, scratchA).n01;
  const nk = ctx.tables[K].at(fk, scratchB).n01;
  // (scratch mediators, one list per count: mediatedExchange only reads them during the call)
  const mediators = (SCRATCH_MEDIATORS[via.length] ??= Array.from({ length: via.length }, () => ({ giGHz: 0, gkGHz: 0, fGHz: 0 })));
  for (let v = 0; v < via.length; v++) {
    const S = via[v];
    const fs = freqOf(S).f01GHz;
    const ns = ctx.tables[S].at(fs, scratchB).n01;
    const m = mediators[v];
    m.giGHz = ctx.edges[ctx.edgeBetween(Q, S)].gChargeGHz * nq * ns;
    m.gkGHz = ctx.edges[ctx.edgeBetween(K, S)].gChargeGHz * nk * ns;
    m.fGHz = fs;
  }
  return Math.abs(mediatedExchange(fk, fk, mediators));
}

/** nextNearestCoupling's mediator lists by length (single-threaded use, read within one call). */
const SCRATCH_MEDIATORS: Mediator[][] = [];

/** Answers remembered per sweeping qubit and neighbour (slot) or next-nearest pair. */
const CROSSING_MEMO_WAYS = 8;

/**
 * The crossing couplings sweep needs, remembered per context for the last few positions of each
 * neighbour (or next-nearest neighbour and its mediators) of each sweeping qubit: a gate's
 * neighbours stand at their parking in almost every evaluation, and the same gates are evaluated
 * again and again (options, spectator points, ramps, repair trials). A remembered answer is the
 * one computing it again gives (the tables are fixed for the context; tested).
 */
class CrossingMemo {
  private readonly slotOf: Int32Array;
  private readonly nnSlotOf: Int32Array;
  private readonly keys: Float64Array;
  private readonly values: NeighbourCrossings[];
  private readonly next: Uint8Array;
  /**
   * Next-nearest keys, `nnWidth` doubles per way (fk, then each mediator's f01), and how many of
   * them a way holds (0: empty). Typed arrays, not a key array per answer: a drawn chip's sweeps
   * fill thousands of ways.
   */
  private readonly nnKeys: Float64Array;
  private readonly nnLength: Uint8Array;
  private readonly nnWidth: number;
  /** The key being looked up. */
  private readonly nnProbe: Float64Array;
  private readonly nnValues: Float64Array;
  private readonly nnNext: Uint8Array;

  /** The context whose answers the memo holds. */
  private owner: PlanContext;
  /** The structure the slots are laid out on (shared by a yield run's drawn chips). */
  readonly neighbours: PlanContext['neighbours'];
  readonly nextNearestOf: PlanContext['nextNearestOf'];
  readonly nextNearestPairs: PlanContext['nextNearest'];

  constructor(ctx: PlanContext) {
    const n = ctx.n;
    this.owner = ctx;
    this.neighbours = ctx.neighbours;
    this.nextNearestOf = ctx.nextNearestOf;
    this.nextNearestPairs = ctx.nextNearest;
    this.slotOf = new Int32Array(n + 1);
    this.nnSlotOf = new Int32Array(n + 1);
    for (let q = 0; q < n; q++) {
      this.slotOf[q + 1] = this.slotOf[q] + ctx.neighbours[q].length;
      this.nnSlotOf[q + 1] = this.nnSlotOf[q] + ctx.nextNearestOf[q].length;
    }
    const slots = this.slotOf[n];
    this.keys = new Float64Array(slots * CROSSING_MEMO_WAYS * 2).fill(NaN);
    this.values = new Array<NeighbourCrossings>(slots * CROSSING_MEMO_WAYS);
    this.next = new Uint8Array(slots);
    const nnSlots = this.nnSlotOf[n];
    let width = 1;
    for (const pair of ctx.nextNearest) width = Math.max(width, pair.via.length + 1);
    this.nnWidth = width;
    this.nnProbe = new Float64Array(width);
    this.nnKeys = new Float64Array(nnSlots * CROSSING_MEMO_WAYS * width);
    this.nnLength = new Uint8Array(nnSlots * CROSSING_MEMO_WAYS);
    this.nnValues = new Float64Array(nnSlots * CROSSING_MEMO_WAYS);
    this.nnNext = new Uint8Array(nnSlots);
  }

  /** The memo for `ctx`: this one, emptied when it held another context's answers (same structure). */
  takeOver(ctx: PlanContext): this {
    if (this.owner === ctx) return this;
    this.owner = ctx;
    this.keys.fill(NaN);
    this.values.fill(undefined as unknown as NeighbourCrossings);
    this.next.fill(0);
    this.nnLength.fill(0);
    this.nnNext.fill(0);
    return this;
  }

  /** neighbourCrossings of Q with its k-th neighbour at (f01, f12). */
  neighbour(ctx: PlanContext, Q: number, k: number, f01: number, f12: number): NeighbourCrossings {
    const slot = this.slotOf[Q] + k;
    const base = slot * CROSSING_MEMO_WAYS;
    const keys = this.keys;
    for (let w = 0; w < CROSSING_MEMO_WAYS; w++) {
      const i = 2 * (base + w);
      if (keys[i] === f01 && keys[i + 1] === f12) return this.values[base + w];
    }
    const v = neighbourCrossings(ctx, Q, ctx.neighbours[Q][k], f01, f12);
    const w = this.next[slot];
    this.next[slot] = (w + 1) % CROSSING_MEMO_WAYS;
    keys[2 * (base + w)] = f01;
    keys[2 * (base + w) + 1] = f12;
    this.values[base + w] = v;
    return v;
  }

  /** nextNearestCoupling of Q with the K of its j-th next-nearest pair at fk, the mediators where freqOf has them. */
  nextNearest(ctx: PlanContext, Q: number, j: number, K: number, fk: number, via: readonly number[], freqOf: (q: number) => DuringGate): number {
    const slot = this.nnSlotOf[Q] + j;
    const base = slot * CROSSING_MEMO_WAYS;
    // the key: fk and each mediator's f01, gathered once (a NaN in it matches nothing, as before)
    const width = this.nnWidth;
    const probe = this.nnProbe;
    probe[0] = fk;
    for (let v = 0; v < via.length; v++) probe[v + 1] = freqOf(via[v]).f01GHz;
    const keys = this.nnKeys;
    for (let w = 0; w < CROSSING_MEMO_WAYS; w++) {
      const at = (base + w) * width;
      if (this.nnLength[base + w] !== via.length + 1) continue;
      let same = true;
      for (let v = 0; v <= via.length; v++) {
        if (keys[at + v] !== probe[v]) {
          same = false;
          break;
        }
      }
      if (same) return this.nnValues[base + w];
    }
    const g = nextNearestCoupling(ctx, Q, K, fk, via, freqOf);
    const w = this.nnNext[slot];
    this.nnNext[slot] = (w + 1) % CROSSING_MEMO_WAYS;
    const at = (base + w) * width;
    for (let v = 0; v <= via.length; v++) keys[at + v] = probe[v];
    this.nnLength[base + w] = via.length + 1;
    this.nnValues[base + w] = g;
    return g;
  }
}

/**
 * One memo per chip structure (its neighbour lists), holding the answers of one context at a
 * time: each planner context has lists of its own, so its memo lasts as long as it does; a
 * yield run's drawn chips share the nominal chip's lists, and each takes the memo over, emptied
 * (building one per drawn chip took ~2 % of a sample's time in a profile). Switching back and forth between two
 * contexts of one structure empties it each time: slower, never another context's answer.
 */
const crossingMemos = new WeakMap<PlanContext['neighbours'], CrossingMemo>();

function crossingMemoOf(ctx: PlanContext): CrossingMemo {
  const m = crossingMemos.get(ctx.neighbours);
  if (m && m.nextNearestOf === ctx.nextNearestOf && m.nextNearestPairs === ctx.nextNearest && m.neighbours === ctx.neighbours) return m.takeOver(ctx);
  const made = new CrossingMemo(ctx);
  crossingMemos.set(ctx.neighbours, made);
  return made;
}

/** The crossing position and couplings of a NeighbourCrossings, read in the order given (for tests). */
export interface CrossingValues {
  f1120: number;
  g0101: number;
  g1120: number;
  g1102: number;
}

/**
 * For tests: the crossing couplings sweep uses for Q and its k-th neighbour at (f01, f12),
 * remembered (its couplings read in the order `order`, e.g. ['g1102', 'g0101', 'g1120']) and
 * computed anew (read in the order of the fields).
 */
export function crossingCouplingsForTest(
  ctx: PlanContext, Q: number, k: number, f01: number, f12: number, order: readonly ('g0101' | 'g1120' | 'g1102')[] = ['g0101', 'g1120', 'g1102'],
): { remembered: CrossingValues; computed: CrossingValues } {
  const r = crossingMemoOf(ctx).neighbour(ctx, Q, k, f01, f12);
  const read: Partial<CrossingValues> = { f1120: r.f1120 };
  for (const g of order) read[g] = r[g];
  const c = neighbourCrossings(ctx, Q, ctx.neighbours[Q][k], f01, f12);
  return {
    remembered: { f1120: read.f1120!, g0101: read.g0101!, g1120: read.g1120!, g1102: read.g1102! },
    computed: { f1120: c.f1120, g0101: c.g0101, g1120: c.g1120, g1102: c.g1102 },
  };
}

/**
 * For tests: the mediated coupling sweep uses for Q and the K of its j-th next-nearest pair at
 * fk, the mediators at `mediatorGHz` (by qubit), remembered and computed anew.
 */
export function nextNearestCouplingForTest(ctx: PlanContext, Q: number, j: number, fk: number, mediatorGHz: ReadonlyMap<number, number>): { remembered: number; computed: number } {
  const pair = ctx.nextNearest[ctx.nextNearestOf[Q][j]];
  const K = pair.a === Q ? pair.b : pair.a;
  const freqOf = (q: number): DuringGate => ({ f01GHz: mediatorGHz.get(q)!, f12GHz: NaN });
  return { remembered: crossingMemoOf(ctx).nextNearest(ctx, Q, j, K, fk, pair.via, freqOf), computed: nextNearestCoupling(ctx, Q, K, fk, pair.via, freqOf) };
}
