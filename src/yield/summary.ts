/**
 * The result of a yield run, built from the outcome of every sample in sample order (the same
 * function for a single run and for merged slices, so both give the same bytes).
 *
 * The JSON is self-describing and stable (`format: "fluxlane-yield"`, `version: 1`; fields are
 * only ever added): what was run (chip, layout digest, mode, seed, samples, spreads, the plan
 * kept or the planner seed), the yield with its Wilson 95 % interval (./wilson.ts), the rules,
 * qubits and edges that fail most often (counts of samples; `findings` also counts repeats within
 * a sample), the first failing samples with their reasons (re-run one with `--sample K`), the
 * distribution of the cycle error when the plans state one, and the yield against spread.
 * Fractions are plain numbers (0..1), frequencies are not involved.
 */
import { roundSignificant } from '../layout/units.js';
import { ruleRank, type SampleOutcome } from './outcome.js';
import { wilsonInterval, Z_95 } from './wilson.js';

export const YIELD_FORMAT = 'fluxlane-yield';
export const YIELD_VERSION = 1;

/** What identifies a run: two slices merge only when these are equal. */
export interface YieldRunIdentity {
  chip: string;
  /** The layout file as named on the command line, and the SHA-256 of its bytes. */
  layout: string;
  layoutSha256: string;
  mode: 'fixed' | 'replan';
  seed: number;
  samples: number;
  spread: { rn: number; ec: number; g: number; measured: { rn: string[]; ec: string[] } };
  /** Fixed mode: where the kept plan came from. */
  plan: { source: 'planned'; seed: number; holds: boolean; violations: number } | { source: 'file'; file: string; sha256: string } | null;
  /** Replan mode: the planner's seed. */
  planSeed: number | null;
  sweep: number[] | null;
  cycleErrorCeiling: number | null;
  /** The fluxlane version that ran it. */
  fluxlane: string;
}

/** How many failing samples are listed with their reasons. */
export const EXAMPLES = 10;

export interface YieldStatistics {
  samples: number;
  successes: number;
  fraction: number;
  low: number;
  high: number;
}

function stats(outcomes: readonly SampleOutcome[]): YieldStatistics {
  const successes = outcomes.reduce((s, o) => s + (o.ok ? 1 : 0), 0);
  const n = outcomes.length;
  const w = wilsonInterval(successes, n);
  return { samples: n, successes, fraction: plain(successes / n), low: plain(w.low), high: plain(w.high) };
}

/**
 * The result object. `ids` and `edgeKeys` name qubits and edges by index; `rows` holds the
 * outcomes of each row in sample order (row 0 at the run's spread), `rowSpreads` their
 * resistance spreads.
 */
export function yieldResult(
  run: YieldRunIdentity,
  ids: readonly string[],
  edgeKeys: readonly string[],
  rows: readonly (readonly SampleOutcome[])[],
  rowSpreads: readonly number[],
): Record<string, unknown> {
  const main = rows[0];
  const n = main.length;
  const ruleSamples = new Map<string, { samples: number; findings: number }>();
  const qubitCounts = new Map<number, number>();
  const edgeCounts = new Map<number, number>();
  const examples: { sample: number; rules: string[]; reason: string | null }[] = [];
  for (const o of main) {
    for (const [rule, count] of o.rules) {
      const r = ruleSamples.get(rule) ?? { samples: 0, findings: 0 };
      r.samples++;
      r.findings += count;
      ruleSamples.set(rule, r);
    }
    for (const q of o.qubits) qubitCounts.set(q, (qubitCounts.get(q) ?? 0) + 1);
    for (const e of o.edges) edgeCounts.set(e, (edgeCounts.get(e) ?? 0) + 1);
    if (!o.ok && examples.length < EXAMPLES) examples.push({ sample: o.index, rules: o.rules.map(([r]) => r), reason: o.reason });
  }
  // Rules by samples (most first), ties in catalogue order, then by name.
  const rules = [...ruleSamples.entries()]
    .sort((a, b) => b[1].samples - a[1].samples || ruleRank(a[0]) - ruleRank(b[0]) || (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0))
    .map(([rule, r]) => ({ rule, samples: r.samples, findings: r.findings, fraction: plain(r.samples / n) }));
  const qubits = [...qubitCounts.entries()].sort((a, b) => b[1] - a[1] || a[0] - b[0]).map(([q, c]) => ({ qubit: ids[q], samples: c, fraction: plain(c / n) }));
  const edges = [...edgeCounts.entries()].sort((a, b) => b[1] - a[1] || a[0] - b[0]).map(([e, c]) => ({ edge: edgeKeys[e], samples: c, fraction: plain(c / n) }));
  const sweep = run.sweep === null ? null : run.sweep.map((rn) => {
    const row = rowSpreads.indexOf(rn);
    return { rn, ...stats(rows[row]) };
  });
  return {
    format: YIELD_FORMAT,
    version: YIELD_VERSION,
    ...run,
    confidence: { level: 0.95, z: Z_95, method: 'Wilson score interval' },
    yield: stats(main),
    failures: { rules, qubits, edges, examples },
    cycleError: cycleErrorDistribution(main),
    sweepSpread: sweep,
  };
}

/** Quantiles and a histogram of the cycle errors stated by the plans (null when none did). */
export function cycleErrorDistribution(outcomes: readonly SampleOutcome[]): Record<string, unknown> | null {
  const values = outcomes.map((o) => o.cycleError).filter((x): x is number => x !== null);
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const q = (p: number) => {
    // linear interpolation between order statistics (NumPy's default "linear" method)
    const x = p * (sorted.length - 1);
    const lo = Math.floor(x);
    const hi = Math.min(sorted.length - 1, lo + 1);
    return sorted[lo] + (sorted[hi] - sorted[lo]) * (x - lo);
  };
  let sum = 0;
  for (const v of values) sum += v;
  // decade bins from 1e-6 to 1 (values outside go to the first or last bin)
  const edges = [1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 1e-1, 1];
  const counts = new Array<number>(edges.length - 1).fill(0);
  for (const v of values) {
    let k = 0;
    while (k < counts.length - 1 && v >= edges[k + 1]) k++;
    counts[k]++;
  }
  return {
    samples: values.length,
    min: plain(sorted[0]),
    p05: plain(q(0.05)),
    median: plain(q(0.5)),
    p95: plain(q(0.95)),
    max: plain(sorted[sorted.length - 1]),
    mean: plain(sum / values.length),
    histogram: { edges, counts },
  };
}

function plain(x: number): number {
  return roundSignificant(x, 12);
}
