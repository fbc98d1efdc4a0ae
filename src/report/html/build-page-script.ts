/**
 * Build step of `npm run build` (and `prepare`, so `npm ci`): bundles the report page's browser
 * code (./browser/, with its d3 modules) into dist/report/html/report-page.iife.js, beside this
 * module's compiled file. Run as `node dist/report/html/build-page-script.js` after tsc.
 */
import { writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildPageScript, PAGE_SCRIPT_FILE, pageScriptEntry } from './page-script.js';

const here = dirname(fileURLToPath(import.meta.url));
if (/[\\/]src[\\/]report[\\/]html$/.test(here)) {
  // A bundle beside the sources would shadow the on-demand build of the current sources.
  process.stderr.write('build-page-script: run the compiled file (node dist/report/html/build-page-script.js), not the source\n');
  process.exit(1);
}
const entry = pageScriptEntry();
if (!entry) {
  process.stderr.write('build-page-script: the browser sources (src/report/html/browser/main.ts) are missing\n');
  process.exit(1);
}
const script = await buildPageScript(entry);
writeFileSync(join(here, PAGE_SCRIPT_FILE), script);
process.stdout.write(`report page script: ${join(here, PAGE_SCRIPT_FILE)} (${(script.length / 1024).toFixed(0)} kB)\n`);
