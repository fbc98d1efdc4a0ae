/**
 * The idle rules of ./catalogue.ts as blocked frequency intervals: with every other qubit held at
 * its current frequency, the f01 values qubit i must not take. Used by the parking search
 * (allowed set = domain minus blocked intervals), by the explanations of infeasible windows, and
 * by the crowding margins (distance to the nearest blocked interval = distance to the nearest
 * collision condition minus its threshold).
 *
 *   01-01       [f01_j - t, f01_j + t]                         each coupled neighbour j
 *   01-12       [f12_j - t, f12_j + t] and {f : f12_i(f) in [f01_j - t, f01_j + t]}
 *   next-01-01  [f01_k - t, f01_k + t]                         each next-nearest neighbour k
 *   tls         [f_TLS - width - t, f_TLS + width + t]         each listed defect of i
 *   readout     [f_r - t, f_r + t]
 *   zz          {f : |zeta_ij(f, f_j)| > limit}                 each coupled neighbour j
 *   idle-error  {f : the qubit's own idle error over the reference idle time > idleErrorLimit}
 *               (T1, white and quasi-static 1/f dephasing, thermal excitation: src/budget/idle-error.ts;
 *               the residual-ZZ share depends on the neighbours and is left to the exact check);
 *               only when some point of the range is below the limit (a qubit whose T1 alone
 *               breaks it is reported by the budget, not blocked everywhere)
 *
 * ZZ uses the second-order estimate of src/plan/zz-second-order.ts with tabulated levels, scaled
 * by a per-edge calibration against the exact dressed ZZ (src/plan/parking/assign.ts). |zeta|
 * has poles at the 11-20 and 11-02 crossings and falls off monotonically outside them
 * (~ 2 g^2 (|alpha_i| + |alpha_j|) / Delta^2), so its blocked set is found by bisection from each
 * pole outwards, and between the poles by sampling (fully blocked unless g is weak).
 *
 * Narrow ZZ resonances: the exact ZZ also spikes where |11>, |10> or |01> meets a state with a
 * third, fourth or fifth level of one qubit and the ground state of the other (one application of
 * G n_A n_B): E_11 = E_40 (f01_i + f01_j = E_4,i), E_11 = E_04, E_10 = E_03 (f01_i = E_3,j),
 * E_10 = E_05 and their mirrors. They appear when the two qubits are 2-3x apart in frequency.
 * Near one, zeta ~ c^2 / delta with c = G |n_ik| |n_jl| and delta the energy mismatch, so each is
 * blocked where |delta| < 2 c^2 / limit (zeta stays below half the limit at the edge).
 */
import type { PlanContext } from '../context.js';
import { emptyTableState, type TableState } from '../qubit-table.js';
import { secondOrderZz } from '../zz-second-order.js';
import type { Interval } from '../intervals.js';
import type { RuleName } from './catalogue.js';
import { qubitIdleError } from '../../budget/idle-error.js';

export interface Blocker extends Interval {
  rule: RuleName;
  /** The other qubit (index), or -1 for a defect or resonator of the qubit itself. */
  other: number;
}

/** What the blockers read: current frequencies and tabulated states of every qubit. */
export interface FrequencyView {
  freq: Float64Array;
  states: TableState[];
  /** 1 when the qubit takes part (subset solves and greedy construction leave some out). */
  active: Uint8Array;
  /** Per-edge factor on the second-order ZZ estimate. */
  zzScale: Float64Array;
  /** ZZ limit used by the search (GHz). */
  zzLimitGHz: number;
}

interface ZzCacheEntry {
  fOther: number;
  scale: number;
  intervals: Interval[];
}

/** Reference idle time of the idle-error blocker (ns): about one error-correction cycle, the parking search's own reference (src/plan/options.ts cycleNs). */
export const IDLE_REFERENCE_NS = 1000;

/**
 * Idle-error bands per qubit, shared by every IdleBlockers of one PlanContext (they depend only on
 * the context's transmons, tables and rules; the parking states and the crowding stage each build
 * their own IdleBlockers, and recomputing the 401-point scan per instance was ~10 % of a replan).
 */
const idleBandsOf = new WeakMap<PlanContext, Map<number, Interval[]>>();

export class IdleBlockers {
  private readonly zzCache = new Map<number, ZzCacheEntry>();
  private readonly tmp = emptyTableState();
  private readonly idleCache: Map<number, Interval[]>;

  constructor(readonly ctx: PlanContext) {
    let shared = idleBandsOf.get(ctx);
    if (!shared) idleBandsOf.set(ctx, (shared = new Map()));
    this.idleCache = shared;
  }

  /**
   * The f01 bands where qubit i's own idle error over IDLE_REFERENCE_NS exceeds idleErrorLimit
   * (scanned on 400 points of its planning range; empty when the whole range is above or below it).
   * Memoised per context: the returned array is shared, callers must not change it.
   */
  idleErrorIntervals(i: number): readonly Interval[] {
    let hit = this.idleCache.get(i);
    if (!hit) this.idleCache.set(i, (hit = idleErrorBands(this.ctx, i)));
    return hit;
  }

  /** Forget cached ZZ intervals (after a calibration change). */
  clearZzCache(): void {
    this.zzCache.clear();
  }

  /**
   * Blocked intervals of qubit i, appended to `out` (cleared first). The intervals a neighbour
   * blocks depend on its f01 and f12 and the edge's ZZ scale only, a next-nearest neighbour's on
   * its f01, the qubit's own (defects, resonator, idle error) on nothing that changes: each part is
   * remembered as its list of Blocker objects and appended again while what it depends on stays
   * (the same objects, in the same order, as building them anew; blockers are never changed once
   * made). The parking search asks for a qubit's list each time a neighbour moved.
   */
  of(i: number, view: FrequencyView, out: Blocker[] = []): Blocker[] {
    out.length = 0;
    const ctx = this.ctx;
    const ns = ctx.neighbours[i];
    for (let s = 0; s < ns.length; s++) {
      const j = ns[s];
      if (!view.active[j]) continue;
      const part = this.neighbourPart(i, j, view);
      for (let k = 0; k < part.length; k++) out.push(part[k]);
    }
    const nn = ctx.nextNearestOf[i];
    for (let s = 0; s < nn.length; s++) {
      const pair = ctx.nextNearest[nn[s]];
      const k = pair.a === i ? pair.b : pair.a;
      if (!view.active[k]) continue;
      out.push(this.nextNearestPart(nn[s], i === pair.a ? 0 : 1, k, view.freq[k]));
    }
    const own = this.ownPart(i);
    for (let k = 0; k < own.length; k++) out.push(own[k]);
    return out;
  }

  /** The intervals neighbour j blocks for qubit i (01-01, 01-12 both ways, ZZ), remembered while f_j, its f12, the edge's ZZ scale and the ZZ limit stay. */
  private neighbourPart(i: number, j: number, view: FrequencyView): Blocker[] {
    const ctx = this.ctx;
    const r = ctx.rules;
    const e = ctx.edgeBetween(i, j);
    const key = e * 2 + (ctx.edges[e].a === i ? 0 : 1);
    const fj = view.freq[j];
    const sj = view.states[j];
    const scale = view.zzScale[e];
    const hit = this.neighbourParts.get(key);
    if (hit && hit.fj === fj && hit.f12 === sj.f12 && hit.scale === scale && hit.limit === view.zzLimitGHz) return hit.list;
    const list: Blocker[] = [];
    list.push({ lo: fj - r.detuning0101GHz, hi: fj + r.detuning0101GHz, rule: '01-01', other: j });
    list.push({ lo: sj.f12 - r.detuning0112GHz, hi: sj.f12 + r.detuning0112GHz, rule: '01-12', other: j });
    const b = this.f12Preimage(i, fj - r.detuning0112GHz, fj + r.detuning0112GHz);
    if (b) list.push({ lo: b.lo, hi: b.hi, rule: '01-12', other: j });
    for (const z of this.zzIntervals(i, j, view)) list.push({ lo: z.lo, hi: z.hi, rule: 'zz', other: j });
    this.neighbourParts.set(key, { fj, f12: sj.f12, scale, limit: view.zzLimitGHz, list });
    return list;
  }

  private readonly neighbourParts = new Map<number, { fj: number; f12: number; scale: number; limit: number; list: Blocker[] }>();

  /** The interval next-nearest neighbour k (pair p, i its end `end`) blocks, remembered while f_k stays. */
  private nextNearestPart(p: number, end: number, k: number, fk: number): Blocker {
    const key = p * 2 + end;
    const hit = this.nextNearestParts.get(key);
    if (hit && hit.fk === fk) return hit.blocker;
    const t = this.ctx.rules.detuningNext0101GHz;
    const blocker: Blocker = { lo: fk - t, hi: fk + t, rule: 'next-01-01', other: k };
    this.nextNearestParts.set(key, { fk, blocker });
    return blocker;
  }

  private readonly nextNearestParts = new Map<number, { fk: number; blocker: Blocker }>();

  /** Qubit i's own blocked intervals (defects, readout resonator, idle error), made once. */
  private ownPart(i: number): Blocker[] {
    let list = this.ownParts[i];
    if (list) return list;
    const r = this.ctx.rules;
    const q = this.ctx.qubits[i];
    list = [];
    for (const d of q.tls) {
      const w = d.widthGHz + r.tlsClearanceGHz;
      list.push({ lo: d.atGHz - w, hi: d.atGHz + w, rule: 'tls', other: -1 });
    }
    if (q.readoutGHz !== undefined) list.push({ lo: q.readoutGHz - r.readoutDetuningGHz, hi: q.readoutGHz + r.readoutDetuningGHz, rule: 'readout', other: -1 });
    for (const b of this.idleErrorIntervals(i)) list.push({ lo: b.lo, hi: b.hi, rule: 'idle-error', other: -1 });
    this.ownParts[i] = list;
    return list;
  }

  private readonly ownParts: (Blocker[] | undefined)[] = [];

  /**
   * {f in the planning range of i : f12_i(f) in [lo, hi]} as an interval (f12 grows with f01),
   * or null when it is empty.
   */
  f12Preimage(i: number, lo: number, hi: number): Interval | null {
    const t = this.ctx.tables[i];
    const bottom = t.at(t.fLowGHz).f12;
    const top = t.at(t.fMaxGHz).f12;
    if (hi < bottom - 1e-9 || lo > top + 1e-9) return null;
    const a = lo <= bottom ? t.fLowGHz - 1e-9 : lo >= top ? t.fMaxGHz : t.f01ForF12(lo)!;
    const b = hi >= top ? t.fMaxGHz + 1e-9 : t.f01ForF12(hi)!;
    return { lo: a, hi: b };
  }

  /** The narrow ZZ resonances of i against j (see the banner), appended to `out`. */
  narrowZz(i: number, j: number, view: FrequencyView, out: Blocker[]): void {
    const ctx = this.ctx;
    const e = ctx.edgeBetween(i, j);
    const g = ctx.edges[e].gChargeGHz;
    const lim = view.zzLimitGHz;
    const ti = ctx.tables[i];
    const sj = view.states[j];
    const fj = view.freq[j];
    const push = (x: number | null, c: number) => {
      if (x === null || !(x >= ti.fLowGHz - 0.05 && x <= ti.fMaxGHz + 0.05)) return;
      const w = (2 * g * g * c * c) / lim;
      if (w > 1e-7) out.push({ lo: x - w, hi: x + w, rule: 'zz', other: j });
    };
    // i's own higher levels against j's f01: E_4,i - f01_i = f01_j (|11> <-> |4_i 0_j>), E_3,i = f01_j, E_5,i = f01_j.
    const at4 = ti.f01ForLevel(4, fj, true);
    if (at4 !== null) push(at4, ti.at(at4, this.tmp).n14 * sj.n01);
    const at3 = ti.f01ForLevel(3, fj);
    if (at3 !== null) push(at3, ti.at(at3, this.tmp).n03 * sj.n01);
    const at5 = ti.f01ForLevel(5, fj);
    if (at5 !== null) push(at5, ti.at(at5, this.tmp).n05 * sj.n01);
    // j's higher levels: f01_i = E_4,j - f01_j, f01_i = E_3,j, f01_i = E_5,j (coupling with i's n01 there).
    for (const [x, cj] of [[sj.e4 - sj.f01, sj.n14], [sj.e3, sj.n03], [sj.e5, sj.n05]] as const) {
      if (x >= ti.fLowGHz - 0.05 && x <= ti.fMaxGHz + 0.05) push(x, ti.at(Math.min(ti.fMaxGHz, Math.max(ti.fLowGHz, x)), this.tmp).n01 * cj);
    }
  }

  /** |zeta_ij| estimate at f_i = f with j at its current state. */
  zzAt(i: number, j: number, f: number, view: FrequencyView): number {
    const e = this.ctx.edgeBetween(i, j);
    const si = this.ctx.tables[i].at(f, this.tmp);
    return Math.abs(view.zzScale[e] * secondOrderZz(si, view.states[j], this.ctx.edges[e].gChargeGHz));
  }

  /** Blocked set of the ZZ rule for qubit i against neighbour j, narrow resonances included (cached while f_j and the scale stay). */
  zzIntervals(i: number, j: number, view: FrequencyView): Interval[] {
    const e = this.ctx.edgeBetween(i, j);
    const key = e * 2 + (this.ctx.edges[e].a === i ? 0 : 1);
    const fj = view.freq[j];
    const scale = view.zzScale[e];
    const hit = this.zzCache.get(key);
    if (hit && hit.fOther === fj && hit.scale === scale) return hit.intervals;
    const intervals = this.computeZzIntervals(i, j, view);
    const narrow: Blocker[] = [];
    this.narrowZz(i, j, view, narrow);
    for (const b of narrow) intervals.push({ lo: b.lo, hi: b.hi });
    this.zzCache.set(key, { fOther: fj, scale, intervals });
    return intervals;
  }

  private computeZzIntervals(i: number, j: number, view: FrequencyView): Interval[] {
    const ti = this.ctx.tables[i];
    const lim = view.zzLimitGHz;
    const lo = ti.fLowGHz;
    const hi = ti.fMaxGHz;
    const sj = view.states[j];
    // Poles: f12_i(f) = f01_j (11-20, i above j) and f = f12_j (11-02, i below j).
    const p1raw = ti.f01ForF12(sj.f01);
    const p1 = p1raw ?? (sj.f01 > ti.at(hi).f12 ? Infinity : -Infinity);
    const p2 = sj.f12;
    const pl = Math.min(p1, p2);
    const ph = Math.max(p1, p2);
    const z = (f: number) => this.zzAt(i, j, f, view);
    const bad = (f: number) => z(f) > lim;
    const tol = 2e-6;
    const out: Interval[] = [];
    // Below the lower pole: |zeta| grows towards it.
    let lowEdge = Infinity;
    if (pl > lo) {
      const top = Math.min(pl, hi);
      if (bad(lo)) lowEdge = lo - 1e-9;
      else if (top < pl && !bad(top)) lowEdge = Infinity;
      else lowEdge = bisect(lo, top, bad, tol);
    } else lowEdge = -Infinity;
    // Above the upper pole: |zeta| falls away from it.
    let highEdge = -Infinity;
    if (ph < hi) {
      const bottom = Math.max(ph, lo);
      if (bad(hi)) highEdge = hi + 1e-9;
      else if (bottom > ph && !bad(bottom)) highEdge = -Infinity;
      else highEdge = bisect(hi, bottom, bad, tol);
    } else highEdge = Infinity;
    // Between the poles (inside the range): usually blocked throughout.
    const mlo = Math.max(pl, lo);
    const mhi = Math.min(ph, hi);
    if (mhi > mlo) {
      let best = Infinity;
      let bestF = 0.5 * (mlo + mhi);
      const samples = 9;
      for (let s = 1; s <= samples; s++) {
        const f = mlo + ((mhi - mlo) * s) / (samples + 1);
        const v = z(f);
        if (v < best) {
          best = v;
          bestF = f;
        }
      }
      if (best > lim) {
        out.push({ lo: Math.max(lowEdge, lo - 1e-9), hi: Math.min(highEdge, hi + 1e-9) });
      } else {
        // Pieces next to each pole (or range edge) where |zeta| still exceeds the limit.
        if (bad(mlo)) {
          const a = bisect(bestF, mlo, bad, tol);
          const from = pl > lo ? Math.max(lowEdge, lo - 1e-9) : lo - 1e-9;
          out.push({ lo: Math.min(from, mlo), hi: a });
        } else if (lowEdge !== Infinity && lowEdge !== -Infinity) out.push({ lo: Math.max(lowEdge, lo - 1e-9), hi: mlo });
        if (bad(mhi)) {
          const b = bisect(bestF, mhi, bad, tol);
          const to = ph < hi ? Math.min(highEdge, hi + 1e-9) : hi + 1e-9;
          out.push({ lo: b, hi: Math.max(to, mhi) });
        } else if (highEdge !== -Infinity && highEdge !== Infinity) out.push({ lo: mhi, hi: Math.min(highEdge, hi + 1e-9) });
      }
    } else {
      // Both poles on one side of the range, or the range between them is empty.
      if (ph <= lo) {
        if (highEdge !== -Infinity) out.push({ lo: lo - 1e-9, hi: highEdge });
      } else if (pl >= hi) {
        if (lowEdge !== Infinity) out.push({ lo: lowEdge, hi: hi + 1e-9 });
      } else if (lowEdge !== Infinity || highEdge !== -Infinity) {
        out.push({ lo: lowEdge === Infinity ? pl : lowEdge, hi: highEdge === -Infinity ? ph : highEdge });
      }
    }
    return out.filter((x) => x.hi > x.lo && Number.isFinite(x.lo) && Number.isFinite(x.hi));
  }
}

/**
 * The f01 bands where qubit i's own idle error over IDLE_REFERENCE_NS exceeds idleErrorLimit,
 * computed anew (IdleBlockers.idleErrorIntervals remembers them per context).
 */
export function idleErrorBands(ctx: PlanContext, i: number): Interval[] {
  const t = ctx.transmons[i];
  const table = ctx.tables[i];
  const out: Interval[] = [];
  const spec = t.coherenceSpec;
  if (spec) {
    const r = ctx.rules;
    const n = 400;
    const lo = table.fLowGHz;
    const hi = table.fMaxGHz;
    const bad: boolean[] = [];
    // (one point, one options and one parts object for the 401 calls: qubitIdleError only reads the
    // first two and fills the third)
    const point = { coherence: spec, f01GHz: 0, slopeGHz: 0, curvatureGHz: 0 };
    const options = { averagingTimeNs: r.noiseAveragingTimeNs, temperatureK: r.qubitTemperatureK };
    const parts = { t1: 0, dephasing: 0, thermal: 0 };
    for (let k = 0; k <= n; k++) {
      const f = lo + ((hi - lo) * k) / n;
      point.f01GHz = f;
      point.slopeGHz = table.fluxSlopeAtF01(f);
      const e = qubitIdleError(point, IDLE_REFERENCE_NS, options, parts);
      bad.push(e.t1 + e.dephasing + e.thermal > r.idleErrorLimit);
    }
    if (bad.some((b) => !b)) {
      let start = -1;
      for (let k = 0; k <= n + 1; k++) {
        const b = k <= n && bad[k];
        if (b && start < 0) start = k;
        if (!b && start >= 0) {
          // a band that reaches an end of the range extends past it, so the end itself is blocked
          // (blocked intervals are open: a point exactly on their edge is allowed)
          out.push({ lo: start === 0 ? lo - 1 : lo + ((hi - lo) * (start - 0.5)) / n, hi: k > n ? hi + 1 : lo + ((hi - lo) * (k - 0.5)) / n });
          start = -1;
        }
      }
    }
  }
  return out;
}

/**
 * Bisection between a point `good` where bad() is false and a point `towards` where bad() is
 * true (or a pole): returns the boundary point, on the bad side, to `tol`.
 */
function bisect(good: number, towards: number, bad: (f: number) => boolean, tol: number): number {
  let g = good;
  let b = towards;
  if (bad(g)) return g;
  while (Math.abs(b - g) > tol) {
    const m = 0.5 * (g + b);
    if (bad(m)) b = m;
    else g = m;
  }
  return b;
}
