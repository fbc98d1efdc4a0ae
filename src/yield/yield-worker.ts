/**
 * Worker-thread entry of the yield pool (src/yield/pool.ts): builds the evaluator of the run it
 * was started with, then evaluates each chunk of samples it is sent and posts the outcomes back
 * (or the error's first line).
 */
import { parentPort, workerData } from 'node:worker_threads';
import { SampleEvaluator, type YieldJob } from './job.js';
import { restoredJob } from './pool.js';

if (!parentPort) throw new Error('yield-worker: must run in a worker thread');
const port = parentPort;
let evaluator: SampleEvaluator | undefined;
port.on('message', (msg: { id: number; chunk: { row: number; from: number; to: number } }) => {
  try {
    evaluator ??= new SampleEvaluator(restoredJob((workerData as { job: YieldJob }).job));
    const outcomes = [];
    for (let i = msg.chunk.from; i < msg.chunk.to; i++) outcomes.push(evaluator.evaluate(msg.chunk.row, i));
    port.postMessage({ id: msg.id, outcomes });
  } catch (err) {
    port.postMessage({ id: msg.id, error: err instanceof Error ? err.message.split('\n')[0] : String(err) });
  }
});
