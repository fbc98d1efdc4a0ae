/** The yield stage: Monte Carlo over fabrication spread, its slices and their merge (re-exports only). */
export { FIXED_DEFAULTS, evaluateFixed, fixedPlan, type FixedEvaluation, type FixedPlan } from './fixed-evaluate.js';
export { SampleEvaluator, rowSpreads, type YieldJob, type YieldMode } from './job.js';
export { nominalChip, type NominalChip } from './chip-model.js';
export { drawChip, sampleDeviates, type DrawnChip } from './draw.js';
export { nominalPlan, planForDrawnChip } from './nominal-plan.js';
export { runSamples } from './run.js';
export { runInWorkers, defaultYieldThreads } from './pool.js';
export { mergeParts, readPart, yieldPart, PART_FORMAT, PART_VERSION, type YieldPart } from './part.js';
export { parseShard, shardFromEnvironment, shardRange, type Shard } from './shard.js';
export { parseSpread, parseSpreadList, SPREAD_DEFAULTS, type FabricationSpread } from './spread.js';
export { yieldResult, YIELD_FORMAT, YIELD_VERSION, type YieldRunIdentity } from './summary.js';
export { wilsonInterval, Z_95 } from './wilson.js';
export { sampledContext, sampledLayout } from './sampled-context.js';
export { SampledSpectrum } from './sampled-spectrum.js';
export { cycleErrorOf } from './cycle-error.js';
export { type SampleOutcome } from './outcome.js';
