/**
 * The report page's script: the browser code of ./browser/ (TypeScript, d3 modules) bundled
 * into one classic script that is inlined into every report, so the page needs no network.
 *
 * `npm run build` (and so `npm ci`, through `prepare`) writes the bundle once, beside this
 * module's compiled file: dist/report/html/report-page.iife.js (./build-page-script.ts). Running from
 * the sources (tsx, vitest) there is no such file, and the bundle is built on first use with
 * esbuild (a development dependency) and kept for the process. The bundle is the same bytes
 * either way (same esbuild version and options).
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const HERE = dirname(fileURLToPath(import.meta.url));

/** File name of the prebuilt bundle, beside the compiled page-script module. */
export const PAGE_SCRIPT_FILE = 'report-page.iife.js';

/** The d3 modules bundled into the page (their licence asks for the notice in copies). */
export const BUNDLED_MODULES = ['d3-array', 'd3-axis', 'd3-color', 'd3-format', 'd3-interpolate', 'd3-scale', 'd3-selection', 'd3-shape', 'd3-path', 'd3-time', 'd3-time-format', 'internmap'] as const;

/** The browser entry point, from the sources beside this file or, in dist/, from the checkout's src/. */
export function pageScriptEntry(): string | null {
  const candidates = [join(HERE, 'browser', 'main.ts'), join(HERE, '..', '..', '..', 'src', 'report', 'html', 'browser', 'main.ts')];
  return candidates.find((p) => existsSync(p)) ?? null;
}

/** Bundle the browser code (needs esbuild, a development dependency). */
export async function buildPageScript(entry: string): Promise<string> {
  const esbuild = await import('esbuild');
  const result = await esbuild.build({
    entryPoints: [entry],
    bundle: true,
    write: false,
    format: 'iife',
    platform: 'browser',
    target: 'es2020',
    minify: true,
    legalComments: 'none',
    charset: 'utf8',
    logLevel: 'silent',
    banner: { js: `/* fluxlane chip report page. ${licenceNotice(entry)} */` },
  });
  const out = result.outputFiles[0];
  if (!out) throw new Error('esbuild produced no output for the report page');
  return out.text;
}

/** Which d3 modules (and versions) the bundle holds, with their ISC licence notice. */
function licenceNotice(entry: string): string {
  const root = join(dirname(entry), '..', '..', '..', '..');
  const versions = BUNDLED_MODULES.map((m) => {
    try {
      const pkg = JSON.parse(readFileSync(join(root, 'node_modules', m, 'package.json'), 'utf8')) as { version?: string };
      return `${m} ${pkg.version ?? '?'}`;
    } catch {
      return null;
    }
  }).filter((x): x is string => x !== null);
  return `Built from ${versions.join(', ')}: ISC License, Copyright 2010-2023 Mike Bostock; permission to use, copy, modify, and/or distribute with or without fee is granted, provided this notice appears in all copies.`;
}

let cached: Promise<string> | undefined;

/** The page script: the prebuilt bundle, or (from the sources) built now. */
export function pageScript(): Promise<string> {
  cached ??= (async () => {
    const prebuilt = join(HERE, PAGE_SCRIPT_FILE);
    if (existsSync(prebuilt)) return readFileSync(prebuilt, 'utf8');
    const entry = pageScriptEntry();
    if (!entry) throw new Error(`the report page script is missing (${prebuilt}); run npm run build`);
    return buildPageScript(entry);
  })();
  cached.catch(() => (cached = undefined));
  return cached;
}
