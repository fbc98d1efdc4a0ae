/**
 * Hold and destination tuning of a CZ (issue: find the hold time at the destination and the
 * destination's offset from the exact crossing that give the target conditional phase with the
 * least leakage, within the maximum gate duration).
 *
 * For a destination offset delta (mover f01 at the destination minus its f01 at the exact
 * crossing), one simulation of the ramp gives the gate for every hold time (src/gate/hold-scan.ts).
 * Along the hold, phi_c(t) is scanned on a fine grid; every solution of phi_c(t) = theta (mod
 * 2 pi) is refined by bisection and the one with the least estimated error kept: the coherent
 * error 1 - F (leakage plus any exchange error) plus the decoherence a longer hold costs,
 * errorPerNs * hold (the caller's estimate of the decoherence rate at the destination), with
 * leakage above 5e-5 penalised strongly (leakage is the error virtual-Z corrections and later
 * gates cannot undo): e*(delta). e* is minimised over delta by a
 * coarse scan over the offset window followed by a golden-section search around the best point. When no offset has a solution within the
 * duration limit, the tuner says so.
 */
import { conditionalPhase, gateMetrics, leakage, wrapAngle, type Block4 } from '../sim/gate-metrics.js';
import type { HoldScan } from './hold-scan.js';
import { goldenSection } from '../util/golden-section.js';

export interface HoldSolution {
  holdNs: number;
  leakage: number;
  conditionalPhase: number;
  /** 1 - F (coherent, after optimal virtual Z). */
  infidelity: number;
  /** What the tuner minimises: infidelity + errorPerNs * hold (an estimate of decoherence). */
  score: number;
}

export const HOLD_SCAN_DEFAULTS = Object.freeze({
  /** Hold grid of the phase scan (ns): ~40 points per period of the 11-20 oscillation; 0.2 gives the same designs on Clove-17 and Bowline-5. */
  stepNs: 0.4,
  refine: 12,
  /** Leakage above this is penalised with leakageWeight per unit (a near-hard limit). */
  leakageTarget: 5e-5,
  leakageWeight: 1000,
});

/**
 * The hold in [0, maxHoldNs] reaching phi_c = theta with the least coherent error (1 - F, which
 * contains the leakage and any exchange error between 01 and 10), or null.
 */
export function bestHold(scan: HoldScan, theta: number, maxHoldNs: number, stepNs: number = HOLD_SCAN_DEFAULTS.stepNs, errorPerNs = 0): HoldSolution | null {
  if (!(maxHoldNs >= 0)) return null;
  const buf: Block4 = { re: new Float64Array(16), im: new Float64Array(16) };
  const err = (t: number): number => wrapAngle(conditionalPhase(scan.block(t, buf)) - theta);
  const n = Math.max(1, Math.ceil(maxHoldNs / stepNs));
  const step = maxHoldNs / n;
  const grid = scan.phaseScan(step, n);
  let best: HoldSolution | null = null;
  const consider = (t: number): void => {
    const m = scan.block(t, buf);
    const g = gateMetrics(m, theta);
    const l = leakage(m);
    const excess = Math.max(0, l - HOLD_SCAN_DEFAULTS.leakageTarget);
    const sol = { holdNs: t, leakage: l, conditionalPhase: conditionalPhase(m), infidelity: 1 - g.fidelity, score: 1 - g.fidelity + errorPerNs * t + HOLD_SCAN_DEFAULTS.leakageWeight * excess };
    if (!best || sol.score < best.score * (1 - 1e-9) - 1e-12) best = sol;
  };
  let e0 = wrapAngle(grid[0] - theta);
  if (Math.abs(e0) < 1e-12) consider(0);
  for (let k = 1; k <= n; k++) {
    const e1 = wrapAngle(grid[k] - theta);
    // a genuine zero crossing (not the wrap jump at +-pi)
    if (e0 !== 0 && Math.sign(e0) !== Math.sign(e1) && Math.abs(e0 - e1) < Math.PI) {
      // Illinois (modified false position) on the bracket
      let a = (k - 1) * step;
      let b = k * step;
      let ea = e0;
      let eb = e1;
      let side = 0;
      let m = a;
      for (let it = 0; it < HOLD_SCAN_DEFAULTS.refine; it++) {
        m = (a * eb - b * ea) / (eb - ea);
        const em = err(m);
        // 1e-10 rad: far below what the secant correction on the samples leaves
        if (Math.abs(em) < 1e-10 || b - a < 1e-12) break;
        if (Math.sign(em) === Math.sign(ea)) {
          a = m;
          ea = em;
          if (side === -1) eb *= 0.5;
          side = -1;
        } else {
          b = m;
          eb = em;
          if (side === 1) ea *= 0.5;
          side = 1;
        }
      }
      consider(m);
    } else if (e1 === 0) consider(k * step);
    e0 = e1;
  }
  return best;
}

/**
 * How close phi_c comes to theta along the hold (min over the scan grid of |phi_c(t) - theta|,
 * rad) when no hold reaches it: near a destination where phi_c only touches theta, this closes
 * to 0, which guides the offset search into narrow windows of solutions (see searchOffset).
 */
export function phaseMiss(scan: HoldScan, theta: number, maxHoldNs: number, stepNs: number = HOLD_SCAN_DEFAULTS.stepNs): number {
  if (!(maxHoldNs >= 0)) return Infinity;
  const n = Math.max(1, Math.ceil(maxHoldNs / stepNs));
  const grid = scan.phaseScan(maxHoldNs / n, n);
  let miss = Infinity;
  for (let k = 0; k <= n; k++) miss = Math.min(miss, Math.abs(wrapAngle(grid[k] - theta)));
  return miss;
}

/** One destination offset: the best hold solution (null when none) and, without one, phaseMiss. */
export interface OffsetEvaluation {
  solution: HoldSolution | null;
  miss: number;
}

export interface OffsetSearchResult {
  offsetGHz: number;
  hold: HoldSolution;
  evaluations: number;
}

/**
 * Minimise e*(delta) over [lo, hi]: `coarse` equally spaced points, then golden-section search
 * in the bracket of each of the `candidates` best local minima of the coarse scan (the landscape
 * has narrow minima where the leakage of the two ramps interferes away). `evaluate` returns null
 * when an offset cannot be reached, and a null solution when no hold reaches theta there.
 *
 * When no point of the scan has a solution (theta is reached only in a window of offsets narrower
 * than the grid, typically where a sudden ramp's phi_c barely touches pi at the full 11-20
 * cycle), the offset with the least phase miss is refined by golden-section search on the miss
 * until a solution appears (at most `golden` extra steps), and the score search then runs in
 * that bracket.
 */
export function searchOffset(
  evaluateOffset: (offsetGHz: number) => OffsetEvaluation | null,
  lo: number,
  hi: number,
  coarse = 17,
  golden = 9,
  candidates = 3,
  /** An extra fine grid [from, to, points], e.g. around the exact crossing where short gates live. */
  fine?: [number, number, number],
): OffsetSearchResult | null {
  const misses = new Map<number, number>();
  const evaluate = (x: number): HoldSolution | null => {
    const r = evaluateOffset(x);
    misses.set(x, r ? (r.solution ? 0 : r.miss) : Infinity);
    return r ? r.solution : null;
  };
  const pts: number[] = [];
  for (let k = 0; k < coarse; k++) pts.push(lo + ((hi - lo) * k) / (coarse - 1));
  if (fine) for (let k = 0; k < fine[2]; k++) pts.push(fine[0] + ((fine[1] - fine[0]) * k) / (fine[2] - 1));
  pts.sort((a, b) => a - b);
  const xs: number[] = [];
  const vals: (HoldSolution | null)[] = [];
  let evaluations = 0;
  for (const x of pts) {
    if (xs.length > 0 && Math.abs(x - xs[xs.length - 1]) < 1e-12) continue;
    xs.push(x);
    vals.push(evaluate(x));
    evaluations++;
  }
  coarse = xs.length;
  const score = (s: HoldSolution | null): number => (s ? s.score : Infinity);
  let best: { offsetGHz: number; hold: HoldSolution } | null = null;
  const note = (x: number, s: HoldSolution | null): void => {
    if (s && (!best || s.score < best.hold.score)) best = { offsetGHz: x, hold: s };
  };
  xs.forEach((x, k) => note(x, vals[k]));
  let brackets: [number, number][] = [];
  if (!best) {
    // no solution on the grid: close in on the least phase miss
    let k = -1;
    xs.forEach((x, j) => {
      const m = misses.get(x) ?? Infinity;
      if (Number.isFinite(m) && (k < 0 || m < (misses.get(xs[k]) ?? Infinity))) k = j;
    });
    if (k < 0) return null;
    const missAt = (x: number): number => {
      note(x, evaluate(x));
      evaluations++;
      return misses.get(x) ?? Infinity;
    };
    const g = goldenSection(missAt, xs[Math.max(0, k - 1)], xs[Math.min(coarse - 1, k + 1)], golden, () => best !== null);
    if (!best) return null;
    brackets = [[g.a, g.b]];
  }
  const minima = xs
    .map((_, k) => k)
    .filter((k) => Number.isFinite(score(vals[k])) && (k === 0 || score(vals[k]) <= score(vals[k - 1])) && (k === coarse - 1 || score(vals[k]) <= score(vals[k + 1])))
    .sort((a, b) => score(vals[a]) - score(vals[b]))
    .slice(0, candidates);
  if (brackets.length === 0) brackets = minima.map((k) => [xs[Math.max(0, k - 1)], xs[Math.min(coarse - 1, k + 1)]] as [number, number]);
  for (const [a, b] of brackets) {
    goldenSection(
      (x) => {
        const s = evaluate(x);
        note(x, s);
        return score(s);
      },
      a,
      b,
      golden,
    );
    evaluations += 2 + golden;
  }
  const found = best as { offsetGHz: number; hold: HoldSolution };
  return { ...found, evaluations };
}
