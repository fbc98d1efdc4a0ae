/**
 * The parking search's working state: current frequencies and tabulated states of every qubit,
 * which qubits take part, the per-edge ZZ calibration, and the helpers that turn the idle rules
 * into blocked intervals (src/plan/rules/idle-blockers.ts), candidate points and costs
 * (./cost.ts) for one qubit at a time.
 */
import type { PlanContext } from '../context.js';
import { subtract, type Interval } from '../intervals.js';
import type { PlanOptions } from '../options.js';
import { emptyTableState, type TableState } from '../qubit-table.js';
import { IdleBlockers, type Blocker, type FrequencyView } from '../rules/idle-blockers.js';
import { ParkingCost, type CostParts } from './cost.js';
import { KeptParking } from './keep.js';

export class ParkingState implements FrequencyView {
  readonly freq: Float64Array;
  readonly states: TableState[];
  readonly active: Uint8Array;
  readonly zzScale: Float64Array;
  zzLimitGHz: number;
  readonly blockers: IdleBlockers;
  readonly cost: ParkingCost;
  /** Parking kept from an earlier plan (options.keep; ./keep.ts). */
  readonly kept: KeptParking;

  constructor(
    readonly ctx: PlanContext,
    readonly options: PlanOptions,
  ) {
    const n = ctx.n;
    this.freq = new Float64Array(n);
    this.states = Array.from({ length: n }, () => emptyTableState());
    this.active = new Uint8Array(n);
    this.zzScale = new Float64Array(ctx.edges.length).fill(1);
    this.zzLimitGHz = ctx.rules.zzLimitGHz * (1 - options.search.zzSafety);
    this.blockers = new IdleBlockers(ctx);
    this.cost = new ParkingCost(ctx, options);
    this.kept = new KeptParking(ctx, options.keep);
    this.changedAt = new Float64Array(n);
    this.settledAt = [new Float64Array(n).fill(-1), new Float64Array(n).fill(-1)];
    this.reads = ctx.neighbours.map((ns, i) => {
      const set = new Set<number>([i]);
      for (const j of ns) {
        set.add(j);
        for (const k of ctx.neighbours[j]) set.add(k);
      }
      for (const p of ctx.nextNearestOf[i]) set.add(ctx.nextNearest[p].a === i ? ctx.nextNearest[p].b : ctx.nextNearest[p].a);
      return Int32Array.from([...set].sort((a, b) => a - b));
    });
    this.blockerReads = ctx.neighbours.map((ns, i) => {
      const set = new Set<number>(ns);
      for (const p of ctx.nextNearestOf[i]) set.add(ctx.nextNearest[p].a === i ? ctx.nextNearest[p].b : ctx.nextNearest[p].a);
      return Int32Array.from([...set].sort((a, b) => a - b));
    });
    this.blockerList = new Array<Blocker[] | undefined>(n);
    this.blockerAt = new Float64Array(n).fill(-1);
    for (let i = 0; i < n; i++) this.set(i, this.startOf(i));
  }

  /** Where a qubit starts: its fixed park, else the top of its domain (the sweet spot when allowed). */
  startOf(i: number): number {
    const fixed = this.ctx.fixed[i];
    if (fixed !== undefined) return fixed;
    if (!Number.isNaN(this.kept.of(i))) return this.kept.of(i);
    const d = this.ctx.domains[i];
    if (d) return d.hi;
    return this.fallbackOf(i);
  }

  /** For a qubit whose window misses its range: the range point nearest the window. */
  fallbackOf(i: number): number {
    const r = this.ctx.ranges[i];
    const w = this.ctx.qubits[i].windowGHz;
    if (!w) return r.hi;
    return w[0] > r.hi ? r.hi : r.lo;
  }

  /** True when the qubit may move (active, not fixed, with a domain). */
  movable(i: number): boolean {
    return this.active[i] === 1 && this.ctx.fixed[i] === undefined && this.ctx.domains[i] !== null && !this.kept.pinned(i);
  }

  /** Changes whenever a frequency or the set of active qubits changes (cost caches key on it). */
  stamp = 0;

  /** The stamp at which each qubit's frequency was last set, and at which the active set or the ZZ calibration last changed (touch). */
  private readonly changedAt: Float64Array;
  private changedAll = 0;
  /** Per qubit, the stamp of its last visit that found no better point, without and with refinement (-1: none). */
  private readonly settledAt: [Float64Array, Float64Array];
  /** Per qubit, the qubits its visit reads: itself, its neighbours and theirs (next-nearest included). */
  private readonly reads: Int32Array[];

  set(i: number, f: number): void {
    this.stamp++;
    this.changedAt[i] = this.stamp;
    this.freq[i] = f;
    this.ctx.tables[i].at(f, this.states[i]);
  }

  /**
   * True when qubit i's last visit (with the same `refine`) found no better point and nothing it
   * reads has changed since: its own frequency, its neighbours' and their neighbours' (the
   * blocked intervals read the neighbours and next-nearest neighbours; the cost the neighbours'
   * gates and their spectators), the active set and the ZZ calibration (touch). A visit then
   * finds no better point again (the search is deterministic), so it can be skipped.
   */
  settled(i: number, refine: boolean): boolean {
    const t = this.settledAt[refine ? 1 : 0][i];
    if (t < 0 || t < this.changedAll) return false;
    const reads = this.reads[i];
    for (let k = 0; k < reads.length; k++) if (this.changedAt[reads[k]] > t) return false;
    return true;
  }

  /** Record that a visit of qubit i (with `refine`) found no better point where the state stands now. */
  markSettled(i: number, refine: boolean): void {
    this.settledAt[refine ? 1 : 0][i] = this.stamp;
  }

  /**
   * Blocked intervals of qubit i with the others where they are (treat as read-only). Remembered
   * per qubit: the list is what IdleBlockers.of gives again while nothing it reads has changed (the
   * frequencies, states and activity of the qubit's neighbours and next-nearest neighbours, and the
   * active set and ZZ calibration, which touch() marks); a list handed out is never changed.
   */
  blockersOf(i: number): Blocker[] {
    this.cost.beginVisit(i, this.stamp);
    const t = this.blockerAt[i];
    const hit = this.blockerList[i];
    if (hit !== undefined && t >= this.changedAll) {
      const reads = this.blockerReads[i];
      let same = true;
      for (let k = 0; k < reads.length; k++) {
        if (this.changedAt[reads[k]] > t) {
          same = false;
          break;
        }
      }
      if (same) return hit;
    }
    const list = this.blockers.of(i, this, []);
    this.blockerList[i] = list;
    this.blockerAt[i] = this.stamp;
    return list;
  }

  /** Per qubit, the qubits its blocked intervals read (neighbours and next-nearest neighbours), its remembered list and the stamp it was computed at. */
  private readonly blockerReads: Int32Array[];
  private readonly blockerList: (Blocker[] | undefined)[];
  private readonly blockerAt: Float64Array;

  /**
   * Cost of qubit i at f. With a `ceiling`, for callers that only ask whether violation + soft <
   * ceiling: at or above it the result may be a lower bound (ParkingCost.at), the same answer.
   */
  costAt(i: number, f: number, blockers: readonly Blocker[], ceiling = Infinity): CostParts {
    const c = this.cost.at(i, f, blockers, this, this.stamp, ceiling);
    const change = this.kept.costOf(i, f);
    return change > 0 ? { violation: c.violation, soft: c.soft + change } : c;
  }

  /** Mark a change of the active set or of the ZZ calibration (zzScale): invalidates cost caches and settled visits. */
  touch(): void {
    this.stamp++;
    this.changedAll = this.stamp;
  }

  /**
   * The allowed parking set of qubit i: its domain minus the blocked intervals (treat as
   * read-only). Remembered per qubit for the last list of blocked intervals asked with: a visit
   * asks twice (candidates, then the refinement), and lists from blockersOf are never changed once
   * handed out, so the same list gives the same set.
   */
  allowed(i: number, blockers: readonly Blocker[]): Interval[] {
    const d = this.ctx.domains[i];
    if (!d) return [];
    if (this.allowedFrom[i] === blockers) return this.allowedList[i]!;
    const list = subtract(d, blockers);
    this.allowedFrom[i] = blockers;
    this.allowedList[i] = list;
    return list;
  }

  private readonly allowedFrom: (readonly Blocker[] | undefined)[] = [];
  private readonly allowedList: (Interval[] | undefined)[] = [];

  /**
   * Candidate frequencies for qubit i: in each allowed interval its nudged ends, its middle and
   * points one and two fabrication spreads inside each end, plus the domain top (sweet spot);
   * when nothing is allowed, the points just outside each blocked interval and the domain ends.
   */
  candidates(i: number, blockers: readonly Blocker[]): number[] {
    const d = this.ctx.domains[i];
    if (!d) return [this.freq[i]];
    const out: number[] = [this.freq[i]];
    if (!Number.isNaN(this.kept.of(i))) out.push(this.kept.of(i));
    const allowed = this.allowed(i, blockers);
    const nudge = this.options.search.nudgeGHz;
    const sigma = this.sigmaAt(i, this.freq[i]);
    if (allowed.length > 0) {
      for (const a of allowed) {
        const width = a.hi - a.lo;
        const dn = Math.min(nudge, width / 2);
        out.push(a.lo + dn, a.hi - dn, 0.5 * (a.lo + a.hi));
        for (const k of [1, 2]) {
          if (k * sigma < width / 2) out.push(a.lo + k * sigma, a.hi - k * sigma);
        }
        if (d.hi >= a.lo && d.hi <= a.hi) out.push(d.hi);
      }
    } else {
      out.push(d.lo, d.hi);
      for (const b of blockers) {
        if (b.lo - nudge >= d.lo && b.lo - nudge <= d.hi) out.push(b.lo - nudge);
        if (b.hi + nudge >= d.lo && b.hi + nudge <= d.hi) out.push(b.hi + nudge);
      }
    }
    return out;
  }

  /** Expected fabrication spread of f01 at f (tabulated), GHz. */
  sigmaAt(i: number, f: number): number {
    const st = this.ctx.tables[i].at(f);
    return Math.abs(st.df01dEj * st.ejRatio * this.ctx.transmons[i].ejsGHz) * this.ctx.rules.resistanceSpread;
  }

  /** Violation measure of qubit i where it is now. */
  violationOf(i: number): number {
    if (!this.active[i]) return 0;
    return this.costAt(i, this.freq[i], this.blockersOf(i)).violation;
  }
}
