/**
 * The gate table's columns, defined once: gates.csv, gates.txt (and the `gates:` block of
 * `fluxlane plan`) and the README's column list are all derived from GATE_COLUMNS, and every
 * cell is read from the edge's entry in plan.json, so the three carry the same numbers.
 *
 * A column: `csv` its CSV header (snake_case, SI unit last), `title` its header in the text table
 * (null: CSV only), `json` the plan.json field of an edge it shows (a dotted path, e.g.
 * `gate.duration`), `kind` how it prints (SI in the CSV; a unit chosen by size in the text),
 * `doc` what it is. Adding a column is one line here.
 */
import { freq, ns, prob } from '../plan/format.js';

export type ColumnKind =
  | 'text'
  | 'count'
  | 'edge'
  | 'frequency'
  | 'frequency-map'
  | 'time'
  | 'phase'
  | 'fidelity'
  | 'probability'
  | 'yes-no';

export interface GateColumn {
  csv: string;
  title: string | null;
  json: string;
  kind: ColumnKind;
  doc: string;
  /** Significant digits of a frequency in the text table (default 3). */
  digits?: number;
}

export const GATE_COLUMNS: readonly GateColumn[] = [
  { csv: 'edge', title: 'edge', json: 'qubits', kind: 'edge', doc: 'the coupled pair A-B, in layout order' },
  { csv: 'mover', title: 'mover', json: 'mover', kind: 'text', doc: 'the qubit that moves to the crossing' },
  { csv: 'partner', title: null, json: 'partner', kind: 'text', doc: 'the qubit that stays at its parking frequency' },
  { csv: 'crossing', title: 'crossing', json: 'crossing', kind: 'text', doc: '11-20 (the mover goes to |2>) or 11-02' },
  { csv: 'interaction_frequency_hz', title: 'interaction', json: 'interactionFrequency', kind: 'frequency', digits: 5, doc: "the mover's f01 at the gate's destination (the designed one when a gate was designed)" },
  { csv: 'layer', title: 'layer', json: 'layer', kind: 'count', doc: 'the parallel layer the gate runs in' },
  { csv: 'spectator_parking_hz', title: 'spectators moved', json: 'spectatorParking', kind: 'frequency-map', digits: 4, doc: 'spectators moved out of the way for the gate, each as id@frequency' },
  { csv: 'zz_idle_hz', title: 'ZZ idle', json: 'zz', kind: 'frequency', doc: 'static ZZ of the pair at parking' },
  { csv: 'plan_ramp_s', title: 'plan ramp', json: 'rampTime', kind: 'time', doc: "the plan's ramp: the sweep time its rules assume without a design, and the time of each spectator move" },
  { csv: 'design_ramp_s', title: 'design ramp', json: 'gate.rampTime', kind: 'time', doc: "the designed waveform's ramp, each way" },
  { csv: 'hold_s', title: null, json: 'gate.holdTime', kind: 'time', doc: 'the designed hold at the destination' },
  { csv: 'gate_duration_s', title: 'gate', json: 'gate.duration', kind: 'time', doc: "the designed CZ waveform: ramps, hold, the line's settling and the sample grid" },
  { csv: 'slot_duration_s', title: 'slot', json: 'slotDuration', kind: 'time', doc: "the gate's slot: the gate plus the spectator moves before and after it (without a design, the duration model's shortest slot)" },
  { csv: 'family', title: 'family', json: 'gate.family', kind: 'text', doc: 'the ramp family of the design' },
  { csv: 'conditional_phase_rad', title: null, json: 'gate.conditionalPhase', kind: 'phase', doc: 'the conditional phase of the designed waveform' },
  { csv: 'leakage', title: 'leakage', json: 'gate.leakage', kind: 'probability', doc: 'leakage out of the computational states' },
  { csv: 'fidelity', title: 'fidelity', json: 'gate.fidelity', kind: 'fidelity', doc: 'average gate fidelity to the target, coherent' },
  { csv: 'fidelity_noisy', title: 'with noise', json: 'gate.fidelityNoisy', kind: 'fidelity', doc: 'the same with decoherence' },
  { csv: 'virtual_z_a_rad', title: null, json: 'gate.virtualZ.a', kind: 'phase', doc: 'virtual-Z phase a on the mover (undo with -a)' },
  { csv: 'virtual_z_b_rad', title: null, json: 'gate.virtualZ.b', kind: 'phase', doc: 'virtual-Z phase b on the partner (undo with -b)' },
  { csv: 'predicted_error', title: 'predicted error', json: 'budget.total', kind: 'probability', doc: "the gate's predicted error, the sum of its error budget (average gate infidelity; README \"Error budget\")" },
  { csv: 'error_method', title: null, json: 'budget.method', kind: 'text', doc: "'simulated' for a designed gate, 'estimated' before pulse design" },
  { csv: 'error_coherent', title: null, json: 'budget.coherent', kind: 'probability', doc: 'budget: the coherent error of the designed waveform (leakage included)' },
  { csv: 'error_t1', title: null, json: 'budget.t1', kind: 'probability', doc: 'budget: T1 (first-order Lindblad estimate on the trajectory)' },
  { csv: 'error_white_dephasing', title: null, json: 'budget.whiteDephasing', kind: 'probability', doc: 'budget: white dephasing (first-order Lindblad estimate)' },
  { csv: 'error_flux_noise', title: null, json: 'budget.fluxNoise', kind: 'probability', doc: 'budget: quasi-static 1/f flux noise of both transmons' },
  { csv: 'error_spectators', title: null, json: 'budget.spectators', kind: 'probability', doc: 'budget: the spectators (three-transmon simulations)' },
  { csv: 'error_swept_crossings', title: null, json: 'budget.sweptCrossings', kind: 'probability', doc: 'budget: Landau-Zener transfers of both passages of every swept crossing' },
  { csv: 'error_spectator_moves', title: null, json: 'budget.spectatorMoves', kind: 'probability', doc: 'budget: the extra slot time and dephasing of moved spectators' },
  { csv: 'feasible', title: 'ok', json: 'feasible', kind: 'yes-no', doc: 'true when the gate breaks no rule' },
];

/** The value of a dotted plan.json path on an edge (undefined when any step is missing or null). */
export function fieldOf(edge: Record<string, unknown>, path: string): unknown {
  let v: unknown = edge;
  for (const part of path.split('.')) {
    if (v === null || v === undefined || typeof v !== 'object') return undefined;
    v = (v as Record<string, unknown>)[part];
  }
  return v ?? undefined;
}

/** A CSV cell: the JSON value as it stands (SI); empty when absent. */
export function csvValue(c: GateColumn, v: unknown): string {
  if (v === undefined) return '';
  if (c.kind === 'edge') return (v as string[]).join('-');
  if (c.kind === 'frequency-map') return Object.entries(v as Record<string, number>).map(([q, f]) => `${q}@${f}`).join(' ');
  return String(v);
}

/** A text-table cell: units chosen by size; '-' when absent. */
export function textValue(c: GateColumn, v: unknown): string {
  if (v === undefined) return '-';
  switch (c.kind) {
    case 'edge':
      return (v as string[]).join('-');
    case 'frequency':
      return freq((v as number) * 1e-9, c.digits ?? 3);
    case 'frequency-map': {
      const list = Object.entries(v as Record<string, number>);
      return list.length === 0 ? '-' : list.map(([q, f]) => `${q}@${freq(f * 1e-9, c.digits ?? 3)}`).join(' ');
    }
    case 'time':
      return ns((v as number) * 1e9);
    case 'phase':
      return `${(v as number).toFixed(4)} rad`;
    case 'fidelity':
      return (v as number).toFixed(6);
    case 'probability':
      return prob(v as number);
    case 'yes-no':
      return v ? 'yes' : 'NO';
    default:
      return String(v);
  }
}

/** The README's list of the columns (markdown table, generated by npm run generated). */
export function gateColumnsMarkdown(): string {
  const rows = GATE_COLUMNS.map((c) => `| \`${c.csv}\` | ${c.title === null ? '-' : `\`${c.title}\``} | \`${c.json}\` | ${c.doc.replace(/\|/g, '\\|')} |`);
  return ['| gates.csv | gates.txt | plan.json (per edge) | what it is |', '|---|---|---|---|', ...rows].join('\n');
}
