/**
 * One gate design as JSON (SI units: s, Hz, rad): the `gate` object of each edge in plan.json.
 * NaN and infinite numbers (a design that failed has them) become null.
 */
import { plain, toHz, toSeconds } from '../plan/format.js';
import type { GateBudget } from '../plan/gate-budget.js';
import { designBudgetJson, gateBudgetJson } from './budget-json.js';
import type { GateDesign } from '../plan/gate-seam.js';

/** NaN and infinite numbers become null (JSON has no NaN; a design that failed has none). */
export function nanToNull(x: unknown): unknown {
  if (typeof x === 'number') return Number.isFinite(x) ? x : null;
  if (Array.isArray(x)) return x.map(nanToNull);
  if (x && typeof x === 'object' && !(x instanceof Float64Array)) return Object.fromEntries(Object.entries(x).map(([k, v]) => [k, nanToNull(v)]));
  return x;
}

/**
 * A design's JSON fields (SI): `waveform` the file of the flux the mover sees (what `fluxlane
 * simulate` reads) and `awgProgram` the AWG program of the slot, both relative to the plan's
 * folder and present only when the files are written; `targetPhase` the conditional phase the
 * design aimed at.
 */
export function gateJson(edge: [string, string], d: GateDesign, files: { qubit: string; awg: string } | null, targetPhase = Math.PI, budget?: GateBudget | null): Record<string, unknown> {
  const out: Record<string, unknown> = nanToNull({
    edge,
    mover: d.mover,
    family: d.family,
    rampTime: toSeconds(d.rampNs),
    holdTime: toSeconds(d.holdNs),
    duration: toSeconds(d.durationNs),
    interactionFrequency: toHz(d.interactionFrequencyGHz),
    crossingOffset: toHz(d.crossingOffsetGHz),
    targetPhase: plain(targetPhase),
    conditionalPhase: plain(d.conditionalPhase),
    leakage: plain(d.leakage),
    fidelity: plain(d.fidelity),
    fidelityNoisy: d.fidelityNoisy === undefined ? null : plain(d.fidelityNoisy),
    fidelityNoisyMethod: d.fidelityNoisyMethod ?? null,
    virtualZ: { a: plain(d.virtualZ.a), b: plain(d.virtualZ.b) },
    speedLimit: toSeconds(d.speedLimitNs),
    untuned: { conditionalPhase: plain(d.untuned.conditionalPhase), leakage: plain(d.untuned.leakage), fidelity: plain(d.untuned.fidelity) },
    feasible: d.feasible,
  }) as Record<string, unknown>;
  if (d.decoherenceEstimate !== undefined) out.decoherenceEstimate = plain(d.decoherenceEstimate);
  if (Number.isFinite(d.crossingFrequencyGHz)) out.exactCrossingFrequency = toHz(d.crossingFrequencyGHz);
  if (Number.isFinite(d.gapGHz)) out.gap = toHz(d.gapGHz);
  if (d.reason !== undefined) out.reason = d.reason;
  if (files !== null) {
    out.waveform = files.qubit;
    out.awgProgram = files.awg;
  }
  if (d.simulatedSpectators && d.simulatedSpectators.length > 0) out.simulatedSpectators = d.simulatedSpectators.map((s) => ({ qubit: s.qubit, flux: s.flux }));
  if (d.notes && d.notes.length > 0) out.notes = [...d.notes];
  if (budget) out.budget = gateBudgetJson(budget);
  else if (d.budget) out.budget = designBudgetJson(d.budget);
  return out;
}
