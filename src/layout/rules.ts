/**
 * Collision thresholds and limits as data: shared/rules.json holds one entry per field of
 * `Rules` (key used in layouts, internal field, kind, default as a unit string, allowed range,
 * a doc sentence and its source). This file reads and checks that table once, builds the frozen
 * DEFAULT_RULES, converts a layout's `rules:` overrides, and renders the README's rules table.
 */

import { readFileSync } from 'node:fs';
import * as z from 'zod';
import type { Rules } from './types.js';
import { parseQuantity, type QuantityKind } from './units.js';
import { describeFound } from './diagnostics.js';
import { judgeRange, rangeText, type PlausibleRange } from './plausible.js';

export type RuleKind = 'frequency' | 'time' | 'temperature' | 'number';
export type RuleRange = 'positive' | 'nonNegative' | 'fraction';

export interface RuleSpec {
  /** Name under a layout's `rules:` (e.g. `zzLimit`). */
  key: string;
  /** Field of `Rules` (e.g. `zzLimitGHz`). */
  field: keyof Rules;
  kind: RuleKind;
  /** As written in rules.json: a unit string, a number, or null for "not set". */
  default: string | number | null;
  range: RuleRange;
  doc: string;
  source: string;
  /** Hard range (outside: error) and usual range (outside: warning) of an override, as written in rules.json. */
  plausible?: { hard: [string | number, string | number]; usual: [string | number, string | number]; source: string };
}

const BoundSchema = z.union([z.string(), z.number()]);

const RuleSpecSchema = z.strictObject({
  key: z.string().regex(/^[a-z][A-Za-z0-9]*$/),
  field: z.string(),
  kind: z.enum(['frequency', 'time', 'temperature', 'number']),
  default: z.union([z.string(), z.number(), z.null()]),
  range: z.enum(['positive', 'nonNegative', 'fraction']),
  doc: z.string().min(1),
  source: z.string().min(1),
  plausible: z.strictObject({ hard: z.tuple([BoundSchema, BoundSchema]), usual: z.tuple([BoundSchema, BoundSchema]), source: z.string().min(1) }).optional(),
});

const RulesFileSchema = z.strictObject({
  $comment: z.string().optional(),
  rules: z.array(RuleSpecSchema),
});

/** Location of the table, relative to this module (works from src/ under tsx and from dist/). */
export const RULES_FILE = new URL('../../shared/rules.json', import.meta.url);

/** Every field of Rules, for the completeness check below (keep in step with src/layout/types.ts). */
const RULE_FIELDS: readonly (keyof Rules)[] = [
  'zzLimitGHz', 'detuning0101GHz', 'detuning0112GHz', 'detuningNext0101GHz', 'tlsClearanceGHz',
  'readoutDetuningGHz', 'spectatorAdmixture', 'sweptTransferLimit', 'maxGateNs', 'sampleRateGHz',
  'fluxBandwidthGHz', 'maxFluxExcursion', 'gateErrorLimit', 'spectatorLeakageLimit', 'idleErrorLimit',
  'cycleOverheadNs', 'noiseAveragingTimeNs', 'qubitTemperatureK', 'resistanceSpread', 'marginFlagSpreads',
  'spectatorRangeMarginSpreads',
];

const OPTIONAL_FIELDS: ReadonlySet<keyof Rules> = new Set(['fluxBandwidthGHz']);

function loadRuleSpecs(): readonly RuleSpec[] {
  const raw: unknown = JSON.parse(readFileSync(RULES_FILE, 'utf8'));
  const parsed = RulesFileSchema.parse(raw);
  const fields = parsed.rules.map((r) => r.field);
  const missing = RULE_FIELDS.filter((f) => !fields.includes(f));
  const extra = fields.filter((f) => !(RULE_FIELDS as readonly string[]).includes(f));
  if (missing.length > 0 || extra.length > 0 || new Set(fields).size !== fields.length) {
    throw new Error(`shared/rules.json does not match Rules: missing ${missing.join(', ') || '-'}, unknown ${extra.join(', ') || '-'}`);
  }
  return Object.freeze(parsed.rules.map((r) => Object.freeze({ ...r, field: r.field as keyof Rules })));
}

/** The rules table of shared/rules.json, in file order. */
export const RULE_SPECS: readonly RuleSpec[] = loadRuleSpecs();

export type RuleValueResult = { ok: true; value: number | undefined; warning?: string } | { ok: false; message: string };

/** Convert one rule value (from rules.json or a layout) to its internal unit and check its range. */
export function parseRuleValue(spec: RuleSpec, input: unknown): RuleValueResult {
  if (input === null) {
    if (OPTIONAL_FIELDS.has(spec.field)) return { ok: true, value: undefined };
    return { ok: false, message: `expected ${ruleNoun(spec)}, found an empty value (only optional rules may be null)` };
  }
  let value: number;
  if (spec.kind === 'number') {
    if (typeof input !== 'number' || !Number.isFinite(input)) {
      return { ok: false, message: `expected ${ruleNoun(spec)}, found ${describeFound(input)}` };
    }
    value = input;
  } else {
    const q = parseQuantity(input, spec.kind as QuantityKind);
    if (!q.ok) return q;
    value = q.value;
  }
  const shown = typeof input === 'string' ? input : String(input);
  if (spec.range === 'positive' && !(value > 0)) {
    return { ok: false, message: `expected ${ruleNoun(spec)} greater than 0, found ${shown}` };
  }
  if (spec.range === 'nonNegative' && !(value >= 0)) {
    return { ok: false, message: `expected ${ruleNoun(spec)} of at least 0, found ${shown}` };
  }
  if (spec.range === 'fraction' && !(value > 0 && value < 1)) {
    return { ok: false, message: `expected ${ruleNoun(spec)} between 0 and 1 (exclusive), found ${shown}` };
  }
  const range = plausibleRangeOf(spec);
  if (range) {
    const verdict = judgeRange(range, value, shown);
    if (verdict.level === 'error') return { ok: false, message: verdict.message };
    if (verdict.level === 'warning') return { ok: true, value, warning: verdict.message };
  }
  return { ok: true, value };
}

/** A rule's `plausible` entry in internal units (null when it has none). */
export function plausibleRangeOf(spec: RuleSpec): PlausibleRange | null {
  const p = spec.plausible;
  if (!p) return null;
  const kind: QuantityKind | null = spec.kind === 'number' ? null : (spec.kind as QuantityKind);
  const bound = (b: string | number): number => {
    if (typeof b === 'number') return b;
    const q = parseQuantity(b, kind ?? 'frequency');
    if (!q.ok) throw new Error(`shared/rules.json: ${spec.key}: plausible bound ${b}: ${q.message}`);
    return q.value;
  };
  return { kind: kind ?? 'number', noun: `${spec.key}`, hard: [bound(p.hard[0]), bound(p.hard[1])], usual: [bound(p.usual[0]), bound(p.usual[1])] };
}

function ruleNoun(spec: RuleSpec): string {
  return spec.kind === 'frequency' ? 'a frequency' : spec.kind === 'time' ? 'a time' : spec.kind === 'temperature' ? 'a temperature' : 'a number';
}

function buildDefaults(): Readonly<Rules> {
  const out: Partial<Record<keyof Rules, number>> = {};
  for (const spec of RULE_SPECS) {
    const r = parseRuleValue(spec, spec.default);
    if (!r.ok) throw new Error(`shared/rules.json: ${spec.key}: ${r.message}`);
    if (r.value !== undefined) out[spec.field] = r.value;
  }
  return Object.freeze(out as Rules);
}

/** Defaults of every rule in internal units (GHz, ns, plain numbers). */
export const DEFAULT_RULES: Readonly<Rules> = buildDefaults();

export function ruleSpecByKey(key: string): RuleSpec | undefined {
  return RULE_SPECS.find((s) => s.key === key);
}

/** The README's rules table (Markdown), generated from shared/rules.json. */
export function rulesTableMarkdown(): string {
  const lines = [
    '| key | default | kind | meaning | source | error outside | warning outside |',
    '|---|---|---|---|---|---|---|',
    ...RULE_SPECS.map((s) => {
      const shown = s.default === null ? 'none' : String(s.default);
      const range = plausibleRangeOf(s);
      const ranges = range ? `${rangeText(range, 'hard')} | ${rangeText(range, 'usual')}` : '- | -';
      return `| \`${s.key}\` | ${shown} | ${s.kind} | ${s.doc.replace(/\|/g, '\\|')} | ${s.source} | ${ranges} |`;
    }),
  ];
  return lines.join('\n');
}
