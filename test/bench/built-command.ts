/**
 * The built command as users run it (`node dist/cli/main.js ...`, whole process), for the
 * benchmarks whose targets are on it (./check.bench.ts, ./yield.bench.ts): where it is, a chip's
 * YAML written once to a temporary file, and one run.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const BUILT_MAIN = fileURLToPath(new URL('../../dist/cli/main.js', import.meta.url));

/** Throws, naming the benchmark file, when the command has not been built. */
export function requireBuilt(benchFile: string): void {
  if (!existsSync(BUILT_MAIN)) throw new Error(`${benchFile}: dist/cli/main.js is missing; run npm run build first`);
}

/** A file holding `text()` as `name` in a fresh temporary folder, written on the first call (the folder is removed when the process exits). */
export function chipFile(name: string, text: () => string): () => string {
  let file: string | undefined;
  return () => {
    if (!file) {
      const dir = mkdtempSync(path.join(tmpdir(), 'fluxlane-bench-'));
      process.on('exit', () => rmSync(dir, { recursive: true, force: true }));
      file = path.join(dir, name);
      writeFileSync(file, text());
    }
    return file;
  };
}

/** One run of the built command; its standard output (exit 1, rules broken, counts as a run). */
export function runBuilt(args: readonly string[]): string {
  const r = spawnSync(process.execPath, [BUILT_MAIN, ...args], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (r.status !== 0 && r.status !== 1) throw new Error(`fluxlane ${args[0]} exited ${r.status}: ${r.stderr}`);
  return r.stdout;
}
