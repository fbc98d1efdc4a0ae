/**
 * Plain YAML values -> ChipLayout: structure checks (zod, schema.ts), unit conversion (units.ts),
 * ranges, the choice of transmon model, cross references between couplings and qubits, and rule
 * overrides. Every problem is collected; nothing stops at the first one. Values that fail their
 * structure check are left out of the later checks (a misspelt key counts as present under its
 * likely name), so one mistake gives one message.
 */

import type { ChipLayout, CouplingLayout, QubitLayout, Rules, SourceRef, TlsDefect, TransmonSpec } from './types.js';
import { describeFound, DiagnosticCollector, formatPath, type Path } from './diagnostics.js';
import { parseQuantity, formatQuantity, type QuantityKind } from './units.js';
import {
  COUPLING_KEYS, CouplingListSchema, CouplingMapSchema, LayoutTopSchema, MAX_QUBIT_SPREAD, QUBIT_ID_PATTERN, QUBIT_KEYS,
  QubitSchema, RULE_KEYS, SPREAD_KEYS, TLS_KEYS, TOP_KEYS, type QubitInput,
} from './schema.js';
import { DEFAULT_RULES, parseRuleValue, ruleSpecByKey } from './rules.js';
import { defaultPhrase, reportZodIssues, unknownKeyMessage } from './zod-issues.js';
import { didYouMean } from './suggest.js';
import type { SourceTree } from './yaml-source.js';
import { judgePlausible } from './plausible.js';

type Sign = 'positive' | 'negative';

const isMap = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);

const TRANSMON_FORMS = 'ec + ejMax (+ asymmetry), fMax + anharmonicity (+ asymmetry or fMin), or ec + rn (+ asymmetry)';

/**
 * Convert a parsed layout; problems go to `collector`, warnings about unusual values (plausible.ts)
 * to `warnings` (default: a collector nobody reads).
 */
export function convertLayout(tree: SourceTree, file: string, collector: DiagnosticCollector, warnings: DiagnosticCollector = new DiagnosticCollector(file, tree.locate)): ChipLayout | undefined {
  judge = { warnings };
  const root = tree.value;
  const ref = (path: Path): SourceRef => {
    const p = tree.locate(path, 'key');
    return { file, line: p?.line ?? 0, column: p?.column ?? 0, path: formatPath(path) };
  };

  // Top-level structure.
  const top = LayoutTopSchema.safeParse(root, { error: defaultPhrase });
  if (!top.success) reportZodIssues(top.error.issues, root, [], collector, () => TOP_KEYS);
  if (!isMap(root)) return undefined;

  // Qubits, one by one.
  const qubits: QubitLayout[] = [];
  const knownIds: string[] = [];
  if (isMap(root.qubits)) {
    const entries = Object.entries(root.qubits);
    if (entries.length === 0) collector.add(['qubits'], 'expected at least one qubit, found an empty map');
    for (const [id, raw] of entries) {
      knownIds.push(id);
      const base: Path = ['qubits', id];
      if (!QUBIT_ID_PATTERN.test(id)) {
        collector.add(base, `expected a qubit id of letters, digits and _ (edges are written A-B), found ${JSON.stringify(id)}`, 'key');
      }
      const parsed = QubitSchema.safeParse(raw, { error: defaultPhrase });
      if (parsed.success) {
        const qubit = convertQubit(id, parsed.data, new Set(Object.keys(parsed.data)), base, collector, ref(base));
        if (qubit) qubits.push(qubit);
        continue;
      }
      reportZodIssues(parsed.error.issues, raw, base, collector, (rel) =>
        rel.length >= 2 && rel[0] === 'tls' ? TLS_KEYS : rel.length >= 1 && rel[0] === 'spread' ? SPREAD_KEYS : QUBIT_KEYS,
      );
      if (!isMap(raw)) continue;
      // Go on with the fields that passed, so that one file shows all its problems. A misspelt
      // key counts as present under its likely name, which avoids follow-up "missing" messages.
      const failed = new Set(parsed.error.issues.map((i) => i.path[0]).filter((k) => typeof k === 'string'));
      const present = new Set<string>();
      const usable: Record<string, unknown> = {};
      for (const key of Object.keys(raw)) {
        if (QUBIT_KEYS.includes(key)) {
          present.add(key);
          if (!failed.has(key)) usable[key] = raw[key];
        } else {
          const likely = didYouMean(key, QUBIT_KEYS);
          if (likely) present.add(likely);
        }
      }
      convertQubit(id, usable as Partial<QubitInput>, present, base, collector, ref(base));
    }
  }

  // Couplings.
  const couplings: CouplingLayout[] = [];
  if (Array.isArray(root.couplings)) {
    const idSet = new Set(knownIds);
    const seen = new Map<string, { index: number; a: string; b: string }>();
    root.couplings.forEach((raw, index) => {
      const base: Path = ['couplings', index];
      const c = convertCoupling(raw, base, collector);
      if (!c) return;
      let ok = true;
      for (const [which, id] of [[0, c.a], [1, c.b]] as const) {
        if (idSet.has(id)) continue;
        ok = false;
        const hint = didYouMean(id, knownIds);
        collector.add(
          [...base, ...c.idPath(which)],
          `expected a qubit id listed under qubits, found ${JSON.stringify(id)}${hint ? ` (did you mean ${JSON.stringify(hint)}?)` : ''}`,
        );
      }
      if (c.a === c.b) {
        ok = false;
        collector.add(base, `expected two different qubits, found ${c.a} coupled to itself`);
      }
      if (!ok) return;
      const key = c.a < c.b ? `${c.a}\u0000${c.b}` : `${c.b}\u0000${c.a}`;
      const first = seen.get(key);
      if (first) {
        const firstRef = ref(['couplings', first.index]);
        collector.add(
          base,
          `expected each pair coupled once, found ${c.a}-${c.b} again (first as ${first.a}-${first.b} at line ${firstRef.line})`,
        );
        return;
      }
      seen.set(key, { index, a: c.a, b: c.b });
      couplings.push({ a: c.a, b: c.b, gGHz: c.gGHz, source: ref(base) });
    });
  }

  // Rules.
  const rules: Rules = { ...DEFAULT_RULES };
  if (isMap(root.rules)) {
    for (const [key, raw] of Object.entries(root.rules)) {
      const spec = ruleSpecByKey(key);
      if (!spec) {
        collector.add(['rules', key], unknownKeyMessage(key, RULE_KEYS), 'key');
        continue;
      }
      const r = parseRuleValue(spec, raw);
      if (r.ok && r.warning) warnings.add(['rules', key], `warning: ${r.warning}`);
      if (!r.ok) collector.add(['rules', key], r.message);
      else if (r.value === undefined) delete (rules as Partial<Rules>)[spec.field];
      else (rules as unknown as Record<string, number>)[spec.field] = r.value;
    }
  }

  if (collector.count > 0 || !top.success) return undefined;
  return {
    file,
    chip: top.data.chip,
    description: top.data.description,
    qubits,
    couplings,
    rules,
  };
}

/** Where warnings of the conversion in progress go (set by convertLayout; conversion is synchronous). */
let judge: { warnings: DiagnosticCollector } | undefined;

/**
 * Read one quantity field; report and return undefined when it is wrong. `plausible` names its
 * entry in plausible.ts: outside the hard range an error, outside the usual range a warning.
 */
function readQuantity(
  value: unknown,
  kind: QuantityKind,
  path: Path,
  collector: DiagnosticCollector,
  sign: Sign = 'positive',
  plausible?: string,
): number | undefined {
  if (value === undefined) return undefined;
  const q = parseQuantity(value, kind);
  if (!q.ok) {
    collector.add(path, q.message);
    return undefined;
  }
  const shown = typeof value === 'string' ? value.trim() : String(value);
  if (sign === 'positive' && !(q.value > 0)) {
    collector.add(path, `expected a positive ${kind === 'fluxNoise' ? 'flux-noise amplitude' : kind}, found ${shown}`);
    return undefined;
  }
  if (sign === 'negative' && !(q.value < 0)) {
    collector.add(path, `expected a negative frequency (transmon anharmonicity f12 - f01 is below zero, e.g. "-210 MHz"), found ${shown}`);
    return undefined;
  }
  if (plausible !== undefined) {
    const verdict = judgePlausible(plausible, q.value, shown);
    if (verdict.level === 'error') {
      collector.add(path, verdict.message);
      return undefined;
    }
    if (verdict.level === 'warning') judge?.warnings.add(path, `warning: ${verdict.message}`);
  }
  return q.value;
}

/**
 * Convert one qubit whose fields in `input` passed the structure check. `present` names the keys
 * the user wrote (some may have been dropped from `input` for structural errors already reported).
 */
function convertQubit(
  id: string,
  input: Partial<QubitInput>,
  present: ReadonlySet<string>,
  base: Path,
  collector: DiagnosticCollector,
  source: SourceRef,
): QubitLayout | undefined {
  const before = collector.count;
  const at = (...rel: (string | number)[]): Path => [...base, ...rel];
  const f = (key: keyof QubitInput, sign: Sign = 'positive') =>
    readQuantity(input[key], 'frequency', at(key), collector, sign, key);

  // Transmon model.
  const transmon = convertTransmon(input, present, at, collector, f);

  // Coherence.
  const t1Ns = readQuantity(input.t1, 'time', at('t1'), collector, 'positive', 't1');
  const tphiNs = readQuantity(input.tphi, 'time', at('tphi'), collector, 'positive', 'tphi');
  const fluxNoisePhi0 = readQuantity(input.fluxNoise, 'fluxNoise', at('fluxNoise'), collector, 'positive', 'fluxNoise');
  if (!present.has('tphi') && !present.has('fluxNoise')) {
    collector.add(base, 'missing dephasing: expected tphi (white dephasing time) or fluxNoise (1/f flux-noise amplitude), or both', 'key');
  }

  // Planning constraints.
  let windowGHz: [number, number] | undefined;
  if (input.window) {
    const lo = readQuantity(input.window[0], 'frequency', at('window', 0), collector, 'positive', 'window');
    const hi = readQuantity(input.window[1], 'frequency', at('window', 1), collector, 'positive', 'window');
    if (lo !== undefined && hi !== undefined) {
      if (lo >= hi) {
        collector.add(at('window'), `expected a window [lo, hi] with lo < hi, found [${formatQuantity(lo, 'frequency')}, ${formatQuantity(hi, 'frequency')}]`);
      } else windowGHz = [lo, hi];
    }
  }
  const parkGHz = f('park');
  if (parkGHz !== undefined && windowGHz && (parkGHz < windowGHz[0] || parkGHz > windowGHz[1])) {
    collector.add(
      at('park'),
      `expected a parking frequency inside window [${formatQuantity(windowGHz[0], 'frequency')}, ${formatQuantity(windowGHz[1], 'frequency')}], found ${formatQuantity(parkGHz, 'frequency')}`,
    );
  }
  if (parkGHz !== undefined && transmon?.kind === 'frequencies') {
    if (parkGHz > transmon.fMaxGHz) {
      collector.add(at('park'), `expected a parking frequency at or below fMax (${formatQuantity(transmon.fMaxGHz, 'frequency')}), found ${formatQuantity(parkGHz, 'frequency')}`);
    } else if (transmon.fMinGHz !== undefined && parkGHz < transmon.fMinGHz) {
      collector.add(at('park'), `expected a parking frequency at or above fMin (${formatQuantity(transmon.fMinGHz, 'frequency')}), found ${formatQuantity(parkGHz, 'frequency')}`);
    }
  }
  const tls: TlsDefect[] = [];
  (input.tls ?? []).forEach((defect, i) => {
    const atGHz = readQuantity(defect.at, 'frequency', at('tls', i, 'at'), collector, 'positive', 'tls.at');
    const widthGHz = readQuantity(defect.width, 'frequency', at('tls', i, 'width'), collector, 'positive', 'tls.width');
    if (atGHz !== undefined && widthGHz !== undefined) tls.push({ atGHz, widthGHz });
  });
  const readoutGHz = f('readout');
  let spread: { rn?: number; ec?: number } | undefined;
  if (input.spread) {
    spread = {};
    for (const key of ['rn', 'ec'] as const) {
      const v = input.spread[key];
      if (v === undefined) continue;
      if (!(v >= 0 && v <= MAX_QUBIT_SPREAD)) collector.add(at('spread', key), `expected a relative spread (1 sigma) from 0 to ${MAX_QUBIT_SPREAD}, e.g. 0.015, found ${v}`);
      else spread[key] = v;
    }
  }

  if (collector.count > before || transmon === undefined || t1Ns === undefined || input.pos === undefined) return undefined;
  const qubit: QubitLayout = { id, pos: [input.pos[0], input.pos[1]], transmon, t1Ns, tls, source };
  if (tphiNs !== undefined) qubit.tphiNs = tphiNs;
  if (fluxNoisePhi0 !== undefined) qubit.fluxNoisePhi0 = fluxNoisePhi0;
  if (windowGHz) qubit.windowGHz = windowGHz;
  if (parkGHz !== undefined) qubit.parkGHz = parkGHz;
  if (readoutGHz !== undefined) qubit.readoutGHz = readoutGHz;
  if (spread) qubit.spread = spread;
  if (input.note !== undefined) qubit.note = input.note;
  return qubit;
}

function convertTransmon(
  input: Partial<QubitInput>,
  present: ReadonlySet<string>,
  at: (...rel: (string | number)[]) => Path,
  collector: DiagnosticCollector,
  f: (key: keyof QubitInput, sign?: Sign) => number | undefined,
): TransmonSpec | undefined {
  const base = at();
  const has = (k: keyof QubitInput) => present.has(k);
  const forms = [
    has('ejMax') ? 'ec + ejMax' : undefined,
    has('fMax') || has('anharmonicity') || has('fMin') ? 'fMax + anharmonicity' : undefined,
    has('rn') ? 'ec + rn' : undefined,
  ].filter((x): x is string => x !== undefined);
  const given = (['ec', 'ejMax', 'fMax', 'anharmonicity', 'fMin', 'rn', 'asymmetry'] as const).filter(has);

  if (forms.length === 0) {
    const found = has('ec') ? 'ec alone' : 'none';
    collector.add(base, `missing transmon model: expected ${TRANSMON_FORMS}, found ${found}`, 'key');
    return undefined;
  }
  if (forms.length > 1) {
    collector.add(base, `expected one transmon model (${TRANSMON_FORMS}), found keys of several: ${given.join(', ')}`, 'key');
    return undefined;
  }

  let asymmetry: number | undefined;
  if (input.asymmetry !== undefined) {
    if (!(input.asymmetry >= 0 && input.asymmetry < 1)) {
      collector.add(at('asymmetry'), `expected a SQUID asymmetry d in [0, 1), found ${input.asymmetry}`);
    } else asymmetry = input.asymmetry;
  }
  const ecGHz = f('ec');
  const form = forms[0];

  if (form === 'ec + ejMax') {
    const ejMaxGHz = f('ejMax');
    if (!has('ec')) collector.add(base, 'missing key "ec": expected a charging energy to go with ejMax', 'key');
    if (ecGHz === undefined || ejMaxGHz === undefined || (has('asymmetry') && asymmetry === undefined)) return undefined;
    return { kind: 'energies', ecGHz, ejMaxGHz, asymmetry: asymmetry ?? 0 };
  }

  if (form === 'fMax + anharmonicity') {
    let ok = true;
    if (has('ec')) {
      collector.add(at('ec'), 'expected no ec with fMax + anharmonicity (E_C follows from them), found ec', 'key');
      ok = false;
    }
    if (!has('fMax')) {
      collector.add(base, 'missing key "fMax": expected the maximum frequency to go with anharmonicity', 'key');
      ok = false;
    }
    if (!has('anharmonicity')) {
      collector.add(base, 'missing key "anharmonicity": expected the anharmonicity (e.g. "-210 MHz") to go with fMax', 'key');
      ok = false;
    }
    if (has('fMin') && has('asymmetry')) {
      collector.add(at('fMin'), 'expected asymmetry or fMin (each fixes the tunable range), found both', 'key');
      ok = false;
    }
    const fMaxGHz = f('fMax');
    const anharmonicityGHz = f('anharmonicity', 'negative');
    const fMinGHz = f('fMin');
    if (fMaxGHz !== undefined && fMinGHz !== undefined && !(fMinGHz < fMaxGHz)) {
      collector.add(at('fMin'), `expected fMin below fMax (${formatQuantity(fMaxGHz, 'frequency')}), found ${formatQuantity(fMinGHz, 'frequency')}`);
      ok = false;
    }
    if (fMaxGHz !== undefined && anharmonicityGHz !== undefined && -anharmonicityGHz >= fMaxGHz) {
      collector.add(at('anharmonicity'), `expected an anharmonicity much smaller than fMax (${formatQuantity(fMaxGHz, 'frequency')}), found ${formatQuantity(anharmonicityGHz, 'frequency')}`);
      ok = false;
    }
    if (!ok || fMaxGHz === undefined || anharmonicityGHz === undefined) return undefined;
    if (has('asymmetry') && asymmetry === undefined) return undefined;
    if (has('fMin') && fMinGHz === undefined) return undefined;
    const spec: TransmonSpec = { kind: 'frequencies', fMaxGHz, anharmonicityGHz };
    if (fMinGHz !== undefined) spec.fMinGHz = fMinGHz;
    else spec.asymmetry = asymmetry ?? 0;
    return spec;
  }

  // ec + rn
  if (!has('ec')) collector.add(base, 'missing key "ec": expected a charging energy to go with rn', 'key');
  const rn = input.rn;
  let rnKOhm: number | [number, number] | undefined;
  if (Array.isArray(rn)) {
    const r1 = readQuantity(rn[0], 'resistance', at('rn', 0), collector, 'positive', 'rn');
    const r2 = readQuantity(rn[1], 'resistance', at('rn', 1), collector, 'positive', 'rn');
    if (has('asymmetry')) {
      collector.add(at('asymmetry'), 'expected no asymmetry with two junction resistances (it follows from them), found asymmetry', 'key');
      return undefined;
    }
    if (r1 !== undefined && r2 !== undefined) rnKOhm = [r1, r2];
  } else {
    rnKOhm = readQuantity(rn, 'resistance', at('rn'), collector, 'positive', 'rn');
  }
  if (ecGHz === undefined || rnKOhm === undefined || (has('asymmetry') && asymmetry === undefined)) return undefined;
  const spec: TransmonSpec = { kind: 'resistance', ecGHz, rnKOhm };
  if (!Array.isArray(rnKOhm)) spec.asymmetry = asymmetry ?? 0;
  return spec;
}

interface CouplingDraft {
  a: string;
  b: string;
  gGHz: number;
  /** Path (relative to the coupling) of qubit id 0 or 1. */
  idPath(which: 0 | 1): Path;
}

function idText(v: string | number): string {
  return typeof v === 'number' ? String(v) : v;
}

function convertCoupling(raw: unknown, base: Path, collector: DiagnosticCollector): CouplingDraft | undefined {
  if (Array.isArray(raw)) {
    const parsed = CouplingListSchema.safeParse(raw, { error: defaultPhrase });
    if (!parsed.success) {
      reportZodIssues(parsed.error.issues, raw, base, collector, () => COUPLING_KEYS);
      return undefined;
    }
    const gGHz = readQuantity(parsed.data[2], 'frequency', [...base, 2], collector, 'positive', 'g');
    if (gGHz === undefined) return undefined;
    return { a: idText(parsed.data[0]), b: idText(parsed.data[1]), gGHz, idPath: (w) => [w] };
  }
  if (isMap(raw)) {
    const parsed = CouplingMapSchema.safeParse(raw, { error: defaultPhrase });
    if (!parsed.success) {
      reportZodIssues(parsed.error.issues, raw, base, collector, () => COUPLING_KEYS);
      return undefined;
    }
    const gGHz = readQuantity(parsed.data.g, 'frequency', [...base, 'g'], collector, 'positive', 'g');
    if (gGHz === undefined) return undefined;
    return { a: idText(parsed.data.qubits[0]), b: idText(parsed.data.qubits[1]), gGHz, idPath: (w) => ['qubits', w] };
  }
  collector.add(base, `expected a coupling [A, B, g] or { qubits: [A, B], g }, found ${describeFound(raw)}`);
  return undefined;
}
