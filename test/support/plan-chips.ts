/**
 * Small chips built by hand for the planner's tests: a compact way to write a layout in code
 * (each qubit by fMax, anharmonicity and asymmetry or fMin, plus the optional keys) and parse it
 * with the real layout stage, so the planner sees exactly what a layout file would give it.
 */
import { parseLayoutText } from '../../src/layout/load.js';
import type { ChipLayout } from '../../src/layout/types.js';

export interface HandQubit {
  fMax: string;
  alpha?: string;
  asymmetry?: number;
  fMin?: string;
  window?: [string, string];
  park?: string;
  tls?: { at: string; width: string }[];
  readout?: string;
  t1?: string;
  fluxNoise?: string;
}

export function handChip(name: string, qubits: Record<string, HandQubit>, couplings: [string, string, string][], rules: Record<string, string | number> = {}): ChipLayout {
  const lines = [`chip: ${name}`, 'qubits:'];
  let x = 0;
  for (const [id, q] of Object.entries(qubits)) {
    lines.push(`  ${id}:`, `    pos: [${x++}, 0]`, `    fMax: ${q.fMax}`, `    anharmonicity: ${q.alpha ?? '-210 MHz'}`);
    if (q.fMin !== undefined) lines.push(`    fMin: ${q.fMin}`);
    else lines.push(`    asymmetry: ${q.asymmetry ?? 0.3}`);
    lines.push(`    t1: ${q.t1 ?? '60 us'}`, `    fluxNoise: ${q.fluxNoise ?? '3 uPhi0'}`);
    if (q.window) lines.push(`    window: [${q.window[0]}, ${q.window[1]}]`);
    if (q.park) lines.push(`    park: ${q.park}`);
    if (q.readout) lines.push(`    readout: ${q.readout}`);
    if (q.tls && q.tls.length > 0) {
      lines.push('    tls:');
      for (const d of q.tls) lines.push(`      - { at: ${d.at}, width: ${d.width} }`);
    }
  }
  if (couplings.length > 0) {
    lines.push('couplings:');
    for (const [a, b, g] of couplings) lines.push(`  - [${a}, ${b}, ${g}]`);
  }
  const keys = Object.entries(rules);
  if (keys.length > 0) {
    lines.push('rules:');
    for (const [k, v] of keys) lines.push(`  ${k}: ${v}`);
  }
  return parseLayoutText(`${lines.join('\n')}\n`, `${name}.yaml`);
}
