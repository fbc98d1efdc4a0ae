/**
 * Vitest global setup (vitest.config.ts): one temporary folder per test run, made the system's
 * temporary directory (TMPDIR, which os.tmpdir() reads) for every test file and every process the
 * tests start, and removed when the run ends. Tests make their scratch folders with mkdtemp in
 * os.tmpdir(), and not all of them can remove them (the interrupt tests kill writers on purpose):
 * before this, the suite's runs had left 2,425 fluxlane-* folders in /tmp on the development
 * machine.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** The prefix of a run's folder (test/support/global-temp.test.ts checks the tests see it). */
export const RUN_TEMP_PREFIX = 'fluxlane-test-run-';

export default function setup(): () => void {
  const previous = process.env.TMPDIR;
  const dir = mkdtempSync(join(tmpdir(), RUN_TEMP_PREFIX));
  // (set before the test workers start: they and the processes they spawn inherit it)
  process.env.TMPDIR = dir;
  return () => {
    if (previous === undefined) delete process.env.TMPDIR;
    else process.env.TMPDIR = previous;
    rmSync(dir, { recursive: true, force: true });
  };
}
