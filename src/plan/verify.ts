/**
 * `verifyPlan`: recompute every rule from scratch on a plan read back from plan.json (for plans
 * edited by hand): the exact idle rules at the plan's parking frequencies, each edge's crossing
 * recomputed from those (it must match the plan's crossing frequency, and the interaction
 * frequency, when no gate was designed, must be that crossing, within 10 kHz: rule cz-crossing), every
 * cz rule at the plan's interaction frequency with the plan's spectator parking and ramp time
 * (with the waveform file's real sweep rates when the gate has one next to the plan), conflicts
 * between gates that share a layer, and the crowding flags. Nothing the plan claims about its
 * own rule results is trusted.
 */
import { existsSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { ChipLayout } from '../layout/types.js';
import { pairResonances } from '../pair/resonances.js';
import { parseTrajectoryCsv } from '../sim/trajectory.js';
import { buildPlanContext, type PlanContext } from './context.js';
import { calibratedZzScale, crowding } from './crowding.js';
import { exactQubitState, type ExactQubitState } from './exact-state.js';
import { freq, fromHz, ghz } from './format.js';
import type { EdgePlan, ParkedSpectator } from './interaction/plan-edge.js';
import { gatesConflict, movedQubits } from './layers.js';
import type { PlanInput } from './plan-read.js';
import { waveformSweepFindings } from './pulses.js';
import { COLLISION_RULES } from './rules/catalogue.js';
import { evaluateGate, type DuringGate, type GateScenario } from './rules/cz-evaluate.js';
import { sortFindings, type Finding } from './rules/findings.js';
import { evaluateIdle } from './rules/idle-evaluate.js';
import { tuningRoomShortfall } from './rules/tuning-room.js';
import { slotNs } from './rules/cz-duration.js';

export const VERIFY_DEFAULTS = Object.freeze({ crossingToleranceGHz: 1e-5 });

export interface VerifyResult {
  ok: boolean;
  violations: Finding[];
  flags: Finding[];
  checked: { qubits: number; edges: number; layers: number; waveforms: number };
  /** Waveform files named by the plan that were not found (their sweeps checked with the ramp estimate). */
  missingWaveforms: string[];
}

export function verifyPlan(layout: ChipLayout, plan: PlanInput, where: { dir: string }): VerifyResult {
  const ctx = buildPlanContext(layout);
  const parking = Float64Array.from(ctx.ids, (q) => fromHz(plan.qubits[q].parkingFrequency));
  const idle = evaluateIdle(ctx, parking);
  const violations: Finding[] = [...idle.violations];
  const states: ExactQubitState[] = idle.states.map((s, i) => s ?? exactQubitState(ctx.transmons[i], Math.min(ctx.transmons[i].fMaxGHz, Math.max(ctx.transmons[i].fMinGHz, parking[i])), ctx.rules.resistanceSpread));
  const edgePlans: EdgePlan[] = [];
  const layerOf: number[] = [];
  let waveforms = 0;
  const missing: string[] = [];
  const byPair = new Map(ctx.edges.map((e) => [pairKey(ctx.ids[e.a], ctx.ids[e.b]), e.index]));
  const planEdges = [...plan.edges].sort((x, y) => byPair.get(pairKey(...x.qubits))! - byPair.get(pairKey(...y.qubits))!);
  for (const pe of planEdges) {
    const edge = ctx.edges[byPair.get(pairKey(...pe.qubits))!];
    const mover = ctx.index.get(pe.mover)!;
    const partner = mover === edge.a ? edge.b : edge.a;
    const key = edge.key;
    const res = pairResonances(ctx.transmons[mover], ctx.transmons[partner], states[partner].flux, edge.gChargeGHz)[pe.crossing];
    const range = ctx.ranges[mover];
    layerOf[edge.index] = pe.layer;
    const short = res && res.moverF01GHz >= range.lo - 1e-9 ? tuningRoomShortfall(range, states[mover].f01GHz, res.moverF01GHz, res.couplingGHz) : 0;
    if (!res || res.moverF01GHz < range.lo - 1e-9 || short > 0) {
      const why = short > 0 ? ` with room to tune past it (less than one splitting inside its planning range)` : '';
      violations.push({ rule: 'cz-range', qubits: [pe.mover, ctx.ids[partner]], value: res?.moverF01GHz ?? null, threshold: null, edge: key,
        message: `${pe.mover} cannot reach the ${pe.crossing} crossing with ${ctx.ids[partner]} parked at ${ghz(parking[partner])}${why}` });
      edgePlans[edge.index] = stubPlan(edge.index, mover, partner, pe.crossing);
      continue;
    }
    const tol = VERIFY_DEFAULTS.crossingToleranceGHz;
    const crossing = res.moverF01GHz;
    const stated = pe.crossingFrequency != null ? fromHz(pe.crossingFrequency) : null;
    if (stated !== null && Math.abs(stated - crossing) > tol) {
      violations.push({ rule: 'cz-crossing', qubits: [pe.mover, ctx.ids[partner]], value: stated, threshold: crossing, edge: key,
        message: `${key}: the plan's ${pe.crossing} crossing ${ghz(stated, 6)} no longer matches the parking frequencies (now ${ghz(crossing, 6)}, ${freq(stated - crossing)} off); re-plan this edge` });
    }
    // Without a designed gate the interaction point is the crossing itself; a designed gate sits
    // at its own offset from the exact (dressed) crossing, which the stated crossing pins down.
    const to = pe.interactionFrequency !== null ? fromHz(pe.interactionFrequency) : crossing;
    if (!pe.gate && Math.abs(to - crossing) > tol) {
      violations.push({ rule: 'cz-crossing', qubits: [pe.mover, ctx.ids[partner]], value: to, threshold: crossing, edge: key,
        message: `${key}: the interaction frequency ${ghz(to, 6)} is not the ${pe.crossing} crossing at the parking frequencies (${ghz(crossing, 6)})` });
    }
    const toFlux = ctx.transmons[mover].fluxForF01OrNull(to);
    if (toFlux === null) {
      violations.push({ rule: 'cz-range', qubits: [pe.mover], value: to, threshold: null, edge: key, message: `${pe.mover} cannot reach the interaction frequency ${ghz(to)}` });
      edgePlans[edge.index] = stubPlan(edge.index, mover, partner, pe.crossing);
      continue;
    }
    const parked = new Map<number, DuringGate>();
    const parkedInfo: ParkedSpectator[] = [];
    for (const [s, fHz] of Object.entries(pe.spectatorParking).sort((a, b) => ctx.index.get(a[0])! - ctx.index.get(b[0])!)) {
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
      fromGHz: parking[mover], toGHz: to, moverF12AtToGHz: ctx.transmons[mover].spectrum(toFlux).f12GHz,
      crossingCouplingGHz: res.couplingGHz, rampNs, spectatorRampNs, parking: states.map((s) => ({ f01GHz: s.f01GHz, f12GHz: s.f12GHz })), parked,
    };
    const ev = evaluateGate(ctx, scenario);
    const wfPath = pe.gate?.waveform;
    let waveform: { timeNs: Float64Array; flux: Float64Array } | null = null;
    if (wfPath) {
      const full = resolve(where.dir, wfPath);
      if (existsSync(full)) {
        waveform = parseTrajectoryCsv(readFileSync(full, 'utf8'), wfPath);
        waveforms++;
      } else missing.push(wfPath);
    }
    for (const f of ev.findings) {
      if (waveform && f.rule.startsWith('cz-swept-') && f.qubits[0] === pe.mover) continue;
      if (pe.gate?.duration != null && f.rule === 'cz-duration') continue;
      const { blame: _b, ...rest } = f;
      violations.push(rest);
    }
    if (waveform) violations.push(...waveformSweepFindings(ctx, mover, key, ev.swept, waveform));
    if (pe.gate && pe.gate.feasible === false) {
      violations.push({ rule: 'cz-design', qubits: [pe.mover, ctx.ids[partner]], value: null, threshold: null, edge: key,
        message: `the plan's CZ design for ${key} is marked infeasible${pe.gate.reason ? `: ${pe.gate.reason}` : ''}` });
    }
    if (pe.gate?.duration != null) {
      const total = slotNs(pe.gate.duration * 1e9, parked.size > 0, spectatorRampNs, ctx.rules);
      if (total > ctx.rules.maxGateNs + 1e-9) violations.push({ rule: 'cz-duration', qubits: [pe.mover, ctx.ids[partner]], value: total, threshold: ctx.rules.maxGateNs, edge: key, message: `the designed CZ on ${key} takes ${total.toFixed(1)} ns with its spectator moves; the limit is ${ctx.rules.maxGateNs} ns` });
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
  }
  // Layers: gates sharing one must not conflict.
  const f12 = states.map((s) => s.f12GHz);
  const moved = edgePlans.map((p) => movedQubits(ctx, p, f12, parking));
  const layerIds = [...new Set(layerOf)].sort((a, b) => a - b);
  for (const layer of layerIds) {
    const members = edgePlans.map((_, k) => k).filter((k) => layerOf[k] === layer);
    for (let i = 0; i < members.length; i++) {
      for (let j = i + 1; j < members.length; j++) {
        const [a, b] = [members[i], members[j]];
        if (gatesConflict(ctx, edgePlans[a], moved[a], edgePlans[b], moved[b])) {
          violations.push({ rule: 'layer-conflict', qubits: [ctx.ids[edgePlans[a].mover], ctx.ids[edgePlans[b].mover]], value: null, threshold: null, edge: ctx.edges[a].key,
            message: `layer ${layer}: the gates on ${ctx.edges[a].key} and ${ctx.edges[b].key} share a qubit or a crossing and cannot run at the same time` });
        }
      }
    }
  }
  const crowd = crowding(ctx, parking, states, calibratedZzScale(ctx, parking, idle.zzGHz), edgePlans);
  const order = COLLISION_RULES.map((r) => r.name);
  const v = sortFindings(violations, order);
  return {
    ok: v.length === 0,
    violations: v,
    flags: sortFindings(crowd.flags, order),
    checked: { qubits: ctx.n, edges: edgePlans.length, layers: layerIds.length, waveforms },
    missingWaveforms: missing,
  };
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
