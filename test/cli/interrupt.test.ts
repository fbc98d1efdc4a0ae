/**
 * Interrupting `fluxlane plan -o DIR` (real child processes, SIGINT and SIGTERM at many moments):
 * the folder ends either wholly old or wholly new, and nothing temporary is left beside it. The
 * write phase is stretched with the test hook FLUXLANE_WRITE_PAUSE_MS (a synchronous pause after
 * each file and each rename, src/cli/output-write.ts), so the signals land inside it at known
 * steps; others land while the plan is still being computed. A SIGKILL in the middle of the swap
 * (which no program can defer) leaves debris that the next run cleans up.
 */
import { describe, expect, it } from 'vitest';
import { spawn, type ChildProcess } from 'node:child_process';
import { createHash } from 'node:crypto';
import { cpSync, existsSync, mkdtempSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, relative, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

const ROOT = resolve('.');
const MAIN = join(ROOT, 'src/cli/main.ts');
const TSX_LOADER = pathToFileURL(join(ROOT, 'node_modules/tsx/dist/loader.mjs')).href;
const PAUSE_MS = 150;

/** Two small layouts whose plans differ (old and new contents of the folder). */
function layouts(dir: string): { a: string; b: string } {
  const chip = (name: string, f1: string, f2: string) => `chip: ${name}
qubits:
  A: { pos: [0, 0], fMax: ${f1}, anharmonicity: -210 MHz, asymmetry: 0.3, t1: 60 us, fluxNoise: 3 uPhi0 }
  B: { pos: [1, 0], fMax: ${f2}, anharmonicity: -220 MHz, asymmetry: 0.3, t1: 60 us, fluxNoise: 3 uPhi0 }
  C: { pos: [2, 0], fMax: 5.5 GHz, anharmonicity: -200 MHz, asymmetry: 0.3, t1: 60 us, fluxNoise: 3 uPhi0 }
couplings:
  - [A, B, 12 MHz]
  - [B, C, 12 MHz]
`;
  writeFileSync(join(dir, 'a.yaml'), chip('Old', '6.1 GHz', '5.2 GHz'));
  writeFileSync(join(dir, 'b.yaml'), chip('New', '6.3 GHz', '5.0 GHz'));
  return { a: join(dir, 'a.yaml'), b: join(dir, 'b.yaml') };
}

function run(args: string[], cwd: string, env: Record<string, string> = {}): ChildProcess {
  // one process (node with the tsx loader), so the signal reaches fluxlane itself
  return spawn(process.execPath, ['--import', TSX_LOADER, MAIN, ...args], { cwd, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
}

function finished(child: ChildProcess): Promise<{ code: number | null; signal: NodeJS.Signals | null; err: string }> {
  let err = '';
  child.stderr!.on('data', (d) => (err += d));
  child.stdout!.resume();
  return new Promise((res) => child.on('close', (code, signal) => res({ code, signal, err })));
}

/** Every file below `dir` with a hash of its bytes. */
function snapshot(dir: string): Record<string, string> {
  const out: Record<string, string> = {};
  const walk = (d: string) => {
    for (const e of readdirSync(d).sort()) {
      const p = join(d, e);
      if (statSync(p).isDirectory()) walk(p);
      else out[relative(dir, p)] = createHash('sha256').update(readFileSync(p)).digest('hex');
    }
  };
  walk(dir);
  return out;
}

async function waitFor(test: () => boolean, timeoutMs: number): Promise<boolean> {
  const t0 = Date.now();
  while (Date.now() - t0 < timeoutMs) {
    if (test()) return true;
    await new Promise((r) => setTimeout(r, 5));
  }
  return false;
}

const stagingOf = (parent: string) => readdirSync(parent).some((e) => /^\.out\.fluxlane-new-/.test(e));

describe('interrupting plan -o leaves the old folder or the new one, never a mix', () => {
  it('SIGINT and SIGTERM during the computation and at every step of the write phase', async () => {
    const template = mkdtempSync(join(tmpdir(), 'fluxlane-interrupt-'));
    const { a, b } = layouts(template);
    // the two possible end states, from clean runs
    expect((await finished(run(['plan', b, '--no-pulses', '-o', 'out'], template))).code).toBe(0);
    const fresh = snapshot(join(template, 'out'));
    expect((await finished(run(['plan', a, '--no-pulses', '-o', 'out', '--force'], template))).code).toBe(0);
    const old = snapshot(join(template, 'out'));
    expect(old).not.toEqual(fresh);
    expect(Object.keys(old).sort()).toEqual(['.fluxlane-output', 'gates.csv', 'gates.txt', 'plan.json', 'report.html']);

    // moments: before the write phase (while starting or planning), then during the k-th pause of
    // it (after the marker, plan.json, gates.csv and gates.txt are staged, after the old folder is
    // renamed away, after the new one is renamed in), SIGINT and SIGTERM in turn; each try in its
    // own copy of the old folder, all at once
    const moments: { signal: NodeJS.Signals; atStep: number | null }[] = [{ signal: 'SIGINT', atStep: null }, { signal: 'SIGTERM', atStep: null }];
    for (let k = 0; k <= 5; k++) moments.push({ signal: k % 2 === 0 ? 'SIGINT' : 'SIGTERM', atStep: k });
    const outcomes = await Promise.all(moments.map(async (m) => {
      const work = mkdtempSync(join(tmpdir(), 'fluxlane-interrupt-'));
      cpSync(join(template, 'out'), join(work, 'out'), { recursive: true });
      const child = run(['plan', b, '--no-pulses', '-o', 'out'], work, { FLUXLANE_WRITE_PAUSE_MS: String(PAUSE_MS) });
      const done = finished(child);
      if (m.atStep === null) {
        await new Promise((r) => setTimeout(r, 300));
        expect(stagingOf(work)).toBe(false);
      } else {
        expect(await waitFor(() => stagingOf(work), 60_000)).toBe(true);
        await new Promise((r) => setTimeout(r, m.atStep! * PAUSE_MS + PAUSE_MS / 3));
      }
      child.kill(m.signal);
      const r = await done;
      expect(r.err).not.toMatch(/internal error|\n\s+at /);
      expect(`${m.signal}@${m.atStep}: ${r.signal ?? `exit ${r.code}`}`).toBe(`${m.signal}@${m.atStep}: ${m.signal}`); // it ends as the signal says, once the write phase is over
      const now = JSON.stringify(snapshot(join(work, 'out')));
      const state = now === JSON.stringify(old) ? 'old' : now === JSON.stringify(fresh) ? 'new' : 'MIXED';
      expect(readdirSync(work)).toEqual(['out']); // nothing temporary beside it
      return `${m.signal}@${m.atStep ?? 'plan'}:${state}`;
    }));
    // a signal before the write phase stops the run with nothing written; one during the write
    // phase is held until the new folder is complete
    expect(outcomes).toEqual([
      'SIGINT@plan:old', 'SIGTERM@plan:old',
      'SIGINT@0:new', 'SIGTERM@1:new', 'SIGINT@2:new', 'SIGTERM@3:new', 'SIGINT@4:new', 'SIGTERM@5:new',
    ]);
  }, 120_000);

  it('a SIGKILL in the middle of the swap leaves debris that the next run cleans up', async () => {
    const work = mkdtempSync(join(tmpdir(), 'fluxlane-interrupt-'));
    const { a, b } = layouts(work);
    expect((await finished(run(['plan', a, '--no-pulses', '-o', 'out'], work))).code).toBe(0);
    const child = run(['plan', b, '--no-pulses', '-o', 'out'], work, { FLUXLANE_WRITE_PAUSE_MS: String(PAUSE_MS) });
    const done = finished(child);
    // the old folder is renamed away after the four staged files; the new one comes in a pause later
    expect(await waitFor(() => readdirSync(work).some((e) => /^\.out\.fluxlane-old-/.test(e)), 20_000)).toBe(true);
    child.kill('SIGKILL');
    expect((await done).signal).toBe('SIGKILL');
    expect(existsSync(join(work, 'out'))).toBe(false); // the swap was cut in the middle
    expect(readdirSync(work).filter((e) => e.startsWith('.out.')).length).toBe(2);
    const again = await finished(run(['plan', b, '--no-pulses', '-o', 'out'], work));
    expect(again.code).toBe(0);
    expect(readdirSync(work).sort()).toEqual(['a.yaml', 'b.yaml', 'out']);
    expect(JSON.parse(readFileSync(join(work, 'out/plan.json'), 'utf8')).chip).toBe('New');
  }, 60_000);
});
