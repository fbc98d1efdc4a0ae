/**
 * Up-front bounds on the work of a command: before a command starts its real work it estimates,
 * from its inputs alone, how long that work takes, and refuses (exit 2, one clear message) what
 * lies beyond the documented limits:
 *
 *   - hard limits (memory, or work that grows too steeply to estimate): at most MAX_QUBITS qubits
 *     for the planning commands (check, plan, verify), at most MAX_DEGREE couplings per qubit;
 *   - a time limit: the estimated seconds must not exceed `--max-seconds` (default
 *     DEFAULT_MAX_SECONDS); a user who wants more passes a larger value.
 *
 * The estimates are simple models fitted to runs on the development machine (2 cores, shared,
 * Node 20, December 2026; see the README's "Guarantees and limits"); they are meant to be right
 * within a factor of about 3, which is what a refusal needs: the limits guard against work of
 * minutes to days, never against a few seconds more or less.
 */
import { availableParallelism } from 'node:os';
import type { ChipLayout, Rules } from '../layout/types.js';
import { InputError } from '../util/errors.js';
import { MAX_SCHEDULE_STEPS, scheduleTooLong } from '../sim/propagate-frame.js';

/** Seconds of work a command may plan for without --max-seconds. */
export const DEFAULT_MAX_SECONDS = 300;

/** Most qubits check, plan and verify take (memory: about 250 kB per qubit, 2.4 GB at 10,000). */
export const MAX_QUBITS = 12_000;

/**
 * Most couplings of one qubit. Planar chips with fixed couplers have 2 to 6 (heavy-hex 3, square
 * 4, triangular 6; common practice); the parking search's work grows steeply beyond (measured:
 * fully coupled 8 qubits, degree 7: 5 s; 10 qubits, degree 9: 30-78 s; 20 qubits: no answer in
 * 120 s).
 */
export const MAX_DEGREE = 6;

/** Model constants (seconds), fitted on the development machine. */
export const WORK_MODEL = Object.freeze({
  /** Planner (parking, interaction plan, layers, crowding): per qubit and per qubit squared. */
  plannerPerQubit: 0.015,
  plannerPerQubitSquared: 6e-6,
  /** One CZ design at the default rules (2.4 GS/s, 1 GHz line, maxGate 100 ns): about 1,600 fine samples. */
  designSeconds: 0.1,
  designSamples: 1600,
  /** Lindblad instead of the first-order estimate for fidelityNoisy. */
  lindbladFactor: 8,
  /** A spectator simulated as a third transmon. */
  spectatorFactor: 3,
  /** One simulated step of the frame propagator (6 mover levels, no noise). */
  stepSeconds: 60e-6,
  /** Lindblad noise per step. */
  noisyStepFactor: 20,
  /** Re-simulating one waveform sample in verify. */
  resimPerSample: 1e-4,
  /** Reading a layout, per byte. */
  layoutPerByte: 1.5e-6,
});

/** An estimate: seconds, and what they come from (for the message). */
export interface WorkEstimate {
  seconds: number;
  what: string;
}

/** Refuse an estimate over `maxSeconds` (the option's value, else the default). */
export function enforceWork(estimate: WorkEstimate, maxSeconds: number | undefined, command: string): void {
  const limit = maxSeconds ?? DEFAULT_MAX_SECONDS;
  if (estimate.seconds <= limit) return;
  const shown = estimate.seconds < 1e6 ? `${Math.ceil(estimate.seconds)} s` : `${estimate.seconds.toExponential(1)} s`;
  throw new InputError({
    message: `${command}: expected work of at most ${limit} s (--max-seconds), found an estimated ${shown} for ${estimate.what}; pass --max-seconds ${Math.min(86_400, Math.ceil(estimate.seconds * 1.5))} to run it anyway${estimate.seconds > 86_400 ? ' (more than a day: split the input instead)' : ''}`,
  });
}

/** The hard limits of the planning commands: qubit count and couplings per qubit. */
export function enforceChipLimits(layout: ChipLayout, command: string): void {
  if (layout.qubits.length > MAX_QUBITS) {
    throw new InputError({ file: layout.file, message: `${command}: expected a chip of at most ${MAX_QUBITS} qubits (memory: about 250 kB per qubit), found ${layout.qubits.length}` });
  }
  const degree = new Map<string, number>();
  for (const c of layout.couplings) {
    degree.set(c.a, (degree.get(c.a) ?? 0) + 1);
    degree.set(c.b, (degree.get(c.b) ?? 0) + 1);
  }
  let worst: [string, number] | null = null;
  for (const [q, d] of degree) if (!worst || d > worst[1]) worst = [q, d];
  if (worst && worst[1] > MAX_DEGREE) {
    const q = layout.qubits.find((x) => x.id === worst![0])!;
    throw new InputError({
      file: layout.file, line: q.source.line || undefined, column: q.source.column || undefined, path: q.source.path,
      message: `expected at most ${MAX_DEGREE} couplings per qubit (planar chips with fixed couplers have 2 to 6; the parking search grows too steeply beyond), found ${worst[1]} on ${worst[0]}`,
    });
  }
}

function maxDegree(layout: ChipLayout): number {
  const degree = new Map<string, number>();
  let m = 0;
  for (const c of layout.couplings) {
    for (const q of [c.a, c.b]) {
      const d = (degree.get(q) ?? 0) + 1;
      degree.set(q, d);
      m = Math.max(m, d);
    }
  }
  return m;
}

/** The planner on a chip (check, plan --no-pulses, the first part of plan). */
export function plannerWork(layout: ChipLayout): WorkEstimate {
  const n = layout.qubits.length;
  const degreeFactor = Math.max(1, (maxDegree(layout) / 4) ** 2);
  const seconds = (WORK_MODEL.plannerPerQubit * n + WORK_MODEL.plannerPerQubitSquared * n * n) * degreeFactor;
  return { seconds, what: `planning ${n} qubits and ${layout.couplings.length} couplings` };
}

/** Expected gate duration bound (ns): ramps and holds grow as 1/g; never above maxGate. */
function designDurationNs(rules: Pick<Rules, 'maxGateNs'>, gGHz: number): number {
  return Math.min(rules.maxGateNs, 100 + 3 / (2 * Math.SQRT2 * gGHz));
}

/** One CZ design (gate, and each edge of plan with pulses). */
export function designSeconds(rules: Pick<Rules, 'maxGateNs' | 'sampleRateGHz' | 'fluxBandwidthGHz'>, gGHz: number, options: { lindblad?: boolean; spectators?: number } = {}): number {
  const fs = rules.sampleRateGHz;
  const fineRate = Math.max(1, Math.ceil(16 / fs - 1e-9)) * fs;
  const samples = designDurationNs(rules, gGHz) * fineRate;
  const bw = rules.fluxBandwidthGHz;
  const reachSamples = bw !== undefined && bw > 0 ? 16 * (Math.sqrt(Math.LN2) / (2 * Math.PI * bw)) * fs : 0;
  let s = WORK_MODEL.designSeconds * (samples / WORK_MODEL.designSamples) * (1 + reachSamples / 250);
  if (options.lindblad) s *= WORK_MODEL.lindbladFactor;
  s *= WORK_MODEL.spectatorFactor ** (options.spectators ?? 0);
  return s;
}

/** `plan`: the planner plus a design per edge on `threads` threads. */
export function planWork(layout: ChipLayout, pulses: { lindblad?: boolean; spectators?: boolean; threads: number } | null): WorkEstimate {
  const planner = plannerWork(layout);
  if (!pulses) return planner;
  let designs = 0;
  for (const c of layout.couplings) designs += designSeconds(layout.rules, c.gGHz, { lindblad: pulses.lindblad, spectators: pulses.spectators ? 1 : 0 });
  const parallel = Math.max(1, Math.min(pulses.threads, availableParallelism()));
  return {
    seconds: planner.seconds + designs / parallel,
    what: `${planner.what}, with ${layout.couplings.length} CZ designs${pulses.lindblad ? ' (Lindblad)' : ''} on ${parallel} thread(s)`,
  };
}

/** `simulate`: the frame propagator over a trajectory (steps of at most 0.2 ns and 0.25 GHz of E_J). */
export function simulateWork(timeNs: ArrayLike<number>, flux: ArrayLike<number>, ejGHz: (k: number) => number, options: { levels: number; noise: boolean; spectators: number; file?: string }): WorkEstimate {
  // at most as many as src/sim/propagate-frame.ts stepSchedule makes: a segment of constant flux is
  // one exact step (0.25 ns pieces with noise; without noise a run of them is one), any other at
  // most 0.2 ns and 0.25 GHz of E_J per step
  let steps = 0;
  for (let k = 1; k < timeNs.length; k++) {
    const dt = timeNs[k] - timeNs[k - 1];
    if (flux[k] === flux[k - 1]) steps += options.noise ? Math.max(1, Math.ceil(dt / 0.25)) : 1;
    else steps += Math.max(1, Math.ceil(dt / 0.2), Math.ceil(Math.abs(ejGHz(k) - ejGHz(k - 1)) / 0.25));
  }
  if (steps > MAX_SCHEDULE_STEPS) throw scheduleTooLong(steps, timeNs[timeNs.length - 1] - timeNs[0], options.file);
  let s = steps * WORK_MODEL.stepSeconds * (options.levels / 6) ** 3 * WORK_MODEL.spectatorFactor ** options.spectators;
  if (options.noise) s *= WORK_MODEL.noisyStepFactor;
  return { seconds: s, what: `a trajectory of ${timeNs.length} samples needing about ${steps.toExponential(2)} propagator steps${options.noise ? ' with Lindblad noise' : ''}` };
}

/** `verify`: the planner's checks without the search, and the re-simulation of every waveform. */
export function verifyWork(layout: ChipLayout, waveformBytes: number): WorkEstimate {
  const planner = plannerWork(layout);
  const samples = waveformBytes / 40;
  return {
    seconds: planner.seconds * 0.3 + samples * WORK_MODEL.resimPerSample,
    what: `checking ${layout.qubits.length} qubits and re-simulating about ${Math.round(samples)} waveform samples`,
  };
}
