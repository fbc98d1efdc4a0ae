/**
 * The gate table for people (gates.txt and the `gates:` block of `fluxlane plan`): the columns
 * of ./gate-columns.ts that have a title, read from plan.json, units printed and chosen by size.
 */
import { fieldOf, GATE_COLUMNS, textValue } from './gate-columns.js';

/** The gate table (aligned columns). */
export function gateTableText(json: Record<string, unknown>): string {
  const columns = GATE_COLUMNS.filter((c) => c.title !== null);
  const head = columns.map((c) => c.title!);
  const rows = (json.edges as Record<string, unknown>[]).map((e) => columns.map((c) => textValue(c, fieldOf(e, c.json))));
  const widths = head.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c].length)));
  const line = (r: string[]) => r.map((x, c) => x.padEnd(widths[c])).join('  ').trimEnd();
  return [line(head), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n') + '\n';
}

/** gates.txt: the table and what each column is. */
export function gateTableFile(json: Record<string, unknown>): string {
  const legend = GATE_COLUMNS.filter((c) => c.title !== null).map((c) => `  ${c.title!.padEnd(17)} ${c.doc}`);
  return `${gateTableText(json)}\ncolumns:\n${legend.join('\n')}\nModel estimates: verify on hardware, and respect the flux-line current limits of your wiring.\n`;
}
