/**
 * The test run's own temporary folder (./global-temp.ts): the tests and the processes they start
 * write their scratch files under it, so the run removes them all at its end.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { basename } from 'node:path';
import { RUN_TEMP_PREFIX } from './global-temp.js';

describe('the test run\'s temporary folder', () => {
  it('is the temporary directory of the tests and of the processes they start', () => {
    expect(basename(tmpdir()).startsWith(RUN_TEMP_PREFIX), tmpdir()).toBe(true);
    const child = spawnSync(process.execPath, ['-e', "process.stdout.write(require('node:os').tmpdir())"], { encoding: 'utf8' });
    expect(child.stdout).toBe(tmpdir());
  });
});
