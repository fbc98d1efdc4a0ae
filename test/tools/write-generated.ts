/**
 * Writes the files fluxlane generates from its own definitions (run `npm run generated` after
 * changing src/layout/schema.ts or shared/rules.json):
 * - shared/layout.schema.json from the zod schemas (src/layout/json-schema.ts);
 * - the rules table in README.md (between the rules-table markers) from shared/rules.json;
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

export function readmeWithRulesTable(readme: string): string {
  const start = readme.indexOf(RULES_TABLE_START);
  const end = readme.indexOf(RULES_TABLE_END);
  if (start < 0 || end < start) throw new Error('README.md: rules-table markers not found');
  return `${readme.slice(0, start + RULES_TABLE_START.length)}\n${rulesTableMarkdown()}\n${readme.slice(end)}`;
}

if (process.argv[1] && realpathSync(process.argv[1]) === fileURLToPath(import.meta.url)) {
  writeFileSync(SCHEMA_FILE, schemaText());
  writeFileSync(README_FILE, readmeWithGateColumns(readmeWithRulesTable(readFileSync(README_FILE, 'utf8'))));
  console.log('wrote shared/layout.schema.json, the rules table and the gate columns of README.md');
}
