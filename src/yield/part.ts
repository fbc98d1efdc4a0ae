/**
 * One slice of a sharded yield run (`fluxlane yield --shard K/N -o part-K.json`) and the merge
 * of all slices (`fluxlane yield-merge PARTS... -o RESULT.json`) into exactly the result one run
 * of all samples gives: the outcome of every sample travels in its slice, and the merge rebuilds
 * the result from them in sample order with the same function (./summary.ts).
 *
 * Part file (JSON): { format: "fluxlane-yield-part", version: 1, run: <the run's identity>,
 * shard: { index, count, from, to }, qubits: [ids], edges: ["A-B", ...],
 * rows: [[<outcome>, ...] per row], } with each outcome { index, ok, rules: [[rule, findings]],
 * qubits: [qubit indices], edges: [edge indices], reason, cycleError }.
 *
 * The merge refuses, with one message each: a file that is not a part, parts of different runs
 * (layout, seed, samples, spreads, mode, plan, sweep, ceiling or fluxlane version differ: it names
 * the first field that differs), parts of different shard counts, the same shard twice, missing
 * shards, and a part whose samples are not its shard's.
 */
import * as z from 'zod';
import { InputError, type Diagnostic } from '../util/errors.js';
import { rowSpreads } from './job.js';
import type { SampleOutcome } from './outcome.js';
import { shardRange, type Shard } from './shard.js';
import { yieldResult, type YieldRunIdentity } from './summary.js';

export const PART_FORMAT = 'fluxlane-yield-part';
export const PART_VERSION = 1;

export interface YieldPart {
  format: typeof PART_FORMAT;
  version: typeof PART_VERSION;
  run: YieldRunIdentity;
  shard: Shard & { from: number; to: number };
  qubits: string[];
  edges: string[];
  rows: SampleOutcome[][];
}

export function yieldPart(run: YieldRunIdentity, shard: Shard, qubits: string[], edges: string[], rows: SampleOutcome[][]): YieldPart {
  return { format: PART_FORMAT, version: PART_VERSION, run, shard: { ...shard, ...shardRange(run.samples, shard) }, qubits, edges, rows };
}

const int = z.number().int().min(0);
const OutcomeSchema = z.object({
  index: int,
  ok: z.boolean(),
  rules: z.array(z.tuple([z.string(), int])),
  qubits: z.array(int),
  edges: z.array(int),
  reason: z.string().nullable(),
  cycleError: z.number().nullable(),
});
const PartSchema = z.object({
  format: z.literal(PART_FORMAT),
  version: z.literal(PART_VERSION),
  run: z.looseObject({ samples: int.min(1), spread: z.looseObject({ rn: z.number() }), sweep: z.array(z.number()).nullable() }),
  shard: z.object({ index: int, count: int.min(1), from: int, to: int }),
  qubits: z.array(z.string()),
  edges: z.array(z.string()),
  rows: z.array(z.array(OutcomeSchema)),
});

/** Read one part file's text (InputError naming the file on anything else). */
export function readPart(text: string, file: string): YieldPart {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (err) {
    throw new InputError({ file, message: `expected a yield part (JSON written by fluxlane yield --shard K/N -o FILE), found a JSON syntax error: ${err instanceof Error ? err.message : String(err)}` });
  }
  const format = (raw as { format?: unknown } | null)?.format;
  if (format === 'fluxlane-yield') {
    throw new InputError({ file, message: 'expected a yield part (fluxlane yield --shard K/N -o FILE), found a whole yield result (format "fluxlane-yield"): merge the parts, not results' });
  }
  const parsed = PartSchema.safeParse(raw);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const where = issue.path.length > 0 ? ` at ${issue.path.join('.')}` : '';
    throw new InputError({ file, message: `expected a yield part (format "${PART_FORMAT}", version ${PART_VERSION}), found something else${where}: ${issue.message}` });
  }
  // the text's own objects (their key order is the run's, so the merged result is byte-identical)
  return raw as YieldPart;
}

/** Join the parts of one run into its result (see the banner for what is refused). */
export function mergeParts(parts: readonly { file: string; part: YieldPart }[]): Record<string, unknown> {
  if (parts.length === 0) throw new InputError({ message: 'expected at least one part file, found none' });
  const [first, ...rest] = parts;
  const problems: Diagnostic[] = [];
  for (const { file, part } of rest) {
    const field = firstDifference(first.part.run, part.run, 'run');
    if (field) {
      problems.push({ file, message: `expected a part of the same run as ${first.file}, found another ${field.path}: ${field.there} here, ${field.here} there` });
      continue;
    }
    if (!sameList(first.part.qubits, part.qubits) || !sameList(first.part.edges, part.edges)) {
      problems.push({ file, message: `expected the qubits and edges of ${first.file}, found others` });
    }
    if (part.shard.count !== first.part.shard.count) {
      problems.push({ file, message: `expected shard K/${first.part.shard.count} like ${first.file}, found shard ${part.shard.index}/${part.shard.count}` });
    }
  }
  if (problems.length > 0) throw new InputError(problems);
  const count = first.part.shard.count;
  const byShard = new Map<number, { file: string; part: YieldPart }>();
  for (const p of parts) {
    const seen = byShard.get(p.part.shard.index);
    if (seen) problems.push({ file: p.file, message: `expected each shard once, found shard ${p.part.shard.index}/${count} again (also in ${seen.file})` });
    else byShard.set(p.part.shard.index, p);
  }
  const missing = Array.from({ length: count }, (_, k) => k).filter((k) => !byShard.has(k));
  if (missing.length > 0) {
    const shown = missing.length > 12 ? `${missing.slice(0, 12).join(', ')}, ... (${missing.length} in all)` : missing.join(', ');
    problems.push({ message: `expected all ${count} shards 0-${count - 1}, found shard(s) ${shown} missing` });
  }
  const run = first.part.run;
  const rowCount = rowSpreads(run).length;
  for (const { file, part } of parts) {
    const { from, to } = shardRange(run.samples, part.shard);
    const ok = part.shard.from === from && part.shard.to === to && part.rows.length === rowCount &&
      part.rows.every((row) => row.length === to - from && row.every((o, k) => o.index === from + k));
    if (!ok) problems.push({ file, message: `expected samples ${from}-${to - 1} of ${run.samples} in ${rowCount} row(s) for shard ${part.shard.index}/${count}, found other samples` });
  }
  if (problems.length > 0) throw new InputError(problems);
  const ordered = Array.from({ length: count }, (_, k) => byShard.get(k)!.part);
  const rows = Array.from({ length: rowCount }, (_, r) => ordered.flatMap((p) => p.rows[r]));
  return yieldResult(run, first.part.qubits, first.part.edges, rows, rowSpreads(run));
}

function sameList(a: readonly string[], b: readonly string[]): boolean {
  return a.length === b.length && a.every((x, k) => x === b[k]);
}

/** The first field (dotted path) where two JSON values differ, with both values shown briefly. */
function firstDifference(a: unknown, b: unknown, path: string): { path: string; here: string; there: string } | null {
  if (a !== null && b !== null && typeof a === 'object' && typeof b === 'object' && Array.isArray(a) === Array.isArray(b)) {
    const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])];
    for (const k of keys) {
      const d = firstDifference((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], `${path}.${k}`);
      if (d) return d;
    }
    return null;
  }
  if (Object.is(a, b)) return null;
  const show = (x: unknown) => {
    const t = JSON.stringify(x) ?? 'nothing';
    return t.length > 60 ? `${t.slice(0, 57)}...` : t;
  };
  return { path: path.replace(/^run\./, ''), here: show(a), there: show(b) };
}
