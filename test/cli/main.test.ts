import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { loadedModules } from '../support/loaded-modules.js';

/** The real process: shebang entry, exit codes through process.exitCode, stderr without stacks. */
function fluxlane(args: string[]) {
  return spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', ...args], { encoding: 'utf8', env: { ...process.env, FLUXLANE_DEBUG: '' } });
}

describe('src/cli/main.ts as a program', () => {
  it('starts with a node shebang (it is the package bin)', () => {
    expect(readFileSync('src/cli/main.ts', 'utf8').startsWith('#!/usr/bin/env node\n')).toBe(true);
    expect(JSON.parse(readFileSync('package.json', 'utf8')).bin.fluxlane).toBe('dist/cli/main.js');
  });

  it('--version and --help load neither zod nor the yaml package (start-up: the layout stage is loaded when a command runs)', () => {
    for (const args of [['--version'], ['--help']]) {
      const { run, loaded } = loadedModules(['--import', 'tsx'], 'src/cli/main.ts', args);
      expect(run.status, run.stderr).toBe(0);
      expect(loaded.some((u) => u.endsWith('/src/cli/main.ts')), args[0]).toBe(true);
      expect(loaded.filter((u) => /node_modules\/(zod|yaml)\//.test(u) || u.includes('/src/layout/')), args[0]).toEqual([]);
    }
    // a command loads them
    const { loaded } = loadedModules(['--import', 'tsx'], 'src/cli/main.ts', ['check', 'layouts/bowline-5.yaml']);
    expect(loaded.some((u) => u.includes('node_modules/zod/'))).toBe(true);
    expect(loaded.some((u) => u.endsWith('/src/layout/load.ts'))).toBe(true);
  }, 60_000);

  it('check on a demo exits 0; a bad layout exits 2 with located messages and no stack trace', () => {
    const ok = fluxlane(['check', 'layouts/bowline-5.yaml']);
    expect(ok.status).toBe(0);
    expect(ok.stdout).toMatch(/^Bowline-5/);
    const bad = fluxlane(['check', 'package.json']);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/^package\.json:\d+:\d+: /);
    expect(bad.stderr).not.toMatch(/\n\s+at /);
  });
});
