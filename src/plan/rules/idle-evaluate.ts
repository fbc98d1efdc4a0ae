/**
 * Exact evaluation of the idle collision rules on a parking assignment (the planner's final check
 * and `fluxlane verify`): every qubit's exact state at its parking frequency
 * (src/plan/exact-state.ts), every coupled pair's exact static ZZ from the dressed levels
 * (CoupledPair.zz, src/pair/pair.ts; never the perturbative formula), and each rule of
 * ./catalogue.ts with scope `idle` against its threshold. Returns the failing conditions as
 * findings with units in their messages.
 */
import type { PlanContext } from '../context.js';
import { exactQubitState, exactQubitStateAtFlux, type ExactQubitState } from '../exact-state.js';
import { band, freq, ghz, mhz } from '../format.js';
import type { Finding } from './findings.js';

export interface IdleEvaluation {
  /** Exact state per qubit (null when its parking frequency is outside its tunable range). */
  states: (ExactQubitState | null)[];
  /** Exact static ZZ per edge (GHz; NaN when a state is missing). */
  zzGHz: Float64Array;
  violations: Finding[];
}

/**
 * Exact states of every qubit at `parkingGHz` (null outside the tunable range). `known`, when
 * given: the flux of qubit i at f01 = parkingGHz[i] already found (Transmon.fluxForF01 of that very
 * frequency, inside the tunable range), NaN where not; the state is then built on it (the same
 * state: exactQubitState finds that flux first).
 */
export function exactStates(ctx: PlanContext, parkingGHz: ArrayLike<number>, known?: ArrayLike<number>): (ExactQubitState | null)[] {
  return ctx.transmons.map((t, i) => {
    const f = parkingGHz[i];
    // 1 Hz of slack: plan files carry 12 significant digits.
    if (!(f >= t.fMinGHz - 1e-9 && f <= t.fMaxGHz + 1e-9)) return null;
    if (known && !Number.isNaN(known[i]) && f >= t.fMinGHz && f <= t.fMaxGHz) return exactQubitStateAtFlux(t, known[i], ctx.rules.resistanceSpread, f);
    return exactQubitState(t, Math.min(t.fMaxGHz, Math.max(t.fMinGHz, f)), ctx.rules.resistanceSpread);
  });
}

/**
 * Exact ZZ of every edge at the states' fluxes. `known`, when given: ZZ values already computed
 * (CoupledPair.zz) for the edges whose `has` is true, at the same fluxes.
 */
export function exactZz(ctx: PlanContext, states: readonly (ExactQubitState | null)[], known?: { zzGHz: Float64Array; has: Uint8Array }): Float64Array {
  const out = new Float64Array(ctx.edges.length);
  for (const e of ctx.edges) {
    const a = states[e.a];
    const b = states[e.b];
    out[e.index] = a && b ? (known && known.has[e.index] ? known.zzGHz[e.index] : ctx.pair(e.index).zz(a.flux, b.flux)) : NaN;
  }
  return out;
}

export function evaluateIdle(ctx: PlanContext, parkingGHz: ArrayLike<number>, given?: { states?: (ExactQubitState | null)[]; zzGHz?: Float64Array }): IdleEvaluation {
  const states = given?.states ?? exactStates(ctx, parkingGHz);
  const zz = given?.zzGHz ?? exactZz(ctx, states);
  const r = ctx.rules;
  const out: Finding[] = [];
  const id = ctx.ids;
  for (let i = 0; i < ctx.n; i++) {
    const f = parkingGHz[i];
    const q = ctx.qubits[i];
    const range = ctx.ranges[i];
    const win = q.windowGHz;
    if (!states[i]) {
      out.push({ rule: 'window', qubits: [id[i]], value: f, threshold: null,
        message: `${id[i]} parking ${ghz(f)} is outside its tunable range ${band(ctx.transmons[i].fMinGHz, ctx.transmons[i].fMaxGHz)}` });
      continue;
    }
    if (f < range.lo - 1e-9) {
      out.push({ rule: 'window', qubits: [id[i]], value: f, threshold: range.lo,
        message: `${id[i]} parking ${ghz(f)} is below its planning range ${band(range.lo, range.hi)} (E_J/E_C < 30 there)` });
    }
    if (win && (f < win[0] - 1e-9 || f > win[1] + 1e-9)) {
      out.push({ rule: 'window', qubits: [id[i]], value: f, threshold: null, message: `${id[i]} parking ${ghz(f)} is outside its window ${band(win[0], win[1])}` });
    }
    if (q.parkGHz !== undefined && Math.abs(f - q.parkGHz) > 1e-9) {
      out.push({ rule: 'window', qubits: [id[i]], value: f, threshold: q.parkGHz, message: `${id[i]} parking ${ghz(f)} differs from its fixed park ${ghz(q.parkGHz)}` });
    }
    for (const d of q.tls) {
      const dist = Math.abs(f - d.atGHz) - d.widthGHz;
      if (dist < r.tlsClearanceGHz) {
        out.push({ rule: 'tls', qubits: [id[i]], value: dist, threshold: r.tlsClearanceGHz,
          message: `${id[i]} at ${ghz(f)} is ${mhz(dist)} beyond the edge of its defect at ${ghz(d.atGHz)} (width ${mhz(d.widthGHz)}); needs ${mhz(r.tlsClearanceGHz)}`,
          details: { tlsGHz: d.atGHz, widthGHz: d.widthGHz } });
      }
    }
    if (q.readoutGHz !== undefined) {
      const dist = Math.abs(f - q.readoutGHz);
      if (dist < r.readoutDetuningGHz) {
        out.push({ rule: 'readout', qubits: [id[i]], value: dist, threshold: r.readoutDetuningGHz,
          message: `${id[i]} at ${ghz(f)} is ${mhz(dist)} from its readout resonator at ${ghz(q.readoutGHz)}; needs ${mhz(r.readoutDetuningGHz)}`,
          details: { readoutGHz: q.readoutGHz } });
      }
    }
  }
  for (const e of ctx.edges) {
    const a = states[e.a];
    const b = states[e.b];
    if (!a || !b) continue;
    const A = id[e.a];
    const B = id[e.b];
    const d0101 = Math.abs(a.f01GHz - b.f01GHz);
    if (d0101 < r.detuning0101GHz) {
      out.push({ rule: '01-01', qubits: [A, B], value: d0101, threshold: r.detuning0101GHz, edge: e.key,
        message: `${A} (${ghz(a.f01GHz)}) and ${B} (${ghz(b.f01GHz)}) are ${mhz(d0101)} apart; coupled neighbours need ${mhz(r.detuning0101GHz)}` });
    }
    const dab = Math.abs(a.f01GHz - b.f12GHz);
    if (dab < r.detuning0112GHz) {
      out.push({ rule: '01-12', qubits: [A, B], value: dab, threshold: r.detuning0112GHz, edge: e.key,
        message: `${A} f01 ${ghz(a.f01GHz)} is ${mhz(dab)} from ${B} f12 ${ghz(b.f12GHz)} (11-02 crossing); needs ${mhz(r.detuning0112GHz)}` });
    }
    const dba = Math.abs(a.f12GHz - b.f01GHz);
    if (dba < r.detuning0112GHz) {
      out.push({ rule: '01-12', qubits: [A, B], value: dba, threshold: r.detuning0112GHz, edge: e.key,
        message: `${A} f12 ${ghz(a.f12GHz)} is ${mhz(dba)} from ${B} f01 ${ghz(b.f01GHz)} (11-20 crossing); needs ${mhz(r.detuning0112GHz)}` });
    }
    const z = zz[e.index];
    if (Math.abs(z) > r.zzLimitGHz) {
      out.push({ rule: 'zz', qubits: [A, B], value: Math.abs(z), threshold: r.zzLimitGHz, edge: e.key,
        message: `${A}-${B} static ZZ is ${freq(z)} at ${ghz(a.f01GHz)} / ${ghz(b.f01GHz)}; the limit is ${freq(r.zzLimitGHz)}`,
        details: { zzGHz: z } });
    }
  }
  for (const p of ctx.nextNearest) {
    const a = states[p.a];
    const b = states[p.b];
    if (!a || !b) continue;
    const d = Math.abs(a.f01GHz - b.f01GHz);
    if (d < r.detuningNext0101GHz) {
      const via = p.via.map((v) => id[v]).join(', ');
      out.push({ rule: 'next-01-01', qubits: [id[p.a], id[p.b]], value: d, threshold: r.detuningNext0101GHz,
        message: `${id[p.a]} (${ghz(a.f01GHz)}) and ${id[p.b]} (${ghz(b.f01GHz)}) share ${via} and are ${mhz(d)} apart; next-nearest neighbours need ${mhz(r.detuningNext0101GHz)}`,
        details: { via } });
    }
  }
  return { states, zzGHz: zz, violations: out };
}
