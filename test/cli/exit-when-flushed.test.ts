// The command's last step (src/cli/exit-when-flushed.ts): the process ends only after stdout and
// stderr have taken what was written, with the command's exit code, and after a write phase has
// acted on a signal it held (afterHeldSignals, src/cli/output-write.ts; the signals themselves:
// test/cli/interrupt.test.ts); whole output through a pipe.
import { spawn } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { exitWhenFlushed, type FlushableStream } from '../../src/cli/exit-when-flushed.js';
import { memoryIo } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/main.js';
import { afterHeldSignals, HELD_SIGNALS, withSignalsHeld } from '../../src/cli/output-write.js';

/** A stream whose writes complete only when the test says so. */
function slowStream(): FlushableStream & { finish: () => void; writes: number } {
  const waiting: ((err?: Error | null) => void)[] = [];
  const s = {
    writes: 0,
    write(_chunk: string, callback: (err?: Error | null) => void) {
      s.writes++;
      waiting.push(callback);
      return false;
    },
    finish: () => waiting.splice(0).forEach((cb) => cb()),
  };
  return s;
}

describe('exitWhenFlushed', () => {
  it('exits with the code only after every stream has flushed', () => {
    const out = slowStream();
    const err = slowStream();
    const exits: number[] = [];
    exitWhenFlushed(1, [out, err], (c) => exits.push(c));
    expect(out.writes).toBe(1);
    expect(err.writes).toBe(1);
    expect(exits).toEqual([]);
    out.finish();
    expect(exits).toEqual([]);
    err.finish();
    expect(exits).toEqual([1]);
  });

  it('counts a stream whose write fails (callback with an error, or a throw) as flushed', () => {
    const exits: number[] = [];
    const failing: FlushableStream = { write: (_c, cb) => (cb(new Error('EPIPE')), false) };
    const throwing: FlushableStream = {
      write: () => {
        throw new Error('write after end');
      },
    };
    exitWhenFlushed(2, [failing, throwing], (c) => exits.push(c));
    expect(exits).toEqual([2]);
  });

  it('exits at once with no streams', () => {
    const exits: number[] = [];
    exitWhenFlushed(0, [], (c) => exits.push(c));
    expect(exits).toEqual([0]);
  });
});

describe('the command as a process, read through a pipe by a slow reader', () => {
  /** Runs the command from the sources; the reader pauses after each chunk, so the pipe fills. */
  const run = (args: string[]) =>
    new Promise<{ stdout: string; code: number | null }>((resolve, reject) => {
      const child = spawn(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', ...args], { env: { ...process.env, FLUXLANE_DEBUG: '' } });
      const chunks: Buffer[] = [];
      child.stdout.on('data', (b: Buffer) => {
        chunks.push(b);
        child.stdout.pause();
        setTimeout(() => child.stdout.resume(), 2);
      });
      child.on('error', reject);
      child.on('close', (code) => resolve({ stdout: Buffer.concat(chunks).toString('utf8'), code }));
    });

  it('delivers the whole output and the exit code (the same bytes as in-process)', async () => {
    const args = ['check', 'layouts/reef-49.yaml', '--json'];
    const io = memoryIo();
    const code = await runCli(args, io);
    const child = await run(args);
    // (more than a pipe holds, 64 kB on Linux: the writer waits for the reader)
    expect(io.out.length).toBeGreaterThan(65536);
    expect(child.code).toBe(code);
    expect(child.stdout).toBe(io.out);
  }, 120_000);

  it('carries exit code 2 for bad input', async () => {
    const child = await run(['check', 'layouts/no-such-file.yaml', '--json']);
    expect(child.code).toBe(2);
    expect(JSON.parse(child.stdout).ok).toBe(false);
  }, 60_000);
});

describe('afterHeldSignals (the exit waits for a write phase to act on a held signal)', () => {
  const turn = () => new Promise((r) => setImmediate(r));

  it('runs at once when no write phase holds signals', () => {
    const calls: string[] = [];
    afterHeldSignals(() => calls.push('now'));
    expect(calls).toEqual(['now']);
  });

  it('waits until the write phase has released its signals (two check phases after it), in order', async () => {
    const calls: string[] = [];
    withSignalsHeld(() => {
      afterHeldSignals(() => calls.push('during'));
    });
    afterHeldSignals(() => calls.push('after'));
    expect(calls).toEqual([]);
    await turn();
    expect(calls).toEqual([]);
    await turn();
    await turn();
    expect(calls).toEqual(['during', 'after']);
    // released: the next runs at once, and the process has no listener of ours left
    afterHeldSignals(() => calls.push('later'));
    expect(calls).toEqual(['during', 'after', 'later']);
    for (const s of HELD_SIGNALS) expect(process.listeners(s).length).toBe(0);
  });
});
