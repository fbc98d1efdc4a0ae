/**
 * Benchmarks of the yield stage (issue 13 targets), on the generated 100-qubit square chip
 * (src/chip/generate.ts, 10 x 10, seed 1; layout parsed first):
 * - fixed mode, 10,000 drawn chips checked against the nominal plan on 2 worker threads: target
 *   under 30 s for the built command as users run it (`node dist/cli/main.js yield`, whole
 *   process: start-up and the nominal plan included; run `npm run build` after changes); the same
 *   run from the TypeScript sources in this process is listed too (its workers start under tsx,
 *   whose transform names every closure it creates: measured 1.4x slower per sample);
 * - replan mode, one drawn chip planned anew (no pulses): target under 0.5 s;
 * - fixed mode, one drawn chip in this thread (the per-sample cost behind the first).
 */
import type { Benchmark } from './run.js';
import { chipFile, requireBuilt, runBuilt } from './built-command.js';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { parseLayoutText } from '../../src/layout/load.js';
import type { ChipLayout } from '../../src/layout/types.js';
import { SampleEvaluator, type YieldJob } from '../../src/yield/job.js';
import { nominalPlan } from '../../src/yield/nominal-plan.js';
import { runSamples } from '../../src/yield/run.js';

let layout: ChipLayout | undefined;
const chip = () => (layout ??= parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 10, cols: 10, seed: 1 })), 'square-10x10.yaml'));
const spread = { rn: 0.02, ec: 0.01, g: 0.03 };
let fixedJob: YieldJob | undefined;
const fixed = (samples: number): YieldJob => {
  fixedJob ??= { layout: chip(), mode: 'fixed', seed: 1, samples, spread, sweep: null, plan: nominalPlan(chip(), 1).plan, planSeed: 1, cycleErrorCeiling: null };
  return { ...fixedJob, samples };
};

let fixedEvaluator: SampleEvaluator | undefined;
let fixedIndex = 0;
export const fixedOne: Benchmark = {
  name: 'yield, fixed mode: one drawn 100-qubit chip checked against the plan (this thread)',
  setup: () => void (fixedEvaluator ??= new SampleEvaluator(fixed(1_000_000))),
  run: () => fixedEvaluator!.evaluate(0, fixedIndex++),
};

const file = chipFile('square-10x10.yaml', () => layoutToYaml(generateLayout({ kind: 'square', rows: 10, cols: 10, seed: 1 })));

export const fixed10kBuilt: Benchmark = {
  name: 'yield, fixed mode: 10,000 drawn 100-qubit chips on 2 worker threads (built command, whole process)',
  target: 30e6,
  runs: 1,
  warmup: 0,
  setup: () => {
    requireBuilt('yield.bench.ts');
    file();
  },
  run: () => runBuilt(['yield', file(), '--samples', '10000', '--seed', '1', '--threads', '2', '--json']).length,
};

export const fixed10k: Benchmark = {
  name: 'yield, fixed mode: 10,000 drawn 100-qubit chips on 2 worker threads (from the sources, under tsx)',
  runs: 1,
  warmup: 0,
  setup: () => void fixed(10_000),
  run: () => runSamples(fixed(10_000), 0, 10_000, { threads: 2 }),
};

let replanEvaluator: SampleEvaluator | undefined;
let replanIndex = 0;
export const replanOne: Benchmark = {
  name: 'yield, replan mode: one drawn 100-qubit chip planned anew (no pulses)',
  target: 0.5e6,
  runs: 5,
  warmup: 1,
  setup: () => void (replanEvaluator ??= new SampleEvaluator({ layout: chip(), mode: 'replan', seed: 1, samples: 1000, spread, sweep: null, plan: null, planSeed: 1, cycleErrorCeiling: null })),
  run: () => replanEvaluator!.evaluate(0, replanIndex++),
};
