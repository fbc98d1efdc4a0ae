/**
 * Crowding: how much room each qubit has. A qubit's margin is its smallest distance to any
 * collision condition minus that condition's threshold (README physics conventions sec. 5):
 *
 *   idle margin   the smallest |f - f_c| - threshold over the idle detuning conditions (01-01,
 *                 01-12 both ways, next-01-01, tls beyond its width, readout) with the exact
 *                 spectra at parking, and for ZZ the distance to where |zeta| reaches the limit
 *                 with the neighbour where it parks (src/plan/rules/idle-blockers.ts, inside the
 *                 tunable range)
 *   CZ margin     for each gate the qubit moves in or watches as a spectator, the smallest
 *                 cz-spectator / cz-next / cz-tls distance at the interaction point minus its threshold
 *
 * read in units of the expected frequency spread from fabrication, sigma_f = |df01/d ln E_J| *
 * resistanceSpread (default 2 %; src/plan/exact-state.ts). A margin below marginFlagSpreads
 * spreads (default 3) is flagged. Chip summary: the usable fraction of each qubit's window (the
 * part not blocked with the others where they park) and the 100 MHz bands where at least two
 * qubits, and at least half of those parked there, are flagged.
 */
import type { PlanContext } from './context.js';
import type { ExactQubitState } from './exact-state.js';
import { band, ghz, mhz } from './format.js';
import { coveredLength, signedDistance } from './intervals.js';
import type { EdgePlan } from './interaction/plan-edge.js';
import type { RuleName } from './rules/catalogue.js';
import type { Finding } from './rules/findings.js';
import { IdleBlockers, type FrequencyView } from './rules/idle-blockers.js';
import { emptyTableState } from './qubit-table.js';
import { narrowResonanceZz, secondOrderZz } from './zz-second-order.js';

export interface QubitCrowding {
  /** Smallest margin (GHz), idle and CZ together. */
  marginGHz: number;
  idleMarginGHz: number;
  czMarginGHz: number;
  sigmaGHz: number;
  marginSpreads: number;
  /** The nearest condition. */
  nearest: { rule: RuleName; other: string | null };
  /** Fraction of the window (domain) not blocked by the others where they park. */
  usableFraction: number;
}

export interface CrowdedBand {
  loGHz: number;
  hiGHz: number;
  qubits: string[];
  flagged: string[];
}

export interface Crowding {
  qubits: QubitCrowding[];
  bands: CrowdedBand[];
  flags: Finding[];
}

export const CROWDING_DEFAULTS = Object.freeze({ bandGHz: 0.1 });

export function crowding(
  ctx: PlanContext,
  parkingGHz: ArrayLike<number>,
  states: readonly (ExactQubitState | null)[],
  zzScale: Float64Array,
  plans: readonly EdgePlan[],
): Crowding {
  const n = ctx.n;
  const view: FrequencyView = {
    freq: Float64Array.from(parkingGHz),
    states: ctx.tables.map((t, i) => t.at(parkingGHz[i], emptyTableState())),
    active: new Uint8Array(n).fill(1),
    zzScale,
    zzLimitGHz: ctx.rules.zzLimitGHz,
  };
  const blockers = new IdleBlockers(ctx);
  const czMargin = new Float64Array(n).fill(Infinity);
  const czNearest: { rule: RuleName; other: string | null }[] = Array.from({ length: n }, () => ({ rule: 'cz-spectator-01-01' as RuleName, other: null }));
  const r = ctx.rules;
  // Ties (within 1 kHz: plans read back carry 12 digits) keep the condition found first.
  const TIE = 1e-6;
  const noteCz = (q: number, m: number, rule: RuleName, other: number) => {
    if (m < czMargin[q] - TIE) {
      czMargin[q] = m;
      czNearest[q] = { rule, other: other >= 0 ? ctx.ids[other] : null };
    }
  };
  for (const p of plans) {
    if (!Number.isFinite(p.interactionGHz)) continue;
    const A = p.mover;
    const to = p.interactionGHz;
    const parked = new Map(p.parked.map((x) => [x.qubit, x]));
    for (const S of ctx.neighbours[A]) {
      if (S === p.partner) continue;
      const st = states[S];
      if (!st) continue;
      const f01 = parked.get(S)?.fGHz ?? st.f01GHz;
      const f12 = parked.get(S)?.f12GHz ?? st.f12GHz;
      const sd = r.spectatorDetuningGHz;
      const list: [RuleName, number][] = [
        ['cz-spectator-01-01', Math.abs(to - f01) - sd],
        ['cz-spectator-11-20', Math.abs(p.moverF12AtInteractionGHz - f01) - sd],
        ['cz-spectator-11-02', Math.abs(to - f12) - sd],
      ];
      for (const [rule, m] of list) {
        noteCz(A, m, rule, S);
        noteCz(S, m, rule, A);
      }
    }
    for (const t of ctx.qubits[A].tls) noteCz(A, Math.abs(to - t.atGHz) - t.widthGHz - r.tlsClearanceGHz, 'cz-tls', -1);
  }
  const qubits: QubitCrowding[] = [];
  const flags: Finding[] = [];
  for (let i = 0; i < n; i++) {
    const f = parkingGHz[i];
    const list = blockers.of(i, view, []);
    let idle = Infinity;
    let nearest: { rule: RuleName; other: string | null } = { rule: '01-01', other: null };
    const note = (m: number, rule: RuleName, other: number) => {
      if (m < idle - TIE) {
        idle = m;
        nearest = { rule, other: other >= 0 ? ctx.ids[other] : null };
      }
    };
    // Detuning conditions, exact (they count even where tuning cannot reach them: fabrication can).
    const si = states[i];
    if (si) {
      for (const j of ctx.neighbours[i]) {
        const sj = states[j];
        if (!sj) continue;
        note(Math.abs(si.f01GHz - sj.f01GHz) - r.detuning0101GHz, '01-01', j);
        note(Math.abs(si.f01GHz - sj.f12GHz) - r.detuning0112GHz, '01-12', j);
        note(Math.abs(si.f12GHz - sj.f01GHz) - r.detuning0112GHz, '01-12', j);
      }
      for (const p of ctx.nextNearestOf[i]) {
        const pair = ctx.nextNearest[p];
        const k = pair.a === i ? pair.b : pair.a;
        const sk = states[k];
        if (sk) note(Math.abs(si.f01GHz - sk.f01GHz) - r.detuningNext0101GHz, 'next-01-01', k);
      }
      for (const d of ctx.qubits[i].tls) note(Math.abs(si.f01GHz - d.atGHz) - d.widthGHz - r.tlsClearanceGHz, 'tls', -1);
      const rd = ctx.qubits[i].readoutGHz;
      if (rd !== undefined) note(Math.abs(si.f01GHz - rd) - r.readoutDetuningGHz, 'readout', -1);
    }
    // ZZ: distance to where |zeta| reaches the limit (within the tunable range).
    for (const b of list) if (b.rule === 'zz') note(signedDistance(f, b), 'zz', b.other);
    const margin = Math.min(idle, czMargin[i]);
    if (czMargin[i] < idle - TIE) nearest = czNearest[i];
    const sigma = states[i]?.sigmaGHz ?? NaN;
    const spreads = margin / sigma;
    const d = ctx.domains[i] ?? ctx.ranges[i];
    const length = d.hi - d.lo;
    const usable = length > 0 ? Math.max(0, 1 - coveredLength(d, list) / length) : f > d.lo - 1e-9 && f < d.hi + 1e-9 ? 1 : 0;
    qubits.push({ marginGHz: margin, idleMarginGHz: idle, czMarginGHz: czMargin[i], sigmaGHz: sigma, marginSpreads: spreads, nearest, usableFraction: usable });
    if (Number.isFinite(spreads) && spreads < r.marginFlagSpreads) {
      const what = nearest.other ? `${nearest.other} ${nearest.rule}` : nearest.rule;
      flags.push({
        rule: 'margin', qubits: nearest.other ? [ctx.ids[i], nearest.other] : [ctx.ids[i]], value: spreads, threshold: r.marginFlagSpreads,
        message: `${ctx.ids[i]} at ${ghz(f)}: margin ${mhz(margin)} = ${spreads.toFixed(2)} fabrication spreads (sigma ${mhz(sigma)}) to ${what}; below ${r.marginFlagSpreads}`,
        details: { marginGHz: margin, sigmaGHz: sigma },
      });
    }
  }
  // Crowded bands.
  const bands: CrowdedBand[] = [];
  const width = CROWDING_DEFAULTS.bandGHz;
  const flagged = new Set(flags.map((fl) => fl.qubits[0]));
  const bins = new Map<number, number[]>();
  for (let i = 0; i < n; i++) {
    const k = Math.floor(parkingGHz[i] / width + 1e-9);
    bins.set(k, [...(bins.get(k) ?? []), i]);
  }
  for (const k of [...bins.keys()].sort((a, b) => a - b)) {
    const members = bins.get(k)!.map((i) => ctx.ids[i]);
    const bad = members.filter((id) => flagged.has(id));
    if (bad.length >= 2 && 2 * bad.length >= members.length) bands.push({ loGHz: k * width, hiGHz: (k + 1) * width, qubits: members, flagged: bad });
  }
  return { qubits, bands, flags };
}

/**
 * Per-edge factor that makes the second-order ZZ estimate equal the exact ZZ at the parking point
 * (1 where the estimate is tiny or the ratio is implausible), so ZZ margins read the exact limit.
 */
export function calibratedZzScale(ctx: PlanContext, parkingGHz: ArrayLike<number>, exactZzGHz: Float64Array): Float64Array {
  const scale = new Float64Array(ctx.edges.length).fill(1);
  const a = emptyTableState();
  const b = emptyTableState();
  for (const e of ctx.edges) {
    const sa = ctx.tables[e.a].at(parkingGHz[e.a], a);
    const sb = ctx.tables[e.b].at(parkingGHz[e.b], b);
    const est = secondOrderZz(sa, sb, e.gChargeGHz) + narrowResonanceZz(sa, sb, e.gChargeGHz);
    const ratio = exactZzGHz[e.index] / est;
    if (Math.abs(est) > 1e-9 && ratio > 0.2 && ratio < 5) scale[e.index] = ratio;
  }
  return scale;
}

/** One line per crowded band: "5.100-5.200 GHz: 6 qubits parked, 4 flagged (Q1, Q4, Q7, Q9)". */
export function bandText(b: CrowdedBand): string {
  return `${band(b.loGHz, b.hiGHz)}: ${b.qubits.length} qubits parked, ${b.flagged.length} with margins under the flag (${b.flagged.join(', ')})`;
}
