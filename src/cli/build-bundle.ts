/**
 * Build step of `npm run build`, after tsc: the command line as one bundle. dist/cli/main.js (the
 * package bin) becomes the bundle of the compiled command and everything it imports (our modules
 * and the packages); the commands it loads only when they run (src/cli/main.ts, LazyCommand) and
 * the gate stage (src/plan/gate-seam.ts) become chunks beside it (dist/cli/bundle-*.js), so a
 * command still loads only what it runs. Every other file of dist/ stays as tsc wrote it (the
 * library, the worker threads' entry files, the report page's script).
 *
 * Why: Node 20 loads ES modules one file at a time (resolve, stat, read, compile, link). `check`
 * of a small chip opened 298 JavaScript files (124 of them ours, 95 zod's, 72 the yaml package's);
 * bundled, it loads 28 (main.js and its chunks). Measured in DEVELOPERS.md (Performance log, tenth round).
 *
 * The bundled code is the compiled code: esbuild only joins the modules (renaming top-level names
 * where two modules use the same one), so every computation is the same. Two things are kept as
 * they were in separate files:
 *   - `import.meta.url` of each of our modules is its own file's URL under dist/ (a module finds
 *     shared/rules.json, package.json, its worker's entry file or the report page's script
 *     relative to itself): the plugin below writes it as that file's location relative to the
 *     bundle's folder;
 *   - `require` for the packages that are CommonJS (yaml, graphology): each output file starts
 *     with one made by createRequire (esbuild's wrapper asks for it for Node's built-in modules).
 * Run as `node dist/cli/build-bundle.js` after tsc (`npm run build` does both). tsc's main.js is
 * kept as dist/cli/main-compiled.js, the entry when the step runs again on a main.js that is
 * already a bundle.
 */
import { copyFileSync, existsSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Plugin } from 'esbuild';

/** First line after the shebang of every output file: marks a bundle and defines `require`. */
export const BUNDLE_BANNER = "/* fluxlane command bundle (src/cli/build-bundle.ts) */ import { createRequire as __fluxlaneCreateRequire } from 'node:module'; const require = __fluxlaneCreateRequire(import.meta.url);";

/** Chunks are named bundle-HASH.js in the bundle's folder (all output in one folder: see moduleUrlPlugin). */
const CHUNK_PREFIX = 'bundle-';

export interface BundleOptions {
  /** The tsc output folder (its cli/main.js is the entry). */
  distDir: string;
  /** Where main.js and its chunks are written (default: distDir/cli, replacing tsc's main.js). */
  outDir?: string;
}

/**
 * An esbuild plugin: in every module under `distDir` but the entry, `import.meta.url` becomes the
 * URL of that module's own file, written relative to the bundle's folder `outDir` (so the bundle
 * can move with dist/ as a whole). The entry's code is the bundle's main.js, so its own URL is
 * right as it is (src/cli/main.ts compares it with the script Node runs). Packages are loaded as
 * they are.
 */
export function moduleUrlPlugin(distDir: string, outDir: string, entry: string): Plugin {
  const root = resolve(distDir) + sep;
  return {
    name: 'fluxlane-module-url',
    setup(build) {
      build.onLoad({ filter: /\.js$/ }, (args) => {
        if (!args.path.startsWith(root) || args.path === entry) return undefined;
        const text = readFileSync(args.path, 'utf8');
        return { contents: withModuleUrl(text, relative(outDir, args.path)), loader: 'js', resolveDir: dirname(args.path) };
      });
    },
  };
}

/** `text` with each `import.meta.url` replaced by the URL of the file at `relativePath` from the bundle's folder. */
export function withModuleUrl(text: string, relativePath: string): string {
  const rel = relativePath.split(sep).join('/');
  const href = `new URL(${JSON.stringify(rel.startsWith('.') ? rel : `./${rel}`)}, import.meta.url).href`;
  return text.replace(/\bimport\.meta\.url\b/g, `(${href})`);
}

/** The compiled entry kept beside the bundle (tsc's main.js, copied before the bundle replaces it), so the step can run again. */
export const COMPILED_ENTRY = 'main-compiled.js';

const isBundle = (file: string): boolean => readFileSync(file, 'utf8').includes(BUNDLE_BANNER);

/**
 * Bundles the compiled command (distDir/cli/main.js as tsc wrote it, or the copy of it kept as
 * COMPILED_ENTRY once main.js is a bundle); returns the files written.
 */
export async function bundleCommand(options: BundleOptions): Promise<string[]> {
  const distDir = resolve(options.distDir);
  const outDir = resolve(options.outDir ?? join(distDir, 'cli'));
  const main = join(distDir, 'cli', 'main.js');
  const compiled = join(distDir, 'cli', COMPILED_ENTRY);
  let entry = main;
  if (isBundle(main)) {
    if (!existsSync(compiled) || isBundle(compiled)) throw new Error(`${main} is already a bundle and ${compiled} is missing: compile again first (npm run build runs tsc, then this step)`);
    entry = compiled;
  } else if (outDir === dirname(main)) {
    copyFileSync(main, compiled);
    entry = compiled;
  }
  const { build } = await import('esbuild');
  const result = await build({
    entryPoints: [{ in: entry, out: 'main' }],
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    outdir: outDir,
    chunkNames: `${CHUNK_PREFIX}[hash]`,
    banner: { js: BUNDLE_BANNER },
    plugins: [moduleUrlPlugin(distDir, outDir, entry)],
    write: false,
    logLevel: 'silent',
  });
  // the chunks of an earlier bundle go; the new files are written only once all are built
  for (const f of readdirSync(outDir)) if (f.startsWith(CHUNK_PREFIX) && f.endsWith('.js')) rmSync(join(outDir, f));
  const written: string[] = [];
  for (const file of result.outputFiles) {
    writeFileSync(file.path, file.contents);
    written.push(file.path);
  }
  return written.sort();
}

const here = dirname(fileURLToPath(import.meta.url));
if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  if (/[\\/]src[\\/]cli$/.test(here)) {
    process.stderr.write('build-bundle: run the compiled file (node dist/cli/build-bundle.js), not the source\n');
    process.exit(1);
  }
  const files = await bundleCommand({ distDir: dirname(here) });
  const size = files.reduce((s, f) => s + readFileSync(f).length, 0);
  process.stdout.write(`command bundle: ${join(here, 'main.js')} and ${files.length - 1} chunks (${(size / 1024).toFixed(0)} kB)\n`);
}
