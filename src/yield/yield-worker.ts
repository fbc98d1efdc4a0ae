/**
 * Worker-thread entry of the yield pool (src/yield/pool.ts): builds the evaluator of the run it
 * was started with, then evaluates each chunk of samples it is sent and posts the outcomes back
 * (or the error's first line). A worker started before the run's plan was known (`planFollows`,
 * EarlyWorkers) builds the reduced table and the nominal chips at once and receives the plan in
 * a message `{ plan }` before its first chunk.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { SampleEvaluator, nominalChips, type YieldJob } from './job.js';
import { restoredJob, type WorkerStart } from './pool.js';
import type { NominalChip } from './chip-model.js';
import { sharedReducedSpectrum } from '../transmon/reduced-spectrum.js';

if (!parentPort) throw new Error('yield-worker: must run in a worker thread');
const port = parentPort;
const start = workerData as WorkerStart;
let job: YieldJob = start.job;
let evaluator: SampleEvaluator | undefined;
let chips: NominalChip[] | undefined;
let early: string | undefined;
if (start.planFollows) {
  // (what the evaluator needs but the plan, built while the main thread plans; a failure here is
  // reported with the first chunk, as a failure to build the evaluator is)
  try {
    sharedReducedSpectrum();
    chips = nominalChips(job);
  } catch (err) {
    early = err instanceof Error ? err.message.split('\n')[0] : String(err);
  }
}
port.on('message', (msg: { plan: YieldJob['plan'] } | { id: number; chunk: { row: number; from: number; to: number } }) => {
  if ('plan' in msg) {
    job = { ...job, plan: msg.plan };
    return;
  }
  try {
    if (early !== undefined) throw new Error(early);
    evaluator ??= new SampleEvaluator(restoredJob(job), undefined, chips);
    const outcomes = [];
    for (let i = msg.chunk.from; i < msg.chunk.to; i++) outcomes.push(evaluator.evaluate(msg.chunk.row, i));
    port.postMessage({ id: msg.id, outcomes });
  } catch (err) {
    port.postMessage({ id: msg.id, error: err instanceof Error ? err.message.split('\n')[0] : String(err) });
  }
});
