/**
 * An edge of an earlier plan, kept: its interaction plan (mover, crossing, destination, the
 * spectators it moves and where, the plan's ramp) evaluated again with every CZ rule in the new
 * context (src/plan/rules/cz-evaluate.ts), and its designed gate read back from plan.json and its
 * two waveform files (src/report/waveform-files.ts writes them). Each returns what it could not
 * keep and why instead of a result.
 */
import { existsSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { pairResonances } from '../../pair/resonances.js';
import { lineDelayNs } from '../../gate/pulse.js';
import { parseTrajectoryCsv } from '../../sim/trajectory.js';
import type { GateDesign } from '../gate-seam.js';
import type { EdgeContext, EdgePlan, ParkedSpectator } from '../interaction/plan-edge.js';
import type { PlanDocumentEdge as PlanEdgeInput } from '../plan-read.js';
import { evaluateGate, type DuringGate, type GateScenario } from '../rules/cz-evaluate.js';
import { spectatorMoveNs } from '../rules/cz-duration.js';

/**
 * The earlier plan's interaction plan of ctx edge `edge` with the findings of the CZ rules on it
 * now (none: it still holds), or why it cannot even be rebuilt.
 */
export function keptEdgePlan(ec: EdgeContext, edge: number, entry: PlanEdgeInput, fresh: EdgePlan): { plan: EdgePlan } | { why: string } {
  const { ctx } = ec;
  const e = ctx.edges[edge];
  const mover = ctx.index.get(entry.mover)!;
  const partner = mover === e.a ? e.b : e.a;
  if (entry.interactionFrequency === null) return { why: 'the earlier plan had no interaction point for it' };
  const res = pairResonances(ctx.transmons[mover], ctx.transmons[partner], ec.states[partner].flux, e.gChargeGHz)[entry.crossing];
  if (!res) return { why: `the ${entry.crossing} crossing is out of ${entry.mover}'s range now` };
  const to = entry.interactionFrequency * 1e-9;
  const toFlux = ctx.transmons[mover].fluxForF01OrNull(to);
  if (toFlux === null) return { why: `${entry.mover} cannot reach its earlier interaction frequency now` };
  const parked = new Map<number, DuringGate>();
  const parkedInfo: ParkedSpectator[] = [];
  for (const [s, fHz] of Object.entries(entry.spectatorParking)) {
    const q = ctx.index.get(s)!;
    const t = ctx.transmons[q];
    const flux = t.fluxForF01OrNull(fHz * 1e-9);
    if (flux === null) return { why: `spectator ${s} cannot reach its earlier temporary frequency now` };
    const f12 = t.spectrum(flux).f12GHz;
    parked.set(q, { f01GHz: fHz * 1e-9, f12GHz: f12 });
    parkedInfo.push({ qubit: q, fGHz: fHz * 1e-9, flux, f12GHz: f12, reason: 'kept from the earlier plan' });
  }
  parkedInfo.sort((a, b) => a.qubit - b.qubit);
  const rampNs = entry.rampTime * 1e9;
  const designRampNs = entry.gate?.rampTime != null ? entry.gate.rampTime * 1e9 : rampNs;
  const scenario: GateScenario = {
    edge, mover, partner, crossing: entry.crossing,
    fromGHz: ec.states[mover].f01GHz, toGHz: to, moverF12AtToGHz: ctx.transmons[mover].spectrum(toFlux).f12GHz,
    crossingCouplingGHz: res.couplingGHz, rampNs: designRampNs, spectatorRampNs: rampNs,
    parking: ec.states.map((st) => ({ f01GHz: st.f01GHz, f12GHz: st.f12GHz })), parked,
  };
  const ev = evaluateGate(ctx, scenario);
  // a designed gate's duration and its mover's sweeps are checked on its waveform (src/plan/pulses.ts)
  const findings = ev.findings.filter((f) => !(entry.gate && (f.rule === 'cz-duration' || (f.rule.startsWith('cz-swept-') && f.qubits[0] === entry.mover))));
  const atFlux = toFlux;
  const fluxA = mover === e.a ? atFlux : ec.states[e.a].flux;
  const fluxB = mover === e.b ? atFlux : ec.states[e.b].flux;
  const same = fresh.mover === mover && fresh.crossing === entry.crossing;
  return {
    plan: {
      edge, mover, partner, crossing: entry.crossing, feasible: findings.length === 0,
      crossingGHz: res.moverF01GHz, interactionGHz: to, moverInteractionFlux: atFlux, moverF12AtInteractionGHz: scenario.moverF12AtToGHz,
      crossingCouplingGHz: res.couplingGHz, speedLimitNs: 1 / (2 * res.couplingGHz), gAtInteractionGHz: ctx.pair(edge).exchangeCoupling(fluxA, fluxB),
      durationNs: ev.durationNs, rampNs, parked: parkedInfo, swept: ev.swept, findings, score: same ? fresh.score : NaN,
      reason: `kept from the earlier plan: ${entry.mover} moves to the ${entry.crossing} crossing with ${ctx.ids[partner]}${parkedInfo.length > 0 ? `, with ${parkedInfo.map((p) => ctx.ids[p.qubit]).join(', ')} moved out of the way` : ''}`,
      options: fresh.options,
    },
  };
}

/** Read a waveform CSV's columns (comments skipped): header names and numbers. */
function readColumns(text: string, file: string): { head: string[]; rows: number[][] } {
  const lines = text.split(/\r?\n/).filter((l) => l.trim() !== '' && !l.trimStart().startsWith('#'));
  if (lines.length < 2) throw new Error(`${file}: no samples`);
  const head = lines[0].split(',').map((s) => s.trim());
  return { head, rows: lines.slice(1).map((l) => l.split(',').map(Number)) };
}

/**
 * The earlier plan's design of an edge, from plan.json's gate entry and its two waveform files in
 * the earlier plan's folder, or why it cannot be kept. Fields plan.json does not carry
 * (populations, the idle estimate) are NaN.
 */
export function keptDesign(ec: EdgeContext, edge: number, entry: PlanEdgeInput, oldDir: string): { design: GateDesign } | { why: string } {
  const { ctx } = ec;
  const g = entry.gate as (Record<string, any> & PlanEdgeInput['gate']) | null | undefined;
  if (!g) return { why: 'the earlier plan designed no gate for it' };
  if (g.feasible === false) return { why: 'its earlier design was infeasible' };
  if (!g.waveform || !g.awgProgram) return { why: 'the earlier plan wrote no waveform files for it' };
  const qubitFile = resolve(oldDir, g.waveform);
  const awgFile = resolve(oldDir, g.awgProgram);
  if (!existsSync(qubitFile) || !existsSync(awgFile)) return { why: `its waveform files are not next to the earlier plan (${g.waveform}, ${g.awgProgram})` };
  const waveform = parseTrajectoryCsv(readFileSync(qubitFile, 'utf8'), g.waveform);
  const slot = readColumns(readFileSync(awgFile, 'utf8'), g.awgProgram);
  const column = slot.head.indexOf(`${entry.mover}_flux_phi0`);
  if (column < 0) return { why: `${g.awgProgram} has no column of ${entry.mover}` };
  const r = ctx.rules;
  const fs = r.sampleRateGHz;
  const pad = Math.round(lineDelayNs(fs, r.fluxBandwidthGHz) * fs);
  const moves = Object.keys(entry.spectatorParking).length > 0 ? Math.round(spectatorMoveNs(entry.rampTime * 1e9, r) * fs) : 0;
  const start = pad + moves;
  const end = slot.rows.length - 1 - pad - moves;
  if (!(end > start)) return { why: `${g.awgProgram} does not hold the gate's program` };
  const awg = Float64Array.from(slot.rows.slice(start, end + 1), (row) => row[column]);
  const mover = ctx.transmons[ctx.index.get(entry.mover)!];
  const num = (x: unknown, scale = 1): number => (typeof x === 'number' ? x * scale : NaN);
  const crossingGHz = num(g.exactCrossingFrequency, 1e-9);
  const design: GateDesign = {
    mover: entry.mover,
    family: String(g.family ?? '-'),
    rampNs: num(g.rampTime, 1e9),
    holdNs: num(g.holdTime, 1e9),
    durationNs: num(g.duration, 1e9),
    interactionFrequencyGHz: num(g.interactionFrequency, 1e-9),
    crossingOffsetGHz: num(g.crossingOffset, 1e-9),
    conditionalPhase: num(g.conditionalPhase),
    leakage: num(g.leakage),
    fidelity: num(g.fidelity),
    virtualZ: { a: num(g.virtualZ?.a), b: num(g.virtualZ?.b) },
    speedLimitNs: num(g.speedLimit, 1e9),
    untuned: { conditionalPhase: num(g.untuned?.conditionalPhase), leakage: num(g.untuned?.leakage), fidelity: num(g.untuned?.fidelity) },
    waveform,
    feasible: true,
    crossingFlux: Number.isFinite(crossingGHz) ? (mover.fluxForF01OrNull(crossingGHz) ?? NaN) : NaN,
    crossingFrequencyGHz: crossingGHz,
    gapGHz: num(g.gap, 1e-9),
    populations: { '20': NaN, '02': NaN },
    idleErrorEstimate: NaN,
    evaluations: 0,
    awg: { sampleRateGHz: fs, lineDelayNs: lineDelayNs(fs, r.fluxBandwidthGHz), flux: awg },
  };
  if (typeof g.targetPhase === 'number') design.targetPhase = g.targetPhase;
  if (typeof g.fidelityNoisy === 'number') design.fidelityNoisy = g.fidelityNoisy;
  if (g.fidelityNoisyMethod === 'lindblad' || g.fidelityNoisyMethod === 'estimate') design.fidelityNoisyMethod = g.fidelityNoisyMethod;
  if (typeof g.decoherenceEstimate === 'number') design.decoherenceEstimate = g.decoherenceEstimate;
  // the gate stage's part of its error budget, as the earlier plan recorded it
  const b = g.budget as Record<string, any> | null | undefined;
  if (b && typeof b.total === 'number') {
    const shares = Array.isArray(b.spectatorShares) ? b.spectatorShares.map((x: any) => ({ qubit: String(x.qubit), error: num(x.error), leakage: num(x.leakage), reduced: x.reducedModel === 'manifolds' || x.reducedModel === 'mover-levels' || x.reducedModel === 'moving-basis' || x.reducedModel === 'estimate' ? x.reducedModel : 'none' })) : [];
    design.budget = {
      coherent: num(b.coherent), t1: num(b.t1), whiteDephasing: num(b.whiteDephasing), fluxNoise: num(b.fluxNoise),
      fluxNoiseSplit: { mover: NaN, partner: NaN, moverSigma: NaN, partnerSigma: NaN },
      spectators: num(b.spectators), spectatorLeakage: typeof b.spectatorLeakage === 'number' ? b.spectatorLeakage : NaN, spectatorShares: shares,
    };
  }
  return { design };
}
