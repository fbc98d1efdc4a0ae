/**
 * Per-edge CZ design through the gate stage (./gate-seam.ts), on the interaction plan: mover,
 * partner, crossing and parking fluxes from the plan, the family and ramp the user asked for (else
 * the gate stage's best family, and its default ramp unless the plan had to fall back to a faster
 * one for the edge), decoherence on by default, and with
 * `spectators` the worst spectator of the gate simulated as a third transmon so its error shows
 * in the fidelity. The worst spectator is the neighbour of the mover or of the partner (at its
 * frequency during the gate) with the largest g / Delta, Delta its smallest distance to a
 * crossing with the mover at the interaction point (or with the static partner).
 *
 * The designed gate is then checked again where it really goes: the cz rules at its destination
 * (the crossing plus the designer's offset) and, for every crossing the mover passes, the
 * Landau-Zener transfer at the rate the exported waveform actually sweeps there
 * (|df01/dt| between the two samples around the crossing, each passage; the worst counts).
 * These findings replace the plan's linear-ramp estimate for the edge.
 */
import type { ChipPlan, PlannedGate } from './plan.js';
import { collectFindings, edgeExplanations } from './plan.js';
import type { GateDesign, GateDesigner, GateDesignRequest, GateSpectatorRequest } from './gate-seam.js';
import { evaluateGate, type DuringGate, type GateScenario, type SweptCrossing } from './rules/cz-evaluate.js';
import type { Finding } from './rules/findings.js';
import { edgePlanOf, parkSpectators, sweptListOf, type EdgePlan, type ParkedSpectator } from './interaction/plan-edge.js';
import { planLayers } from './layers.js';
import { calibratedZzScale, crowding } from './crowding.js';
import { landauZenerTransfer } from './landau-zener.js';
import { spectatorMovesNs } from './rules/cz-duration.js';
import { band, ghz, mhz, prob, ns } from './format.js';
import { planBudget } from './plan-budget.js';
import type { PooledDesign } from '../gate/design-pool.js';
import { budgetSpectatorList } from './budget-spectators.js';
import { withSpectatorBudget } from '../gate/design.js';

export interface PulseOptions {
  family?: string;
  /** Ramp time for every edge (ns); default the plan's per-edge ramp. */
  rampNs?: number;
  targetPhase?: number;
  /** Decoherence in the design (default true). */
  noise?: boolean;
  /** Integrate the Lindblad equation for fidelityNoisy (default: the first-order estimate, ~10x faster, within ~2 %). */
  lindblad?: boolean;
  /** Simulate the worst spectator as a third transmon. */
  spectators?: boolean;
}

/**
 * `given`: designs to use instead of designing (by edge index; re-planning keeps the designs of
 * the edges it keeps, src/plan/replan/); they are checked where they go like the others.
 */
export function designPulses(plan: ChipPlan, designer: GateDesigner, options: PulseOptions = {}, progress?: (done: number, total: number) => void, given?: readonly (GateDesign | null | undefined)[]): void {
  let done = 0;
  const designs = plan.edges.map((e, k) => {
    const d = given?.[k] ? keptWithBudget(plan, e, given[k]!, options) : Number.isFinite(e.interactionGHz) ? designOrFailure(plan, e, () => designer(gateRequest(plan, e, options))) : null;
    progress?.(++done, plan.edges.length);
    return d;
  });
  applyDesigns(plan, designs, options.targetPhase);
}

/**
 * Fewer designs than this are made in this thread: each worker's start-up and JIT warm-up (its
 * first design came back after 0.34-0.56 s, against 81 ms per design on average) cost more than
 * the threads save (Bowline-5's 4 designs: 1.2 s with 2 workers, 0.9 s
 * without; Clove-17's 24 break even, Reef-49's 83 gain 1.3x on 2 cores; measured 2026-12-02).
 */
export const MIN_DESIGNS_FOR_WORKERS = 12;

/**
 * designPulses with the designs on `threads` worker threads (src/gate/design-pool.ts), the same
 * plan bit for bit; with fewer than `minDesigns` designs (default MIN_DESIGNS_FOR_WORKERS) they
 * are made in this thread. If the workers cannot run (no worker support, a worker dies), the
 * designs are made in this thread with `designer`, and the reason is returned.
 */
export async function designPulsesInParallel(
  plan: ChipPlan,
  designer: GateDesigner,
  workers: { threads: number; minDesigns?: number },
  options: PulseOptions = {},
  progress?: (done: number, total: number) => void,
  given?: readonly (GateDesign | null | undefined)[],
): Promise<{ fallback?: string }> {
  const { threads, minDesigns = MIN_DESIGNS_FOR_WORKERS } = workers;
  const edges = plan.edges.map((e, k) => ({ e, k })).filter(({ e, k }) => Number.isFinite(e.interactionGHz) && !given?.[k]);
  const requests = edges.map(({ e }) => gateRequest(plan, e, options));
  const skipped = plan.edges.length - edges.length;
  let pooled: PooledDesign[] | null = null;
  let fallback: string | undefined;
  if (threads > 1 && requests.length >= Math.max(2, minDesigns)) {
    try {
      const { designInWorkers } = await import('../gate/design-pool.js');
      pooled = await designInWorkers(requests, threads, (done) => progress?.(skipped + done, plan.edges.length));
    } catch (err) {
      pooled = null;
      fallback = err instanceof Error ? err.message.split('\n')[0] : String(err);
    }
  }
  const designs: (GateDesign | null)[] = plan.edges.map((e, k) => (given?.[k] ? keptWithBudget(plan, e, given[k]!, options) : null));
  edges.forEach(({ e, k }, j) => {
    const p = pooled?.[j];
    designs[k] = designOrFailure(plan, e, () => {
      if (p === undefined) return designer(requests[j]);
      if ('error' in p) throw new Error(p.error);
      return p;
    });
    if (!pooled) progress?.(skipped + j + 1, plan.edges.length);
  });
  applyDesigns(plan, designs, options.targetPhase);
  return fallback === undefined ? {} : { fallback };
}

/**
 * A design kept from an earlier plan (src/plan/replan/), its spectators' share of the budget
 * simulated again where the spectators sit in this plan (a neighbour may have moved; the rest of
 * the gate stage's budget belongs to the kept waveform and the pair, which were kept).
 */
function keptWithBudget(plan: ChipPlan, e: EdgePlan, d: GateDesign, options: PulseOptions): GateDesign {
  if (!d.budget || !d.feasible) return d;
  const req = gateRequest(plan, e, { ...options, noise: true });
  return withSpectatorBudget({ ...req, targetPhase: d.targetPhase ?? req.targetPhase }, d);
}

/** The design, or a failed one when the gate stage throws on this edge. */
function designOrFailure(plan: ChipPlan, e: EdgePlan, design: () => GateDesign): GateDesign {
  try {
    return design();
  } catch (err) {
    if (process.env.FLUXLANE_DEBUG) console.error(err);
    // A failure inside the gate stage on one edge is reported on that edge (rule cz-design)
    // instead of losing the whole plan.
    return failedDesign(plan.ctx.ids[e.mover], `the gate stage failed on this edge: ${err instanceof Error ? err.message.split('\n')[0] : String(err)}`);
  }
}

/** Check each edge's design where it really goes, then layers, crowding and findings again. */
function applyDesigns(plan: ChipPlan, designs: readonly (GateDesign | null)[], targetPhase?: number): void {
  const { ctx } = plan;
  plan.gates = plan.edges.map((e, k) => {
    const design = designs[k];
    if (!design) return null;
    const { findings, edge } = checkDesign(plan, e, design);
    plan.edges[k] = edge;
    const planned: PlannedGate = { design, findings };
    if (targetPhase !== undefined) planned.targetPhase = targetPhase;
    return planned;
  });
  // Destinations and spectator moves may have changed: layers and crowding again (the layers
  // start from the planned ones, src/plan/layer-moves.ts, where those still hold).
  const f12 = plan.states.map((s) => s.f12GHz);
  plan.layers = planLayers(ctx, plan.edges, f12, plan.parking.parkingGHz, 1, plan.layers.layerOf);
  plan.crowding = crowding(ctx, plan.parking.parkingGHz, plan.states, calibratedZzScale(ctx, plan.parking.parkingGHz, plan.parking.idle.zzGHz), plan.edges);
  plan.budget = planBudget(plan);
  collectFindings(plan);
  plan.explanations = [...plan.explanations.filter((x) => x.kind === 'parking'), ...edgeExplanations(plan)];
}

export function gateRequest(plan: ChipPlan, e: EdgePlan, options: PulseOptions): GateDesignRequest {
  const { ctx } = plan;
  const edge = ctx.edges[e.edge];
  const request: GateDesignRequest = {
    mover: ctx.transmons[e.mover],
    partner: ctx.transmons[e.partner],
    gGHz: edge.gGHz,
    moverParkFlux: plan.states[e.mover].flux,
    partnerFlux: plan.states[e.partner].flux,
    crossing: e.crossing,
    // Spectators moved for the gate take two of the plan's ramps out of the time budget (the
    // designer itself keeps the waveform's rounding to the sample grid inside the limit).
    rules: { ...ctx.rules, maxGateNs: ctx.rules.maxGateNs - spectatorMovesNs(e.parked.length > 0, e.rampNs, ctx.rules) },
    noise: options.noise ?? true,
    decoherence: options.lindblad ? 'lindblad' : 'estimate',
  };
  // The ramp: the user's, else the faster one the plan fell back to for this edge, else the gate
  // stage's default for the family.
  const ramp = options.rampNs ?? (e.rampNs < plan.options.rampNs ? e.rampNs : undefined);
  if (ramp !== undefined) request.rampNs = ramp;
  if (options.family !== undefined) request.family = options.family;
  if (options.targetPhase !== undefined) request.targetPhase = options.targetPhase;
  if (options.spectators) {
    const worst = worstSpectator(plan, e);
    if (worst) request.spectators = [worst];
  }
  if (request.noise) request.budgetSpectators = budgetSpectators(plan, e);
  return request;
}

/** The spectators whose error the gate's budget reports (./budget-spectators.ts), each where it sits during the gate (moved or at parking). */
export function budgetSpectators(plan: ChipPlan, e: EdgePlan): GateSpectatorRequest[] {
  const { ctx } = plan;
  const parked = new Map(e.parked.map((p) => [p.qubit, p]));
  return budgetSpectatorList((q: number) => ctx.neighbours[q], e.mover, e.partner, e.crossing).map(({ qubit: S, coupledTo }) => {
    const edge = ctx.edges[ctx.edgeBetween(coupledTo === 'mover' ? e.mover : e.partner, S)];
    return { transmon: ctx.transmons[S], coupledTo, gGHz: edge.gGHz, flux: parked.get(S)?.flux ?? plan.states[S].flux };
  });
}

/** A design that did not happen (the gate stage threw): infeasible, with the reason. */
function failedDesign(mover: string, reason: string): GateDesign {
  return {
    mover, family: '-', rampNs: NaN, holdNs: NaN, durationNs: NaN, interactionFrequencyGHz: NaN, crossingOffsetGHz: NaN,
    conditionalPhase: NaN, leakage: NaN, fidelity: NaN, virtualZ: { a: NaN, b: NaN }, speedLimitNs: NaN,
    untuned: { conditionalPhase: NaN, leakage: NaN, fidelity: NaN }, waveform: { timeNs: new Float64Array(0), flux: new Float64Array(0) },
    feasible: false, reason, crossingFlux: NaN, crossingFrequencyGHz: NaN, gapGHz: NaN, populations: { '20': NaN, '02': NaN }, idleErrorEstimate: NaN, evaluations: 0,
  };
}

/** The neighbour of mover or partner with the largest g / Delta during the gate. */
export function worstSpectator(plan: ChipPlan, e: EdgePlan): GateSpectatorRequest | null {
  const { ctx } = plan;
  const parked = new Map(e.parked.map((p) => [p.qubit, p]));
  let best: { score: number; req: GateSpectatorRequest } | null = null;
  const consider = (S: number, side: 'mover' | 'partner') => {
    const edge = ctx.edges[ctx.edgeBetween(side === 'mover' ? e.mover : e.partner, S)];
    const p = parked.get(S);
    const f01 = p?.fGHz ?? plan.states[S].f01GHz;
    const f12 = p?.f12GHz ?? plan.states[S].f12GHz;
    const flux = p?.flux ?? plan.states[S].flux;
    const distances =
      side === 'mover'
        ? [Math.abs(e.interactionGHz - f01), Math.abs(e.moverF12AtInteractionGHz - f01), Math.abs(e.interactionGHz - f12)]
        : [Math.abs(plan.states[e.partner].f01GHz - f01), Math.abs(plan.states[e.partner].f12GHz - f01), Math.abs(plan.states[e.partner].f01GHz - f12)];
    const score = edge.gGHz / Math.max(1e-6, Math.min(...distances));
    if (!best || score > best.score) best = { score, req: { transmon: ctx.transmons[S], coupledTo: side, gGHz: edge.gGHz, flux } };
  };
  for (const S of ctx.neighbours[e.mover]) if (S !== e.partner) consider(S, 'mover');
  for (const S of ctx.neighbours[e.partner]) if (S !== e.mover && !ctx.neighbours[e.mover].includes(S)) consider(S, 'partner');
  return best ? (best as { req: GateSpectatorRequest }).req : null;
}

/**
 * The cz rules on the designed gate: at its destination as designed (spectators moved again
 * where the designed point needs it), the mover's sweeps at the waveform's rates, the duration
 * with the spectator moves. Returns the findings and the edge plan updated to the designed
 * destination and spectator moves.
 */
export function checkDesign(plan: ChipPlan, e: EdgePlan, design: GateDesign): { findings: Finding[]; edge: EdgePlan } {
  const { ctx } = plan;
  const id = ctx.ids;
  const key = ctx.edges[e.edge].key;
  const out: Finding[] = [];
  if (!design.feasible) {
    out.push({ rule: 'cz-design', qubits: [id[e.mover], id[e.partner]], value: null, threshold: null, edge: key,
      message: `no CZ design for ${key} within ${ns(ctx.rules.maxGateNs)}: ${design.reason ?? 'the gate stage gave no reason'}` });
  }
  const mover = ctx.transmons[e.mover];
  const to = design.interactionFrequencyGHz;
  const toFlux = Number.isFinite(to) ? mover.fluxForF01OrNull(to) : null;
  // no designed destination (the design failed): the edge's planned findings still stand
  if (toFlux === null) return { findings: [...out, ...e.findings.map(({ blame: _b, ...rest }) => rest)], edge: e };
  const parking: DuringGate[] = plan.states.map((s) => ({ f01GHz: s.f01GHz, f12GHz: s.f12GHz }));
  const parked = new Map<number, DuringGate>(e.parked.map((p) => [p.qubit, { f01GHz: p.fGHz, f12GHz: p.f12GHz }]));
  const scenario: GateScenario = {
    edge: e.edge, mover: e.mover, partner: e.partner, crossing: e.crossing,
    fromGHz: plan.states[e.mover].f01GHz, toGHz: to, moverF12AtToGHz: mover.spectrum(toFlux).f12GHz,
    crossingCouplingGHz: e.crossingCouplingGHz, rampNs: design.rampNs, spectatorRampNs: e.rampNs, parking, parked,
  };
  const parkedInfo: ParkedSpectator[] = e.parked.map((p) => ({ ...p }));
  const { evaluation: ev } = parkSpectators({ ctx, options: plan.options, blockers: plan.parking.state.blockers, states: plan.states }, scenario, parkedInfo);
  for (const f of ev.findings) {
    if (f.rule === 'cz-duration') continue;
    if (f.rule.startsWith('cz-swept-') && f.qubits[0] === id[e.mover]) continue;
    const { blame: _b, ...rest } = f;
    out.push(rest);
  }
  const moves = spectatorMovesNs(parkedInfo.length > 0, e.rampNs, ctx.rules);
  const total = design.durationNs + moves;
  if (total > ctx.rules.maxGateNs + 1e-9) {
    out.push({ rule: 'cz-duration', qubits: [id[e.mover], id[e.partner]], value: total, threshold: ctx.rules.maxGateNs, edge: key,
      message: `the designed CZ on ${key} takes ${ns(design.durationNs)}${moves > 0 ? ` plus ${ns(moves)} of spectator moves` : ''}; the limit is ${ns(ctx.rules.maxGateNs)}` });
  }
  const swept = sweptListOf(ctx, scenario, ev);
  out.push(...waveformSweepFindings(plan.ctx, e.mover, key, swept, design.waveform));
  const edge = edgePlanOf({
    ...e,
    interactionGHz: to,
    moverInteractionFlux: toFlux,
    moverF12AtInteractionGHz: scenario.moverF12AtToGHz,
    parked: parkedInfo,
    swept,
    durationNs: total,
  });
  return { findings: out, edge };
}

/**
 * Landau-Zener findings for the crossings the mover passes, at the rate the waveform sweeps each
 * one (|df01/dt| between the samples around it, every passage; the worst counts).
 */
export function waveformSweepFindings(
  ctx: ChipPlan['ctx'],
  moverIndex: number,
  key: string,
  swept: readonly SweptCrossing[],
  wf: { timeNs: ArrayLike<number>; flux: ArrayLike<number> },
): Finding[] {
  const id = ctx.ids;
  const mover = ctx.transmons[moverIndex];
  const out: Finding[] = [];
  const f = Array.from(wf.flux, (x) => mover.f01(x));
  for (const c of swept) {
    if (c.moving !== moverIndex) continue;
    let worst = 0;
    let rateAt = NaN;
    for (let k = 0; k + 1 < f.length; k++) {
      if ((f[k] - c.atGHz) * (f[k + 1] - c.atGHz) > 0 || f[k] === f[k + 1]) continue;
      const rate = Math.abs(f[k + 1] - f[k]) / (wf.timeNs[k + 1] - wf.timeNs[k]);
      const p = landauZenerTransfer(c.couplingGHz, rate);
      if (p > worst) {
        worst = p;
        rateAt = rate;
      }
    }
    if (worst > ctx.rules.sweptTransferLimit) {
      const with_ = c.other >= 0 ? id[c.other] : 'its defect';
      out.push({ rule: c.rule, qubits: c.other >= 0 ? [id[moverIndex], id[c.other]] : [id[moverIndex]], value: worst, threshold: ctx.rules.sweptTransferLimit, edge: key,
        message: `the designed waveform of ${key} sweeps ${id[moverIndex]} through a crossing with ${with_} at ${ghz(c.atGHz)} at ${(rateAt * 1e3).toFixed(0)} MHz/ns (g = ${mhz(c.couplingGHz, 2)}): transfer ${prob(worst)} > ${prob(ctx.rules.sweptTransferLimit)} (band ${band(Math.min(...f), Math.max(...f))})`,
        details: { atGHz: c.atGHz, couplingGHz: c.couplingGHz, rateHzPerS: rateAt * 1e18, waveform: true } });
    }
  }
  return out;
}
