/**
 * Yield samples on worker threads, in the pattern of the gate stage's design pool
 * (src/gate/design-pool.ts): each worker receives the run once (plain data: the layout, the plan
 * kept, the spreads) and builds its own evaluator; then chunks of samples (row, from, to) are
 * handed out one at a time to whichever worker is free, and their outcomes are put back in
 * sample order. A worker that fails to start or dies rejects the whole call (the caller then runs
 * in its own thread). In fixed mode with a planned nominal chip the workers are started before
 * the plan is known (EarlyWorkers) and receive it once the main thread has it.
 *
 * Under tsx or vitest (this module is a .ts file) the workers start from
 * yield-worker-from-source.mjs, which registers tsx's loader; the built package runs
 * yield-worker.js.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import type { SampleOutcome } from './outcome.js';
import { rowSpreads, type YieldJob } from './job.js';
import type { RunProgress } from './run.js';

/** Threads used by default: the machine's cores, at most 8. */
export function defaultYieldThreads(): number {
  return Math.max(1, Math.min(8, availableParallelism()));
}

/** Samples per message: a fixed-mode sample takes milliseconds, a re-plan a good part of a second. */
export function chunkSize(job: Pick<YieldJob, 'mode'>): number {
  return job.mode === 'fixed' ? 16 : 1;
}

/**
 * A worker's young generation (MB). A sample allocates some megabytes of short-lived objects
 * (findings, swept crossings, scenarios); with V8's default young generation the scavenges took
 * ~14 % of a fixed-mode run's CPU time, with a larger one under half of that (profiles of 330
 * samples of the generated 10 x 10 chip, 2026-12-03). Results do not depend on it.
 */
const YOUNG_GENERATION_MB = 192;

/** What a worker is started with (src/yield/yield-worker.ts). */
export interface WorkerStart {
  job: YieldJob;
  /** The job's plan comes later, in a message `{ plan }` sent before the first chunk (EarlyWorkers). */
  planFollows?: boolean;
}

function spawnWorker(job: YieldJob, planFollows = false): Worker {
  const here = import.meta.url;
  const typescript = here.endsWith('.ts');
  const start: WorkerStart = { job: cloneableJob(job), planFollows };
  return new Worker(new URL(typescript ? './yield-worker-from-source.mjs' : './yield-worker.js', here), {
    workerData: start,
    resourceLimits: { maxYoungGenerationSizeMb: YOUNG_GENERATION_MB },
  });
}

/**
 * The workers of a fixed-mode run started before its plan is known: they load their modules and
 * build the reduced table and the nominal chips while this thread plans the nominal chip (about a
 * second of wall time on 2 cores for the generated 10 x 10 chip); `givePlan` then sends them the
 * plan, and runInWorkers hands them the chunks. A worker that fails or stops before then is
 * remembered (`failure`): runInWorkers then rejects and the caller runs the samples in its own
 * thread, as when a worker fails to start there. Whatever happens, `terminate` ends them.
 */
export class EarlyWorkers {
  readonly workers: Worker[] = [];
  failure: Error | null = null;
  private planGiven = false;

  /** `job` without its plan (job.plan is ignored); `count` workers (workerCount). */
  constructor(job: YieldJob, count: number) {
    for (let k = 0; k < count; k++) {
      const w = spawnWorker({ ...job, plan: null }, true);
      w.on('error', (err) => (this.failure ??= err instanceof Error ? err : new Error(String(err))));
      w.on('exit', (code) => (this.failure ??= new Error(`a yield worker stopped (exit code ${code}) before its first chunk`)));
      this.workers.push(w);
    }
  }

  /** Send every worker the run's plan (once). */
  givePlan(plan: YieldJob['plan']): void {
    if (this.planGiven) throw new Error('EarlyWorkers: the plan was given already');
    this.planGiven = true;
    const sent = cloneableJob({ plan } as YieldJob).plan;
    for (const w of this.workers) w.postMessage({ plan: sent });
  }

  get hasPlan(): boolean {
    return this.planGiven;
  }

  async terminate(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}

/**
 * The run as plain data a worker can receive: the kept plan's position finder (a function over
 * the plan file's text, which structured cloning refuses) is left out; the worker puts back one
 * that knows no positions (a drawn chip's findings never point into the plan file).
 */
export function cloneableJob(job: YieldJob): YieldJob {
  if (!job.plan) return job;
  const { locate: _dropped, ...plan } = job.plan;
  return { ...job, plan: plan as YieldJob['plan'] };
}

/** The run a worker was sent by cloneableJob, with a position finder that knows no positions. */
export function restoredJob(job: YieldJob): YieldJob {
  if (!job.plan || typeof job.plan.locate === 'function') return job;
  return { ...job, plan: { ...job.plan, locate: () => undefined } };
}

interface Chunk {
  row: number;
  from: number;
  to: number;
}

function chunksOf(job: Pick<YieldJob, 'mode' | 'spread' | 'sweep'>, from: number, to: number): Chunk[] {
  const rowCount = rowSpreads(job).length;
  const size = chunkSize(job);
  const chunks: Chunk[] = [];
  for (let row = 0; row < rowCount; row++) for (let a = from; a < to; a += size) chunks.push({ row, from: a, to: Math.min(to, a + size) });
  return chunks;
}

/** The workers runInWorkers starts for samples [from, to) on `threads` threads. */
export function workerCount(job: Pick<YieldJob, 'mode' | 'spread' | 'sweep'>, from: number, to: number, threads: number): number {
  return Math.max(1, Math.min(threads, chunksOf(job, from, to).length));
}

/**
 * `early`: workers started before the plan was known (EarlyWorkers, workerCount of them, the plan
 * given or given here); runInWorkers uses them instead of starting its own, and ends them.
 */
export async function runInWorkers(job: YieldJob, from: number, to: number, threads: number, progress?: RunProgress, early?: EarlyWorkers): Promise<SampleOutcome[][]> {
  const rowCount = rowSpreads(job).length;
  const chunks = chunksOf(job, from, to);
  const rows: SampleOutcome[][] = Array.from({ length: rowCount }, () => new Array<SampleOutcome>(to - from));
  const total = rowCount * (to - from);
  const n = Math.max(1, Math.min(threads, chunks.length));
  const workers: Worker[] = early ? early.workers : [];
  if (early) {
    if (early.workers.length !== n) {
      await early.terminate();
      throw new Error(`${early.workers.length} early yield workers for ${n} threads`);
    }
    if (!early.hasPlan) early.givePlan(job.plan);
  }
  let done = 0;
  let doneRow0 = 0;
  let ok0 = 0;
  try {
    await new Promise<void>((resolve, reject) => {
      let next = 0;
      let finished = 0;
      let failed = false;
      const fail = (err: unknown): void => {
        if (failed) return;
        failed = true;
        reject(err instanceof Error ? err : new Error(String(err)));
      };
      const give = (w: Worker): void => {
        if (next >= chunks.length) return;
        const id = next++;
        w.postMessage({ id, chunk: chunks[id] });
      };
      if (early?.failure) {
        fail(early.failure);
        return;
      }
      for (let k = 0; k < n; k++) {
        const w = early ? early.workers[k] : spawnWorker(job);
        if (!early) workers.push(w);
        w.on('message', (msg: { id: number; outcomes?: SampleOutcome[]; error?: string }) => {
          if (!msg.outcomes) {
            fail(new Error(`a yield worker failed: ${msg.error ?? 'no result'}`));
            return;
          }
          const c = chunks[msg.id];
          msg.outcomes.forEach((o, j) => (rows[c.row][c.from - from + j] = o));
          done += msg.outcomes.length;
          if (c.row === 0) {
            doneRow0 += msg.outcomes.length;
            ok0 += msg.outcomes.filter((o) => o.ok).length;
          }
          progress?.(done, total, ok0, doneRow0);
          finished++;
          if (finished === chunks.length) resolve();
          else give(w);
        });
        w.on('error', fail);
        w.on('exit', (code) => {
          if (finished < chunks.length) fail(new Error(`a yield worker stopped (exit code ${code}) with ${chunks.length - finished} chunk(s) left`));
        });
        give(w);
      }
    });
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return rows;
}
