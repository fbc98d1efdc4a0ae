/**
 * The modules a Node process loads, for tests of what a command imports: module hooks
 * (node:module register, Node >= 20.6) log the URL of every module loaded through the ES module
 * loader (CommonJS files required by a package are not listed).
 */
import { spawnSync, type SpawnSyncReturns } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

/** Runs `node [nodeArgs] script args` and returns the process and the URLs it loaded, in order. */
export function loadedModules(nodeArgs: readonly string[], script: string, args: readonly string[]): { run: SpawnSyncReturns<string>; loaded: string[] } {
  const d = mkdtempSync(join(tmpdir(), 'fluxlane-loaded-'));
  try {
    const log = join(d, 'loaded.txt');
    writeFileSync(log, '');
    writeFileSync(join(d, 'hooks.mjs'), "import { appendFileSync } from 'node:fs';\nexport async function load(url, context, next) { appendFileSync(process.env.FLUXLANE_LOADED_LOG, url + '\\n'); return next(url, context); }\n");
    writeFileSync(join(d, 'register.mjs'), "import { register } from 'node:module';\nregister(new URL('./hooks.mjs', import.meta.url));\n");
    const run = spawnSync(process.execPath, [...nodeArgs, '--import', pathToFileURL(join(d, 'register.mjs')).href, script, ...args], {
      encoding: 'utf8',
      env: { ...process.env, FLUXLANE_LOADED_LOG: log, FLUXLANE_DEBUG: '' },
    });
    const loaded = readFileSync(log, 'utf8').split('\n').filter((l) => l !== '');
    return { run, loaded };
  } finally {
    rmSync(d, { recursive: true, force: true });
  }
}
