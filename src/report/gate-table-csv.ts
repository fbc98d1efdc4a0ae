/** The gate table as CSV (gates.csv): one row per edge, read from the plan.json document (SI units). */
import { csvCell } from './csv.js';

const CSV_HEADER = [
  'edge', 'mover', 'partner', 'crossing', 'interaction_frequency_hz', 'layer', 'spectator_parking', 'zz_hz', 'ramp_time_s', 'duration_s',
  'family', 'hold_time_s', 'conditional_phase_rad', 'leakage', 'fidelity', 'fidelity_noisy', 'virtual_z_a_rad', 'virtual_z_b_rad', 'feasible',
];

/** The gate table: one CSV row per edge. */
export function gateTableCsv(json: Record<string, unknown>): string {
  const edges = json.edges as Record<string, any>[];
  const rows = [CSV_HEADER.join(',')];
  for (const e of edges) {
    const g = e.gate as Record<string, any> | null;
    const parking = Object.entries(e.spectatorParking as Record<string, number>).map(([q, f]) => `${q}@${f}`).join(' ');
    const cells = [
      (e.qubits as string[]).join('-'), e.mover, e.partner, e.crossing, e.interactionFrequency ?? '', e.layer, parking, e.zz, e.rampTime, e.duration ?? '',
      g?.family ?? '', g?.holdTime ?? '', g?.conditionalPhase ?? '', g?.leakage ?? '', g?.fidelity ?? '', g?.fidelityNoisy ?? '', g?.virtualZ?.a ?? '', g?.virtualZ?.b ?? '', e.feasible,
    ];
    rows.push(cells.map(csvCell).join(','));
  }
  return rows.join('\n') + '\n';
}
