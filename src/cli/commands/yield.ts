/**
 * `fluxlane yield LAYOUT [--samples N] [--seed S] [--spread-rn P] [--spread-ec P] [--spread-g P]
 * [--mode fixed|replan] [--plan PLAN.json] [--plan-seed N] [--sweep-spread P,P,...]
 * [--max-cycle-error E] [--threads W] [--shard K/N] [--sample K] [-o FILE] [--json]`:
 * Monte Carlo over fabrication spread (src/yield): what fraction of fabricated chips work, and
 * which qubits, edges and rules make them fail. With --shard (or inside a Slurm array task) it
 * runs one slice and writes a part for `fluxlane yield-merge`. With --sample K it checks one
 * drawn chip and lists everything it breaks.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { Argument, Option, type Command } from 'commander';
import * as z from 'zod';
import { loadLayoutFile } from '../../layout/load.js';
import type { ChipLayout } from '../../layout/types.js';
import { readPlan, type PlanInput } from '../../plan/plan-read.js';
import { toFindingJson } from '../../plan/rules/findings.js';
import { InputError } from '../../util/errors.js';
import { SampleEvaluator, rowSpreads, type YieldJob, type YieldMode } from '../../yield/job.js';
import { nominalPlan } from '../../yield/nominal-plan.js';
import { yieldPart } from '../../yield/part.js';
import { defaultYieldThreads, EarlyWorkers, workerCount } from '../../yield/pool.js';
import { onWorkers, runSamples } from '../../yield/run.js';
import { parseShard, shardFromEnvironment, shardRange, type Shard } from '../../yield/shard.js';
import { parseSpread, parseSpreadList, qubitSpreads, SPREAD_DEFAULTS, type FabricationSpread } from '../../yield/spread.js';
import { sampleFindings } from '../../yield/sample-findings.js';
import { yieldResult, type YieldRunIdentity } from '../../yield/summary.js';
import { yieldText } from '../../yield/yield-text.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { integerOption, parseOptions, withCommonOptions } from '../options.js';
import { packageVersion } from '../version.js';

export const YIELD_CLI_DEFAULTS = Object.freeze({ samples: 1000, seed: 1, planSeed: 1, maxSamples: 10_000_000 });

const YieldOptions = z.object({
  samples: integerOption(1, YIELD_CLI_DEFAULTS.maxSamples),
  seed: integerOption(0, 0xffffffff),
  planSeed: integerOption(0, 0xffffffff),
  mode: z.enum(['fixed', 'replan'], { error: () => '"fixed" or "replan"' }),
  spreadRn: z.string().optional(),
  spreadEc: z.string().optional(),
  spreadG: z.string().optional(),
  sweepSpread: z.string().optional(),
  plan: z.string().min(1, { error: () => 'a plan file' }).optional(),
  maxCycleError: z
    .string({ error: () => 'an error per cycle (a number between 0 and 1)' })
    .regex(/^(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/, { error: () => 'an error per cycle (a number between 0 and 1)' })
    .transform(Number)
    .pipe(z.number().min(0, { error: () => 'an error per cycle (a number between 0 and 1)' }).max(1, { error: () => 'an error per cycle (a number between 0 and 1)' }))
    .optional(),
  threads: integerOption(1, 64).optional(),
  shard: z.string().optional(),
  sample: integerOption(0, 0xffffffff).optional(),
  output: z.string().min(1, { error: () => 'a file name' }).optional(),
});

function readFileOrThrow(path: string, shown: string, what: string): Buffer {
  try {
    return readFileSync(path);
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new InputError({ file: shown, message: `expected a readable ${what}, found ${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'a folder' : String(code ?? err)}` });
  }
}

const sha256 = (bytes: Buffer | string) => createHash('sha256').update(bytes).digest('hex');

export async function yieldCommand(ctx: CommandContext, layoutPath: string, raw: Record<string, unknown>): Promise<CommandOutcome> {
  const o = parseOptions(YieldOptions, raw);
  const mode = o.mode as YieldMode;
  if (o.plan !== undefined && mode !== 'fixed') throw new InputError({ message: 'option --plan: expected with --mode fixed (the plan to keep), found --mode replan (every chip is planned anew)' });
  if (o.maxCycleError !== undefined && mode !== 'replan') throw new InputError({ message: 'option --max-cycle-error: expected with --mode replan (the ceiling applies to each new plan), found --mode fixed' });
  const shard: Shard | null = o.shard !== undefined ? parseShard(o.shard) : shardFromEnvironment(ctx.io.env);
  if (shard && o.sample !== undefined) throw new InputError({ message: 'option --sample: expected without --shard (it checks one chip), found both' });
  if (shard && o.output === undefined && !ctx.json) throw new InputError({ message: `shard ${shard.index}/${shard.count}: expected -o FILE for its part (or --json to print it)` });
  if (o.sample !== undefined && o.sample >= o.samples) throw new InputError({ message: `option --sample: expected a sample index below --samples ${o.samples}, found ${o.sample}` });

  const full = ctx.resolvePath(layoutPath);
  const layoutBytes = readFileOrThrow(full, layoutPath, 'layout file');
  const layout: ChipLayout = ctx.profiler.time('layout', () => loadLayoutFile(full, layoutPath));
  const spread: FabricationSpread = {
    rn: o.spreadRn !== undefined ? parseSpread(o.spreadRn, '--spread-rn') : layout.rules.resistanceSpread,
    ec: o.spreadEc !== undefined ? parseSpread(o.spreadEc, '--spread-ec') : SPREAD_DEFAULTS.ec,
    g: o.spreadG !== undefined ? parseSpread(o.spreadG, '--spread-g') : SPREAD_DEFAULTS.g,
  };
  const sweep = o.sweepSpread !== undefined ? parseSpreadList(o.sweepSpread, '--sweep-spread') : null;

  const { from, to } = shard ? shardRange(o.samples, shard) : { from: 0, to: o.samples };
  const threads = o.threads ?? defaultYieldThreads();
  const unplanned: YieldJob = { layout, mode, seed: o.seed, samples: o.samples, spread, sweep, plan: null, planSeed: o.planSeed, cycleErrorCeiling: o.maxCycleError ?? null };
  // (fixed mode planning the nominal chip: the workers start meanwhile, EarlyWorkers)
  const early = mode === 'fixed' && o.plan === undefined && o.sample === undefined && onWorkers(threads, rowSpreads(unplanned).length * (to - from))
    ? new EarlyWorkers(unplanned, workerCount(unplanned, from, to, threads))
    : undefined;
  try {
    return await withJob(ctx, o, layout, layoutPath, layoutBytes, unplanned, from, to, threads, shard, early);
  } finally {
    await early?.terminate();
  }
}

async function withJob(
  ctx: CommandContext, o: z.infer<typeof YieldOptions>, layout: ChipLayout, layoutPath: string, layoutBytes: Buffer, unplanned: YieldJob,
  from: number, to: number, threads: number, shard: Shard | null, early: EarlyWorkers | undefined,
): Promise<CommandOutcome> {
  const { mode, spread, sweep } = unplanned;
  let plan: PlanInput | null = null;
  let planInfo: YieldRunIdentity['plan'] = null;
  if (mode === 'fixed') {
    if (o.plan !== undefined) {
      const bytes = readFileOrThrow(ctx.resolvePath(o.plan), o.plan, 'plan file');
      plan = ctx.profiler.time('read plan', () => readPlan(bytes.toString('utf8'), o.plan!, layout));
      planInfo = { source: 'file', file: o.plan, sha256: sha256(bytes) };
    } else {
      const nominal = ctx.profiler.time('nominal plan', () => nominalPlan(layout, o.planSeed));
      plan = nominal.plan;
      planInfo = { source: 'planned', seed: o.planSeed, holds: nominal.ok, violations: nominal.violations };
    }
  }
  const job: YieldJob = { ...unplanned, plan };
  const measured = qubitSpreads(layout, spread).measured;
  const run: YieldRunIdentity = {
    chip: layout.chip,
    layout: layoutPath,
    layoutSha256: sha256(layoutBytes),
    mode,
    seed: o.seed,
    samples: o.samples,
    spread: { ...spread, measured },
    plan: planInfo,
    planSeed: mode === 'replan' ? o.planSeed : null,
    sweep,
    cycleErrorCeiling: o.maxCycleError ?? null,
    fluxlane: packageVersion(),
  };

  if (o.sample !== undefined) return oneSample(ctx, job, run, o.sample);

  const rows = rowSpreads(job).length;
  const bar = ctx.progress(`yield (${mode})`, rows * (to - from));
  let last = 0;
  const { rows: outcomes, fallback } = await ctx.profiler.timeAsync('samples', () =>
    runSamples(job, from, to, {
      threads,
      early,
      progress: (done, _total, ok0, done0) => {
        bar.tick(done - last, done0 > 0 ? `yield ${((100 * ok0) / done0).toFixed(1)} %` : '');
        last = done;
      },
    }),
  );
  bar.done();
  if (fallback) ctx.io.stderr(`note: the worker threads could not run (${fallback}); the samples ran in one thread\n`);
  const ids = layout.qubits.map((q) => q.id);
  const edgeKeys = layout.couplings.map((c) => `${c.a}-${c.b}`);
  if (shard) {
    const part = yieldPart(run, shard, ids, edgeKeys, outcomes);
    const text = `yield part ${shard.index}/${shard.count} of ${layout.chip}: samples ${part.shard.from}-${part.shard.to - 1} of ${o.samples}${o.output ? `; wrote ${o.output} (join the parts with fluxlane yield-merge)` : ''}`;
    return { data: part as unknown as Record<string, unknown>, text, exitCode: 0, files: o.output ? [{ path: o.output, contents: `${JSON.stringify(part)}\n` }] : undefined };
  }
  const result = ctx.profiler.time('summary', () => yieldResult(run, ids, edgeKeys, outcomes, rowSpreads(job)));
  const written = o.output ? `\nwrote ${o.output}` : '';
  return {
    data: result,
    text: `${yieldText(result)}${written}`,
    exitCode: 0,
    files: o.output ? [{ path: o.output, contents: `${JSON.stringify(result, null, 2)}\n` }] : undefined,
  };
}

/** One drawn chip in detail: everything it breaks. */
function oneSample(ctx: CommandContext, job: YieldJob, run: YieldRunIdentity, index: number): CommandOutcome {
  const evaluator = ctx.profiler.time('setup', () => new SampleEvaluator(job));
  const { outcome, findings, parameters } = ctx.profiler.time('sample', () => sampleFindings(evaluator, index));
  const lines = [
    `${run.chip}: sample ${index} of the ${run.mode} yield run (seed ${run.seed}): ${outcome.ok ? 'works (every rule holds)' : `fails: ${findings.length} rule condition(s) broken`}`,
    ...findings.map((f) => `violation [${f.rule}] ${f.qubits.join(', ')}: ${f.message}`),
  ];
  if (outcome.cycleError !== null) lines.push(`error per cycle ${outcome.cycleError.toPrecision(3)}`);
  return {
    data: { chip: run.chip, layout: run.layout, mode: run.mode, seed: run.seed, sample: index, ok: outcome.ok, qubits: parameters.qubits, couplings: parameters.couplings, violations: findings.map(toFindingJson), cycleError: outcome.cycleError },
    text: lines.join('\n'),
    exitCode: 0,
  };
}

export function registerYield(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('yield')
      .description('Monte Carlo over fabrication spread: the fraction of fabricated chips that work, with a 95 % interval, and the qubits, edges and rules that make them fail (model estimates: verify on hardware)')
      .addArgument(new Argument('<layout>', 'layout YAML file'))
      .option('--samples <n>', 'chips to draw', String(YIELD_CLI_DEFAULTS.samples))
      .option('--seed <n>', 'seed of the draws (sample K of seed S is the same chip in every run, thread count and slice)', String(YIELD_CLI_DEFAULTS.seed))
      .option('--spread-rn <p>', 'relative spread (1 sigma) of each junction\'s normal-state resistance, e.g. "2%" (default: the layout\'s resistanceSpread rule)')
      .option('--spread-ec <p>', `relative spread of each shunt capacitance, i.e. of E_C (default ${SPREAD_DEFAULTS.ec * 100}%)`)
      .option('--spread-g <p>', `relative spread of each coupling capacitance (default ${SPREAD_DEFAULTS.g * 100}%)`)
      .addOption(new Option('--mode <mode>', 'fixed: keep the nominal plan and retune each chip to it; replan: plan each chip anew').choices(['fixed', 'replan']).default('fixed'))
      .option('--plan <file>', 'fixed mode: the plan.json to keep (default: the planner\'s plan of the layout, no pulses)')
      .option('--plan-seed <n>', 'seed of the planner (the nominal plan, and each re-plan)', String(YIELD_CLI_DEFAULTS.planSeed))
      .option('--sweep-spread <list>', 'also the yield against resistance spread, e.g. 0.5%,1%,2%,4% (the same draws, scaled)')
      .option('--max-cycle-error <e>', 'replan mode: a chip works only when its plan\'s error per cycle (when the plan states one) is at most this')
      .option('--threads <n>', 'worker threads (default: the machine\'s cores, at most 8; same result for any count)')
      .option('--shard <k/n>', 'run slice K of N (K = 0..N-1) and write a part for fluxlane yield-merge (default inside a Slurm array task: SLURM_ARRAY_TASK_ID of SLURM_ARRAY_TASK_COUNT)')
      .option('--sample <k>', 'check drawn chip K alone and list every rule it breaks')
      .option('-o, --output <file>', 'write the result (or the part of a shard) as JSON to this file'),
  ).action(commandAction<[string]>(io, (ctx, layoutPath, options) => yieldCommand(ctx, layoutPath, options)));
}
