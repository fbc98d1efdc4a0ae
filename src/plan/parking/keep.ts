/**
 * Parking kept from an earlier plan (re-planning, src/plan/replan/): the planner option
 * `keep` (src/plan/options.ts) applied in the parking search (./state.ts):
 *
 *   pin     the kept frequencies are fixed, like a layout `park` (`plan --from OLD --edges ...`:
 *           only the named edges are planned again);
 *   prefer  each qubit starts at its kept frequency, which is always one of its candidates, and
 *           every qubit parked more than 1 kHz away from it adds `changePenalty` to the cost the
 *           search minimises (`plan MEASURED.yaml --from OLD`: the fewest changes first, then the
 *           least cost). The default penalty, 0.5 in the cost's units (an estimated error per
 *           cycle), is above any difference of the cost between allowed points we have seen
 *           (those stay below 0.1: dephasing, ZZ and margin terms) and below a point in the
 *           qubit's own idle-error band (IDLE_ERROR_BREAK, 0.6, ./cost.ts), an unreachable gate
 *           (1) and a broken collision rule (violationPenalty, 1000): a kept frequency gives way
 *           to a rule or an unreachable crossing, never to a slightly cheaper point.
 *
 * A kept frequency outside a qubit's domain (its window in its new planning range: a measured
 * maximum frequency below it, say) cannot be kept; that qubit is placed like any other.
 */
import type { PlanContext } from '../context.js';

export interface KeepParking {
  /** Kept f01 by qubit id (GHz). */
  parkingGHz: Readonly<Record<string, number>>;
  mode: 'pin' | 'prefer';
  /** Cost of parking a qubit away from its kept frequency (mode prefer). */
  changePenalty?: number;
  /** Preferred option (mover, crossing) by edge key, for edges planned again (mode prefer). */
  edgeOptions?: Readonly<Record<string, { mover: string; crossing: '11-20' | '11-02' }>>;
}

export const KEEP_DEFAULTS = Object.freeze({ changePenalty: 0.5, toleranceGHz: 1e-6 });

/** The keep option resolved to qubit indices. */
export class KeptParking {
  private readonly kept: Float64Array;
  readonly pin: boolean;
  readonly penalty: number;

  constructor(ctx: PlanContext, keep: KeepParking | undefined) {
    this.kept = new Float64Array(ctx.n).fill(NaN);
    this.pin = keep?.mode === 'pin';
    this.penalty = keep?.changePenalty ?? KEEP_DEFAULTS.changePenalty;
    if (!keep) return;
    ctx.ids.forEach((id, i) => {
      const f = keep.parkingGHz[id];
      if (f === undefined || !Number.isFinite(f)) return;
      const d = ctx.domains[i];
      // pinned frequencies are kept as they are (a rule they break is reported); preferred ones only inside the domain
      if (this.pin || (d && f >= d.lo - 1e-12 && f <= d.hi + 1e-12)) this.kept[i] = f;
    });
  }

  /** The kept frequency of qubit i (NaN: none). */
  of(i: number): number {
    return this.kept[i];
  }

  pinned(i: number): boolean {
    return this.pin && !Number.isNaN(this.kept[i]);
  }

  /** The change penalty of parking qubit i at f (0 when kept, pinned, or nothing to keep). */
  costOf(i: number, f: number): number {
    const k = this.kept[i];
    if (this.pin || Number.isNaN(k)) return 0;
    return Math.abs(f - k) > KEEP_DEFAULTS.toleranceGHz ? this.penalty : 0;
  }
}
