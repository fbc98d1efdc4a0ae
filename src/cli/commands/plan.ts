/**
 * `fluxlane plan LAYOUT [-o DIR] [--json]`: the whole planner (src/plan/plan.ts): parking,
 * interaction plan per edge with spectator handling, parallel layers, crowding, and (unless
 * --no-pulses) a CZ design per edge from the gate stage (src/plan/pulses.ts). With -o it writes
 * the files of src/report/plan-files.ts: DIR/plan.json (schema: shared/plan.schema.json),
 * DIR/gates.csv (one row per edge), DIR/gates.txt (the same table for people) and, per edge
 * whose designed gate breaks no rule, DIR/waveforms/A-B.awg.csv (the AWG program of its slot) and
 * DIR/waveforms/A-B.qubit.csv (the flux the mover sees). With --from OLD.json it re-plans from an
 * earlier plan (src/plan/replan/replan.ts): only the --edges named, or, on a re-measured layout,
 * everything that no longer holds. Exit 1 when a rule is broken (the files are still complete and
 * say so). It also writes DIR/report.html (the chip report, src/report/html).
 */
import { Argument, type Command } from 'commander';
import { z } from 'zod';
import { loadLayoutFile } from '../../layout/load.js';
import { buildChipGraph } from '../../chip/graph.js';
import { parseQuantity } from '../../layout/units.js';
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
import type { CommandOutcome, OutputFile } from '../outcome.js';
import { integerOption, parseOptions, withCommonOptions } from '../options.js';
import type { Progress } from '../progress.js';

const PlanOptionsSchema = z.object({
  seed: integerOption(0, 0xffffffff),
  outputDir: z.string().min(1, { error: () => 'a folder name' }).optional(),
  pulses: z.boolean().default(true),
  noise: z.boolean().default(true),
  lindblad: z.boolean().optional(),
  spectators: z.boolean().optional(),
  family: z.string().regex(/^[A-Za-z0-9_-]{1,40}$/, { error: () => 'a ramp family name' }).optional(),
  ramp: z.string().optional(),
  threads: integerOption(1, 64).optional(),
  from: z.string().min(1, { error: () => 'a plan.json file' }).optional(),
  edges: z.string().min(1, { error: () => 'edges A-B,C-D' }).optional(),
  phase: z
    .string({ error: () => 'a phase in rad' })
    .regex(/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/, { error: () => 'a phase in rad (a number)' })
    .transform(Number)
    .optional(),
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
  let rampNs: number | undefined;
  if (o.ramp !== undefined) {
    const q = parseQuantity(o.ramp, 'time');
    if (!q.ok || !(q.value > 0)) throw new InputError({ message: `option --ramp: expected a ramp time such as "12 ns", found ${JSON.stringify(o.ramp)}` });
    rampNs = q.value;
  }
  const designer = o.pulses ? await ctx.profiler.timeAsync('gate stage', () => loadGateDesigner()) : null;
  if (o.pulses && !designer) {
    throw new InputError({ message: 'expected the CZ pulse designer of the gate stage (src/gate/design.ts), found none in this build; run with --no-pulses' });
  }
  if (o.edges !== undefined && o.from === undefined) throw new InputError({ message: 'option --edges: expected together with --from OLD_PLAN.json (the plan whose other edges are kept), found it alone' });
  const layout = ctx.profiler.time('layout', () => loadLayoutFile(ctx.resolvePath(layoutPath), layoutPath));
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
    const threads = o.threads ?? defaultDesignThreads();
    const onDone = (done: number, total: number): void => progress.update('designing CZ pulses', done, total);
    const given = replan?.keptDesigns;
    if (threads > 1) {
      const r = await ctx.profiler.timeAsync('pulses', () => designPulsesInParallel(plan, designer, { threads }, pulses, onDone, given));
      if (r.fallback) ctx.io.stderr(`note: the worker threads could not run (${r.fallback}); the CZ pulses were designed in one thread\n`);
    } else ctx.profiler.time('pulses', () => designPulses(plan, designer, pulses, onDone, given));
  }
  if (replan) finishReplan(replan);
  progress.finish();
  const json = ctx.profiler.time('output', () =>
    planJson(plan, { file: layout.file, seed: o.seed, pulses: designer !== null, replan: replan && earlier ? replanJson(replan, earlier.file) : undefined }),
  );
  const files: OutputFile[] = [];
  if (o.outputDir !== undefined) {
    const dir = o.outputDir.replace(/\/+$/, '') || '.';
    files.push(...planFiles(plan, json, dir));
    files.push(await ctx.profiler.timeAsync('report', () => planReportFile(dir, json, layout, plan)));
  }
  const written = files.length > 0 ? `\n${writtenLine(files)}` : '';
  return {
    data: json,
    text: `${planText(plan, json, layout.file)}${written}`,
    exitCode: plan.violations.length === 0 ? 0 : 1,
    files: files.length > 0 ? files : undefined,
  };
}

export function registerPlan(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('plan')
      .description('plan parking and interaction frequencies, spectator moves, CZ pulses and parallel layers for a chip (model estimates: verify on hardware)')
      .addArgument(new Argument('<layout>', 'layout YAML file'))
      .option('-o, --output-dir <dir>', 'write plan.json, gates.csv, gates.txt and the waveform files (waveforms/A-B.awg.csv, A-B.qubit.csv) and report.html to this folder')
      .option('--seed <n>', 'seed of the parking search (same seed, same plan)', '1')
      .option('--no-pulses', 'skip the per-edge CZ pulse design (parking, interactions, layers and crowding only)')
      .option('--family <name>', 'CZ ramp family for every edge (default: the gate stage\'s best-performing one)')
      .option('--ramp <time>', 'ramp time for every CZ, e.g. "12 ns" (default: the ramp the plan chose per edge)')
      .option('--phase <rad>', 'target conditional phase in rad (default pi)')
      .option('--spectators', 'simulate the worst spectator of each gate as a third transmon')
      .option('--no-noise', 'design without decoherence (fidelityNoisy is then absent)')
      .option('--lindblad', 'fidelityNoisy from the Lindblad equation (default: the first-order estimate, within ~2 %)')
      .option('--threads <n>', 'worker threads for the per-edge CZ designs (default: the machine\'s cores, at most 8; 1, or fewer than 12 designs, designs in this thread; the plan is the same for any count)')
      .option('--from <plan>', 'an earlier plan.json to start from: keep every parking frequency and gate that still holds (fewest changes, then the least cost) and say why anything changed')
      .option('--edges <A-B,C-D>', 'with --from: plan only these edges again, keeping every parking frequency and every other edge'),
  ).action(commandAction<[string]>(io, (ctx, layoutPath, options) => planCommand(ctx, layoutPath, options)));
}
