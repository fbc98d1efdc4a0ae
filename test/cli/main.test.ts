import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';

/** The real process: shebang entry, exit codes through process.exitCode, stderr without stacks. */
function fluxlane(args: string[]) {
  return spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', ...args], { encoding: 'utf8', env: { ...process.env, FLUXLANE_DEBUG: '' } });
}

describe('src/cli/main.ts as a program', () => {
  it('starts with a node shebang (it is the package bin)', () => {
    expect(readFileSync('src/cli/main.ts', 'utf8').startsWith('#!/usr/bin/env node\n')).toBe(true);
    expect(JSON.parse(readFileSync('package.json', 'utf8')).bin.fluxlane).toBe('dist/cli/main.js');
  });

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
