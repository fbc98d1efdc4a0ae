/**
 * The claims a plan makes and how `fluxlane verify` recomputes each one: one table of
 * (claim, recompute, tolerance). A claim is a number the plan states (a gate's fidelity, an edge's
 * interaction frequency, a qubit's f12, ...); `recompute` derives the same number from the layout
 * and the files the plan names, without reading the claim; the claim holds when the two agree
 * within the tolerance |stated - recomputed| <= abs + rel * max(|stated|, |recomputed|) (phases
 * are compared modulo 2 pi). A claim that does not hold is a `plan-claim` violation naming its
 * path in plan.json, both values and the tolerance.
 *
 * Scopes: `plan` (top level), `qubit` (qubits.<id>), `edge` (edges[k]) and `gate` (edges[k].gate,
 * recomputed from its waveform file: the gate stage's simulator, src/sim/simulate-gate.ts, on the
 * model the designer used, src/sim/pair-model.ts, re-run on the file's samples). Adding a claim is
 * one entry in CLAIMS; its recomputation gets what it needs from the scope's environment.
 *
 * Tolerances: the re-simulation of a plan's own waveform reproduces the designer's numbers to
 * about 1e-8 rad in phases and 1e-12 in fidelities (the frame is tabulated over the waveform's
 * own E_J range instead of the designer's wider one); plan.json keeps 12 significant digits.
 * The tolerances below sit well above both and far below any edit that matters.
 */
import type { ExactQubitState } from './exact-state.js';
import type { PlanContext } from './context.js';
import type { QubitCrowding } from './crowding.js';
import type { PlanEdgeInput, PlanInput } from './plan-read.js';
import { slotNs } from './rules/cz-duration.js';
import type { Trajectory } from '../sim/trajectory.js';
import type { GateSimulation } from '../sim/simulate-gate.js';
import type { WaveformNoiseBudget } from '../budget/waveform-budget.js';
import type { RecomputedBudget } from './verify-budget.js';
import type { GateBudget } from './gate-budget.js';
import type { QubitIdleBudget } from './cycle-budget.js';

export type ClaimScope = 'plan' | 'qubit' | 'edge' | 'gate';
export type ClaimUnit = 'Hz' | 's' | 'rad' | 'Phi0' | '1';

/** What a claim's recomputation can use: the whole plan, and per scope its qubit or edge. */
export interface ClaimEnv {
  ctx: PlanContext;
  plan: PlanInput;
  /** Exact state of each qubit at the plan's parking frequency. */
  states: readonly ExactQubitState[];
  /** Exact static ZZ of each layout edge at the parking frequencies (GHz). */
  zzGHz: Float64Array;
  /** Margins recomputed by verify (per qubit, layout order). */
  crowding: readonly QubitCrowding[];
  /** The error budget recomputed by verify (./verify-budget.ts; gates by layout edge index). */
  budget: RecomputedBudget;
  /** qubit scope: the qubit's index. */
  qubit?: number;
  /** edge and gate scopes: the plan's edge and its layout edge index, mover and partner. */
  edge?: {
    input: PlanEdgeInput;
    index: number;
    mover: number;
    partner: number;
    /** The interaction frequency the gate really reaches (GHz): its waveform's plateau, else the plan's value. */
    interactionGHz: number;
    interactionFlux: number;
    /** Spectators moved for the gate. */
    parkedCount: number;
  };
  /** gate scope: the waveform the plan names and its re-simulation (computed on first use). */
  gate?: {
    waveform: Trajectory;
    /** Duration of the samples (ns). */
    durationNs: number;
    simulation(): GateSimulation;
    /** The gate stage's noise terms on the waveform (null when the plan claims no noisy fidelity). */
    noise(): WaveformNoiseBudget | null;
    /** 'estimate' or 'lindblad' when the plan claims a noisy fidelity. */
    noisyMethod: 'estimate' | 'lindblad' | null;
  };
}

export interface Claim {
  scope: ClaimScope;
  /** Path of the claim below its scope's object in plan.json (e.g. ['fidelity'] in a gate). */
  path: readonly (string | number)[];
  /** The quantity in words (messages). */
  what: string;
  unit: ClaimUnit;
  /** Where the recomputed value comes from, in words (messages). */
  from: string;
  /**
   * The claim recomputed, in plan.json's unit (SI); null when the plan's value should be null
   * (nothing to claim), undefined when this environment cannot recompute it (skipped).
   */
  recompute(env: ClaimEnv): number | null | undefined;
  tolerance: { abs: number; rel?: number };
  /** Compare modulo 2 pi (phases). */
  periodic?: boolean;
}

const GHZ = 1e9;
const NS = 1e-9;
const resim = 'the waveform re-simulated';

function sim(env: ClaimEnv): GateSimulation {
  return env.gate!.simulation();
}

function qubitState(env: ClaimEnv): ExactQubitState {
  return env.states[env.qubit!];
}

/** Finite numbers only: a recomputation that gives NaN has nothing to say. */
function finite(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}

const BUDGET_FROM = 'the budget recomputed from the layout, the plan\'s choices and its waveforms';

/**
 * The budget's tolerance: the re-simulation reproduces the gate stage's terms to about 1e-10 (the
 * frame tabulated over the waveform's own E_J range), the rest is the same arithmetic on the same
 * recomputed inputs; plan.json keeps 12 significant digits.
 */
const BUDGET_TOLERANCE = { abs: 1e-9, rel: 1e-6 };

const GATE_BUDGET_TERMS: readonly [keyof GateBudget & string, string][] = [
  ['coherent', 'coherent error'], ['t1', 'T1'], ['whiteDephasing', 'white dephasing'], ['fluxNoise', 'quasi-static flux noise'],
  ['spectators', 'spectators'], ['sweptCrossings', 'swept crossings'], ['spectatorMoves', 'spectator moves'], ['total', 'total'],
  ['spectatorLeakage', 'leakage the spectators add'],
];

const IDLE_TERMS: readonly [Exclude<keyof QubitIdleBudget, 'idleNs'> | 'idleTime', string][] = [
  ['t1', 'T1'], ['dephasing', 'dephasing'], ['zz', 'residual ZZ'], ['thermal', 'thermal excitation'], ['total', 'total'], ['idleTime', 'idle time in the cycle'],
];

function gateBudgetTerm(env: ClaimEnv, key: keyof GateBudget & string): number | null {
  const b = env.budget.gates[env.edge!.index];
  if (!b) return null;
  const v = b[key];
  return typeof v === 'number' ? finite(v) : null;
}

/** The claims verify checks, by scope. The lead's error budget adds its rows here. */
export const CLAIMS: readonly Claim[] = [
  // qubits.<id>: the transmon at its parking frequency (exact spectrum, src/plan/exact-state.ts)
  { scope: 'qubit', path: ['parkingFlux'], what: 'parking flux', unit: 'Phi0', from: 'the parking frequency', tolerance: { abs: 1e-7 },
    recompute: (env) => qubitState(env).flux },
  { scope: 'qubit', path: ['f12'], what: 'f12 at parking', unit: 'Hz', from: 'the parking frequency', tolerance: { abs: 1e3, rel: 1e-9 },
    recompute: (env) => qubitState(env).f12GHz * GHZ },
  { scope: 'qubit', path: ['anharmonicity'], what: 'anharmonicity at parking', unit: 'Hz', from: 'the parking frequency', tolerance: { abs: 1e3, rel: 1e-9 },
    recompute: (env) => qubitState(env).anharmonicityGHz * GHZ },
  { scope: 'qubit', path: ['fabricationSpread'], what: 'expected frequency spread', unit: 'Hz', from: 'the parking frequency', tolerance: { abs: 1e3, rel: 1e-6 },
    recompute: (env) => qubitState(env).sigmaGHz * GHZ },
  { scope: 'qubit', path: ['t1'], what: 'T1', unit: 's', from: 'the layout', tolerance: { abs: 0, rel: 1e-9 },
    recompute: (env) => finite(qubitState(env).t1Ns * NS) },
  { scope: 'qubit', path: ['tphi'], what: 'T_phi at parking', unit: 's', from: 'the parking frequency', tolerance: { abs: 0, rel: 1e-6 },
    recompute: (env) => finite(qubitState(env).tphiNs * NS) },
  { scope: 'qubit', path: ['t2'], what: 'T2 at parking', unit: 's', from: 'the parking frequency', tolerance: { abs: 0, rel: 1e-6 },
    recompute: (env) => finite(qubitState(env).t2Ns * NS) },
  { scope: 'qubit', path: ['margin'], what: 'collision margin', unit: 'Hz', from: 'the plan\'s frequencies', tolerance: { abs: 1e4, rel: 1e-6 },
    recompute: (env) => finite(env.crowding[env.qubit!].marginGHz * GHZ) },

  // edges[k]: the pair at its parking frequencies and where the gate goes
  { scope: 'edge', path: ['zz'], what: 'static ZZ at idle', unit: 'Hz', from: 'the parking frequencies (exact dressed levels)', tolerance: { abs: 1, rel: 1e-6 },
    recompute: (env) => env.zzGHz[env.edge!.index] * GHZ },
  { scope: 'edge', path: ['interactionFrequency'], what: 'interaction frequency', unit: 'Hz', from: 'the waveform\'s plateau', tolerance: { abs: 1e4 },
    recompute: (env) => (env.gate ? env.edge!.interactionGHz * GHZ : undefined) },
  { scope: 'edge', path: ['moverInteractionFlux'], what: 'mover flux at the interaction point', unit: 'Phi0', from: 'the waveform\'s plateau', tolerance: { abs: 1e-6 },
    recompute: (env) => (env.gate ? env.edge!.interactionFlux : undefined) },
  { scope: 'edge', path: ['slotDuration'], what: 'slot duration (the gate and its spectator moves)', unit: 's', from: 'the waveform\'s samples and the spectator moves on the AWG grid', tolerance: { abs: 1e-12 },
    recompute: (env) => (env.gate ? slotNs(env.gate.durationNs, env.edge!.parkedCount > 0, env.edge!.input.rampTime * GHZ, env.ctx.rules) * NS : undefined) },

  // edges[k].gate: the designed CZ, from its waveform file
  { scope: 'gate', path: ['duration'], what: 'gate duration', unit: 's', from: 'the waveform\'s samples', tolerance: { abs: 1e-12 },
    recompute: (env) => env.gate!.durationNs * NS },
  { scope: 'gate', path: ['interactionFrequency'], what: 'interaction frequency', unit: 'Hz', from: 'the waveform\'s plateau', tolerance: { abs: 1e4 },
    recompute: (env) => env.edge!.interactionGHz * GHZ },
  { scope: 'gate', path: ['conditionalPhase'], what: 'conditional phase', unit: 'rad', from: resim, tolerance: { abs: 1e-5 }, periodic: true,
    recompute: (env) => sim(env).conditionalPhase },
  { scope: 'gate', path: ['leakage'], what: 'leakage', unit: '1', from: resim, tolerance: { abs: 1e-7, rel: 1e-4 },
    recompute: (env) => sim(env).leakage },
  { scope: 'gate', path: ['fidelity'], what: 'coherent fidelity', unit: '1', from: resim, tolerance: { abs: 1e-7 },
    recompute: (env) => sim(env).fidelity },
  { scope: 'gate', path: ['fidelityNoisy'], what: 'fidelity with decoherence', unit: '1', from: `${resim} with decoherence and averaged over quasi-static flux offsets`, tolerance: { abs: 1e-6 },
    recompute: (env) => {
      const n = env.gate!.noise();
      return n === null ? null : finite(n.fidelityNoisy);
    } },
  { scope: 'gate', path: ['decoherenceEstimate'], what: 'first-order decoherence error', unit: '1', from: `${resim} with decoherence`, tolerance: { abs: 1e-7, rel: 1e-5 },
    recompute: (env) => (env.gate!.noisyMethod === null ? null : sim(env).decoherenceEstimate) },
  { scope: 'gate', path: ['virtualZ', 'a'], what: 'virtual-Z phase a', unit: 'rad', from: resim, tolerance: { abs: 1e-5 }, periodic: true,
    recompute: (env) => sim(env).virtualZ.a },
  { scope: 'gate', path: ['virtualZ', 'b'], what: 'virtual-Z phase b', unit: 'rad', from: resim, tolerance: { abs: 1e-5 }, periodic: true,
    recompute: (env) => sim(env).virtualZ.b },

  // the error budget (README physics conventions sec. 4): each gate's, each qubit's idle budget, the cycle
  ...GATE_BUDGET_TERMS.flatMap(([key, what]) => (['edge', 'gate'] as const).map((scope): Claim => ({
    scope, path: ['budget', key], what: `error budget: ${what}`, unit: '1', from: BUDGET_FROM, tolerance: BUDGET_TOLERANCE,
    recompute: (env) => gateBudgetTerm(env, key),
  }))),
  ...IDLE_TERMS.map(([key, what]): Claim => ({
    scope: 'qubit', path: ['idle', key], what: `idle budget: ${what}`, unit: key === 'idleTime' ? 's' : '1', from: 'the parking point, the slots and the layers', tolerance: key === 'idleTime' ? { abs: 1e-12 } : BUDGET_TOLERANCE,
    recompute: (env) => {
      const q = env.budget.cycle.qubits[env.qubit!];
      return key === 'idleTime' ? q.idleNs * NS : finite(q[key]);
    },
  })),
  { scope: 'plan', path: ['cycle', 'duration'], what: 'reference cycle duration', unit: 's', from: 'the slots and the layers', tolerance: { abs: 1e-12 },
    recompute: (env) => env.budget.cycle.durationNs * NS },
  ...(['error', 'gates', 'idles'] as const).map((key): Claim => ({
    scope: 'plan', path: ['cycle', key], what: `reference cycle error (${key})`, unit: '1', from: BUDGET_FROM, tolerance: BUDGET_TOLERANCE,
    recompute: (env) => finite(env.budget.cycle[key]),
  })),
];

/** |stated - recomputed| (modulo 2 pi for phases). */
export function claimDifference(claim: Claim, stated: number, recomputed: number): number {
  const d = stated - recomputed;
  if (!claim.periodic) return Math.abs(d);
  const w = d - 2 * Math.PI * Math.round(d / (2 * Math.PI));
  return Math.abs(w);
}

/** True when the claim holds within its tolerance. */
export function claimHolds(claim: Claim, stated: number | null, recomputed: number | null): boolean {
  if (stated === null || recomputed === null) return stated === recomputed;
  const allowed = claim.tolerance.abs + (claim.tolerance.rel ?? 0) * Math.max(Math.abs(stated), Math.abs(recomputed));
  return claimDifference(claim, stated, recomputed) <= allowed;
}

/** A number in a claim's unit for messages. */
export function formatClaimValue(x: number | null, unit: ClaimUnit): string {
  if (x === null) return 'null';
  switch (unit) {
    case 'Hz':
      if (Math.abs(x) >= 1e8) return `${(x * 1e-9).toFixed(6)} GHz`;
      if (Math.abs(x) >= 1e5) return `${(x * 1e-6).toFixed(4)} MHz`;
      if (Math.abs(x) >= 1e3) return `${shortNumber(x * 1e-3, 6)} kHz`;
      return `${shortNumber(x, 6)} Hz`;
    case 's':
      return Math.abs(x) < 1e-6 ? `${shortNumber(x * 1e9, 7)} ns` : `${shortNumber(x * 1e6, 7)} us`;
    case 'rad':
      return `${shortNumber(x, 8)} rad`;
    case 'Phi0':
      return `${shortNumber(x, 8)} Phi0`;
    default:
      return shortNumber(x, 9);
  }
}

/** A number to `digits` significant digits, exponent form below 1e-3: 0.999985053, 1e-7. */
export function shortNumber(v: number, digits: number): string {
  const r = Number(v.toPrecision(digits));
  return r !== 0 && (Math.abs(r) < 1e-3 || Math.abs(r) >= 1e9) ? r.toExponential().replace('e+', 'e') : String(r);
}

/** The README's table of the claims verify checks (generated by npm run generated). */
export function claimsTableMarkdown(): string {
  const scopePath: Record<ClaimScope, string> = { plan: '', qubit: 'qubits.<id>.', edge: 'edges[].', gate: 'edges[].gate.' };
  const tol = (c: Claim): string => {
    const abs = c.tolerance.abs === 0 ? '' : formatClaimValue(c.tolerance.abs, c.unit);
    const rel = c.tolerance.rel ? `${shortNumber(c.tolerance.rel, 3)} relative` : '';
    return [abs, rel].filter(Boolean).join(' + ') + (c.periodic ? ' (modulo 2 pi)' : '');
  };
  return [
    '| claim | recomputed from | tolerance |',
    '|---|---|---|',
    ...CLAIMS.map((c) => `| \`${scopePath[c.scope]}${c.path.join('.')}\` (${c.what}) | ${c.from} | ${tol(c)} |`),
  ].join('\n');
}
