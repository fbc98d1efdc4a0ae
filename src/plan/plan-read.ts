/**
 * Reading a plan back (for `fluxlane verify`, the per-edge commands' `--plan`, `fluxlane plan
 * --from` and `fluxlane diff`; written by src/report/plan-json.ts): the one place that reads
 * plan.json and the one place that reads the waveform files a plan names (`readPlanWaveform`).
 *
 * plan.json gets the care layouts get (src/layout/yaml-source.ts): UTF-8 only (a byte-order mark
 * is dropped, other bytes refused with their position), a size limit, strict JSON with positions
 * and no duplicate keys (./json-source.ts), qubit ids kept off Object.prototype (Maps), and every
 * problem reported at once as `plan.json:line:column: path: expected ..., found ...`. Only the
 * fields verify needs are required (a plan edited by hand may drop the derived ones); the rest of
 * the file is kept as `raw` with its positions, so verify's claim table (./verify-claims.ts) can
 * read any claim the plan makes and say where it stands. `planDocument` gives the same checked
 * document as plain typed objects (qubits and edges as written) for the commands that take a
 * plan's choices (--plan, --from).
 */
import { readFileSync, statSync } from 'node:fs';
import { isAbsolute, join, resolve, sep } from 'node:path';
import { DiagnosticCollector, describeFound, type Path, type Position } from '../layout/diagnostics.js';
import { decodeUtf8 } from '../layout/yaml-source.js';
import { mergePlateaus, type Trajectory } from '../sim/trajectory.js';
import { readTrajectoryFile } from '../sim/trajectory-file.js';
import { InputError } from '../util/errors.js';
import { hasOwn } from '../util/own.js';
import * as z from 'zod';
import type { ChipLayout } from '../layout/types.js';
import { readJsonSource } from './json-source.js';

/** The plan file's format name and version (plan.json's `format` and `version`). */
export const PLAN_FORMAT = 'fluxlane-plan';
export const PLAN_VERSION = 1;

export const PLAN_READ_LIMITS = Object.freeze({
  /** Largest plan.json accepted (a 10,000-qubit plan without pulses is about 60 MB). */
  maxBytes: 256 * 1024 * 1024,
});

export type CrossingName = '11-20' | '11-02';

export interface PlanGateInput {
  /** Waveform file relative to the plan's folder, when the plan names one. */
  waveform?: string;
  feasible?: boolean;
  reason?: string;
  rampTime?: number | null;
  duration?: number | null;
  /** Target conditional phase of the design (rad; plans before it was written: pi). */
  targetPhase?: number;
  /** How fidelityNoisy was computed, when it was. */
  fidelityNoisyMethod?: 'estimate' | 'lindblad' | null;
  /** Spectators simulated as third transmons in the design (qubit and its flux). */
  simulatedSpectators: { qubit: string; flux: number }[];
}

export interface PlanEdgeInput {
  /** Position in the plan's `edges` list. */
  index: number;
  qubits: [string, string];
  mover: string;
  crossing: CrossingName;
  interactionFrequency: number | null;
  crossingFrequency: number | null;
  spectatorParking: Map<string, number>;
  layer: number;
  rampTime: number;
  duration: number | null;
  gate: PlanGateInput | null;
}

export interface PlanLayerInput {
  index: number;
  edges: [string, string][];
}

export interface PlanInput {
  /** The file as the user named it (messages). */
  file: string;
  /** Parking frequency (Hz) of each qubit. */
  qubits: Map<string, { parkingFrequency: number }>;
  edges: PlanEdgeInput[];
  /** The top-level `layers` list, when present. */
  layers: PlanLayerInput[] | null;
  /** The top-level `layerSummary`, when present. */
  layerSummary: { count: number | null; lowerBound: number | null; conflicts: number | null } | null;
  /** The whole document (objects without prototype). */
  raw: Record<string, unknown>;
  /** Position of a path in the file. */
  locate(path: Path): Position | undefined;
}

/** Read plan.json from disk and check it against the layout; throws InputError with positions. */
export function readPlanFile(fullPath: string, shown: string, layout: ChipLayout): PlanInput {
  let bytes: Uint8Array;
  try {
    const st = statSync(fullPath);
    if (st.isDirectory()) throw Object.assign(new Error('folder'), { code: 'EISDIR' });
    if (st.size > PLAN_READ_LIMITS.maxBytes) {
      throw new InputError({ file: shown, message: `expected a plan file of at most ${PLAN_READ_LIMITS.maxBytes} bytes, found ${st.size} bytes` });
    }
    bytes = readFileSync(fullPath);
  } catch (err) {
    if (err instanceof InputError) throw err;
    const code = (err as NodeJS.ErrnoException).code;
    const what = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'a folder' : code === 'EACCES' ? 'permission denied' : String(code ?? err);
    throw new InputError({ file: shown, message: `expected a readable plan file, found ${what}` });
  }
  const collector = new DiagnosticCollector(shown);
  const text = decodeUtf8(bytes, collector, { noun: 'a plan file', format: 'JSON', maxBytes: PLAN_READ_LIMITS.maxBytes });
  collector.throwIfAny();
  return readPlan(text ?? '', shown, layout);
}

/** Parse and check a plan's text against the layout; throws InputError with positions. */
export function readPlan(text: string, file: string, layout: ChipLayout): PlanInput {
  const syntax = new DiagnosticCollector(file);
  const source = readJsonSource(text.startsWith('\uFEFF') ? text.slice(1) : text, syntax);
  syntax.throwIfAny();
  if (!source) throw new InputError({ file, line: 1, column: 1, message: 'expected a plan.json written by fluxlane plan, found unreadable text' });
  const c = new DiagnosticCollector(file, source.locate);
  const root = source.value;
  if (!isObject(root)) {
    c.add([], `expected a plan.json written by fluxlane plan (a JSON object), found ${describeJson(root)}`);
    c.throwIfAny();
  }
  const doc = root as Record<string, unknown>;
  const get = (o: Record<string, unknown>, key: string): unknown => (hasOwn(o, key) ? o[key] : undefined);

  if (get(doc, 'format') !== PLAN_FORMAT) expect(c, ['format'], get(doc, 'format'), `"${PLAN_FORMAT}" (a plan.json written by fluxlane plan)`);
  if (get(doc, 'version') !== PLAN_VERSION) expect(c, ['version'], get(doc, 'version'), `version ${PLAN_VERSION}`);

  // qubits
  const qubits = new Map<string, { parkingFrequency: number }>();
  const rawQubits = get(doc, 'qubits');
  if (!isObject(rawQubits)) expect(c, ['qubits'], rawQubits, 'an object from qubit id to { parkingFrequency }');
  else {
    for (const [id, q] of Object.entries(rawQubits)) {
      if (!isObject(q)) {
        expect(c, ['qubits', id], q, 'an object { parkingFrequency, ... }');
        continue;
      }
      const f = positiveNumber(c, ['qubits', id, 'parkingFrequency'], get(q, 'parkingFrequency'), 'a parking frequency in Hz (a positive number)');
      if (f !== undefined) qubits.set(id, { parkingFrequency: f });
    }
  }

  // edges
  const edges: PlanEdgeInput[] = [];
  const rawEdges = get(doc, 'edges');
  if (!Array.isArray(rawEdges)) expect(c, ['edges'], rawEdges, 'a list of edges');
  else rawEdges.forEach((e, k) => {
    const base: Path = ['edges', k];
    if (!isObject(e)) {
      expect(c, base, e, 'an edge object { qubits, mover, crossing, interactionFrequency, layer, rampTime, ... }');
      return;
    }
    const before = c.count;
    const pair = idPair(c, [...base, 'qubits'], get(e, 'qubits'));
    const mover = get(e, 'mover');
    if (typeof mover !== 'string') expect(c, [...base, 'mover'], mover, 'a qubit id');
    const crossing = get(e, 'crossing');
    if (crossing !== '11-20' && crossing !== '11-02') expect(c, [...base, 'crossing'], crossing, '"11-20" or "11-02"');
    const interaction = nullableNumber(c, [...base, 'interactionFrequency'], get(e, 'interactionFrequency'), 'an interaction frequency in Hz (a positive number, or null)', true, true);
    const crossingFrequency = nullableNumber(c, [...base, 'crossingFrequency'], get(e, 'crossingFrequency'), 'a crossing frequency in Hz (a positive number, or null)', false, true);
    const layer = get(e, 'layer');
    if (typeof layer !== 'number' || !Number.isInteger(layer) || layer < 0) expect(c, [...base, 'layer'], layer, 'a layer index (an integer from 0)');
    const rampTime = positiveNumber(c, [...base, 'rampTime'], get(e, 'rampTime'), 'a ramp time in s (a positive number)');
    const duration = nullableNumber(c, [...base, 'duration'], get(e, 'duration'), 'a duration in s (a positive number, or null)', false, true);
    const spectatorParking = new Map<string, number>();
    const sp = get(e, 'spectatorParking');
    if (sp !== undefined) {
      if (!isObject(sp)) expect(c, [...base, 'spectatorParking'], sp, 'an object from qubit id to frequency in Hz');
      else for (const [s, f] of Object.entries(sp)) {
        const v = positiveNumber(c, [...base, 'spectatorParking', s], f, 'a frequency in Hz (a positive number)');
        if (v !== undefined) spectatorParking.set(s, v);
      }
    }
    const gate = readGate(c, [...base, 'gate'], get(e, 'gate'));
    if (c.count > before || !pair) return;
    edges.push({
      index: k,
      qubits: pair,
      mover: mover as string,
      crossing: crossing as CrossingName,
      interactionFrequency: interaction ?? null,
      crossingFrequency: crossingFrequency ?? null,
      spectatorParking,
      layer: layer as number,
      rampTime: rampTime!,
      duration: duration ?? null,
      gate,
    });
  });

  // layers (optional; verify checks them against edges[].layer)
  let layers: PlanLayerInput[] | null = null;
  const rawLayers = get(doc, 'layers');
  if (rawLayers !== undefined) {
    if (!Array.isArray(rawLayers)) expect(c, ['layers'], rawLayers, 'a list of layers { index, edges }');
    else {
      layers = [];
      rawLayers.forEach((l, k) => {
        const base: Path = ['layers', k];
        if (!isObject(l)) return expect(c, base, l, 'a layer { index, edges: [["A", "B"], ...] }');
        const index = get(l, 'index');
        if (typeof index !== 'number' || !Number.isInteger(index) || index < 0) expect(c, [...base, 'index'], index, 'a layer index (an integer from 0)');
        const list = get(l, 'edges');
        const pairs: [string, string][] = [];
        if (!Array.isArray(list)) expect(c, [...base, 'edges'], list, 'a list of edges ["A", "B"]');
        else list.forEach((p, j) => {
          const pr = idPair(c, [...base, 'edges', j], p);
          if (pr) pairs.push(pr);
        });
        layers!.push({ index: index as number, edges: pairs });
      });
    }
  }
  let layerSummary: PlanInput['layerSummary'] = null;
  const rawSummary = get(doc, 'layerSummary');
  if (rawSummary !== undefined) {
    if (!isObject(rawSummary)) expect(c, ['layerSummary'], rawSummary, 'an object { count, lowerBound, conflicts }');
    else {
      const count = (key: string): number | null => {
        const v = get(rawSummary, key);
        if (v === undefined || v === null) return null;
        if (typeof v !== 'number' || !Number.isInteger(v) || v < 0) {
          expect(c, ['layerSummary', key], v, 'a count (an integer from 0)');
          return null;
        }
        return v;
      };
      layerSummary = { count: count('count'), lowerBound: count('lowerBound'), conflicts: count('conflicts') };
    }
  }
  c.throwIfAny();

  // the plan against the layout
  const ids = new Set(layout.qubits.map((q) => q.id));
  for (const q of layout.qubits) if (!qubits.has(q.id)) c.add(['qubits'], `expected a parking frequency for every qubit of ${layout.file}, found none for ${q.id}`, 'key');
  for (const q of qubits.keys()) if (!ids.has(q)) c.add(['qubits', q], `expected a qubit of ${layout.file}, found ${JSON.stringify(q)}`, 'key');
  const pairKey = (a: string, b: string) => (a < b ? `${a}\u0000${b}` : `${b}\u0000${a}`);
  const couplings = new Set(layout.couplings.map((cp) => pairKey(cp.a, cp.b)));
  const seen = new Set<string>();
  for (const e of edges) {
    const k = e.index;
    const key = pairKey(e.qubits[0], e.qubits[1]);
    if (!couplings.has(key)) c.add(['edges', k, 'qubits'], `expected a coupling of ${layout.file}, found ${e.qubits.join('-')}`);
    else if (seen.has(key)) c.add(['edges', k, 'qubits'], `expected each coupling once, found ${e.qubits.join('-')} again`);
    seen.add(key);
    if (!e.qubits.includes(e.mover)) c.add(['edges', k, 'mover'], `expected ${e.qubits[0]} or ${e.qubits[1]}, found ${JSON.stringify(e.mover)}`);
    for (const s of e.spectatorParking.keys()) {
      if (!ids.has(s) || e.qubits.includes(s)) c.add(['edges', k, 'spectatorParking', s], `expected a spectator qubit id (not the gate's own qubits), found ${JSON.stringify(s)}`, 'key');
    }
    e.gate?.simulatedSpectators.forEach((s, j) => {
      if (!ids.has(s.qubit) || e.qubits.includes(s.qubit)) c.add(['edges', k, 'gate', 'simulatedSpectators', j, 'qubit'], `expected a neighbour of ${e.qubits.join(' or ')}, found ${JSON.stringify(s.qubit)}`);
    });
  }
  for (const cp of layout.couplings) if (!seen.has(pairKey(cp.a, cp.b))) c.add(['edges'], `expected an edge for every coupling of ${layout.file}, found none for ${cp.a}-${cp.b}`);
  layers?.forEach((l, k) => l.edges.forEach((p, j) => {
    if (!couplings.has(pairKey(p[0], p[1]))) c.add(['layers', k, 'edges', j], `expected a coupling of ${layout.file}, found ${p.join('-')}`);
  }));
  c.throwIfAny();
  return { file, qubits, edges, layers, layerSummary, raw: doc, locate: (path) => source.locate(path, 'value') };
}

function readGate(c: DiagnosticCollector, base: Path, g: unknown): PlanGateInput | null {
  if (g === undefined || g === null) return null;
  if (!isObject(g)) {
    expect(c, base, g, 'a gate design object, or null');
    return null;
  }
  const get = (key: string): unknown => (hasOwn(g, key) ? g[key] : undefined);
  const out: PlanGateInput = { simulatedSpectators: [] };
  const waveform = get('waveform');
  if (waveform !== undefined && waveform !== null) {
    if (typeof waveform !== 'string' || waveform === '') expect(c, [...base, 'waveform'], waveform, 'a waveform file name relative to plan.json');
    else if (isAbsolute(waveform) || waveform.split(/[\\/]/).includes('..')) expect(c, [...base, 'waveform'], waveform, 'a waveform file inside the plan\'s folder (no absolute path, no "..")');
    else out.waveform = waveform;
  }
  const feasible = get('feasible');
  if (feasible !== undefined) {
    if (typeof feasible !== 'boolean') expect(c, [...base, 'feasible'], feasible, 'true or false');
    else out.feasible = feasible;
  }
  const reason = get('reason');
  if (typeof reason === 'string') out.reason = reason;
  const ramp = nullableNumber(c, [...base, 'rampTime'], get('rampTime'), 'a ramp time in s (a positive number, or null)', false, true);
  if (ramp !== undefined) out.rampTime = ramp;
  const duration = nullableNumber(c, [...base, 'duration'], get('duration'), 'a duration in s (a positive number, or null)', false, true);
  if (duration !== undefined) out.duration = duration;
  const phase = get('targetPhase');
  if (phase !== undefined) {
    if (typeof phase !== 'number' || !Number.isFinite(phase) || phase === 0 || Math.abs(phase) > Math.PI + 1e-9) expect(c, [...base, 'targetPhase'], phase, 'a target phase in rad in [-pi, pi], not 0');
    else out.targetPhase = phase;
  }
  const method = get('fidelityNoisyMethod');
  if (method !== undefined) {
    if (method !== null && method !== 'estimate' && method !== 'lindblad') expect(c, [...base, 'fidelityNoisyMethod'], method, '"estimate", "lindblad" or null');
    else out.fidelityNoisyMethod = method;
  }
  const sims = get('simulatedSpectators');
  if (sims !== undefined) {
    if (!Array.isArray(sims)) expect(c, [...base, 'simulatedSpectators'], sims, 'a list of { qubit, flux }');
    else sims.forEach((s, j) => {
      const at: Path = [...base, 'simulatedSpectators', j];
      if (!isObject(s) || typeof s.qubit !== 'string' || typeof s.flux !== 'number' || !(Math.abs(s.flux) <= 0.5)) {
        expect(c, at, s, 'a spectator { qubit, flux } (flux in Phi0 from -0.5 to 0.5)');
      } else out.simulatedSpectators.push({ qubit: s.qubit, flux: s.flux });
    });
  }
  return out;
}

function isObject(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

/** "found ..." for a JSON value. */
export function describeJson(v: unknown): string {
  if (typeof v === 'number' && !Number.isFinite(v)) return 'a number too large to represent';
  if (typeof v === 'string') return JSON.stringify(v.length > 40 ? `${v.slice(0, 40)}...` : v);
  if (v === null) return 'null';
  if (typeof v === 'number' || typeof v === 'boolean') return String(v);
  if (isObject(v)) {
    const keys = Object.keys(v);
    return keys.length === 0 ? 'an empty object' : `an object (keys ${keys.slice(0, 4).join(', ')}${keys.length > 4 ? ', ...' : ''})`;
  }
  return describeFound(v).replace('an empty value', 'null').replace('an empty map', 'an empty object');
}

function expect(c: DiagnosticCollector, path: Path, value: unknown, what: string): undefined {
  if (value === undefined && path.length > 0) c.add(path.slice(0, -1), `missing key ${JSON.stringify(path[path.length - 1])}: expected ${what}`, 'value');
  else c.add(path, `expected ${what}, found ${describeJson(value)}`);
  return undefined;
}

function positiveNumber(c: DiagnosticCollector, path: Path, v: unknown, what: string): number | undefined {
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v > 0)) return expect(c, path, v, what);
  return v;
}

/** A number (positive when asked), null, or (when optional) absent; undefined also on a problem. */
function nullableNumber(c: DiagnosticCollector, path: Path, v: unknown, what: string, required: boolean, positive: boolean): number | null | undefined {
  if (v === undefined) return required ? expect(c, path, v, what) : undefined;
  if (v === null) return null;
  if (typeof v !== 'number' || !Number.isFinite(v) || (positive && !(v > 0))) return expect(c, path, v, what);
  return v;
}

function idPair(c: DiagnosticCollector, path: Path, v: unknown): [string, string] | undefined {
  if (!Array.isArray(v) || v.length !== 2 || typeof v[0] !== 'string' || typeof v[1] !== 'string') return expect(c, path, v, 'a pair of qubit ids ["A", "B"]');
  return [v[0], v[1]];
}

/** Where a plan's waveform file is and what it holds. */
export interface PlanWaveform {
  /** The file as the user would name it (the plan's folder as given, joined with the plan's name for it). */
  file: string;
  /** The mover's flux as the qubit sees it (time_ns, flux; samples joined piecewise-linearly). */
  trajectory: Trajectory;
}

/**
 * The waveform the plan names for an edge (the flux the mover sees), read from the plan's folder:
 * null when the edge has no designed gate or names no file, `{ missing }` when the file is not
 * there. Throws InputError (file:line:column) when the file is there but unreadable as a waveform.
 */
export function readPlanWaveform(planDir: string, edge: PlanEdgeInput, shownDir = planDir): PlanWaveform | { missing: string } | null {
  const rel = edge.gate?.waveform;
  if (!rel) return null;
  const name = shownDir === '.' || shownDir === '' ? rel : join(shownDir, rel);
  const full = resolve(planDir, rel);
  if (!(full === planDir || full.startsWith(planDir.endsWith(sep) ? planDir : planDir + sep))) {
    throw new InputError({ file: name, message: 'expected a waveform file inside the plan\'s folder, found a path outside it' });
  }
  try {
    if (!statSync(full).isFile()) return { missing: name };
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return { missing: name };
  }
  // as `fluxlane simulate` reads it: runs of equal flux joined into one segment (the same
  // piecewise-linear path; the simulator takes a hold as one exact step)
  return { file: name, trajectory: mergePlateaus(readTrajectoryFile(full, name, 'waveform')) };
}

/** Total bytes of the waveform files a plan names that are there (for verify's work estimate). */
export function planWaveformBytes(planDir: string, plan: PlanInput): number {
  let bytes = 0;
  for (const e of plan.edges) {
    const rel = e.gate?.waveform;
    if (!rel) continue;
    try {
      bytes += statSync(resolve(planDir, rel)).size;
    } catch {
      // missing: reported by verify
    }
  }
  return bytes;
}

// ---------------------------------------------------------------------------------------------
// The checked plan as plain typed objects (the choices --plan and --from take from it).

const hz = z.number({ error: () => 'a frequency in Hz (a number)' }).positive({ error: () => 'a positive frequency in Hz' });

const DocumentGateSchema = z.looseObject({
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

const DocumentEdgeSchema = z.looseObject({
  qubits: z.tuple([z.string(), z.string()], { error: () => 'a pair of qubit ids ["A", "B"]' }),
  mover: z.string({ error: () => 'a qubit id' }),
  crossing: z.enum(['11-20', '11-02'], { error: () => '"11-20" or "11-02"' }),
  interactionFrequency: hz.nullable(),
  crossingFrequency: hz.nullable().optional(),
  spectatorParking: z.record(z.string(), hz, { error: () => 'an object from qubit id to frequency in Hz' }).default({}),
  spectatorParkingFlux: z.record(z.string(), z.number(), { error: () => 'an object from qubit id to flux in Phi0' }).optional(),
  layer: z.number({ error: () => 'a layer index (an integer >= 0)' }).int({ error: () => 'a layer index (an integer >= 0)' }).min(0, { error: () => 'a layer index (an integer >= 0)' }),
  rampTime: z.number({ error: () => 'a ramp time in s (a number)' }).positive({ error: () => 'a positive ramp time in s' }),
  gate: DocumentGateSchema.nullable().optional(),
});

const DocumentSchema = z.looseObject({
  format: z.literal(PLAN_FORMAT, { error: () => `"${PLAN_FORMAT}"` }),
  version: z.literal(PLAN_VERSION, { error: () => `version ${PLAN_VERSION}` }),
  qubits: z.record(z.string(), z.looseObject({ parkingFrequency: hz, parkingFlux: z.number({ error: () => 'a flux in Phi0 (a number)' }).optional() }), { error: () => 'an object from qubit id to { parkingFrequency }' }),
  edges: z.array(DocumentEdgeSchema, { error: () => 'a list of edges' }),
});

/** A plan read back as written: qubits and edges as plain objects (after readPlan's checks). */
export type PlanDocument = z.output<typeof DocumentSchema>;
export type PlanDocumentEdge = z.output<typeof DocumentEdgeSchema>;

/**
 * The document of a plan read by readPlan, as plain typed objects. readPlan has checked the
 * structure and the layout; this also checks the optional fields the choices use (types, with
 * their positions).
 */
export function planDocument(plan: PlanInput): PlanDocument {
  const parsed = DocumentSchema.safeParse(plan.raw);
  if (parsed.success) return parsed.data;
  const located = new DiagnosticCollector(plan.file, (path, at) => plan.locate(path) ?? undefined);
  for (const issue of parsed.error.issues) {
    const path = issue.path.filter((p): p is string | number => typeof p === 'string' || typeof p === 'number');
    located.add(path, `expected ${issue.message}, found ${describeJson(valueAt(plan.raw, path))}`, 'value');
  }
  located.throwIfAny();
  throw new InputError({ file: plan.file, message: 'expected a plan.json written by fluxlane plan' });
}

/** Read and check a plan (readPlan) and give its document (planDocument). */
export function readPlanChecked(text: string, file: string, layout: ChipLayout): { input: PlanInput; document: PlanDocument } {
  const input = readPlan(text, file, layout);
  return { input, document: planDocument(input) };
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
