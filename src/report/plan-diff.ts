/**
 * What changed between two plans (`fluxlane diff OLD.json NEW.json`), field by field: the rules,
 * each qubit's measured device parameters and parking, each edge's decisions (mover, crossing,
 * interaction frequency, spectators moved, layer, feasibility) and its designed gate (family,
 * ramps, durations, fidelities). Why: the reasons a re-plan recorded (NEW's `replan` block, when
 * NEW was planned `--from` OLD); without them, the measured changes of the qubits involved.
 * Numbers are equal within the 12 significant digits plan.json keeps.
 */
import { freq } from '../plan/format.js';

export interface FieldDiff {
  field: string;
  from: unknown;
  to: unknown;
}

export interface SubjectDiff {
  /** Qubit id or edge key (A-B as in NEW), or 'rules'. */
  subject: string;
  changes: FieldDiff[];
  why: string[];
}

export interface PlanDiff {
  chip: { from: unknown; to: unknown };
  /** NEW was re-planned from a plan (its `replan.from`), or null. */
  replannedFrom: string | null;
  rules: SubjectDiff | null;
  measured: SubjectDiff[];
  parking: SubjectDiff[];
  edges: SubjectDiff[];
  added: string[];
  removed: string[];
  unchanged: { parking: number; edges: number };
}

type Doc = Record<string, any>;

const QUBIT_FIELDS = ['parkingFrequency'] as const;
const EDGE_FIELDS = ['mover', 'crossing', 'interactionFrequency', 'spectatorParking', 'layer', 'feasible', 'rampTime', 'slotDuration'] as const;
const GATE_FIELDS = ['family', 'rampTime', 'holdTime', 'duration', 'targetPhase', 'leakage', 'fidelity', 'fidelityNoisy'] as const;

function equal(a: unknown, b: unknown): boolean {
  if (typeof a === 'number' && typeof b === 'number') return a === b || Math.abs(a - b) <= 1e-11 * Math.max(Math.abs(a), Math.abs(b));
  if (a && b && typeof a === 'object' && typeof b === 'object') {
    const ka = Object.keys(a as object).sort();
    const kb = Object.keys(b as object).sort();
    return ka.length === kb.length && ka.every((k, i) => k === kb[i] && equal((a as Doc)[k], (b as Doc)[k]));
  }
  return (a ?? null) === (b ?? null);
}

function compare(oldObj: Doc | undefined, newObj: Doc | undefined, fields: readonly string[], prefix = ''): FieldDiff[] {
  const out: FieldDiff[] = [];
  for (const f of fields) {
    const a = oldObj?.[f];
    const b = newObj?.[f];
    if (!equal(a, b)) out.push({ field: prefix + f, from: a ?? null, to: b ?? null });
  }
  return out;
}

const pairKey = (q: string[]) => [...q].sort().join('\u0000');

export function planDiff(oldDoc: Doc, newDoc: Doc): PlanDiff {
  const replan = newDoc.replan as { from?: string; changes?: { subject: string; kind: string; message: string }[] } | undefined;
  const reasons = (subject: string, kinds: string[]) => (replan?.changes ?? []).filter((c) => c.subject === subject && kinds.includes(c.kind)).map((c) => c.message);
  const ruleKeys = [...new Set([...Object.keys(oldDoc.rules ?? {}), ...Object.keys(newDoc.rules ?? {})])];
  const ruleChanges = compare(oldDoc.rules, newDoc.rules, ruleKeys);
  const measured: SubjectDiff[] = [];
  const measuredText = new Map<string, string[]>();
  const parking: SubjectDiff[] = [];
  let unchangedParking = 0;
  for (const id of Object.keys(newDoc.qubits)) {
    const o = oldDoc.qubits[id] as Doc | undefined;
    const n = newDoc.qubits[id] as Doc;
    if (!o) continue;
    const dev = compare(o.device, n.device, [...new Set([...Object.keys(o.device ?? {}), ...Object.keys(n.device ?? {})])], 'device.');
    if (dev.length > 0) {
      measured.push({ subject: id, changes: dev, why: [] });
      measuredText.set(id, dev.map((d) => `${id} ${d.field.slice(7)} ${valueText(d.field, d.from)} -> ${valueText(d.field, d.to)}`));
    }
    const park = compare(o, n, QUBIT_FIELDS);
    if (park.length === 0) {
      unchangedParking++;
      continue;
    }
    const why = reasons(id, ['parking']);
    parking.push({ subject: id, changes: park, why: why.length > 0 ? why : measuredText.get(id) ?? [] });
  }
  const oldEdges = new Map((oldDoc.edges as Doc[]).map((e) => [pairKey(e.qubits), e]));
  const newKeys = new Set((newDoc.edges as Doc[]).map((e) => pairKey(e.qubits)));
  const edges: SubjectDiff[] = [];
  const added: string[] = [];
  let unchangedEdges = 0;
  for (const n of newDoc.edges as Doc[]) {
    const key = n.qubits.join('-');
    const o = oldEdges.get(pairKey(n.qubits));
    if (!o) {
      added.push(key);
      continue;
    }
    const changes = [...compare(o, n, EDGE_FIELDS), ...compare(o.gate ?? undefined, n.gate ?? undefined, GATE_FIELDS, 'gate.')];
    if (!equal(o.gMax, n.gMax)) changes.push({ field: 'gMax', from: o.gMax ?? null, to: n.gMax ?? null });
    if (changes.length === 0) {
      unchangedEdges++;
      continue;
    }
    let why = reasons(key, ['edge', 'design']);
    if (why.length === 0) {
      // without a re-plan's reasons: what changed under the gate
      why = (n.qubits as string[]).flatMap((q) => [...(measuredText.get(q) ?? []), ...(parking.some((p) => p.subject === q) ? [`${q}'s parking changed`] : [])]);
      if (changes.every((c) => c.field === 'layer')) why.push('another gate took its layer or freed one');
    }
    edges.push({ subject: key, changes, why });
  }
  const removed = [...oldEdges.values()].filter((o) => !newKeys.has(pairKey(o.qubits))).map((o) => o.qubits.join('-'));
  return {
    chip: { from: oldDoc.chip ?? null, to: newDoc.chip ?? null },
    replannedFrom: replan?.from ?? null,
    rules: ruleChanges.length > 0 ? { subject: 'rules', changes: ruleChanges, why: [] } : null,
    measured,
    parking,
    edges,
    added,
    removed,
    unchanged: { parking: unchangedParking, edges: unchangedEdges },
  };
}

/** A value as people read it: frequencies and times with units chosen by size. */
export function valueText(field: string, v: unknown): string {
  if (v === null || v === undefined) return '-';
  if (typeof v === 'number') {
    const name = field.split('.').pop()!;
    if (/requency|^fMax$|^fMin$|^anharmonicity$|^ec$|^ejMax$|^readout$|^gMax$|^zz$/.test(name)) return freq(v * 1e-9, 6);
    if (/^(rampTime|holdTime|duration|slotDuration|t1|tphi|maxGate)$/.test(name)) return Math.abs(v) >= 1e-6 ? `${(v * 1e6).toPrecision(4)} us` : `${(v * 1e9).toFixed(2)} ns`;
    if (/^(fidelity|fidelityNoisy)$/.test(name)) return v.toFixed(6);
    if (name === 'leakage') return v.toExponential(2);
    return String(v);
  }
  if (typeof v === 'object' && !Array.isArray(v)) {
    const entries = Object.entries(v as Doc);
    return entries.length === 0 ? 'none' : entries.map(([k, x]) => `${k}@${typeof x === 'number' ? freq(x * 1e-9, 5) : JSON.stringify(x)}`).join(' ');
  }
  if (Array.isArray(v)) return v.length === 0 ? 'none' : JSON.stringify(v);
  return String(v);
}

/** The diff for people. */
export function planDiffText(d: PlanDiff, oldFile: string, newFile: string, wrap: (line: string, indent: string) => string): string {
  const lines: string[] = [`${oldFile} -> ${newFile}${d.replannedFrom ? ` (re-planned from ${d.replannedFrom})` : ''}`];
  if (!equal(d.chip.from, d.chip.to)) lines.push(`  chip ${String(d.chip.from)} -> ${String(d.chip.to)}`);
  const changeLine = (c: FieldDiff) => `${c.field} ${valueText(c.field, c.from)} -> ${valueText(c.field, c.to)}`;
  if (d.rules) lines.push('rules:', ...d.rules.changes.map((c) => `  ${changeLine(c)}`));
  if (d.measured.length > 0) lines.push('measured:', ...d.measured.map((m) => wrap(`  ${m.subject}: ${m.changes.map(changeLine).join('; ')}`, '    ')));
  const block = (title: string, list: SubjectDiff[]) => {
    if (list.length === 0) return;
    lines.push(title);
    for (const s of list) {
      lines.push(wrap(`  ${s.subject}: ${s.changes.map(changeLine).join('; ')}`, '    '));
      for (const w of s.why) lines.push(wrap(`    why: ${w}`, '      '));
    }
  };
  block(`parking (${d.parking.length} changed, ${d.unchanged.parking} kept):`, d.parking);
  block(`edges (${d.edges.length} changed, ${d.unchanged.edges} unchanged):`, d.edges);
  if (d.added.length > 0) lines.push(`edges only in ${newFile}: ${d.added.join(', ')}`);
  if (d.removed.length > 0) lines.push(`edges only in ${oldFile}: ${d.removed.join(', ')}`);
  if (!d.rules && d.measured.length === 0 && d.parking.length === 0 && d.edges.length === 0 && d.added.length === 0 && d.removed.length === 0) lines.push('no differences');
  return lines.join('\n');
}
