/**
 * The command bundle (src/cli/build-bundle.ts): each module keeps its own import.meta.url, and
 * the bundled command gives, byte for byte, what the commands give run from the sources
 * in-process (the reference here: the same code without the bundle). Needs the compiled dist/
 * (`npm run build`; CI's `npm ci` runs it): a dist/ older than the sources fails it.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { BUNDLE_BANNER, bundleCommand, withModuleUrl } from '../../src/cli/build-bundle.js';
import { runFluxlane } from '../support/cli.js';
import { loadedModules } from '../support/loaded-modules.js';

const DIST = resolve('dist');
const temp: string[] = [];
const tempDir = (): string => {
  const d = mkdtempSync(join(tmpdir(), 'fluxlane-bundle-'));
  temp.push(d);
  return d;
};
afterAll(() => {
  for (const d of temp) rmSync(d, { recursive: true, force: true });
});

describe('withModuleUrl', () => {
  it("gives a module moved into the bundle's folder the URL of its own file (Node's own import.meta.url as the reference)", async () => {
    const root = tempDir();
    const original = join(root, 'dist', 'layout', 'rules.js');
    const bundleDir = join(root, 'dist', 'cli');
    mkdirSync(bundleDir, { recursive: true });
    const text = 'export const url = import.meta.url;\nexport const rules = new URL("../../shared/rules.json", import.meta.url).href;\n';
    const moved = join(bundleDir, 'bundle-test.mjs');
    writeFileSync(moved, withModuleUrl(text, relative(bundleDir, original)));
    const mod = (await import(pathToFileURL(moved).href)) as { url: string; rules: string };
    expect(mod.url).toBe(pathToFileURL(original).href);
    expect(mod.rules).toBe(pathToFileURL(join(root, 'shared', 'rules.json')).href);
    // a module in the bundle's own folder: ./name
    expect(withModuleUrl('import.meta.url', 'main.js')).toBe('(new URL("./main.js", import.meta.url).href)');
  });
});

describe('bundleCommand', () => {
  let bundle = '';
  beforeAll(async () => {
    if (!existsSync(join(DIST, 'cli', 'main.js'))) throw new Error('dist/cli/main.js is missing: run npm run build first');
    bundle = tempDir();
    await bundleCommand({ distDir: DIST, outDir: bundle });
  }, 60_000);
  const built = (args: string[]) => spawnSync(process.execPath, [join(bundle, 'main.js'), ...args], { encoding: 'utf8', env: { ...process.env, FLUXLANE_DEBUG: '' } });

  it('npm run build made dist/cli/main.js a bundle (shebang first, then the banner)', () => {
    const text = readFileSync(join(DIST, 'cli', 'main.js'), 'utf8');
    expect(text.split('\n').slice(0, 2)).toEqual(['#!/usr/bin/env node', BUNDLE_BANNER]);
  });

  it('plan with pulses in one thread loads no module of dist/: the gate stage comes from the bundle (src/plan/gate-seam.ts imports it by a literal specifier)', () => {
    const out = join(tempDir(), 'out');
    const { run, loaded } = loadedModules([], join(bundle, 'main.js'), ['plan', 'layouts/bowline-5.yaml', '--threads', '1', '-o', out]);
    expect(run.status, run.stderr).toBe(0);
    expect(loaded.filter((u) => u.startsWith(pathToFileURL(bundle).href)).length).toBeGreaterThan(3);
    expect(loaded.filter((u) => u.startsWith(pathToFileURL(DIST).href) && u.endsWith('.js'))).toEqual([]);
  }, 60_000);

  it('refuses an entry that is already a bundle', async () => {
    const d = tempDir();
    mkdirSync(join(d, 'cli'));
    writeFileSync(join(d, 'cli', 'main.js'), `#!/usr/bin/env node\n${BUNDLE_BANNER}\n`);
    await expect(bundleCommand({ distDir: d })).rejects.toThrow(/already a bundle/);
  });

  it('--version reads package.json through its module URL', () => {
    const r = built(['--version']);
    expect(r.status).toBe(0);
    expect(r.stdout.trim()).toBe(JSON.parse(readFileSync('package.json', 'utf8')).version);
  });

  it('check (Bowline-5, Hitch-30) and a bad layout: the same bytes and exit codes as the commands run from the sources', async () => {
    for (const args of [
      ['check', 'layouts/bowline-5.yaml', '--json'],
      ['check', 'layouts/hitch-30.yaml'],
      ['check', 'package.json'],
    ]) {
      const ref = await runFluxlane(args);
      const r = built(args);
      expect(r.status, args.join(' ')).toBe(ref.code);
      expect(r.stdout, args.join(' ')).toBe(ref.out);
      expect(r.stderr, args.join(' ')).toBe(ref.err);
    }
  }, 60_000);

  it('plan with pulses (the gate stage as a chunk, the design workers from dist/) and its report page: the same files', async () => {
    const a = join(tempDir(), 'ref');
    const b = join(tempDir(), 'bundle');
    const ref = await runFluxlane(['plan', 'layouts/bowline-5.yaml', '-o', a]);
    const r = built(['plan', 'layouts/bowline-5.yaml', '-o', b]);
    expect(r.status).toBe(ref.code);
    const files = readdirSync(a, { recursive: true, encoding: 'utf8' }).filter((f) => f.includes('.')).sort();
    expect(files).toEqual(expect.arrayContaining(['plan.json', 'report.html', join('waveforms', 'Q0-Q1.qubit.csv')]));
    expect(readdirSync(b, { recursive: true, encoding: 'utf8' }).filter((f) => f.includes('.')).sort()).toEqual(files);
    for (const f of files) expect(readFileSync(join(b, f), 'utf8'), f).toBe(readFileSync(join(a, f), 'utf8'));
  }, 120_000);

  it('yield on two worker threads: the same result', async () => {
    const args = ['yield', 'layouts/bowline-5.yaml', '--samples', '60', '--threads', '2', '--json'];
    const ref = await runFluxlane(args);
    const r = built(args);
    expect(r.status).toBe(ref.code);
    expect(r.stdout).toBe(ref.out);
  }, 120_000);
});
