/**
 * Workers started before the plan is known (EarlyWorkers, src/yield/pool.ts): the samples they
 * evaluate once given the plan are the outcomes this thread computes for the same job, in
 * sample order; a worker that stops before its first chunk sends the run back to this thread
 * (the same outcomes, with the reason).
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { EarlyWorkers, workerCount } from '../../src/yield/pool.js';
import { nominalPlan } from '../../src/yield/nominal-plan.js';
import { runInThisThread, runSamples } from '../../src/yield/run.js';
import type { YieldJob } from '../../src/yield/job.js';

const layout = loadLayoutFile('layouts/bowline-5.yaml', 'bowline-5.yaml');
const unplanned: YieldJob = { layout, mode: 'fixed', seed: 5, samples: 40, spread: { rn: 0.03, ec: 0.01, g: 0.03 }, sweep: [0.01, 0.06], plan: null, planSeed: 1, cycleErrorCeiling: null };

describe('EarlyWorkers', () => {
  it('started before the plan, give the outcomes of this thread for the planned job', async () => {
    const early = new EarlyWorkers(unplanned, workerCount(unplanned, 3, 40, 2));
    expect(early.workers.length).toBe(2);
    const job = { ...unplanned, plan: nominalPlan(layout, 1).plan };
    const r = await runSamples(job, 3, 40, { threads: 2, early });
    expect(r.fallback).toBeUndefined();
    expect(r.rows).toEqual(runInThisThread(job, 3, 40));
    expect(r.rows.length).toBe(3);
  }, 60_000);

  it('a worker that stopped before its first chunk: the run falls back to this thread, with the reason', async () => {
    const early = new EarlyWorkers(unplanned, 2);
    await early.workers[1].terminate();
    const job = { ...unplanned, plan: nominalPlan(layout, 1).plan };
    const r = await runSamples(job, 0, 12, { threads: 2, early });
    expect(r.fallback).toMatch(/stopped \(exit code \d+\) before its first chunk/);
    expect(r.rows).toEqual(runInThisThread(job, 0, 12));
  }, 60_000);
});
