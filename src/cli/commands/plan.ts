/**
 * `fluxlane plan LAYOUT [-o DIR] [--json]`: the whole planner (src/plan/plan.ts): parking,
 * interaction plan per edge with spectator handling, parallel layers, crowding, and (unless
 * --no-pulses) a CZ design per edge from the gate stage (src/plan/pulses.ts). With -o it writes
 * the files of src/report/plan-files.ts: DIR/plan.json (schema: shared/plan.schema.json),
 * DIR/gates.csv (one row per edge), DIR/gates.txt (the same table for people) and, per edge
 * with a designed gate, DIR/waveforms/A-B.awg.csv (the AWG program of its slot) and
 * DIR/waveforms/A-B.qubit.csv (the flux the mover sees). With --from OLD.json it re-plans from an
 * earlier plan (src/plan/replan/replan.ts): only the --edges named, or, on a re-measured layout,
 * everything that no longer holds. Exit 1 when a rule is broken (the files are still complete and
 * say so). It also writes DIR/report.html (the chip report, src/report/html).
 */
import { Argument, type Command } from 'commander';
import * as z from 'zod';
import { buildChipGraph } from '../../chip/graph.js';
import { InputError } from '../../util/errors.js';
import { planChip } from '../../plan/plan.js';
import { finishReplan, replanChip, replanJson } from '../../plan/replan/replan.js';
import { readPlanOption } from '../plan-option.js';
import { writtenLine } from '../written.js';
import { designPulses, designPulsesInParallel, type PulseOptions } from '../../plan/pulses.js';
import { loadGateDesigner } from '../../plan/gate-seam.js';
import { defaultDesignThreads } from '../../gate/design-pool.js';
import { planJson } from '../../report/plan-json.js';
import { planText } from '../../report/plan-text.js';
import { planFiles } from '../../report/plan-files.js';
import { planReportFile } from '../../report/html/chip-report.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome, OutputFile, OutputFolder } from '../outcome.js';
import { checkOutputFolder } from '../output-write.js';
import { FigureGuard, guardPlan } from '../figure-guard.js';
import { enforceChipLimits, enforceWork, planWork } from '../work-limits.js';
import { familyOption, MAX_SECONDS_HELP, maxSecondsOption, parseOptions, phaseOption, rampOption, seedOption, threadsOption, withCommonOptions } from '../options.js';
import { RAMP_FAMILIES } from '../../gate/families/index.js';
import type { Progress } from '../progress.js';

const PlanOptionsSchema = z.object({
  seed: seedOption(),
  outputDir: z.string().min(1, { error: () => 'a folder name' }).optional(),
  pulses: z.boolean().default(true),
  noise: z.boolean().default(true),
  lindblad: z.boolean().optional(),
  spectators: z.boolean().optional(),
  family: familyOption(RAMP_FAMILIES.map((f) => f.name)).optional(),
  ramp: rampOption().optional(),
  threads: threadsOption().optional(),
  from: z.string().min(1, { error: () => 'a plan.json file' }).optional(),
  edges: z.string().min(1, { error: () => 'edges A-B,C-D' }).optional(),
  phase: phaseOption().optional(),
  force: z.boolean().optional(),
  maxSeconds: maxSecondsOption().optional(),
  /** Internal (fluxlane report LAYOUT): return the chip report page instead of writing a folder. */
  reportPage: z.boolean().optional(),
});

/** Draws one progress bar per stage of a long computation (terminal only). */
export function stageProgress(ctx: CommandContext): { update: (stage: string, done: number, total: number) => void; finish: () => void } {
  let bar: Progress | undefined;
  let current = '';
  return {
    update(stage, done, total) {
      if (stage !== current) {
        bar?.done();
        current = stage;
        bar = total > 1 ? ctx.progress(stage, total) : undefined;
      }
      bar?.tick();
      if (done >= total) {
        bar?.done();
        bar = undefined;
      }
    },
    finish() {
      bar?.done();
    },
  };
}

export async function planCommand(ctx: CommandContext, layoutPath: string, raw: Record<string, unknown>): Promise<CommandOutcome> {
  const o = parseOptions(PlanOptionsSchema, raw);
  const rampNs = o.ramp;
  if (o.outputDir !== undefined) checkOutputFolder(o.outputDir, ctx.io.cwd, o.force ?? false, '--output-dir', [layoutPath]);
  const designer = o.pulses ? await ctx.profiler.timeAsync('gate stage', () => loadGateDesigner()) : null;
  if (o.pulses && !designer) {
    throw new InputError({ message: 'expected the CZ pulse designer of the gate stage (src/gate/design.ts), found none in this build; run with --no-pulses' });
  }
  if (o.edges !== undefined && o.from === undefined) throw new InputError({ message: 'option --edges: expected together with --from OLD_PLAN.json (the plan whose other edges are kept), found it alone' });
  const layout = ctx.loadLayout(layoutPath);
  const threads = o.threads ?? defaultDesignThreads();
  enforceChipLimits(layout, 'plan');
  enforceWork(planWork(layout, o.pulses ? { lindblad: o.lindblad, spectators: o.spectators, threads } : null), o.maxSeconds, 'plan');
  const graph = ctx.profiler.time('chip', () => buildChipGraph(layout));
  const progress = stageProgress(ctx);
  const earlier = o.from !== undefined ? ctx.profiler.time('read plan', () => readPlanOption(ctx, o.from!, layout)) : null;
  const replan = earlier
    ? replanChip(layout, earlier, { edges: o.edges?.split(',').map((x) => x.trim()).filter((x) => x !== ''), options: { seed: o.seed } }, { profiler: ctx.profiler, progress: progress.update }, graph)
    : null;
  const plan = replan ? replan.plan : planChip(layout, { seed: o.seed }, { profiler: ctx.profiler, progress: progress.update }, graph);
  if (designer) {
    const pulses: PulseOptions = { noise: o.noise, lindblad: o.lindblad ?? false, spectators: o.spectators ?? false };
    if (o.family !== undefined) pulses.family = o.family;
    if (rampNs !== undefined) pulses.rampNs = rampNs;
    if (o.phase !== undefined) pulses.targetPhase = o.phase;
    const onDone = (done: number, total: number): void => progress.update('designing CZ pulses', done, total);
    const given = replan?.keptDesigns;
    if (threads > 1) {
      const r = await ctx.profiler.timeAsync('pulses', () => designPulsesInParallel(plan, designer, { threads }, pulses, onDone, given));
      if (r.fallback) ctx.io.stderr(`note: the worker threads could not run (${r.fallback}); the CZ pulses were designed in one thread\n`);
    } else ctx.profiler.time('pulses', () => designPulses(plan, designer, pulses, onDone, given));
  }
  if (replan) finishReplan(replan);
  progress.finish();
  const guard = new FigureGuard(layout);
  guardPlan(guard, plan);
  guard.throwIfAny();
  const json = ctx.profiler.time('output', () =>
    planJson(plan, { file: layout.file, seed: o.seed, pulses: designer !== null, replan: replan && earlier ? replanJson(replan, earlier.file) : undefined }),
  );
  let folder: OutputFolder | undefined;
  let page: OutputFile | undefined;
  if (o.outputDir !== undefined || o.reportPage) {
    const report = await ctx.profiler.timeAsync('report', () => planReportFile('.', json, layout, plan));
    page = { ...report, path: 'report.html' };
  }
  if (o.outputDir !== undefined) {
    const dir = o.outputDir.replace(/\/+$/, '') || '.';
    // every file of a plan folder (src/report/plan-files.ts), relative to it, and the chip report
    const files: OutputFile[] = [...planFiles(plan, json, '.').map((f) => ({ ...f, path: f.path.replace(/^\.\//, '') })), page!];
    folder = { path: dir, command: 'plan', files, force: o.force ?? false };
  }
  const written = folder ? `\n${writtenLine(folder.files.map((f) => ({ ...f, path: `${folder!.path}/${f.path}` })))}` : '';
  return {
    data: json,
    text: `${planText(plan, json, layout.file)}${written}`,
    exitCode: plan.violations.length === 0 ? 0 : 1,
    folder,
    ...(o.reportPage && page ? { page } : {}),
  };
}

export function registerPlan(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('plan')
      .description('plan parking and interaction frequencies, spectator moves, CZ pulses and parallel layers for a chip (model estimates: verify on hardware)')
      .addArgument(new Argument('<layout>', 'layout YAML file'))
      .option('-o, --output-dir <dir>', 'write plan.json, gates.csv, gates.txt, the waveform files (waveforms/A-B.awg.csv, A-B.qubit.csv) and report.html to this folder (replaced whole; a folder holding other files only with --force)')
      .option('--force', 'replace the output folder even when it holds files fluxlane did not write')
      .option('--max-seconds <s>', MAX_SECONDS_HELP)
      .option('--seed <n>', 'seed of the parking search (same seed, same plan)', '1')
      .option('--no-pulses', 'skip the per-edge CZ pulse design (parking, interactions, layers and crowding only)')
      .option('--family <name>', `CZ ramp family for every edge: ${RAMP_FAMILIES.map((f) => f.name).join(', ')} (default: the gate stage's best-performing one)`)
      .option('--ramp <time>', 'ramp time for every CZ, e.g. "12 ns" (default: the ramp the plan chose per edge)')
      .option('--phase <theta>', 'target conditional phase (default pi), e.g. pi/2, 1.5 or 90 deg')
      .option('--spectators', 'simulate the worst spectator of each gate as a third transmon')
      .option('--no-noise', 'design without decoherence (fidelityNoisy is then absent)')
      .option('--lindblad', 'fidelityNoisy from the Lindblad equation (default: the first-order estimate, within ~2 %)')
      .option('--threads <n>', 'worker threads for the per-edge CZ designs (default: the machine\'s cores, at most 8; 1, or fewer than 12 designs, designs in this thread; the plan is the same for any count)')
      .option('--from <plan>', 'an earlier plan.json to start from: keep every parking frequency and gate that still holds (fewest changes, then the least cost) and say why anything changed')
      .option('--edges <A-B,C-D>', 'with --from: plan only these edges again, keeping every parking frequency and every other edge'),
  ).action(commandAction<[string]>(io, (ctx, layoutPath, options) => planCommand(ctx, layoutPath, options)));
}
