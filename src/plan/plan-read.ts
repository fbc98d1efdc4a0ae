/**
 * Reading a plan.json back (for `fluxlane verify`, the per-edge commands' `--plan` and
 * `fluxlane plan --from`; written by src/report/plan-json.ts): JSON syntax errors and schema
 * problems become
 * an InputError naming file:line:column, what was expected and what was found. Only the fields
 * verify needs are required (a plan edited by hand may drop the derived ones); unknown fields are
 * kept. Positions of schema problems come from the yaml package's source map of the same text
 * (JSON is YAML; src/layout/yaml-source.ts), built only when there is a problem to locate.
 */
import { z } from 'zod';
import { DiagnosticCollector, type Path } from '../layout/diagnostics.js';
import { readYamlSource } from '../layout/yaml-source.js';
import { InputError } from '../util/errors.js';
import type { ChipLayout } from '../layout/types.js';

/** The plan file's format name and version (plan.json's `format` and `version`). */
export const PLAN_FORMAT = 'fluxlane-plan';
export const PLAN_VERSION = 1;

const hz = z.number({ error: () => 'a frequency in Hz (a number)' }).positive({ error: () => 'a positive frequency in Hz' });

const GateSchema = z.looseObject({
  family: z.string({ error: () => 'a ramp family name' }).optional(),
  crossingOffset: z.number({ error: () => 'a frequency offset in Hz (a number)' }).nullable().optional(),
  rampTime: z.number({ error: () => 'a ramp time in s (a number)' }).positive().nullable().optional(),
  duration: z.number({ error: () => 'a duration in s (a number)' }).positive().nullable().optional(),
  targetPhase: z.number({ error: () => 'a phase in rad (a number)' }).nullable().optional(),
  waveform: z.string().optional(),
  awgProgram: z.string().optional(),
  fidelityNoisyMethod: z.enum(['lindblad', 'estimate']).nullable().optional(),
  feasible: z.boolean().optional(),
  reason: z.string().optional(),
});

const EdgeSchema = z.looseObject({
  qubits: z.tuple([z.string(), z.string()], { error: () => 'a pair of qubit ids ["A", "B"]' }),
  mover: z.string({ error: () => 'a qubit id' }),
  crossing: z.enum(['11-20', '11-02'], { error: () => '"11-20" or "11-02"' }),
  interactionFrequency: hz.nullable(),
  crossingFrequency: hz.nullable().optional(),
  spectatorParking: z.record(z.string(), hz, { error: () => 'an object from qubit id to frequency in Hz' }).default({}),
  spectatorParkingFlux: z.record(z.string(), z.number(), { error: () => 'an object from qubit id to flux in Phi0' }).optional(),
  layer: z.number({ error: () => 'a layer index (an integer >= 0)' }).int({ error: () => 'a layer index (an integer >= 0)' }).min(0, { error: () => 'a layer index (an integer >= 0)' }),
  rampTime: z.number({ error: () => 'a ramp time in s (a number)' }).positive({ error: () => 'a positive ramp time in s' }),
  gate: GateSchema.nullable().optional(),
});

const PlanSchema = z.looseObject({
  format: z.literal(PLAN_FORMAT, { error: () => `"${PLAN_FORMAT}"` }),
  version: z.literal(PLAN_VERSION, { error: () => `version ${PLAN_VERSION}` }),
  qubits: z.record(z.string(), z.looseObject({ parkingFrequency: hz, parkingFlux: z.number({ error: () => 'a flux in Phi0 (a number)' }).optional() }), { error: () => 'an object from qubit id to { parkingFrequency }' }),
  edges: z.array(EdgeSchema, { error: () => 'a list of edges' }),
});

export type PlanInput = z.output<typeof PlanSchema>;
export type PlanEdgeInput = z.output<typeof EdgeSchema>;

/** Parse and check a plan's text against the layout; throws InputError with positions. */
export function readPlan(text: string, file: string, layout: ChipLayout): PlanInput {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    const { line, column } = jsonErrorPosition(text, message);
    throw new InputError({ file, line, column, message: `expected JSON (a plan.json written by fluxlane plan), found a syntax error: ${message.replace(/ in JSON at position \d+.*$/, '').replace(/^JSON\.parse: /, '')}` });
  }
  const parsed = PlanSchema.safeParse(raw);
  const problems: { path: Path; message: string }[] = [];
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const path = issue.path.filter((p): p is string | number => typeof p === 'string' || typeof p === 'number');
      problems.push({ path, message: `expected ${issue.message}, found ${describe(valueAt(raw, path))}` });
    }
  } else {
    const plan = parsed.data;
    const ids = new Set(layout.qubits.map((q) => q.id));
    for (const q of layout.qubits) if (!(q.id in plan.qubits)) problems.push({ path: ['qubits'], message: `expected a parking frequency for every qubit of ${layout.file}, found none for ${q.id}` });
    for (const q of Object.keys(plan.qubits)) if (!ids.has(q)) problems.push({ path: ['qubits', q], message: `expected a qubit of ${layout.file}, found ${q}` });
    const pairKey = (a: string, b: string) => (a < b ? `${a}\u0000${b}` : `${b}\u0000${a}`);
    const couplings = new Set(layout.couplings.map((c) => pairKey(c.a, c.b)));
    const seen = new Set<string>();
    plan.edges.forEach((e, k) => {
      const key = pairKey(e.qubits[0], e.qubits[1]);
      if (!couplings.has(key)) problems.push({ path: ['edges', k, 'qubits'], message: `expected a coupling of ${layout.file}, found ${e.qubits.join('-')}` });
      else if (seen.has(key)) problems.push({ path: ['edges', k, 'qubits'], message: `expected each coupling once, found ${e.qubits.join('-')} again` });
      seen.add(key);
      if (!e.qubits.includes(e.mover)) problems.push({ path: ['edges', k, 'mover'], message: `expected ${e.qubits[0]} or ${e.qubits[1]}, found ${JSON.stringify(e.mover)}` });
      for (const s of Object.keys(e.spectatorParking)) {
        if (!ids.has(s) || e.qubits.includes(s)) problems.push({ path: ['edges', k, 'spectatorParking', s], message: `expected a spectator qubit id (not the gate's own qubits), found ${JSON.stringify(s)}` });
      }
    });
    for (const c of layout.couplings) if (!seen.has(pairKey(c.a, c.b))) problems.push({ path: ['edges'], message: `expected an edge for every coupling of ${layout.file}, found none for ${c.a}-${c.b}` });
  }
  if (problems.length > 0) {
    const tree = readYamlSource(text, new DiagnosticCollector(file));
    const located = new DiagnosticCollector(file, tree ? tree.locate : undefined);
    for (const p of problems) located.add(p.path, p.message, 'value');
    located.throwIfAny();
  }
  return parsed.data!;
}

/**
 * A plan.json as a plain document, without a layout to check it against (for `fluxlane diff`):
 * JSON syntax errors with file:line:column, and the format and version checked.
 */
export function readPlanDocument(text: string, file: string): Record<string, unknown> {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    const { line, column } = jsonErrorPosition(text, message);
    throw new InputError({ file, line, column, message: `expected JSON (a plan.json written by fluxlane plan), found a syntax error: ${message.replace(/ in JSON at position \d+.*$/, '').replace(/^JSON\.parse: /, '')}` });
  }
  const doc = raw as Record<string, unknown>;
  if (!doc || typeof doc !== 'object' || Array.isArray(doc) || doc.format !== PLAN_FORMAT || doc.version !== PLAN_VERSION || typeof doc.qubits !== 'object' || !Array.isArray(doc.edges)) {
    throw new InputError({ file, message: `expected a plan.json written by fluxlane plan (format "${PLAN_FORMAT}", version ${PLAN_VERSION}, with qubits and edges), found ${Array.isArray(raw) ? 'a list' : typeof raw === 'object' && raw !== null ? `format ${JSON.stringify(doc.format)}, version ${JSON.stringify(doc.version)}` : typeof raw}` });
  }
  return doc;
}

/** 1-based line and column of a JSON.parse error (V8 reports a character position or line/column). */
export function jsonErrorPosition(text: string, message: string): { line: number; column: number } {
  const lc = /line (\d+) column (\d+)/.exec(message);
  if (lc) return { line: Number(lc[1]), column: Number(lc[2]) };
  const pos = /position (\d+)/.exec(message);
  const offset = pos ? Number(pos[1]) : text.length;
  const before = text.slice(0, offset);
  const line = before.split('\n').length;
  const column = offset - (before.lastIndexOf('\n') + 1) + 1;
  return { line, column };
}

function valueAt(root: unknown, path: Path): unknown {
  let v: unknown = root;
  for (const p of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<string | number, unknown>)[p];
  }
  return v;
}

function describe(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (v === null) return 'null';
  if (typeof v === 'string') return JSON.stringify(v.length > 40 ? `${v.slice(0, 40)}...` : v);
  if (Array.isArray(v)) return `a list of ${v.length}`;
  if (typeof v === 'object') return 'an object';
  return String(v);
}
