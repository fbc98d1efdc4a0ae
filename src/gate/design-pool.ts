/**
 * Per-edge CZ designs on worker threads. The designs of a chip are independent, so N threads
 * divide the pulse stage's time by about N; each result is what designCzGate gives in this
 * process, bit for bit (the same code on the same plain-data request), and the results come back
 * in request order, so a plan's output does not depend on the thread count.
 *
 * Requests are handed out one at a time to whichever worker is free (designs differ in cost: on
 * Reef-49 the longest took 0.30 s against 81 ms on average). A worker that fails to start or dies rejects the whole call; the caller may then
 * design in its own thread (src/plan/pulses.ts does).
 *
 * Under tsx or vitest (this module is a .ts file) the workers start from
 * design-worker-from-source.mjs, which registers tsx's loader for the TypeScript sources; the
 * built package (dist/) runs plain .js workers.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import type { GateDesign, GateDesignRequest } from './design.js';
import { requestToWire } from './design-wire.js';

/** One result: the design, or the message of the error the designer threw. */
export type PooledDesign = GateDesign | { error: string };

/** Threads used by default: the machine's cores, at most 8. */
export function defaultDesignThreads(): number {
  return Math.max(1, Math.min(8, availableParallelism()));
}

function spawnWorker(): Worker {
  const here = import.meta.url;
  const typescript = here.endsWith('.ts');
  return new Worker(new URL(typescript ? './design-worker-from-source.mjs' : './design-worker.js', here));
}

/**
 * Design every request on up to `threads` workers; `onDone(done, total)` after each one. The
 * array returned is in request order.
 */
export async function designInWorkers(requests: readonly GateDesignRequest[], threads: number, onDone?: (done: number, total: number) => void): Promise<PooledDesign[]> {
  const total = requests.length;
  const out: PooledDesign[] = new Array(total);
  if (total === 0) return out;
  const wire = requests.map(requestToWire);
  const n = Math.max(1, Math.min(threads, total));
  const workers: Worker[] = [];
  try {
    await new Promise<void>((resolve, reject) => {
      let next = 0;
      let done = 0;
      let failed = false;
      const fail = (err: unknown): void => {
        if (failed) return;
        failed = true;
        reject(err instanceof Error ? err : new Error(String(err)));
      };
      const give = (w: Worker): void => {
        if (next >= total) return;
        const id = next++;
        w.postMessage({ id, request: wire[id] });
      };
      for (let k = 0; k < n; k++) {
        const w = spawnWorker();
        workers.push(w);
        w.on('message', (msg: { id: number; design?: GateDesign; error?: string }) => {
          out[msg.id] = msg.design ?? { error: msg.error ?? 'the design worker gave no result' };
          done++;
          onDone?.(done, total);
          if (done === total) resolve();
          else give(w);
        });
        w.on('error', fail);
        w.on('exit', (code) => {
          if (done < total) fail(new Error(`a design worker stopped (exit code ${code}) with ${total - done} design(s) left`));
        });
        give(w);
      }
    });
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return out;
}
