/**
 * Writes the files fluxlane generates from its own definitions (run `npm run generated` after
 * changing src/layout/schema.ts or shared/rules.json):
 * - shared/layout.schema.json from the zod schemas (src/layout/json-schema.ts);
 * - the rules table in README.md (between the rules-table markers) from shared/rules.json, and the
 *   ranges table of the layout's inputs (ranges-table markers) from src/layout/plausible.ts;
 * - the gate table's column list in README.md (between the gate-columns markers) from
 *   src/report/gate-columns.ts.
 * test/layout/json-schema.test.ts, test/layout/rules.test.ts and test/report/gate-columns.test.ts
 * fail when these are stale.
 */

import { readFileSync, realpathSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { layoutJsonSchema } from '../../src/layout/json-schema.js';
import { rulesTableMarkdown } from '../../src/layout/rules.js';
import { gateColumnsMarkdown } from '../../src/report/gate-columns.js';
import { rangesTableMarkdown } from '../../src/layout/plausible.js';
import { claimsTableMarkdown } from '../../src/plan/verify-claims.js';

export const SCHEMA_FILE = new URL('../../shared/layout.schema.json', import.meta.url);
export const README_FILE = new URL('../../README.md', import.meta.url);
export const RULES_TABLE_START = '<!-- rules-table:start (generated from shared/rules.json by npm run generated) -->';
export const RULES_TABLE_END = '<!-- rules-table:end -->';

export const GATE_COLUMNS_START = '<!-- gate-columns:start (generated from src/report/gate-columns.ts by npm run generated) -->';
export const GATE_COLUMNS_END = '<!-- gate-columns:end -->';

export function readmeWithGateColumns(readme: string): string {
  const start = readme.indexOf(GATE_COLUMNS_START);
  const end = readme.indexOf(GATE_COLUMNS_END);
  if (start < 0 || end < start) throw new Error('README.md: gate-columns markers not found');
  return `${readme.slice(0, start + GATE_COLUMNS_START.length)}\n${gateColumnsMarkdown()}\n${readme.slice(end)}`;
}

export function schemaText(): string {
  return `${JSON.stringify(layoutJsonSchema(), null, 2)}\n`;
}

export const RANGES_TABLE_START = '<!-- ranges-table:start (generated from src/layout/plausible.ts by npm run generated) -->';
export const RANGES_TABLE_END = '<!-- ranges-table:end -->';
export const CLAIMS_TABLE_START = '<!-- claims-table:start (generated from src/plan/verify-claims.ts by npm run generated) -->';
export const CLAIMS_TABLE_END = '<!-- claims-table:end -->';

function replaceBetween(text: string, startMark: string, endMark: string, body: string): string {
  const start = text.indexOf(startMark);
  const end = text.indexOf(endMark);
  if (start < 0 || end < start) throw new Error(`README.md: markers ${startMark} not found`);
  return `${text.slice(0, start + startMark.length)}\n${body}\n${text.slice(end)}`;
}

/** README with both generated tables (rules, and the ranges of the layout's inputs) brought up to date. */
export function readmeWithRulesTable(readme: string): string {
  let out = replaceBetween(readme, RULES_TABLE_START, RULES_TABLE_END, rulesTableMarkdown());
  if (out.includes(RANGES_TABLE_START)) out = replaceBetween(out, RANGES_TABLE_START, RANGES_TABLE_END, rangesTableMarkdown());
  if (out.includes(CLAIMS_TABLE_START)) out = replaceBetween(out, CLAIMS_TABLE_START, CLAIMS_TABLE_END, claimsTableMarkdown());
  return out;
}

if (process.argv[1] && realpathSync(process.argv[1]) === fileURLToPath(import.meta.url)) {
  writeFileSync(SCHEMA_FILE, schemaText());
  writeFileSync(README_FILE, readmeWithGateColumns(readmeWithRulesTable(readFileSync(README_FILE, 'utf8'))));
  console.log('wrote shared/layout.schema.json and the rules, ranges and gate-column tables of README.md');
}
