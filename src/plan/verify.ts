/**
 * `verifyPlan`: recompute everything a plan claims from the layout and the files it names, and
 * say which claim does not hold. Nothing the plan states about its own results is trusted.
 *
 *   - rules: the exact idle rules at the plan's parking frequencies; each edge's crossing
 *     recomputed from those (it must match the plan's crossing frequency and, without a designed
 *     gate, be its interaction frequency within 10 kHz: rule cz-crossing); every cz rule where the
 *     gate really goes (a designed gate: its waveform's plateau) with the plan's spectator parking
 *     and ramp time, the mover's sweeps at the waveform's own rates, the duration from the
 *     waveform's samples against maxGate; conflicts between gates that share a layer; crowding;
 *   - claims (./verify-claims.ts): every number of the table CLAIMS, recomputed (a designed
 *     gate's metrics by re-simulating its waveform file), against its tolerance: rule plan-claim;
 *   - the files: a waveform the plan names must be there and start at the mover's parking point;
 *   - layers: each edge's layer index lies in 0 .. L-1 with no empty layer, the top-level
 *     `layers` list agrees with the edges' `layer`, and `layerSummary` with what was recomputed
 *     (rule layer-index).
 */
import type { ChipLayout } from '../layout/types.js';
import { pairResonances } from '../pair/resonances.js';
import { buildManifoldFrame, type ManifoldFrame } from '../sim/manifold-frame.js';
import { edgeSimModel, moverEjRange, type EdgeSpectator } from '../sim/pair-model.js';
import { simulateGate, type GateSimulation } from '../sim/simulate-gate.js';
import { trajectoryDuration, type Trajectory } from '../sim/trajectory.js';
import { formatPath, type Path } from '../layout/diagnostics.js';
import { InputError, type Diagnostic } from '../util/errors.js';
import { hasOwn } from '../util/own.js';
import { buildPlanContext, type PlanContext } from './context.js';
import { calibratedZzScale, crowding } from './crowding.js';
import { exactQubitState, type ExactQubitState } from './exact-state.js';
import { freq, fromHz, ghz } from './format.js';
import type { EdgePlan, ParkedSpectator } from './interaction/plan-edge.js';
import { conflictingPairs } from './layers.js';
import { readPlanWaveform, type PlanEdgeInput, type PlanInput } from './plan-read.js';
import { waveformSweepFindings } from './pulses.js';
import { COLLISION_RULES } from './rules/catalogue.js';
import { evaluateGate, type DuringGate, type GateScenario } from './rules/cz-evaluate.js';
import { sortFindings, type Finding } from './rules/findings.js';
import { evaluateIdle } from './rules/idle-evaluate.js';
import { tuningRoomShortfall } from './rules/tuning-room.js';
import { slotNs } from './rules/cz-duration.js';
import { recomputeBudget, type EdgeGateSource } from './verify-budget.js';
import { budgetFindings } from './plan-budget.js';
import { budgetSpectatorList } from './budget-spectators.js';
import { spectatorBudget, waveformNoiseBudget, type WaveformNoiseBudget } from '../budget/waveform-budget.js';
import type { StageBudget } from './gate-budget.js';
import { CLAIMS, claimHolds, formatClaimValue, shortNumber, type Claim, type ClaimEnv } from './verify-claims.js';

export const VERIFY_DEFAULTS = Object.freeze({
  crossingToleranceGHz: 1e-5,
  /** A waveform must start within this of the mover's parking frequency (GHz). */
  waveformStartToleranceGHz: 1e-5,
});

export interface VerifyResult {
  ok: boolean;
  violations: Finding[];
  flags: Finding[];
  checked: { qubits: number; edges: number; layers: number; waveforms: number; claims: number };
  /** Waveform files named by the plan that were not found. */
  missingWaveforms: string[];
  /** The reference cycle's error budget as verify recomputed it (src/plan/verify-budget.ts). */
  cycle: { durationNs: number; error: number; gates: number; idles: number; uncounted: number };
}

export interface VerifyWhere {
  /** The plan's folder (waveform paths are relative to it). */
  dir: string;
  /** The same folder as the user wrote it (for messages); default `dir`. */
  shownDir?: string;
}

interface GateRecord {
  input: PlanEdgeInput;
  index: number;
  mover: number;
  partner: number;
  interactionGHz: number;
  interactionFlux: number;
  parkedCount: number;
  waveform: Trajectory | null;
  waveformFile: string | null;
  simulation: (() => GateSimulation) | null;
  /** The gate stage's noise terms on the waveform (null without noise). */
  noise: (() => WaveformNoiseBudget | null) | null;
  noisyMethod: 'estimate' | 'lindblad' | null;
}

export function verifyPlan(layout: ChipLayout, plan: PlanInput, where: VerifyWhere): VerifyResult {
  const ctx = buildPlanContext(layout);
  const parking = Float64Array.from(ctx.ids, (q) => fromHz(plan.qubits.get(q)!.parkingFrequency));
  const idle = evaluateIdle(ctx, parking);
  const violations: Finding[] = [...idle.violations];
  const states: ExactQubitState[] = idle.states.map((s, i) => s ?? exactQubitState(ctx.transmons[i], Math.min(ctx.transmons[i].fMaxGHz, Math.max(ctx.transmons[i].fMinGHz, parking[i])), ctx.rules.resistanceSpread));
  const edgePlans: EdgePlan[] = [];
  const layerOf: number[] = [];
  const records: GateRecord[] = [];
  const sources: EdgeGateSource[] = [];
  let waveforms = 0;
  const missing: string[] = [];
  const byPair = new Map(ctx.edges.map((e) => [pairKey(ctx.ids[e.a], ctx.ids[e.b]), e.index]));
  const planEdges = [...plan.edges].sort((x, y) => byPair.get(pairKey(...x.qubits))! - byPair.get(pairKey(...y.qubits))!);
  const shownDir = where.shownDir ?? where.dir;
  for (const pe of planEdges) {
    const edge = ctx.edges[byPair.get(pairKey(...pe.qubits))!];
    const mover = ctx.index.get(pe.mover)!;
    const partner = mover === edge.a ? edge.b : edge.a;
    const key = edge.key;
    layerOf[edge.index] = pe.layer;
    const res = pairResonances(ctx.transmons[mover], ctx.transmons[partner], states[partner].flux, edge.gChargeGHz)[pe.crossing];
    const range = ctx.ranges[mover];
    const short = res && res.moverF01GHz >= range.lo - 1e-9 ? tuningRoomShortfall(range, states[mover].f01GHz, res.moverF01GHz, res.couplingGHz) : 0;
    if (!res || res.moverF01GHz < range.lo - 1e-9 || short > 0) {
      const why = short > 0 ? ` with room to tune past it (less than one splitting inside its planning range)` : '';
      violations.push({ rule: 'cz-range', qubits: [pe.mover, ctx.ids[partner]], value: res?.moverF01GHz ?? null, threshold: null, edge: key,
        message: `${pe.mover} cannot reach the ${pe.crossing} crossing with ${ctx.ids[partner]} parked at ${ghz(parking[partner])}${why}` });
      edgePlans[edge.index] = stubPlan(edge.index, mover, partner, pe.crossing);
      sources[edge.index] = { kind: 'none' };
      continue;
    }
    const tol = VERIFY_DEFAULTS.crossingToleranceGHz;
    const crossing = res.moverF01GHz;
    const stated = pe.crossingFrequency != null ? fromHz(pe.crossingFrequency) : null;
    if (stated !== null && Math.abs(stated - crossing) > tol) {
      violations.push({ rule: 'cz-crossing', qubits: [pe.mover, ctx.ids[partner]], value: stated, threshold: crossing, edge: key,
        message: `${key}: the plan's ${pe.crossing} crossing ${ghz(stated, 6)} no longer matches the parking frequencies (now ${ghz(crossing, 6)}, ${freq(stated - crossing)} off); re-plan this edge` });
    }

    // The waveform the plan names: where the gate really goes, how long it takes, how fast it sweeps.
    let waveform: Trajectory | null = null;
    let waveformFile: string | null = null;
    const wf = readPlanWaveform(where.dir, pe, shownDir);
    if (wf && 'missing' in wf) {
      missing.push(wf.missing);
      violations.push({ rule: 'plan-claim', qubits: [pe.mover, ctx.ids[partner]], value: null, threshold: null, edge: key,
        message: `${key}: the plan names the waveform ${wf.missing}, which is not there; the gate's duration, sweeps, interaction point and metrics cannot be checked`,
        details: { claim: formatPath(['edges', pe.index, 'gate', 'waveform']) } });
    } else if (wf) {
      waveform = wf.trajectory;
      waveformFile = wf.file;
      waveforms++;
    }
    const moverT = ctx.transmons[mover];
    let to: number;
    let toFluxFromWave: number | null = null;
    if (waveform) {
      const start = moverT.f01(waveform.flux[0]);
      if (Math.abs(start - parking[mover]) > VERIFY_DEFAULTS.waveformStartToleranceGHz) {
        violations.push({ rule: 'plan-claim', qubits: [pe.mover], value: start, threshold: parking[mover], edge: key,
          message: `${key}: the waveform ${waveformFile} starts at flux ${waveform.flux[0]} (${pe.mover} at ${ghz(start, 6)}), not at ${pe.mover}'s parking frequency ${ghz(parking[mover], 6)}`,
          details: { claim: formatPath(['qubits', pe.mover, 'parkingFrequency']) } });
      }
      const plateau = plateauSample(waveform, (x) => moverT.f01(x));
      to = moverT.f01(plateau);
      toFluxFromWave = plateau;
    } else {
      to = pe.interactionFrequency !== null ? fromHz(pe.interactionFrequency) : crossing;
    }
    // Without a designed gate the interaction point is the crossing itself; a designed gate sits
    // at its own offset from the exact (dressed) crossing (its claims are checked on the waveform).
    if (!pe.gate && Math.abs(to - crossing) > tol) {
      violations.push({ rule: 'cz-crossing', qubits: [pe.mover, ctx.ids[partner]], value: to, threshold: crossing, edge: key,
        message: `${key}: the interaction frequency ${ghz(to, 6)} is not the ${pe.crossing} crossing at the parking frequencies (${ghz(crossing, 6)})` });
    }
    if (pe.gate && waveform && Math.abs(to - crossing) > designWindowGHz(res.couplingGHz)) {
      violations.push({ rule: 'cz-crossing', qubits: [pe.mover, ctx.ids[partner]], value: to, threshold: crossing, edge: key,
        message: `${key}: the waveform ${waveformFile} takes ${pe.mover} to ${ghz(to, 6)}, ${freq(to - crossing)} from the ${pe.crossing} crossing at ${ghz(crossing, 6)}; a CZ design stays within a few splittings of it` });
    }
    const toFlux = toFluxFromWave !== null ? Math.abs(toFluxFromWave) : moverT.fluxForF01OrNull(to);
    if (toFlux === null || to < ctx.ranges[mover].lo - 1e-9) {
      violations.push({ rule: 'cz-range', qubits: [pe.mover], value: to, threshold: null, edge: key, message: `${pe.mover} cannot reach the interaction frequency ${ghz(to)} inside its planning range` });
      edgePlans[edge.index] = stubPlan(edge.index, mover, partner, pe.crossing);
      sources[edge.index] = { kind: 'none' };
      continue;
    }
    const parked = new Map<number, DuringGate>();
    const parkedInfo: ParkedSpectator[] = [];
    for (const [s, fHz] of [...pe.spectatorParking].sort((a, b) => ctx.index.get(a[0])! - ctx.index.get(b[0])!)) {
      const q = ctx.index.get(s)!;
      const f = fromHz(fHz);
      const t = ctx.transmons[q];
      if (!(f >= ctx.ranges[q].lo - 1e-9 && f <= t.fMaxGHz + 1e-9)) {
        violations.push({ rule: 'cz-range', qubits: [s], value: f, threshold: null, edge: key, message: `${s}: spectator parking ${ghz(f)} for ${key} is outside its planning range` });
        continue;
      }
      const st = exactQubitState(t, Math.min(f, t.fMaxGHz), ctx.rules.resistanceSpread);
      parked.set(q, { f01GHz: st.f01GHz, f12GHz: st.f12GHz });
      parkedInfo.push({ qubit: q, fGHz: st.f01GHz, flux: st.flux, f12GHz: st.f12GHz, reason: '' });
    }
    // The mover sweeps with the gate's ramp; spectators move with the plan's.
    const rampNs = (pe.gate?.rampTime ?? pe.rampTime) * 1e9;
    const spectatorRampNs = pe.rampTime * 1e9;
    const scenario: GateScenario = {
      edge: edge.index, mover, partner, crossing: pe.crossing,
      fromGHz: parking[mover], toGHz: to, moverF12AtToGHz: moverT.spectrum(toFlux).f12GHz,
      crossingCouplingGHz: res.couplingGHz, rampNs, spectatorRampNs, parking: states.map((s) => ({ f01GHz: s.f01GHz, f12GHz: s.f12GHz })), parked,
    };
    const ev = evaluateGate(ctx, scenario);
    for (const f of ev.findings) {
      if (waveform && f.rule.startsWith('cz-swept-') && f.qubits[0] === pe.mover) continue;
      if ((waveform || pe.gate?.duration != null) && f.rule === 'cz-duration') continue;
      const { blame: _b, ...rest } = f;
      violations.push(rest);
    }
    if (waveform) violations.push(...waveformSweepFindings(ctx, mover, key, ev.swept, waveform));
    if (pe.gate && pe.gate.feasible === false) {
      violations.push({ rule: 'cz-design', qubits: [pe.mover, ctx.ids[partner]], value: null, threshold: null, edge: key,
        message: `the plan's CZ design for ${key} is marked infeasible${pe.gate.reason ? `: ${pe.gate.reason}` : ''}` });
    }
    // Duration: the waveform's samples when there are any, else what the plan states; the slot
    // adds the spectator moves on the AWG grid (src/plan/rules/cz-duration.ts).
    const gateNs = waveform ? trajectoryDuration(waveform) : pe.gate?.duration != null ? pe.gate.duration * 1e9 : null;
    if (gateNs !== null) {
      const total = slotNs(gateNs, parked.size > 0, spectatorRampNs, ctx.rules);
      if (total > ctx.rules.maxGateNs + 1e-9) {
        violations.push({ rule: 'cz-duration', qubits: [pe.mover, ctx.ids[partner]], value: total, threshold: ctx.rules.maxGateNs, edge: key,
          message: `the designed CZ on ${key} takes ${total.toFixed(1)} ns${waveform ? ` (the samples of ${waveformFile})` : ''}${parked.size > 0 ? ' with its spectator moves' : ''}; the limit is ${ctx.rules.maxGateNs} ns` });
      }
    }
    edgePlans[edge.index] = {
      ...stubPlan(edge.index, mover, partner, pe.crossing),
      feasible: ev.findings.length === 0,
      crossingGHz: crossing,
      interactionGHz: to,
      moverInteractionFlux: toFlux,
      moverF12AtInteractionGHz: scenario.moverF12AtToGHz,
      crossingCouplingGHz: res.couplingGHz,
      rampNs: spectatorRampNs,
      parked: parkedInfo,
      swept: ev.swept,
    };
    edgePlans[edge.index].durationNs = ev.durationNs;
    const noisyMethod = pe.gate?.fidelityNoisyMethod ?? (statedNumber(plan, ['edges', pe.index, 'gate', 'fidelityNoisy']) !== null ? 'estimate' : null);
    const replay = waveform ? gateReplay(ctx, pe, mover, partner, states, waveform, noisyMethod, waveformFile!) : null;
    records.push({
      input: pe, index: edge.index, mover, partner, interactionGHz: to, interactionFlux: toFlux, parkedCount: parked.size,
      waveform, waveformFile, noisyMethod,
      simulation: replay ? replay.simulation : null,
      noise: replay ? replay.noise : null,
    });
    // the gate the budget counts (src/plan/verify-budget.ts), as the planner counts it (src/plan/plan-budget.ts)
    if (pe.gate && pe.gate.feasible === false) sources[edge.index] = { kind: 'none' };
    else if (replay && waveform && noisyMethod !== null) {
      const w = waveform;
      const slot = slotNs(trajectoryDuration(w), parked.size > 0, spectatorRampNs, ctx.rules);
      const during = new Map(parkedInfo.map((p) => [p.qubit, p.flux]));
      let stage: StageBudget | null = null;
      sources[edge.index] = {
        kind: 'designed', waveform: w, slotNs: slot,
        stage: () => (stage ??= replay.stage(budgetSpectatorList((q: number) => ctx.neighbours[q], mover, partner, pe.crossing).map(({ qubit: S, coupledTo }) => ({
          transmon: ctx.transmons[S], coupledTo, gGHz: ctx.edges[ctx.edgeBetween(coupledTo === 'mover' ? mover : partner, S)].gGHz, flux: during.get(S) ?? states[S].flux,
        })))),
      };
    } else if (gateNs !== null) sources[edge.index] = { kind: 'estimated', scenario, slotNs: slotNs(gateNs, parked.size > 0, spectatorRampNs, ctx.rules) };
    else sources[edge.index] = { kind: 'estimated', scenario, slotNs: ev.durationNs };
  }

  // Layers: indices in range and contiguous, the top-level list agrees, conflicts recomputed.
  const f12 = states.map((s) => s.f12GHz);
  const pairs = conflictingPairs(ctx, edgePlans, f12, parking);
  violations.push(...layerFindings(ctx, plan, layerOf, edgePlans, pairs));
  const crowd = crowding(ctx, parking, states, calibratedZzScale(ctx, parking, idle.zzGHz), edgePlans);
  // The error budget, recomputed, and its rules.
  const budget = recomputeBudget(ctx, edgePlans, sources, layerOf, states, idle.zzGHz);
  violations.push(...budgetFindings(ctx, edgePlans, states, budget));

  // Claims.
  const env: ClaimEnv = { ctx, plan, states, zzGHz: idle.zzGHz, crowding: crowd.qubits, budget };
  let claims = 0;
  const problems: Diagnostic[] = [];
  const check = (claim: Claim, scoped: ClaimEnv, base: Path, qubits: string[], edge?: string): void => {
    const path = [...base, ...claim.path];
    const stated = statedNumber(plan, path, problems);
    if (stated === undefined) return;
    const recomputed = claim.recompute(scoped);
    if (recomputed === undefined) return;
    claims++;
    if (claimHolds(claim, stated, recomputed)) return;
    const tol = claim.tolerance.rel ? `${formatClaimValue(claim.tolerance.abs, claim.unit)} + ${shortNumber(claim.tolerance.rel, 3)} relative` : formatClaimValue(claim.tolerance.abs, claim.unit);
    const at = plan.locate(path);
    violations.push({
      rule: 'plan-claim', qubits, value: stated, threshold: recomputed, edge,
      message: `${formatPath(path)}${at ? ` (${plan.file}:${at.line}:${at.column})` : ''}: the plan claims ${claim.what} ${formatClaimValue(stated, claim.unit)}; ${claim.from} gives ${formatClaimValue(recomputed, claim.unit)} (tolerance ${tol})`,
      details: { claim: formatPath(path), stated, recomputed, unit: claim.unit, tolerance: claim.tolerance.abs, relativeTolerance: claim.tolerance.rel ?? 0 },
    });
  };
  for (const claim of CLAIMS) {
    if (claim.scope === 'plan') check(claim, env, [], []);
    else if (claim.scope === 'qubit') ctx.ids.forEach((id, i) => check(claim, { ...env, qubit: i }, ['qubits', id], [id]));
  }
  for (const r of records) {
    const edgeEnv: ClaimEnv = { ...env, edge: { input: r.input, index: r.index, mover: r.mover, partner: r.partner, interactionGHz: r.interactionGHz, interactionFlux: r.interactionFlux, parkedCount: r.parkedCount } };
    if (r.waveform && r.simulation && r.noise) edgeEnv.gate = { waveform: r.waveform, durationNs: trajectoryDuration(r.waveform), simulation: r.simulation, noise: r.noise, noisyMethod: r.noisyMethod };
    const qs = [ctx.ids[r.mover], ctx.ids[r.partner]];
    const key = ctx.edges[r.index].key;
    for (const claim of CLAIMS) {
      if (claim.scope === 'edge') check(claim, edgeEnv, ['edges', r.input.index], qs, key);
      else if (claim.scope === 'gate' && edgeEnv.gate) check(claim, edgeEnv, ['edges', r.input.index, 'gate'], qs, key);
    }
  }
  if (problems.length > 0) throw new InputError(problems);

  const order = COLLISION_RULES.map((r) => r.name);
  const v = sortFindings(violations, order);
  return {
    ok: v.length === 0,
    violations: v,
    flags: sortFindings(crowd.flags, order),
    checked: { qubits: ctx.n, edges: edgePlans.length, layers: new Set(layerOf).size, waveforms, claims },
    missingWaveforms: missing,
    cycle: { durationNs: budget.cycle.durationNs, error: budget.cycle.error, gates: budget.cycle.gates, idles: budget.cycle.idles, uncounted: budget.cycle.uncounted },
  };
}

/**
 * How far from the bare crossing a designed destination may sit (GHz): the designer searches
 * offsets of -1 to +3 minimum splittings from the exact crossing (src/gate/design.ts
 * DESIGN_DEFAULTS.offsetWindow), and the exact crossing lies within about a splitting of the bare
 * one; 5 splittings of the bare coupling (splitting = 2 g_c) bound both with room.
 */
function designWindowGHz(couplingGHz: number): number {
  return 5 * 2 * couplingGHz;
}

/** The sample of a waveform farthest (in the mover's f01) from its first: the plateau. */
export function plateauSample(wf: Trajectory, f01: (flux: number) => number): number {
  const f0 = f01(wf.flux[0]);
  let best = wf.flux[0];
  let dist = 0;
  for (let k = 1; k < wf.flux.length; k++) {
    if (wf.flux[k] === wf.flux[k - 1] && k > 1) continue;
    const d = Math.abs(f01(wf.flux[k]) - f0);
    if (d > dist) {
      dist = d;
      best = wf.flux[k];
    }
  }
  return best;
}

/** What verify re-runs of one designed gate: its simulation, its noise terms and its spectators' share (each computed on first use). */
interface GateReplay {
  simulation(): GateSimulation;
  noise(): WaveformNoiseBudget | null;
  /** The gate stage's budget terms with the given spectators (needs noise). */
  stage(spectators: EdgeSpectator[]): StageBudget;
}

/**
 * The gate's waveform on the model its designer used (src/gate/design.ts): the pair with the
 * spectators the design simulated, the plan's target phase; with the waveform's file named in an
 * InputError (a waveform too long to simulate).
 */
function gateReplay(ctx: PlanContext, pe: PlanEdgeInput, mover: number, partner: number, states: readonly ExactQubitState[], waveform: Trajectory, noisyMethod: 'estimate' | 'lindblad' | null, file: string): GateReplay {
  const named = <T>(f: () => T): T => {
    try {
      return f();
    } catch (err) {
      if (err instanceof InputError) throw new InputError(err.diagnostics.map((d) => ({ ...d, file: d.file ?? file })));
      throw err;
    }
  };
  const edge = ctx.edges[ctx.edgeBetween(mover, partner)];
  const modelSpectators: EdgeSpectator[] = (pe.gate?.simulatedSpectators ?? []).map((s) => {
    const q = ctx.index.get(s.qubit)!;
    const toMover = ctx.edgeBetween(mover, q);
    const k = toMover >= 0 ? toMover : ctx.edgeBetween(partner, q);
    return { transmon: ctx.transmons[q], coupledTo: toMover >= 0 ? 'mover' : 'partner', gGHz: ctx.edges[k].gGHz, flux: s.flux };
  });
  const noise = noisyMethod !== null;
  const targetPhase = pe.gate?.targetPhase ?? Math.PI;
  const pair = { mover: ctx.transmons[mover], partner: ctx.transmons[partner], gGHz: edge.gGHz, partnerFlux: states[partner].flux, traj: waveform, targetPhase };
  let frame: ManifoldFrame | null = null;
  let sim: GateSimulation | null = null;
  let nb: WaveformNoiseBudget | null | undefined;
  const simulation = (): GateSimulation => named(() => {
    const model = edgeSimModel({ mover: pair.mover, partner: pair.partner, gGHz: edge.gGHz, partnerFlux: pair.partnerFlux, noise, spectators: modelSpectators });
    frame ??= buildManifoldFrame(model, { ...moverEjRange(pair.mover, waveform), noiseOperators: noise });
    return (sim ??= simulateGate(frame, waveform, { targetPhase, lindblad: noisyMethod === 'lindblad', estimate: noise, scheme: 'blocks' }));
  });
  const noiseTerms = (): WaveformNoiseBudget | null => {
    if (nb !== undefined) return nb;
    if (noisyMethod === null) return (nb = null);
    const s = simulation();
    return (nb = named(() => waveformNoiseBudget({ ...pair, frame: frame!, modelSpectators, simulation: s, method: noisyMethod })));
  };
  return {
    simulation,
    noise: noiseTerms,
    stage: (spectators) => {
      const n = noiseTerms();
      if (!n) throw new Error('gateReplay.stage needs a gate designed with noise');
      const sb = named(() => spectatorBudget(pair, spectators));
      return { coherent: n.coherent, t1: n.t1, whiteDephasing: n.whiteDephasing, fluxNoise: n.fluxNoise, spectators: sb.spectators, spectatorLeakage: sb.spectatorLeakage, spectatorShares: sb.spectatorShares };
    },
  };
}

/** Layer indices, the top-level layers list and the layer summary against the edges. */
function layerFindings(ctx: PlanContext, plan: PlanInput, layerOf: readonly number[], edgePlans: readonly EdgePlan[], pairs: readonly [number, number][]): Finding[] {
  const out: Finding[] = [];
  const m = ctx.edges.length;
  const used = [...new Set(layerOf)].sort((a, b) => a - b);
  const count = used.length;
  const byEdge = new Map(plan.edges.map((e) => [pairKey(...e.qubits), e]));
  const pe = (k: number): PlanEdgeInput => byEdge.get(pairKey(ctx.ids[ctx.edges[k].a], ctx.ids[ctx.edges[k].b]))!;
  // every index in 0 .. L-1, no gap
  for (let k = 0; k < m; k++) {
    const l = layerOf[k];
    if (l >= count) {
      out.push({ rule: 'layer-index', qubits: [ctx.ids[ctx.edges[k].a], ctx.ids[ctx.edges[k].b]], value: l, threshold: count - 1, edge: ctx.edges[k].key,
        message: `edges[${pe(k).index}].layer: ${ctx.edges[k].key} is in layer ${l}, but the plan's gates fill ${count} layer(s), so the layers run from 0 to ${count - 1}${used.length > 1 ? ` (used: ${used.slice(0, 6).join(', ')}${used.length > 6 ? ', ...' : ''})` : ''}`,
        details: { claim: formatPath(['edges', pe(k).index, 'layer']) } });
    }
  }
  // the top-level list: layers[i].index = i, each edge once, in the layer its edge says
  if (plan.layers) {
    const listed = new Map<string, number>();
    plan.layers.forEach((l, i) => {
      if (l.index !== i) {
        out.push({ rule: 'layer-index', qubits: [], value: l.index, threshold: i,
          message: `layers[${i}].index: the plan numbers this layer ${l.index}; its position in the list is ${i}`, details: { claim: `layers[${i}].index` } });
      }
      for (const p of l.edges) {
        const key = pairKey(...p);
        if (listed.has(key)) {
          out.push({ rule: 'layer-index', qubits: [...p], value: i, threshold: listed.get(key)!,
            message: `layers[${i}]: ${p.join('-')} is listed again (first in layers[${listed.get(key)}])`, details: { claim: `layers[${i}].edges` } });
          continue;
        }
        listed.set(key, i);
        const e = byEdge.get(key);
        if (e && e.layer !== i) {
          out.push({ rule: 'layer-index', qubits: [...p], value: i, threshold: e.layer, edge: `${e.qubits[0]}-${e.qubits[1]}`,
            message: `layers[${i}] lists ${p.join('-')}, but edges[${e.index}].layer puts it in layer ${e.layer}`, details: { claim: `layers[${i}].edges` } });
        }
      }
    });
    for (const e of plan.edges) {
      if (!listed.has(pairKey(...e.qubits))) {
        out.push({ rule: 'layer-index', qubits: [...e.qubits], value: e.layer, threshold: null, edge: `${e.qubits[0]}-${e.qubits[1]}`,
          message: `layers: ${e.qubits.join('-')} is in no layer of the list (edges[${e.index}].layer says ${e.layer})`, details: { claim: 'layers' } });
      }
    }
    // gates the list puts together must not conflict either
    const listLayer = (k: number): number | undefined => listed.get(pairKey(ctx.ids[ctx.edges[k].a], ctx.ids[ctx.edges[k].b]));
    for (const [a, b] of pairs) {
      const la = listLayer(edgePlans[a].edge);
      if (la !== undefined && la === listLayer(edgePlans[b].edge) && layerOf[edgePlans[a].edge] !== layerOf[edgePlans[b].edge]) {
        out.push(conflictFinding(ctx, edgePlans, a, b, `layers[${la}]`));
      }
    }
  }
  for (const [a, b] of pairs) {
    if (layerOf[edgePlans[a].edge] === layerOf[edgePlans[b].edge]) out.push(conflictFinding(ctx, edgePlans, a, b, `layer ${layerOf[edgePlans[a].edge]}`));
  }
  if (plan.layerSummary) {
    const lowerBound = ctx.edgesOf.reduce((mx, list) => Math.max(mx, list.length), 0);
    const rows: [string, number | null, number][] = [['count', plan.layerSummary.count, count], ['lowerBound', plan.layerSummary.lowerBound, lowerBound], ['conflicts', plan.layerSummary.conflicts, pairs.length]];
    for (const [key, stated, actual] of rows) {
      if (stated !== null && stated !== actual) {
        out.push({ rule: 'layer-index', qubits: [], value: stated, threshold: actual,
          message: `layerSummary.${key}: the plan claims ${stated}; recomputed from its edges ${actual}`, details: { claim: `layerSummary.${key}` } });
      }
    }
  }
  return out;
}

function conflictFinding(ctx: PlanContext, edgePlans: readonly EdgePlan[], a: number, b: number, where: string): Finding {
  const [ea, eb] = [edgePlans[a].edge, edgePlans[b].edge];
  return { rule: 'layer-conflict', qubits: [ctx.ids[edgePlans[a].mover], ctx.ids[edgePlans[b].mover]], value: null, threshold: null, edge: ctx.edges[ea].key,
    message: `${where}: the gates on ${ctx.edges[ea].key} and ${ctx.edges[eb].key} share a qubit or a crossing and cannot run at the same time` };
}

/**
 * The number a plan states at `path`: a finite number, null, or undefined when absent. Anything
 * else is bad input, added to `problems` with its position.
 */
function statedNumber(plan: PlanInput, path: Path, problems?: Diagnostic[]): number | null | undefined {
  let v: unknown = plan.raw;
  for (const p of path) {
    if (v === null || typeof v !== 'object' || !hasOwn(v as object, String(p))) return undefined;
    v = (v as Record<string, unknown>)[p as string];
  }
  if (v === null) return null;
  if (typeof v === 'number' && Number.isFinite(v)) return v;
  const at = plan.locate(path);
  problems?.push({ file: plan.file, line: at?.line, column: at?.column, path: formatPath(path), message: `expected a number or null, found ${typeof v === 'number' ? 'a number too large to represent' : JSON.stringify(v)?.slice(0, 40) ?? String(v)}` });
  return undefined;
}

function pairKey(a: string, b: string): string {
  return a < b ? `${a}\u0000${b}` : `${b}\u0000${a}`;
}

function stubPlan(edge: number, mover: number, partner: number, crossing: '11-20' | '11-02'): EdgePlan {
  return {
    edge, mover, partner, crossing, feasible: false, crossingGHz: NaN, interactionGHz: NaN, moverInteractionFlux: NaN, moverF12AtInteractionGHz: NaN,
    crossingCouplingGHz: NaN, speedLimitNs: NaN, gAtInteractionGHz: NaN, durationNs: NaN, rampNs: NaN, parked: [], swept: [], findings: [],
    score: Infinity, reason: '', options: [],
  };
}

export type { PlanContext };
