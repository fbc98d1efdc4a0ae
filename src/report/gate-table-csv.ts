/** The gate table as CSV (gates.csv): one row per edge of plan.json, the columns of ./gate-columns.ts (SI units). */
import { csvCell } from './csv.js';
import { csvValue, fieldOf, GATE_COLUMNS } from './gate-columns.js';

/** The gate table: one CSV row per edge. */
export function gateTableCsv(json: Record<string, unknown>): string {
  const edges = json.edges as Record<string, unknown>[];
  const rows = [GATE_COLUMNS.map((c) => c.csv).join(',')];
  for (const e of edges) rows.push(GATE_COLUMNS.map((c) => csvCell(csvValue(c, fieldOf(e, c.json)))).join(','));
  return rows.join('\n') + '\n';
}
