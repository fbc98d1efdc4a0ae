/**
 * What one drawn chip gave: whether it works, which rules it breaks (with how many findings
 * each), which qubits and edges those findings name, the first finding's message (rules in
 * catalogue order), and its cycle error when the plan states one. Plain data: it crosses worker
 * threads and is stored in the slices of a sharded run (./part.ts).
 */
import type { PlanContext } from '../plan/context.js';
import { COLLISION_RULES } from '../plan/rules/catalogue.js';
import type { Finding } from '../plan/rules/findings.js';

export interface SampleOutcome {
  /** Sample index in the run. */
  index: number;
  ok: boolean;
  /** Rules broken and their number of findings, in catalogue order (unknown rules last, by name). */
  rules: [rule: string, findings: number][];
  /** Qubit indices named by a finding, ascending. */
  qubits: number[];
  /** Edge indices (layout order) of the findings, ascending. */
  edges: number[];
  /** The message of the first finding in rule order; null when the chip works. */
  reason: string | null;
  /** The plan's error per cycle (replan mode, when the plan states it); null otherwise. */
  cycleError: number | null;
}

const RANK = new Map<string, number>(COLLISION_RULES.map((r, k) => [r.name, k]));
/** A rule's place in the catalogue (rules the catalogue does not hold come after all of it). */
export const ruleRank = (rule: string): number => RANK.get(rule) ?? RANK.size;
const rank = ruleRank;

export function outcomeOf(
  ctx: PlanContext,
  index: number,
  findings: readonly Finding[],
  cycleError: number | null,
  extraFailure: { rule: string; message: string } | null = null,
  messageOf: (f: Finding) => string = (f) => f.message,
): SampleOutcome {
  const counts = new Map<string, number>();
  // (the qubits and edges named, marked by index and read back in ascending order: the sets,
  // sorted, of before; a drawn 10 x 10 chip's outcome names hundreds of findings)
  const qubitNamed = new Uint8Array(ctx.n);
  const edgeNamed = new Uint8Array(ctx.edges.length);
  let first: Finding | undefined;
  let firstRank = Infinity;
  const edgeIndex = edgeIndexOf(ctx);
  for (const f of findings) {
    counts.set(f.rule, (counts.get(f.rule) ?? 0) + 1);
    for (const q of f.qubits) {
      const i = ctx.index.get(q);
      if (i !== undefined) qubitNamed[i] = 1;
    }
    if (f.edge !== undefined) {
      const k = edgeIndex.get(f.edge);
      if (k !== undefined) edgeNamed[k] = 1;
    }
    const r = rank(f.rule);
    if (!first || r < firstRank) {
      first = f;
      firstRank = r;
    }
  }
  const qubits: number[] = [];
  for (let i = 0; i < qubitNamed.length; i++) if (qubitNamed[i]) qubits.push(i);
  const edges: number[] = [];
  for (let k = 0; k < edgeNamed.length; k++) if (edgeNamed[k]) edges.push(k);
  if (extraFailure) counts.set(extraFailure.rule, (counts.get(extraFailure.rule) ?? 0) + 1);
  const rules = [...counts.entries()].sort((a, b) => rank(a[0]) - rank(b[0]) || (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0));
  const ok = findings.length === 0 && !extraFailure;
  return {
    index,
    ok,
    rules,
    qubits,
    edges,
    reason: ok ? null : first ? messageOf(first) : extraFailure!.message,
    cycleError,
  };
}

const edgeIndexCache = new WeakMap<readonly unknown[], Map<string, number>>();

function edgeIndexOf(ctx: PlanContext): Map<string, number> {
  let m = edgeIndexCache.get(ctx.edges);
  if (!m) {
    m = new Map(ctx.edges.map((e) => [e.key, e.index]));
    edgeIndexCache.set(ctx.edges, m);
  }
  return m;
}
