/**
 * Closed frequency intervals [lo, hi] (GHz) and the set operations the planner needs: a qubit's
 * allowed parking set is its domain minus the union of the intervals its neighbours block, and an
 * infeasible window is explained by the fewest blocking intervals that still cover it (greedy
 * interval cover, optimal for intervals on a line: Cormen et al., "Introduction to Algorithms",
 * activity-selection style greedy; common practice).
 */

export interface Interval {
  lo: number;
  hi: number;
}

/** Sorted, non-overlapping union of intervals (empty ones, lo > hi, are dropped). */
export function unionOf(intervals: readonly Interval[]): Interval[] {
  // (the given intervals are sorted as they are, and only the union's intervals are new objects:
  // the parking search asks for the union of some 25 blocked intervals per qubit tens of
  // thousands of times)
  const list = intervals.filter((i) => i.lo <= i.hi);
  list.sort((a, b) => a.lo - b.lo || a.hi - b.hi);
  const out: Interval[] = [];
  for (const i of list) {
    const last = out[out.length - 1];
    if (last && i.lo <= last.hi) last.hi = Math.max(last.hi, i.hi);
    else out.push({ lo: i.lo, hi: i.hi });
  }
  return out;
}

/**
 * `domain` minus the union of `blocked` (open blocked intervals: a point exactly on a blocked
 * interval's edge stays allowed). Result sorted; single points are kept as [x, x].
 */
export function subtract(domain: Interval, blocked: readonly Interval[]): Interval[] {
  const out: Interval[] = [];
  let cursor = domain.lo;
  for (const b of unionOf(blocked)) {
    if (b.hi < cursor) continue;
    if (b.lo > domain.hi) break;
    if (b.lo >= cursor) out.push({ lo: cursor, hi: Math.min(b.lo, domain.hi) });
    cursor = Math.max(cursor, b.hi);
    if (cursor > domain.hi) break;
  }
  if (cursor <= domain.hi) out.push({ lo: cursor, hi: domain.hi });
  return out.filter((i) => i.lo <= i.hi);
}

/** Total length of the union of `intervals` inside `domain`. */
export function coveredLength(domain: Interval, intervals: readonly Interval[]): number {
  let total = 0;
  for (const i of unionOf(intervals)) {
    const lo = Math.max(i.lo, domain.lo);
    const hi = Math.min(i.hi, domain.hi);
    if (hi > lo) total += hi - lo;
  }
  return total;
}

/** True when x lies strictly inside [lo, hi]. */
export function strictlyInside(x: number, i: Interval): boolean {
  return x > i.lo && x < i.hi;
}

/**
 * Signed distance from x to the interval: positive outside (distance to the nearer edge),
 * negative inside (minus the distance to the nearer edge), zero on an edge.
 */
export function signedDistance(x: number, i: Interval): number {
  if (x <= i.lo) return i.lo - x;
  if (x >= i.hi) return x - i.hi;
  return -Math.min(x - i.lo, i.hi - x);
}

/**
 * The fewest of `intervals` whose union covers `domain` (greedy: from the left edge, always take
 * the interval reaching furthest right among those that start at or before the covered point).
 * Returns the indices into `intervals`, or null when they do not cover the domain.
 */
export function minimalCover(domain: Interval, intervals: readonly Interval[]): number[] | null {
  const order = intervals.map((_, k) => k).sort((a, b) => intervals[a].lo - intervals[b].lo || a - b);
  const chosen: number[] = [];
  let covered = domain.lo;
  let k = 0;
  let first = true;
  while (first || covered < domain.hi) {
    first = false;
    let best = -1;
    let reach = covered;
    while (k < order.length && intervals[order[k]].lo <= covered) {
      const i = intervals[order[k]];
      if (i.hi > reach || (best < 0 && i.hi >= reach)) {
        reach = i.hi;
        best = order[k];
      }
      k++;
    }
    if (best < 0) return null;
    chosen.push(best);
    if (reach <= covered && covered < domain.hi) return null;
    covered = reach;
  }
  return chosen;
}
