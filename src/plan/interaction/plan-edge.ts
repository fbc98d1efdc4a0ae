/**
 * The interaction plan of one coupled pair: which qubit moves (the mover), to which crossing
 * (11-20: the mover's f12 meets the partner's f01, mover above by |alpha_A|; or 11-02: the
 * mover's f01 meets the partner's f12, mover below by |alpha_B|; README physics conventions
 * sec. 2), the interaction (destination) frequency = the mover's f01 at that crossing against the
 * partner at its parking frequency (exact: src/pair/resonances.ts), the path (a monotone sweep
 * from parking to there and back), and the spectators moved out of the way.
 *
 * All four options (each qubit as mover, each crossing) are evaluated with every rule of
 * src/plan/rules/cz-evaluate.ts. Problems a spectator causes are resolved by spectator parking
 * (./spectator-parking.ts), up to three rounds. An option that breaks a rule no spectator move
 * clears (unclearableFindings) is infeasible whatever the spectators do: while another option is
 * clean its spectators are left unplaced (it cannot be chosen); with no clean option they are
 * placed, so the choice is the one made with every option placed. Among the options that then
 * break no rule the one with the smallest estimated error wins (estimateEdgeBudget below: the fast budget of
 * src/budget/gate-estimate.ts over the whole slot, the moved spectators' dephasing and the
 * spectators' admixtures; the same model the plan's budget reports, before any pulse exists).
 * When no option is clean, the one with the fewest problems is kept and its findings are
 * reported; the reason says what each option ran into.
 */
import { spectrumMemo } from '../exact-memo.js';
import { pairResonances } from '../../pair/resonances.js';
import { exchangeFromChargeCoupling } from '../../pair/coupling.js';
import type { PlanContext } from '../context.js';
import { exactTransitions } from '../exact-state.js';
import { band, ghz, prob } from '../format.js';
import type { PlanOptions } from '../options.js';
import type { IdleBlockers } from '../rules/idle-blockers.js';
import { evaluateGate, gateSlotNs, SpectatorScreen, type EvaluateOptions, type Crossing, type CzFinding, type DuringGate, type GateScenario, type SweptCrossing } from '../rules/cz-evaluate.js';
import type { ExactQubitState } from '../exact-state.js';
import { spectatorParkingCandidates } from './spectator-parking.js';
import { tuningRoomGHz, tuningRoomShortfall } from '../rules/tuning-room.js';
import { admixtureSum, SPECTATOR_ERROR_PER_ADMIXTURE } from '../rules/spectator-admixture.js';
import { estimateGateBudget } from '../../budget/gate-estimate.js';
import { spectatorMoveError, spectatorMovePairError, sweptCrossingError } from '../gate-budget.js';
import { budgetSpectatorList } from '../budget-spectators.js';

export interface ParkedSpectator {
  qubit: number;
  fGHz: number;
  flux: number;
  f12GHz: number;
  /** Why it was moved (the rules it broke where it was). */
  reason: string;
}

export interface OptionReport {
  mover: number;
  crossing: Crossing;
  feasible: boolean;
  /** Estimated error of the gate (see the banner); Infinity when out of range. */
  score: number;
  interactionGHz: number | null;
  /** Mover flux at the interaction point (null when out of range). */
  moverFlux: number | null;
  parked: ParkedSpectator[];
  problems: CzFinding[];
  note: string;
}

export interface EdgePlan {
  edge: number;
  mover: number;
  partner: number;
  crossing: Crossing;
  feasible: boolean;
  /** The crossing: the mover's f01 where the bare resonance with the partner at parking lies (NaN when unreachable). */
  crossingGHz: number;
  /**
   * The interaction (destination) frequency: the crossing, until a designed gate moves it to its
   * own offset (src/plan/pulses.ts).
   */
  interactionGHz: number;
  moverInteractionFlux: number;
  moverF12AtInteractionGHz: number;
  /** Bare coupling of the crossing and the speed limit 1/(2 g_c). */
  crossingCouplingGHz: number;
  speedLimitNs: number;
  /** Exchange coupling g at the interaction point (README physics conventions sec. 6). */
  gAtInteractionGHz: number;
  durationNs: number;
  rampNs: number;
  parked: ParkedSpectator[];
  swept: SweptCrossing[];
  findings: CzFinding[];
  score: number;
  reason: string;
  options: OptionReport[];
}

export interface EdgeContext {
  ctx: PlanContext;
  options: PlanOptions;
  blockers: IdleBlockers;
  /** Exact states at parking (every qubit). */
  states: readonly ExactQubitState[];
  /**
   * Plan for feasibility (the repair's trials, whose plans are made again in full after every
   * move): each option tries the nearest clearing points first and ranks points by estimated
   * error only when those leave problems. The plan is feasible exactly when the full plan is, and
   * an option that stays infeasible keeps the same problems; a feasible option's spectator points
   * and estimated error may differ from the full plan's.
   */
  feasibilityOnly?: boolean;
  /** parkingOf(states), when the caller has it (planEdge looks it up once per edge). */
  parking?: readonly DuringGate[];
}

const MAX_PARKING_ROUNDS = 3;

/** Ramp times tried in order (ns): the planning ramp, then faster ones down to minRampNs. */
export function rampLadder(options: PlanOptions): number[] {
  return [options.rampNs, ...[10, 7.5, 5].filter((r) => r < options.rampNs && r >= options.minRampNs)];
}

/**
 * Plan an edge, falling back to faster ramps when no option is clean at the planning ramp. With
 * ec.feasibilityOnly, `tryFirst` (the option an earlier plan of the edge chose) is evaluated
 * first and the first clean option ends the ramp's search (the verdict is the same; only a
 * feasible plan's choice may differ from the full plan's).
 */
export function planEdge(ec: EdgeContext, edge: number, tryFirst?: { mover: number; crossing: Crossing }): EdgePlan {
  // (the parking list of ec.states, looked up once for every option and ramp of this edge: the
  // states do not change while one edge is planned)
  if (!ec.parking) ec = { ...ec, parking: parkingOf(ec.states) };
  let best: EdgePlan | undefined;
  for (const ramp of rampLadder(ec.options)) {
    if (best && !fasterRampMayHelp(ec, best, ramp)) break;
    const plan = planEdgeAtRamp(ec, edge, ramp, tryFirst);
    if (!best || (plan.feasible && !best.feasible)) best = plan;
    if (plan.feasible) break;
  }
  return best!;
}

/**
 * A faster ramp can only clear an option whose problems are all swept crossings that the faster
 * sweep passes below the limit (transfer ~ 4 pi^2 g^2 / v grows with the ramp time) or a duration
 * that the shorter ramps fit; any other problem stays.
 */
function fasterRampMayHelp(ec: EdgeContext, plan: EdgePlan, ramp: number): boolean {
  const limit = ec.ctx.rules.sweptTransferLimit;
  const exponent = -Math.log1p(-limit);
  return plan.options.some((o) =>
    o.problems.length > 0 &&
    o.problems.every((f) => {
      if (f.rule === 'cz-duration') return true;
      if (!f.rule.startsWith('cz-swept-') || f.value === null) return false;
      // transfer = 1 - exp(-x), x proportional to the ramp time: x at the new ramp must be below -ln(1 - limit)
      const x = -Math.log1p(-Math.min(f.value, 1 - 1e-16));
      return (x * ramp) / plan.rampNs < exponent;
    }),
  );
}

export function planEdgeAtRamp(ec: EdgeContext, edge: number, rampNs: number, tryFirst?: { mover: number; crossing: Crossing }): EdgePlan {
  const { ctx } = ec;
  const e = ctx.edges[edge];
  const reports: OptionReport[] = [];
  const built: ReturnType<typeof evaluateOption>[] = [];
  let options: { mover: number; crossing: Crossing }[] = [
    { mover: e.a, crossing: '11-20' }, { mover: e.a, crossing: '11-02' }, { mover: e.b, crossing: '11-20' }, { mover: e.b, crossing: '11-02' },
  ];
  const quick = ec.feasibilityOnly === true;
  if (quick && tryFirst) {
    const k = options.findIndex((o) => o.mover === tryFirst.mover && o.crossing === tryFirst.crossing);
    if (k > 0) options = [options[k], ...options.slice(0, k), ...options.slice(k + 1)];
  }
  const crossings = new Map<number, ReturnType<typeof crossingsOf>>();
  const args: { mover: number; partner: number; crossing: Crossing; res: ReturnType<typeof crossingsOf>[Crossing] }[] = [];
  for (const { mover, crossing } of options) {
    const partner = mover === e.a ? e.b : e.a;
    let res = crossings.get(mover);
    if (!res) crossings.set(mover, (res = crossingsOf(ctx, mover, partner, ec.states[partner].flux, e.gChargeGHz)));
    args.push({ mover, partner, crossing, res: res[crossing] });
    built.push(evaluateOption(ec, edge, mover, partner, crossing, res[crossing], rampNs, true));
    if (quick && built[built.length - 1].report.feasible) break;
  }
  // (an option left without spectator placement, `unplaced`, breaks a rule no spectator move
  // clears; it can matter for the choice only when no option is clean: then its spectators are
  // placed as for every other option, and the choice below is the one made with all placed)
  if (!built.some((b) => b.report.feasible)) {
    built.forEach((b, k) => {
      const a = args[k];
      if (b.unplaced) built[k] = evaluateOption(ec, edge, a.mover, a.partner, a.crossing, a.res, rampNs);
    });
  }
  // (no clean option: every option was evaluated; back in the usual order, so the choice below is the full plan's)
  if (quick && built.length === 4) {
    const canonical = (o: { report: OptionReport }) => (o.report.mover === e.a ? 0 : 2) + (o.report.crossing === '11-20' ? 0 : 1);
    built.sort((x, y) => canonical(x) - canonical(y));
  }
  for (const b of built) reports.push(b.report);
  // Choose: feasible by score; else fewest problems, then score. When re-planning, an option
  // kept from the earlier plan (options.keep.edgeOptions) goes before others of the same standing.
  const kept = ec.options.keep?.edgeOptions?.[e.key];
  const isKept = (r: OptionReport) => (kept !== undefined && ctx.ids[r.mover] === kept.mover && r.crossing === kept.crossing ? 0 : 1);
  const order = built
    .map((b, k) => ({ b, k }))
    .sort((x, y) => {
      const fx = x.b.report.feasible ? 0 : 1;
      const fy = y.b.report.feasible ? 0 : 1;
      const px = x.b.scenario ? x.b.report.problems.length : 1e9;
      const py = y.b.scenario ? y.b.report.problems.length : 1e9;
      return fx - fy || px - py || isKept(x.b.report) - isKept(y.b.report) || x.b.report.score - y.b.report.score || x.k - y.k;
    });
  const chosen = order[0].b;
  const partner = chosen.report.mover === e.a ? e.b : e.a;
  const reason = reasonText(ctx, chosen.report, reports, partner);
  if (!chosen.scenario || !chosen.eval) {
    const partner0 = e.b;
    return {
      edge, mover: e.a, partner: partner0, crossing: '11-20', feasible: false, crossingGHz: NaN, interactionGHz: NaN, moverInteractionFlux: NaN,
      moverF12AtInteractionGHz: NaN, crossingCouplingGHz: NaN, speedLimitNs: NaN, gAtInteractionGHz: NaN, durationNs: NaN, rampNs,
      parked: [], swept: [], findings: chosen.report.problems, score: Infinity, reason, options: reports,
    };
  }
  const s = chosen.scenario;
  const atFlux = chosen.report.moverFlux!;
  const fluxA = s.mover === e.a ? atFlux : ec.states[e.a].flux;
  const fluxB = s.mover === e.b ? atFlux : ec.states[e.b].flux;
  return {
    edge,
    mover: s.mover,
    partner: s.partner,
    crossing: s.crossing,
    feasible: chosen.report.feasible,
    crossingGHz: s.toGHz,
    interactionGHz: s.toGHz,
    moverInteractionFlux: atFlux,
    moverF12AtInteractionGHz: s.moverF12AtToGHz,
    crossingCouplingGHz: s.crossingCouplingGHz,
    speedLimitNs: 1 / (2 * s.crossingCouplingGHz),
    gAtInteractionGHz: exchangeAtInteraction(ctx, edge, fluxA, fluxB),
    durationNs: chosen.eval.durationNs,
    rampNs,
    parked: chosen.report.parked,
    swept: sweptListOf(ctx, s, chosen.eval),
    findings: chosen.report.problems,
    score: chosen.report.score,
    reason,
    options: reports,
  };
}

/**
 * ctx.pair(edge).exchangeCoupling(fluxA, fluxB), the same number: g = G |<0|n|1>_A| |<0|n|1>_B|
 * from each exact transmon's two lowest levels (Transmon.chargeElement01) instead of the pair's
 * six-level bases (levels 0 and 1 and their vectors do not depend on how many levels are solved:
 * src/transmon/parity-eigenbasis.ts). A tabulated transmon (src/yield) keeps the pair's path.
 */
export function exchangeAtInteraction(ctx: PlanContext, edge: number, fluxA: number, fluxB: number): number {
  const pair = ctx.pair(edge);
  if (pair.a.tabulatedSpectrum || pair.b.tabulatedSpectrum) return pair.exchangeCoupling(fluxA, fluxB);
  return exchangeFromChargeCoupling(pair.gChargeGHz, pair.a.chargeElement01(fluxA), pair.b.chargeElement01(fluxB));
}

function evaluateOption(
  ec: EdgeContext,
  edge: number,
  mover: number,
  partner: number,
  crossing: Crossing,
  res: { moverFlux: number; moverF01GHz: number; couplingGHz: number } | null,
  rampNs: number,
  /** Leave spectators unplaced when the gate breaks a rule no spectator move clears (unclearableFindings). */
  mayLeaveUnplaced = false,
): { report: OptionReport; scenario: GateScenario | null; eval: ReturnType<typeof evaluateGate> | null; g: number; unplaced?: boolean } {
  const { ctx } = ec;
  const id = ctx.ids;
  const range = ctx.ranges[mover];
  const short = res && res.moverF01GHz >= range.lo - 1e-9 ? tuningRoomShortfall(range, ec.states[mover].f01GHz, res.moverF01GHz, res.couplingGHz) : 0;
  if (!res || res.moverF01GHz < range.lo - 1e-9 || short > 0) {
    const where = !res
      ? `outside its tunable range`
      : short > 0
        ? `${ghz(res.moverF01GHz)}, less than one splitting (${ghz(tuningRoomGHz(res.couplingGHz))}) inside its planning range ${band(range.lo, range.hi)}: no room to tune the destination past it`
        : `${ghz(res.moverF01GHz)}, below its planning range ${ghz(range.lo)}`;
    const problem: CzFinding = {
      rule: 'cz-range', qubits: [id[mover], id[partner]], value: res ? res.moverF01GHz : null, threshold: null, edge: ctx.edges[edge].key, blame: -1,
      message: `${id[mover]} cannot reach the ${crossing} crossing with ${id[partner]} (${where})`,
    };
    return { report: { mover, crossing, feasible: false, score: Infinity, interactionGHz: res ? res.moverF01GHz : null, moverFlux: null, parked: [], problems: [problem], note: `${crossing} crossing ${where}` }, scenario: null, eval: null, g: NaN };
  }
  const parking = ec.parking ?? parkingOf(ec.states);
  const moverAt = spectrumMemo(ctx, mover, res.moverFlux);
  const parked = new Map<number, DuringGate>();
  const parkedInfo: ParkedSpectator[] = [];
  const scenario: GateScenario = {
    edge, mover, partner, crossing,
    fromGHz: ec.states[mover].f01GHz,
    toGHz: res.moverF01GHz,
    moverF12AtToGHz: moverAt.f12GHz,
    crossingCouplingGHz: res.couplingGHz,
    rampNs,
    parking,
    parked,
  };
  const scoreOf = optionScore(ec, scenario, res.moverFlux);
  // The gate with no spectator moved. A rule it breaks that no spectator's move can clear keeps
  // the option infeasible whatever spectator parking does (unclearableFindings); the option is then
  // reported as it stands, without placing spectators, when the caller allows it.
  const first = evaluateGate(ctx, scenario, TALLY);
  const stuck = unclearableFindings(first.findings, mover, partner);
  if (mayLeaveUnplaced && stuck.length > 0) {
    // (such an option is never the chosen one: it stays unplaced only while another option of the
    // edge is clean, planEdgeAtRamp places every option otherwise; so its problems are only counted
    // and tested, never shown, and the first evaluation serves as it is: the same findings without
    // their messages, and the same score, its swept crossings summed instead of listed)
    const score = estimateError(ec, scenario, res.moverFlux, [], first);
    const report: OptionReport = {
      mover, crossing, feasible: false, score, interactionGHz: res.moverF01GHz, moverFlux: res.moverFlux, parked: [], problems: first.findings,
      note: `infeasible whatever spectators do: ${problemList(id, mover, stuck)} (${first.findings.length} problem(s) with no spectator moved)`,
    };
    return { report, scenario, eval: first, g: res.couplingGHz, unplaced: true };
  }
  // Spectators go to their points of least estimated error. A point of least error can leave the
  // next spectator no room where the nearest one would not: then the nearest points are tried too
  // and the result with fewer problems kept.
  // (ec.feasibilityOnly: the nearest points first; the ranked points only when those leave
  // problems, kept as the full plan keeps them: unless the nearest give strictly fewer)
  let resolved: ReturnType<typeof parkSpectators>;
  const nearestInfo: ParkedSpectator[] = [];
  const nearestScenario: GateScenario = { ...scenario, parked: new Map<number, DuringGate>() };
  let nearest: ReturnType<typeof parkSpectators> | null = null;
  if (ec.feasibilityOnly) nearest = parkSpectators(ec, nearestScenario, nearestInfo, undefined, first);
  if (nearest && nearest.evaluation.findings.length === 0) resolved = nearest;
  else {
    resolved = parkSpectators(ec, scenario, parkedInfo, scoreOf, first);
    if (resolved.evaluation.findings.length > 0 && !nearest) nearest = parkSpectators(ec, nearestScenario, nearestInfo, undefined, first);
    if (nearest && nearest.evaluation.findings.length >= resolved.evaluation.findings.length) nearest = null;
  }
  if (nearest) {
    resolved = nearest;
    parkedInfo.splice(0, parkedInfo.length, ...nearestInfo);
    parked.clear();
    for (const [q, d] of nearestScenario.parked) parked.set(q, d);
  }
  const ev = resolved.evaluation;
  const unmovable = resolved.unmovable;
  parkedInfo.sort((a, b) => a.qubit - b.qubit);
  const feasible = ev.findings.length === 0;
  const score = estimateError(ec, scenario, res.moverFlux, parkedInfo, ev);
  const report: OptionReport = {
    mover, crossing, feasible, score, interactionGHz: res.moverF01GHz, moverFlux: res.moverFlux, parked: parkedInfo, problems: ev.findings,
    note: feasible
      ? `feasible${parkedInfo.length > 0 ? ` with ${parkedInfo.map((p) => `${id[p.qubit]} parked at ${ghz(p.fGHz)}`).join(', ')}` : ''}, estimated error ${prob(score)}`
      : `${ev.findings.length} problem(s): ${problemList(id, mover, ev.findings)}` +
        (unmovable.length > 0 ? ` (${unmovable.join('; ')})` : ''),
  };
  return { report, scenario, eval: ev, g: res.couplingGHz };
}

/**
 * Resolve by spectator parking every finding of a scenario that a spectator's temporary move
 * could clear (up to three rounds; the qubits already moved may be moved again). `scenario.parked`
 * and `parkedInfo` are updated in place. Returns the final evaluation and, for each spectator that
 * could not be moved, why. The evaluation may have summed its swept crossings instead of listing
 * them (GateEvaluation.sweptError): sweptListOf gives the list.
 */
export function parkSpectators(
  ec: EdgeContext,
  scenario: GateScenario,
  parkedInfo: ParkedSpectator[],
  /** The option's estimated error with the spectators where `scenario.parked` and `info` put them (evaluateOption's estimateError); with it, the clearing point of least error wins, and budgetMoves runs. */
  score?: OptionScore,
  /** An evaluation of this scenario without messages (swept crossings listed or summed) when the caller has it, nothing parked since. */
  first?: ReturnType<typeof evaluateGate>,
): { evaluation: ReturnType<typeof evaluateGate>; unmovable: string[] } {
  const { ctx } = ec;
  const id = ctx.ids;
  const parked = scenario.parked as Map<number, DuringGate>;
  // (the evaluations while spectators are placed are only tested: no messages; the final one is
  // evaluated again with its messages when it has findings, below)
  let ev = first ?? evaluateGate(ctx, scenario, QUIET);
  const tried = new Set<number>();
  const unmovable: string[] = [];
  for (let round = 0; round < MAX_PARKING_ROUNDS; round++) {
    const blamed = [...new Set(ev.findings.map((f) => f.blame).filter((q) => q >= 0 && q !== scenario.mover && q !== scenario.partner && !tried.has(q)))].sort((a, b) => a - b);
    if (blamed.length === 0) break;
    for (const P of blamed) {
      tried.add(P);
      const rules = [...new Set(ev.findings.filter((f) => f.blame === P).map((f) => f.rule))];
      // A spectator moved before is placed again from scratch.
      const before = parked.get(P);
      const k = parkedInfo.findIndex((p) => p.qubit === P);
      const beforeInfo = k >= 0 ? parkedInfo[k] : undefined;
      parked.delete(P);
      if (k >= 0) parkedInfo.splice(k, 1);
      const search = spectatorParkingCandidates(ctx, ec.blockers, scenario, P);
      const clears = (t: ReturnType<typeof evaluateGate>) => !t.findings.some((f) => f.blame === P || f.qubits[0] === id[P]);
      const best = bestSpectatorPoint(ec, scenario, parkedInfo, P, search.points, clears, rules.join(', '), score);
      const placed = best !== null;
      if (best) {
        parked.set(P, { f01GHz: best.info.fGHz, f12GHz: best.info.f12GHz });
        parkedInfo.push(best.info);
        ev = best.ev;
      }
      if (!placed) {
        if (before && beforeInfo) {
          // keep its earlier temporary point rather than none
          parked.set(P, before);
          parkedInfo.push(beforeInfo);
        }
        // Every trial since `ev` was computed has been undone, so the scenario is the one `ev`
        // describes again (unless an earlier point of P could not be put back).
        if (before && !beforeInfo) ev = evaluateGate(ctx, scenario, TALLY);
        unmovable.push(
          search.points.length === 0
            ? `${id[P]} cannot be moved out of the way: from ${ghz(ec.states[P].f01GHz)} it can reach ${band(search.reachable.lo, search.reachable.hi)} without crossing a neighbour, and no point there clears the gate`
            : `${id[P]} found no temporary frequency that clears the gate`,
        );
      }
    }
  }
  if (score && ev.findings.length === 0) ev = budgetMoves(ec, scenario, parkedInfo, ev, score);
  // the scenario is the one `ev` describes (every trial since was undone): its findings with their messages
  if (ev.findings.length > 0) ev = evaluateGate(ctx, scenario);
  parkedInfo.sort((a, b) => a.qubit - b.qubit);
  return { evaluation: ev, unmovable };
}

/** Rule evaluations whose findings are only tested, never reported: no messages built. */
const QUIET = Object.freeze({ messages: false });

/**
 * QUIET, and the swept crossings summed into the budget's term as they are found instead of
 * listed (GateEvaluation.sweptError, the number sweptCrossingError gives for the list): for the
 * evaluations that only rank or test. An evaluation kept for a plan has its list made by
 * evaluating its scenario once more (sweptListOf).
 */
const TALLY = Object.freeze({ messages: false, sweptError: true });

/** The swept crossings of an evaluation: its own list, or, when it summed them (TALLY), the list of its scenario evaluated again. */
export function sweptListOf(ctx: PlanContext, scenario: GateScenario, ev: ReturnType<typeof evaluateGate>): SweptCrossing[] {
  return ev.sweptError === undefined ? ev.swept : evaluateGate(ctx, scenario, QUIET).swept;
}

/**
 * The findings no spectator's temporary move can clear: those blamed on no qubit (the mover's flux
 * excursion, its defects, its readout resonator, the gate's duration, which spectator moves only
 * lengthen) or on the mover or the partner (a sweep past the partner), qubits parkSpectators never
 * moves. For a gate evaluated with nothing parked each of them depends only on the mover, the
 * partner and their own defects and resonators, so it stays whatever spectators do, and so does
 * the option's infeasibility.
 */
export function unclearableFindings(findings: readonly CzFinding[], mover: number, partner: number): CzFinding[] {
  return findings.filter((f) => f.blame < 0 || f.blame === mover || f.blame === partner);
}

/** An option's problems in its note: rule and the other qubits, the first four distinct. */
function problemList(id: readonly string[], mover: number, findings: readonly CzFinding[]): string {
  return [...new Set(findings.map((f) => `${f.rule} ${f.qubits.filter((q) => q !== id[mover]).join('/')}`.trim()))].slice(0, 4).join('; ');
}

/** The reason recorded for a spectator moved by budgetMoves (no rule asked for it). */
export const BUDGET_MOVE_REASON = 'lower estimated error';

/** Candidate temporary points of a spectator tried per move (nearest first). */
const SPECTATOR_POINTS_TRIED = 8;

/** A move must lower the option's estimated error by more than this to be made (our choice: a move costs slot time and control). */
const BUDGET_MOVE_GAIN = 1e-4;

/**
 * For tests: one option of an edge evaluated as planEdgeAtRamp evaluates it (`mayLeaveUnplaced`:
 * as the first pass does, leaving spectators unplaced when a rule no move clears is broken).
 */
export function evaluateOptionForTest(ec: EdgeContext, edge: number, mover: number, crossing: Crossing, rampNs: number, mayLeaveUnplaced: boolean): { report: OptionReport; unplaced: boolean; scenario: GateScenario | null } {
  const e = ec.ctx.edges[edge];
  const partner = mover === e.a ? e.b : e.a;
  const res = crossingsOf(ec.ctx, mover, partner, ec.states[partner].flux, e.gChargeGHz)[crossing];
  const b = evaluateOption({ ...ec, parking: ec.parking ?? parkingOf(ec.states) }, edge, mover, partner, crossing, res, rampNs, mayLeaveUnplaced);
  return { report: b.report, unplaced: b.unplaced === true, scenario: b.scenario };
}

/** For tests: bestSpectatorPoint (with the score's floor when it has one). */
export const bestSpectatorPointForTest = (...a: Parameters<typeof bestSpectatorPoint>): ReturnType<typeof bestSpectatorPoint> => bestSpectatorPoint(...a);

/**
 * An option's estimated error with the spectators where the scenario and `info` put them
 * (evaluateOption's estimateError), and, as `floor`, a lower bound of it that needs no rule
 * evaluation: the estimate's terms before the swept crossings and the spectator moves, for the
 * scenario as it stands with a spectator parked (both later terms are >= 0, and a floating-point
 * sum never falls as non-negative terms are added, so the full sum is at least this prefix).
 */
export type OptionScore = ((ev: ReturnType<typeof evaluateGate>, info: readonly ParkedSpectator[]) => number) & { floor?: () => number };

/** The OptionScore of an option (its scenario and the mover's flux at the interaction point), with its floor. */
export function optionScore(ec: EdgeContext, scenario: GateScenario, moverFlux: number): OptionScore {
  return Object.assign((t: ReturnType<typeof evaluateGate>, info: readonly ParkedSpectator[]) => estimateError(ec, scenario, moverFlux, info, t), {
    floor: () => estimateErrorFloor(ec, scenario, moverFlux),
  });
}

/**
 * The temporary point of spectator P among `points` (nearest first, the first SPECTATOR_POINTS_TRIED)
 * that `clears` the evaluation: without `score` the nearest such point, with it the one of least
 * estimated error (ranked with the tabulated spectrum, confirmed exactly). The scenario is left
 * without P parked; returns the point's record and evaluation.
 */
function bestSpectatorPoint(
  ec: EdgeContext,
  scenario: GateScenario,
  parkedInfo: readonly ParkedSpectator[],
  P: number,
  points: readonly number[],
  clears: (ev: ReturnType<typeof evaluateGate>) => boolean,
  reason: string,
  score?: OptionScore,
): { info: ParkedSpectator; ev: ReturnType<typeof evaluateGate>; score: number } | null {
  if (score?.floor) {
    const lazy = bestSpectatorPointByFloor(ec, scenario, parkedInfo, P, points, clears, reason, score, score.floor);
    if (lazy !== undefined) return lazy;
  }
  const { ctx } = ec;
  const parked = scenario.parked as Map<number, DuringGate>;
  // Screen every point with the tabulated f12 (and, with a score, rank the ones that clear by
  // their score with tabulated values); then confirm in that order with the exact transitions:
  // the first that still clears wins, so the exact solves are spent on about one point.
  // Without a score the points are taken nearest first, each screened and confirmed in turn.
  const screened: { x: number; order: number }[] = [];
  // (the screens differ only in P's point: the parts of the evaluation that do not read it are
  // evaluated once and replayed, src/plan/rules/cz-evaluate.ts SpectatorScreen)
  const screen: EvaluateOptions = { messages: false, screen: new SpectatorScreen(P) };
  for (const x of points.slice(0, SPECTATOR_POINTS_TRIED)) {
    if (!score) {
      screened.push({ x, order: screened.length });
      continue;
    }
    const table = ctx.tables[P];
    const f12 = table.at(x).f12;
    parked.set(P, { f01GHz: x, f12GHz: f12 });
    // (a screen: its findings are only tested and its score ranks, so no messages are built)
    const ev = evaluateGate(ctx, scenario, screen);
    if (!clears(ev)) continue;
    screened.push({ x, order: score(ev, [...parkedInfo, { qubit: P, fGHz: x, flux: table.fluxAt(x), f12GHz: f12, reason }]) });
  }
  screened.sort((a, b) => a.order - b.order || a.x - b.x);
  let best: { info: ParkedSpectator; ev: ReturnType<typeof evaluateGate>; score: number } | null = null;
  for (const { x } of screened) {
    if (!score) {
      parked.set(P, { f01GHz: x, f12GHz: ctx.tables[P].at(x).f12 });
      if (!clears(evaluateGate(ctx, scenario, screen))) continue;
    }
    best = confirmPoint(ec, scenario, parkedInfo, P, x, clears, reason, score);
    if (best) break;
  }
  parked.delete(P);
  return best;
}

/** P at the exact transitions of point x: its record, evaluation and score when the gate still clears there, else null (P left parked there). */
function confirmPoint(
  ec: EdgeContext, scenario: GateScenario, parkedInfo: readonly ParkedSpectator[], P: number, x: number,
  clears: (ev: ReturnType<typeof evaluateGate>) => boolean, reason: string, score?: OptionScore,
): { info: ParkedSpectator; ev: ReturnType<typeof evaluateGate>; score: number } | null {
  const { ctx } = ec;
  const st = transitionsOf(ctx, P, x);
  (scenario.parked as Map<number, DuringGate>).set(P, { f01GHz: st.f01GHz, f12GHz: st.f12GHz });
  // (its findings are only tested here; parkSpectators evaluates its final scenario again with messages)
  const trial = evaluateGate(ctx, scenario, TALLY);
  if (!clears(trial)) return null;
  const info: ParkedSpectator = { qubit: P, fGHz: st.f01GHz, flux: st.flux, f12GHz: st.f12GHz, reason };
  return { info, ev: trial, score: score ? score(trial, [...parkedInfo, info]) : 0 };
}

/**
 * bestSpectatorPoint with a score, screening lazily: the points are confirmed in the order of
 * their screened scores (ties: the lower point), as when every point is screened first, but a
 * point is screened only while its floor (a lower bound of its score: OptionScore) does not
 * already put it behind a point that cleared its screen. The next point to confirm is the
 * clearing point of least score once every unscreened point's floor lies strictly above that
 * score, so the points are confirmed in the same order and the same one wins. Returns undefined
 * (the caller screens every point) when a floor or score is NaN, where that order is not defined
 * by the comparison alone.
 */
function bestSpectatorPointByFloor(
  ec: EdgeContext,
  scenario: GateScenario,
  parkedInfo: readonly ParkedSpectator[],
  P: number,
  points: readonly number[],
  clears: (ev: ReturnType<typeof evaluateGate>) => boolean,
  reason: string,
  score: OptionScore,
  floorOf: () => number,
): { info: ParkedSpectator; ev: ReturnType<typeof evaluateGate>; score: number } | null | undefined {
  const { ctx } = ec;
  const parked = scenario.parked as Map<number, DuringGate>;
  const table = ctx.tables[P];
  const xs = points.slice(0, SPECTATOR_POINTS_TRIED);
  const n = xs.length;
  const f12 = new Float64Array(n);
  const floor = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    f12[k] = table.at(xs[k]).f12;
    parked.set(P, { f01GHz: xs[k], f12GHz: f12[k] });
    floor[k] = floorOf();
    if (Number.isNaN(floor[k])) {
      parked.delete(P);
      return undefined;
    }
  }
  // 0: not screened; 1: cleared its screen, not confirmed yet; 2: did not clear, or confirmed and failed
  const status = new Uint8Array(n);
  const order = new Float64Array(n);
  const screen: EvaluateOptions = { messages: false, screen: new SpectatorScreen(P) };
  let best: { info: ParkedSpectator; ev: ReturnType<typeof evaluateGate>; score: number } | null = null;
  for (;;) {
    let c = -1;
    let u = -1;
    for (let k = 0; k < n; k++) {
      if (status[k] === 1 && (c < 0 || order[k] < order[c] || (order[k] === order[c] && xs[k] < xs[c]))) c = k;
      if (status[k] === 0 && (u < 0 || floor[k] < floor[u])) u = k;
    }
    if (u >= 0 && (c < 0 || !(order[c] < floor[u]))) {
      // screen u (a screen: its findings are only tested and its score ranks, so no messages are built)
      parked.set(P, { f01GHz: xs[u], f12GHz: f12[u] });
      const ev = evaluateGate(ctx, scenario, screen);
      if (!clears(ev)) {
        status[u] = 2;
        continue;
      }
      order[u] = score(ev, [...parkedInfo, { qubit: P, fGHz: xs[u], flux: table.fluxAt(xs[u]), f12GHz: f12[u], reason }]);
      if (Number.isNaN(order[u])) {
        parked.delete(P);
        return undefined;
      }
      status[u] = 1;
      continue;
    }
    if (c < 0) break;
    best = confirmPoint(ec, scenario, parkedInfo, P, xs[c], clears, reason, score);
    if (best) break;
    status[c] = 2;
  }
  parked.delete(P);
  return best;
}

/**
 * Moves that lower the option's estimated error though no rule asks for them: each spectator the
 * budget counts (src/plan/budget-spectators.ts) and the gate has not moved, largest admixture share
 * first, goes to the candidate point (src/plan/interaction/spectator-parking.ts) of least estimated
 * error when that beats staying by more than BUDGET_MOVE_GAIN (the move's own cost, slot time and
 * the moved qubit's dephasing, is part of the score). Every move keeps every rule.
 */
function budgetMoves(
  ec: EdgeContext,
  scenario: GateScenario,
  parkedInfo: ParkedSpectator[],
  ev: ReturnType<typeof evaluateGate>,
  score: OptionScore,
): ReturnType<typeof evaluateGate> {
  const { ctx } = ec;
  const parked = scenario.parked as Map<number, DuringGate>;
  const list = budgetSpectatorList((q: number) => ctx.neighbours[q], scenario.mover, scenario.partner, scenario.crossing).filter((b) => !parked.has(b.qubit));
  const share = (S: number, side: 'mover' | 'partner'): number => {
    const E = side === 'mover' ? scenario.mover : scenario.partner;
    const fE = side === 'mover' ? scenario.toGHz : scenario.parking[E].f01GHz;
    const G = ctx.edges[ctx.edgeBetween(E, S)].gChargeGHz;
    return admixtureSum(ctx, E, fE, S, scenario.parking[S].f01GHz, G, side === 'mover' ? scenario.crossing === '11-20' : true);
  };
  const ranked = list.map((b) => ({ ...b, share: share(b.qubit, b.coupledTo) })).filter((b) => SPECTATOR_ERROR_PER_ADMIXTURE * b.share > BUDGET_MOVE_GAIN).sort((a, b) => b.share - a.share || a.qubit - b.qubit);
  let current = score(ev, parkedInfo);
  for (const { qubit: P } of ranked) {
    const search = spectatorParkingCandidates(ctx, ec.blockers, scenario, P);
    const best = bestSpectatorPoint(ec, scenario, parkedInfo, P, search.points, (t) => t.findings.length === 0, BUDGET_MOVE_REASON, score);
    if (best && best.score < current - BUDGET_MOVE_GAIN) {
      parked.set(P, { f01GHz: best.info.fGHz, f12GHz: best.info.f12GHz });
      parkedInfo.push(best.info);
      ev = best.ev;
      current = best.score;
    }
  }
  return ev;
}

/**
 * A lower bound of estimateError for the scenario as it stands (a spectator parked), without its
 * rule evaluation: the same sum up to the spectators' term, with the slot the evaluation gives
 * (gateSlotNs), plus the pair's part of the spectator-move term. The full sum adds the swept
 * crossings (>= 0) before the moves term, which is at least its pair part
 * (spectatorMovePairError); floating-point addition never falls when an argument grows, so the
 * full sum is at least this.
 */
function estimateErrorFloor(ec: EdgeContext, s: GateScenario, fluxA: number): number {
  const parts = estimateEdgeBudget(ec, s, fluxA, gateSlotNs(ec.ctx, s));
  const prefix = parts.t1 + parts.whiteDephasing + parts.fluxNoise + parts.spectators;
  if (s.parked.size === 0) return prefix;
  return prefix + spectatorMovePairError(ec.ctx, { mover: s.mover, partner: s.partner, rampNs: s.spectatorRampNs ?? s.rampNs }, ec.states);
}

function estimateError(ec: EdgeContext, s: GateScenario, fluxA: number, parked: readonly ParkedSpectator[], ev: ReturnType<typeof evaluateGate>): number {
  const parts = estimateEdgeBudget(ec, s, fluxA, ev.durationNs);
  const e = { mover: s.mover, partner: s.partner, swept: ev.swept, parked: [...parked], rampNs: s.spectatorRampNs ?? s.rampNs };
  return parts.t1 + parts.whiteDephasing + parts.fluxNoise + parts.spectators + (ev.sweptError ?? sweptCrossingError(ec.ctx, e)) + spectatorMoveError(ec.ctx, e, ec.states, ev.durationNs);
}

/**
 * The estimated budget of one option before any pulse exists (src/budget/gate-estimate.ts for
 * T1, white dephasing and quasi-static flux noise over the whole slot, spectator moves included;
 * the spectators' admixtures at the interaction point, src/plan/rules/spectator-admixture.ts,
 * each taken as an error of half its size, the scale three-transmon simulations of the demos
 * show: 0.14-1.0 times the summed admixture on Clove-17). The planner adds swept crossings and
 * spectator moves (src/plan/gate-budget.ts), as for a designed gate.
 */
/**
 * `spectators`: the spectator term when the caller has it already (evaluateGate's spectatorError
 * for this very scenario, the same number); computed here otherwise.
 */
export function estimateEdgeBudget(ec: Pick<EdgeContext, 'ctx' | 'states'>, s: GateScenario, fluxA: number, durationNs: number, known?: number): { t1: number; whiteDephasing: number; fluxNoise: number; spectators: number } {
  const { ctx } = ec;
  const tA = ctx.transmons[s.mover];
  const tB = ctx.transmons[s.partner];
  const r = ctx.rules;
  const hold = 1 / (2 * s.crossingCouplingGHz);
  const partnerFlux = ec.states[s.partner].flux;
  // (the last answer is remembered: an option's screening asks for the same one at every point;
  // the inputs below are all it reads, so a remembered answer is the one computing it gives)
  const last = lastGateEstimate;
  let est: ReturnType<typeof estimateGateBudget>;
  if (last !== null && last.ctx === ctx && last.mover === s.mover && last.partner === s.partner && last.fluxA === fluxA && last.partnerFlux === partnerFlux &&
    last.crossing === s.crossing && last.hold === hold && last.durationNs === durationNs) est = last.est;
  else {
    const a = spectrumMemo(ctx, s.mover, fluxA);
    const b = spectrumMemo(ctx, s.partner, partnerFlux);
    est = estimateGateBudget({
      mover: { coherence: tA.coherenceSpec, slopeGHz: a.df01dFluxGHz, slope12GHz: a.df12dFluxGHz },
      partner: { coherence: tB.coherenceSpec, slopeGHz: b.df01dFluxGHz, slope12GHz: b.df12dFluxGHz },
      // the gate as one speed limit at the interaction point (designs spend 1.02-1.38 times it in
      // their ramps and hold, src/plan/rules/cz-duration.ts), over the whole slot
      excited: s.crossing === '11-20' ? 'mover' : 'partner',
      holdNs: hold, rampNs: 0, durationNs, averagingTimeNs: r.noiseAveragingTimeNs,
    });
    lastGateEstimate = { ctx, mover: s.mover, partner: s.partner, fluxA, partnerFlux, crossing: s.crossing, hold, durationNs, est };
  }
  let spectators: number;
  if (known !== undefined) spectators = known;
  else {
    spectators = spectatorErrorOf(ctx, s, s.mover, s.toGHz, s.crossing === '11-20', s.partner, 0);
    if (s.crossing === '11-02') spectators = spectatorErrorOf(ctx, s, s.partner, s.parking[s.partner].f01GHz, true, s.mover, spectators);
  }
  return { t1: est.t1, whiteDephasing: est.whiteDephasing, fluxNoise: est.fluxNoise, spectators };
}

/** estimateEdgeBudget's last gate estimate and what it was computed from (the coherence and rules are the context's). */
let lastGateEstimate: { ctx: PlanContext; mover: number; partner: number; fluxA: number; partnerFlux: number; crossing: Crossing; hold: number; durationNs: number; est: ReturnType<typeof estimateGateBudget> } | null = null;

/**
 * `sum` plus the spectator term of excited qubit E at fE against its neighbours but `skip`, each
 * where the gate has it (in neighbour order). evaluateGate sums the same terms in the same order
 * when asked (src/plan/rules/cz-evaluate.ts spectatorChecks; tested equal).
 */
function spectatorErrorOf(ctx: PlanContext, s: GateScenario, E: number, fE: number, withLevel2: boolean, skip: number, sum: number): number {
  for (const S of ctx.neighbours[E]) {
    if (S === skip) continue;
    const G = ctx.edges[ctx.edgeBetween(E, S)].gChargeGHz;
    const fS = (s.parked.get(S) ?? s.parking[S]).f01GHz;
    sum += SPECTATOR_ERROR_PER_ADMIXTURE * admixtureSum(ctx, E, fE, S, fS, G, withLevel2);
  }
  return sum;
}

export { SPECTATOR_ERROR_PER_ADMIXTURE };

/**
 * Memos of exact results the interaction plan asks for again and again: the crossings of a mover
 * with a partner at one parking flux (every ramp of the ladder and every repair trial of an edge
 * asks for the same ones), and a spectator's exact transitions at a candidate point. Keyed by the
 * context, so they last as long as the chip's planning does; the values are those the exact calls
 * give, so plans do not change.
 */
const crossingMemo = new WeakMap<PlanContext, Map<string, ReturnType<typeof pairResonances>>>();
/** Per qubit, the exact transitions by f01 (number keys: distinct doubles are distinct keys). */
const transitionMemo = new WeakMap<PlanContext, Map<number, ReturnType<typeof exactTransitions>>[]>();
const CZ_CROSSINGS = ['11-20', '11-02'] as const;

function crossingsOf(ctx: PlanContext, mover: number, partner: number, partnerFlux: number, gChargeGHz: number): ReturnType<typeof pairResonances> {
  let memo = crossingMemo.get(ctx);
  if (!memo) crossingMemo.set(ctx, (memo = new Map()));
  const key = `${mover},${partner},${partnerFlux},${gChargeGHz}`;
  let hit = memo.get(key);
  if (!hit) memo.set(key, (hit = pairResonances(ctx.transmons[mover], ctx.transmons[partner], partnerFlux, gChargeGHz, CZ_CROSSINGS)));
  return hit;
}

function transitionsOf(ctx: PlanContext, q: number, fGHz: number): ReturnType<typeof exactTransitions> {
  let perQubit = transitionMemo.get(ctx);
  if (!perQubit) transitionMemo.set(ctx, (perQubit = []));
  let memo = perQubit[q];
  if (!memo) perQubit[q] = memo = new Map();
  let hit = memo.get(fGHz);
  if (!hit) memo.set(fGHz, (hit = exactTransitions(ctx.transmons[q], fGHz)));
  return hit;
}

/**
 * Every qubit at parking as a rule evaluation reads it (f01, f12 of each exact state), shared by
 * the evaluations while `states` holds the same state objects: the list was built anew for each
 * option and re-evaluation before, one object per qubit of the chip each time. A state replaced
 * in `states` (the repair's trial moves) gives a new list; a list handed out is never changed.
 */
export function parkingOf(states: readonly ExactQubitState[]): readonly DuringGate[] {
  const hit = parkingLists.get(states);
  if (hit && hit.from.length === states.length && hit.from.every((st, i) => st === states[i])) return hit.parking;
  const parking: DuringGate[] = states.map((st) => ({ f01GHz: st.f01GHz, f12GHz: st.f12GHz }));
  parkingLists.set(states, { from: [...states], parking });
  return parking;
}

const parkingLists = new WeakMap<readonly ExactQubitState[], { from: ExactQubitState[]; parking: readonly DuringGate[] }>();

function reasonText(ctx: PlanContext, chosen: OptionReport, all: readonly OptionReport[], partner: number): string {
  const id = ctx.ids;
  const name = (o: OptionReport) => `${id[o.mover]} ${o.crossing}`;
  const head = chosen.feasible
    ? `${id[chosen.mover]} moves to the ${chosen.crossing} crossing with ${id[partner]} at ${ghz(chosen.interactionGHz!)}` +
      (chosen.parked.length > 0
        ? `, with ${chosen.parked.map((p) => `${id[p.qubit]} parked at ${ghz(p.fGHz)} (${p.reason === BUDGET_MOVE_REASON ? 'moved for a lower estimated error' : `where it stood it broke ${p.reason}`})`).join(', ')}`
        : '') +
      `; estimated error ${prob(chosen.score)}`
    : `no option clears every rule; kept ${name(chosen)} with the fewest problems (${chosen.note})`;
  const others = all.filter((o) => o !== chosen).map((o) => `${name(o)}: ${o.note}`);
  return `${head}. Other options: ${others.join('; ')}.`;
}

/**
 * The same planned edge with some of its moved spectators at other temporary points (the exact
 * f01, flux and f12 another gate moved them to), or null when the gate then breaks a rule. Used to
 * give spectators shared by gates of one layer one common point (src/plan/layer-moves.ts).
 */
export function withSpectatorPoints(ec: EdgeContext, plan: EdgePlan, points: ReadonlyMap<number, Pick<ParkedSpectator, 'fGHz' | 'flux' | 'f12GHz'>>): EdgePlan | null {
  return withSpectatorPointsDraft(ec, plan, points)?.plan() ?? null;
}

/**
 * A re-evaluated edge plan whose score is known and whose plan object (with its reason and
 * option notes, text that costs more than the rules) is built on the first call of `plan()` and
 * the same object returned after: the layer fitting compares many candidate points by score and
 * keeps few (src/plan/layer-moves.ts).
 */
export interface EdgePlanDraft {
  score: number;
  plan(): EdgePlan;
}

/** withSpectatorPoints with the plan object built on demand: `draft.plan()` is the plan withSpectatorPoints returns. */
export function withSpectatorPointsDraft(ec: EdgeContext, plan: EdgePlan, points: ReadonlyMap<number, Pick<ParkedSpectator, 'fGHz' | 'flux' | 'f12GHz'>>): EdgePlanDraft | null {
  if (![...points.keys()].every((q) => plan.parked.some((p) => p.qubit === q))) return null;
  return withParkedDraft(
    ec,
    plan,
    plan.parked.map((p) => {
      const at = points.get(p.qubit);
      return at === undefined || at.fGHz === p.fGHz ? p : { qubit: p.qubit, fGHz: at.fGHz, flux: at.flux, f12GHz: at.f12GHz, reason: p.reason };
    }),
  );
}

/** The same planned edge without some of its moved spectators (they stay at parking), or null when the gate then breaks a rule. */
export function withoutSpectators(ec: EdgeContext, plan: EdgePlan, qubits: ReadonlySet<number>): EdgePlan | null {
  return withParked(ec, plan, plan.parked.filter((p) => !qubits.has(p.qubit)));
}

/**
 * A feasible planned edge with another list of moved spectators: the score, findings, swept
 * crossings, slot and reason evaluated again (each spectator keeps the reason it was moved for),
 * or null when the gate then breaks a rule.
 */
function withParked(ec: EdgeContext, plan: EdgePlan, parkedInfo: ParkedSpectator[]): EdgePlan | null {
  return withParkedDraft(ec, plan, parkedInfo)?.plan() ?? null;
}

/**
 * withParked's evaluation now, its plan object (reason and notes) on demand. The draft keeps only
 * what the plan is built from (the plan, the spectators' points, the score and the slot): the
 * layer fitting remembers every draft it makes (18,575 on the generated 32 x 32 chip) and builds
 * the plan of about a fifth (3,770), so the gate's scenario and evaluation are left to the garbage
 * collector at once and made again, the same way, for a plan that is built (ParkedPlanDraft).
 */
function withParkedDraft(ec: EdgeContext, plan: EdgePlan, parkedInfo: ParkedSpectator[]): EdgePlanDraft | null {
  if (!plan.feasible) return null;
  const scenario = parkedScenario(ec, plan, parkedInfo);
  // (returned only without findings: no messages needed)
  const ev = evaluateGate(ec.ctx, scenario, TALLY);
  if (ev.findings.length > 0) return null;
  const score = estimateError(ec, scenario, plan.moverInteractionFlux, parkedInfo, ev);
  return new ParkedPlanDraft(ec, plan, parkedInfo, score, ev.durationNs);
}

/** The gate of a planned edge with the spectators of `parkedInfo` moved (the rest at parking). */
function parkedScenario(ec: EdgeContext, plan: EdgePlan, parkedInfo: readonly ParkedSpectator[]): GateScenario {
  return {
    edge: plan.edge, mover: plan.mover, partner: plan.partner, crossing: plan.crossing,
    fromGHz: ec.states[plan.mover].f01GHz, toGHz: plan.crossingGHz, moverF12AtToGHz: plan.moverF12AtInteractionGHz,
    crossingCouplingGHz: plan.crossingCouplingGHz, rampNs: plan.rampNs,
    parking: ec.parking ?? parkingOf(ec.states),
    parked: new Map(parkedInfo.map((p) => [p.qubit, { f01GHz: p.fGHz, f12GHz: p.f12GHz }])),
  };
}

/** withParkedDraft's result: its plan object built on the first call of plan(), the same object after. */
class ParkedPlanDraft implements EdgePlanDraft {
  private built: EdgePlan | undefined;

  constructor(
    private readonly ec: EdgeContext,
    private readonly base: EdgePlan,
    private readonly parkedInfo: ParkedSpectator[],
    readonly score: number,
    private readonly durationNs: number,
  ) {}

  plan(): EdgePlan {
    return (this.built ??= this.build());
  }

  private build(): EdgePlan {
    const { ec, base: plan, parkedInfo, score } = this;
    const { ctx } = ec;
    const id = ctx.ids;
    const isChosen = (o: OptionReport) => o.mover === plan.mover && o.crossing === plan.crossing && o.feasible;
    const note = `feasible${parkedInfo.length > 0 ? ` with ${parkedInfo.map((p) => `${id[p.qubit]} parked at ${ghz(p.fGHz)}`).join(', ')}` : ''}, estimated error ${prob(score)}`;
    const options = plan.options.map((o) => (isChosen(o) ? optionReportOf({ ...o, parked: parkedInfo, score, note }) : o));
    const chosen = options.find(isChosen)!;
    // (the draft's evaluation summed the swept crossings (TALLY): they are listed by evaluating the
    // same scenario again, as sweptListOf does for such an evaluation; it had no findings)
    return edgePlanOf({
      ...plan, parked: parkedInfo, swept: evaluateGate(ctx, parkedScenario(ec, plan, parkedInfo), QUIET).swept, findings: [], durationNs: this.durationNs, score, options,
      reason: reasonText(ctx, chosen, options, plan.partner),
    });
  }
}

/**
 * The plan's fields copied in the interface's order into one object literal. A plan made by
 * spreading another (`{ ...plan, parked }`) gets a hidden class of its own from the engine (V8's
 * copy of the source's shape); on the generated 32 x 32 chip the plans the layer fitting kept had
 * six, and the conflict tests that read every candidate pair of plans (src/plan/layers.ts) had to
 * tell them apart: with every derived plan made here the kept plans have one (counted with V8's
 * %HaveSameMap). The same values: only the object's shape changes.
 */
export function edgePlanOf(p: EdgePlan): EdgePlan {
  return {
    edge: p.edge, mover: p.mover, partner: p.partner, crossing: p.crossing, feasible: p.feasible, crossingGHz: p.crossingGHz, interactionGHz: p.interactionGHz,
    moverInteractionFlux: p.moverInteractionFlux, moverF12AtInteractionGHz: p.moverF12AtInteractionGHz, crossingCouplingGHz: p.crossingCouplingGHz,
    speedLimitNs: p.speedLimitNs, gAtInteractionGHz: p.gAtInteractionGHz, durationNs: p.durationNs, rampNs: p.rampNs, parked: p.parked, swept: p.swept,
    findings: p.findings, score: p.score, reason: p.reason, options: p.options,
  };
}

/** An option report's fields in the interface's order in one object literal (as edgePlanOf, for the options a derived plan lists). */
export function optionReportOf(o: OptionReport): OptionReport {
  return { mover: o.mover, crossing: o.crossing, feasible: o.feasible, score: o.score, interactionGHz: o.interactionGHz, moverFlux: o.moverFlux, parked: o.parked, problems: o.problems, note: o.note };
}
