/**
 * A layout document -> YAML text, written by hand (not by a generic dumper) so that generated
 * layouts read like hand-written ones: one qubit per block, flow lists for positions, windows,
 * defects and couplings, and deterministic output (same document -> same bytes).
 */

import { stringify } from 'yaml';

/** The file form of a qubit: values are unit strings (or numbers where no unit applies). */
export interface QubitDocument {
  pos: [number, number];
  ec?: string;
  ejMax?: string;
  asymmetry?: number;
  fMax?: string;
  anharmonicity?: string;
  fMin?: string;
  rn?: string | [string, string];
  t1: string;
  tphi?: string;
  fluxNoise?: string;
  window?: [string, string];
  park?: string;
  tls?: { at: string; width: string }[];
  readout?: string;
  spread?: { rn?: number; ec?: number };
  note?: string;
}

export interface LayoutDocument {
  /** Comment lines written at the top (without `#`). */
  header?: string[];
  chip: string;
  description?: string;
  qubits: [id: string, qubit: QubitDocument][];
  couplings: [a: string, b: string, g: string][];
  rules?: [key: string, value: string | number | null][];
}

const KEY_ORDER: readonly (keyof QubitDocument)[] = [
  'pos', 'ec', 'ejMax', 'fMax', 'anharmonicity', 'asymmetry', 'fMin', 'rn',
  't1', 'tphi', 'fluxNoise', 'window', 'park', 'tls', 'readout', 'spread', 'note',
];

/** Texts that every YAML reader keeps as plain strings: "5.8 GHz", "-210 MHz", "Q12" (fast path). */
const PLAIN_QUANTITY = /^-?\d+(\.\d+)? [A-Za-z][A-Za-z0-9]*(\/sqrt\(Hz\))?$/;
const PLAIN_NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;
const RESERVED = /^(true|false|null|yes|no|on|off|y|n)$/i;

/** One scalar as YAML text: plain when the yaml package reads it back unchanged, quoted otherwise. */
export function yamlScalar(value: string | number | null): string {
  if (typeof value === 'number' && !Number.isFinite(value)) {
    throw new RangeError(`yamlScalar: not a finite number: ${value}`);
  }
  if (typeof value === 'number') return String(value);
  if (typeof value === 'string' && (PLAIN_QUANTITY.test(value) || (PLAIN_NAME.test(value) && !RESERVED.test(value)))) {
    return value;
  }
  const text = stringify(value, { lineWidth: 0 }).trimEnd();
  // Multi-line text would come out as a block scalar; a JSON string is a valid one-line YAML scalar.
  return text.includes('\n') ? JSON.stringify(value) : text;
}

function flow(items: (string | number)[]): string {
  return `[${items.map((x) => yamlScalar(x)).join(', ')}]`;
}

export function layoutToYaml(doc: LayoutDocument): string {
  const out: string[] = [];
  for (const line of doc.header ?? []) out.push(line === '' ? '#' : `# ${line}`);
  out.push(`chip: ${yamlScalar(doc.chip)}`);
  if (doc.description !== undefined) out.push(`description: ${yamlScalar(doc.description)}`);
  out.push('', 'qubits:');
  for (const [id, q] of doc.qubits) {
    out.push(`  ${yamlScalar(id)}:`);
    for (const key of KEY_ORDER) {
      const v = q[key];
      if (v === undefined) continue;
      if (key === 'pos' || key === 'window' || (key === 'rn' && Array.isArray(v))) {
        out.push(`    ${key}: ${flow(v as (string | number)[])}`);
      } else if (key === 'tls') {
        const list = v as { at: string; width: string }[];
        if (list.length === 0) continue;
        out.push('    tls:');
        for (const d of list) out.push(`      - { at: ${yamlScalar(d.at)}, width: ${yamlScalar(d.width)} }`);
      } else if (key === 'spread') {
        const sp = v as { rn?: number; ec?: number };
        const parts = (['rn', 'ec'] as const).filter((k) => sp[k] !== undefined).map((k) => `${k}: ${yamlScalar(sp[k]!)}`);
        if (parts.length > 0) out.push(`    spread: { ${parts.join(', ')} }`);
      } else if (key === 'note') {
        out.push(`    note: ${yamlScalar(v as string)}`);
      } else {
        out.push(`    ${key}: ${yamlScalar(v as string | number)}`);
      }
    }
  }
  out.push('', 'couplings:');
  if (doc.couplings.length === 0) out[out.length - 1] = 'couplings: []';
  for (const [a, b, g] of doc.couplings) out.push(`  - ${flow([a, b, g])}`);
  if (doc.rules && doc.rules.length > 0) {
    out.push('', 'rules:');
    for (const [k, v] of doc.rules) out.push(`  ${k}: ${yamlScalar(v)}`);
  }
  return `${out.join('\n')}\n`;
}
