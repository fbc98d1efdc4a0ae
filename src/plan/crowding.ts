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
 *                 spectator distance at the interaction point minus the distance the admixture
 *                 limit needs (g_c / sqrt(spectatorAdmixture)), and cz-tls
 *
 * read in units of the expected frequency spread from fabrication, sigma_f = |df01/d ln E_J| *
 * resistanceSpread (default 2 %; src/plan/exact-state.ts). Flags point at real risks only: a
 * qubit is flagged when a margin below marginFlagSpreads spreads (default 3) belongs to a
 * condition fixed at fabrication - the qubit parked at a sweet spot, against another qubit at a
 * sweet spot, or against its own defect or resonator (the spread of a difference of two qubits is
 * sqrt(sigma_i^2 + sigma_j^2)). Interaction points, spectator moves and parking below a sweet
 * spot are control choices a lab re-tunes after fabrication; their margins are reported, not
 * flagged. Chip summary: the usable fraction of each qubit's window (the
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
import { admixtureChecks, admixtureHalfWidth } from './rules/spectator-admixture.js';

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
  /**
   * The smallest margin among the conditions fixed at fabrication (this qubit at a sweet spot, and
   * the other qubit of the condition too), in GHz and in spreads of the difference; null when the
   * qubit is off its sweet spots (its parking can be re-tuned after fabrication).
   */
  fabrication: { marginGHz: number; sigmaGHz: number; spreads: number; nearest: { rule: RuleName; other: string | null } } | null;
}

/** A qubit within this flux (Phi0) of 0 or 1/2 sits at a sweet spot. */
export const SWEET_SPOT_FLUX = 1e-6;

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
      const G = ctx.edges[ctx.edgeBetween(A, S)].gChargeGHz;
      for (const c of admixtureChecks(ctx, A, to, S, f01, G, p.crossing === '11-20')) {
        const m = c.distanceGHz - admixtureHalfWidth(c.couplingGHz, r.spectatorAdmixture);
        noteCz(A, m, c.rule, S);
        noteCz(S, m, c.rule, A);
      }
    }
    for (const t of ctx.qubits[A].tls) noteCz(A, Math.abs(to - t.atGHz) - t.widthGHz - r.tlsClearanceGHz, 'cz-tls', -1);
  }
  const qubits: QubitCrowding[] = [];
  const flags: Finding[] = [];
  // A qubit at a sweet spot cannot be re-tuned after fabrication without leaving it; below it,
  // it can (its parking is a control choice). Flags count only conditions whose every qubit sits
  // at a sweet spot, or a sweet-spot qubit against its own defects and resonator.
  const atSweetSpot = (q: number): boolean => {
    const st = states[q];
    return !!st && (Math.abs(st.flux) < SWEET_SPOT_FLUX || Math.abs(Math.abs(st.flux) - 0.5) < SWEET_SPOT_FLUX);
  };
  for (let i = 0; i < n; i++) {
    const f = parkingGHz[i];
    const list = blockers.of(i, view, []);
    let idle = Infinity;
    let nearest: { rule: RuleName; other: string | null } = { rule: '01-01', other: null };
    let fixed = Infinity;
    let fixedNearest: { rule: RuleName; other: string | null } = { rule: '01-01', other: null };
    let fixedSigma = NaN;
    const sigmaI = states[i]?.sigmaGHz ?? NaN;
    const note = (m: number, rule: RuleName, other: number) => {
      if (m < idle - TIE) {
        idle = m;
        nearest = { rule, other: other >= 0 ? ctx.ids[other] : null };
      }
      if (!atSweetSpot(i) || (other >= 0 && !atSweetSpot(other))) return;
      // the spread of a difference of two independent qubits' frequencies
      const sg = other >= 0 ? Math.hypot(sigmaI, states[other]?.sigmaGHz ?? 0) : sigmaI;
      if (m / sg < fixed / fixedSigma || !Number.isFinite(fixed)) {
        fixed = m;
        fixedSigma = sg;
        fixedNearest = { rule, other: other >= 0 ? ctx.ids[other] : null };
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
    const spreads = margin / sigmaI;
    const d = ctx.domains[i] ?? ctx.ranges[i];
    const length = d.hi - d.lo;
    const usable = length > 0 ? Math.max(0, 1 - coveredLength(d, list) / length) : f > d.lo - 1e-9 && f < d.hi + 1e-9 ? 1 : 0;
    const fixedSpreads = Number.isFinite(fixed) ? fixed / fixedSigma : Infinity;
    qubits.push({
      marginGHz: margin, idleMarginGHz: idle, czMarginGHz: czMargin[i], sigmaGHz: sigmaI, marginSpreads: spreads, nearest, usableFraction: usable,
      fabrication: Number.isFinite(fixed) ? { marginGHz: fixed, sigmaGHz: fixedSigma, spreads: fixedSpreads, nearest: fixedNearest } : null,
    });
    if (Number.isFinite(fixedSpreads) && fixedSpreads < r.marginFlagSpreads) {
      const what = fixedNearest.other ? `${fixedNearest.other} ${fixedNearest.rule}` : fixedNearest.rule;
      flags.push({
        rule: 'margin', qubits: fixedNearest.other ? [ctx.ids[i], fixedNearest.other] : [ctx.ids[i]], value: fixedSpreads, threshold: r.marginFlagSpreads,
        message: `${ctx.ids[i]} at its sweet spot ${ghz(f)}: margin ${mhz(fixed)} = ${fixedSpreads.toFixed(2)} fabrication spreads (sigma ${mhz(fixedSigma)}) to ${what}${fixedNearest.other ? ', also at its sweet spot' : ''}; below ${r.marginFlagSpreads}: a fabrication shift this size needs one of them tuned off its sweet spot`,
        details: { marginGHz: fixed, sigmaGHz: fixedSigma },
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
