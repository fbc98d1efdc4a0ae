/**
 * Running the samples of a yield run (or of one slice of it): in this thread, or on worker
 * threads (./pool.ts). The outcome of a sample depends on the run and its index only, and the
 * outcomes come back in sample order, so the result is the same bytes for any thread count.
 */
import type { SampleOutcome } from './outcome.js';
import { SampleEvaluator, rowSpreads, type YieldJob } from './job.js';
import { runInWorkers, type EarlyWorkers } from './pool.js';

export interface RunProgress {
  /** After each finished sample or chunk: samples done (all rows), total, successes so far in row 0. */
  (done: number, total: number, successesRow0: number, doneRow0: number): void;
}

export interface RunOptions {
  threads: number;
  progress?: RunProgress;
  /** Workers started before the plan was known (used when the samples run on workers; ended either way). */
  early?: EarlyWorkers;
}

/** Outcomes of samples [from, to) in every row: rows[r][k] is sample from + k. */
export async function runSamples(job: YieldJob, from: number, to: number, options: RunOptions): Promise<{ rows: SampleOutcome[][]; fallback?: string }> {
  const rowCount = rowSpreads(job).length;
  const total = rowCount * (to - from);
  if (onWorkers(options.threads, total)) {
    try {
      return { rows: await runInWorkers(job, from, to, options.threads, options.progress, options.early) };
    } catch (err) {
      const fallback = err instanceof Error ? err.message.split('\n')[0] : String(err);
      return { rows: runInThisThread(job, from, to, options.progress), fallback };
    }
  }
  await options.early?.terminate();
  return { rows: runInThisThread(job, from, to, options.progress) };
}

/** Whether runSamples runs `total` samples (all rows) on worker threads. */
export function onWorkers(threads: number, total: number): boolean {
  return threads > 1 && total >= 2;
}

export function runInThisThread(job: YieldJob, from: number, to: number, progress?: RunProgress): SampleOutcome[][] {
  const evaluator = new SampleEvaluator(job);
  const rows: SampleOutcome[][] = evaluator.rows.map(() => []);
  const total = rows.length * (to - from);
  let done = 0;
  let ok0 = 0;
  for (let r = 0; r < rows.length; r++) {
    for (let i = from; i < to; i++) {
      const o = evaluator.evaluate(r, i);
      rows[r].push(o);
      done++;
      if (r === 0 && o.ok) ok0++;
      progress?.(done, total, ok0, r === 0 ? i - from + 1 : to - from);
    }
  }
  return rows;
}
