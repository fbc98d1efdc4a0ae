/**
 * `fluxlane report LAYOUT|PLAN.json -o report.html`: the chip report, one self-contained HTML
 * page that opens offline (src/report/html). A file ending in `.json` is read as a plan written
 * by `fluxlane plan` (its layout is the one it names, or `--layout`; its waveform files are read
 * from beside it); anything else is a layout, planned first exactly as `fluxlane plan -o` plans
 * it (same options), whose DIR/report.html this is. Exit 1 when the plan shown breaks a rule (the
 * report is still written, and says what is broken); 2 on bad input, with no file written.
 */
import { Argument, type Command } from 'commander';
import * as z from 'zod';
import { chipReportHtml, readPlanForReport } from '../../report/html/index.js';
import { InputError } from '../../util/errors.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { flagName, parseOptions, withCommonOptions } from '../options.js';
import { planCommand } from './plan.js';

const ReportOptionsSchema = z.object({
  output: z.string({ error: () => 'an output file, e.g. -o report.html' }).min(1, { error: () => 'an output file, e.g. -o report.html' }),
  layout: z.string().min(1, { error: () => 'a layout file' }).optional(),
});

/** Options that only mean something when the input is a layout to plan. */
const PLANNER_OPTIONS = ['seed', 'family', 'ramp', 'phase', 'spectators', 'lindblad', 'threads'] as const;

function plannerOptionsGiven(raw: Record<string, unknown>): string[] {
  const given: string[] = PLANNER_OPTIONS.filter((k) => raw[k] !== undefined).map(flagName);
  if (raw.pulses === false) given.push('--no-pulses');
  if (raw.noise === false) given.push('--no-noise');
  return given;
}

export async function reportCommand(ctx: CommandContext, input: string, raw: Record<string, unknown>): Promise<CommandOutcome> {
  const o = parseOptions(ReportOptionsSchema, raw);
  const fromPlanFile = /\.json$/i.test(input);
  let html: string;
  let plan: Record<string, unknown>;
  let layoutShown: string;
  let missingWaveforms: string[] = [];
  if (fromPlanFile) {
    const given = plannerOptionsGiven(raw);
    if (given.length > 0) {
      throw new InputError(given.map((flag) => ({ message: `option ${flag}: expected only with a layout to plan, found it with the plan file ${input} (already planned)` })));
    }
    const read = ctx.profiler.time('read plan', () =>
      readPlanForReport({ plan: ctx.resolvePath(input), planShown: input, cwd: ctx.io.cwd, ...(o.layout !== undefined ? { layout: ctx.resolvePath(o.layout), layoutShown: o.layout } : {}) }),
    );
    plan = read.inputs.plan;
    layoutShown = read.layoutShown;
    missingWaveforms = read.missingWaveforms;
    html = (await ctx.profiler.timeAsync('report', () => chipReportHtml(read.inputs))).html;
  } else {
    if (o.layout !== undefined) {
      throw new InputError({ message: `option --layout: expected only with a plan.json input, found it with the layout ${input} (a layout is planned as it is)` });
    }
    // The same run as `fluxlane plan LAYOUT -o DIR`, whose DIR/report.html this page is.
    const planned = await planCommand(ctx, input, { ...raw, seed: raw.seed ?? '1', reportPage: true });
    const page = planned.page;
    if (!page || typeof page.contents !== 'string') throw new Error('the plan command made no report page');
    html = page.contents;
    plan = planned.data;
    layoutShown = input;
  }
  const bytes = Buffer.byteLength(html, 'utf8');
  const qubits = plan.qubits && typeof plan.qubits === 'object' ? Object.keys(plan.qubits).length : 0;
  const edges = Array.isArray(plan.edges) ? plan.edges.length : 0;
  const layers = Array.isArray(plan.layers) ? plan.layers.length : 0;
  const violations = Array.isArray(plan.violations) ? plan.violations.length : 0;
  const flags = Array.isArray(plan.flags) ? plan.flags.length : 0;
  const ok = violations === 0;
  const lines = [
    `${String(plan.chip)}: report of ${qubits} qubits, ${edges} couplings, ${layers} layers from ${fromPlanFile ? `the plan ${input} (layout ${layoutShown})` : `the layout ${input}`}; ${plan.pulses === true ? 'CZ pulses designed' : 'no pulse design'}`,
    ...missingWaveforms.map((w) => `  waveform ${w} not found: that gate is shown without its waveform`),
    ok ? `  every rule holds; ${flags} flag(s)` : `  the plan breaks ${violations} rule condition(s); the report lists them`,
    `wrote ${o.output} (${(bytes / 1024).toFixed(0)} kB): open it in a browser, it needs no network`,
    'Model estimates: verify on hardware, respect flux-line current limits.',
  ];
  return {
    data: { ok, file: o.output, bytes, chip: plan.chip ?? null, source: fromPlanFile ? 'plan' : 'layout', layout: layoutShown, qubits, edges, layers, violations, flags, missingWaveforms },
    text: lines.join('\n'),
    exitCode: ok ? 0 : 1,
    files: [{ path: o.output, contents: html }],
  };
}

export function registerReport(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('report')
      .description('draw a plan as one HTML page that opens offline: chip map, frequency landscape, gate waveforms, layers, findings (model estimates: verify on hardware)')
      .addArgument(new Argument('<input>', 'layout YAML file (planned first, as by `fluxlane plan`) or a plan.json written by `fluxlane plan`'))
      .requiredOption('-o, --output <file>', 'the HTML file to write, e.g. report.html')
      .option('--layout <file>', 'with a plan.json: its layout (default: the layout the plan names, beside the plan or from the current folder)')
      .option('--seed <n>', 'with a layout: seed of the parking search (default 1)')
      .option('--no-pulses', 'with a layout: skip the per-edge CZ pulse design')
      .option('--family <name>', 'with a layout: CZ ramp family for every edge')
      .option('--ramp <time>', 'with a layout: ramp time for every CZ, e.g. "12 ns"')
      .option('--phase <rad>', 'with a layout: target conditional phase in rad (default pi)')
      .option('--spectators', 'with a layout: simulate the worst spectator of each gate as a third transmon')
      .option('--no-noise', 'with a layout: design without decoherence')
      .option('--lindblad', 'with a layout: fidelityNoisy from the Lindblad equation')
      .option('--threads <n>', 'with a layout: worker threads for the per-edge CZ designs (the plan is the same for any count)'),
  ).action(commandAction<[string]>(io, (ctx, input, options) => reportCommand(ctx, input, options)));
}
