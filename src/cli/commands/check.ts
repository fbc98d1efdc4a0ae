/**
 * `fluxlane check LAYOUT`: validate a layout and summarise the chip (qubits, couplings, degree,
 * connected components, next-nearest-neighbour pairs), then run the registered check stages.
 *
 * Seam for collision rules: CHECK_STAGES. A stage gets the layout and its graph and returns
 * violations (make the check fail: `ok: false`, exit 1), flags (reported, exit unchanged), and
 * optionally extra JSON fields (`data`) and summary lines (`lines`). The planner's stage
 * (./check-planner.ts) evaluates every collision rule at the best parking assignment, the
 * interaction feasibility of every edge and the crowding margins.
 */

import { Argument, type Command } from 'commander';
import type { ChipLayout } from '../../layout/types.js';
import { buildChipGraph, type ChipGraph } from '../../chip/graph.js';
import { nextNearestPairs } from '../../chip/neighbourhood.js';
import { connectedComponents, degreeStats } from '../../chip/stats.js';
import type { StageProfiler } from '../../util/profile.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { MAX_SECONDS_HELP, maxSecondsOption, parseOptions, withCommonOptions } from '../options.js';
import { enforceChipLimits, enforceWork, plannerWork } from '../work-limits.js';
import * as z from 'zod';
import { PLANNER_CHECK_STAGE } from './check-planner.js';
import { wrapLine } from '../../util/wrap.js';

/** One finding of a check stage. Numbers in `details` are SI (Hz, s, rad; flux in Phi0). */
export interface CheckFinding {
  /** Rule key, e.g. `detuning0101` (shared/rules.json) or a stage's own name. */
  rule: string;
  /** Qubits involved, in layout order. */
  qubits: string[];
  /** One sentence with units, for the human output. */
  message: string;
  details?: Record<string, unknown>;
}

export interface CheckStageResult {
  violations: CheckFinding[];
  flags: CheckFinding[];
  /** Extra fields of the `--json` output (SI units), merged in stage order. */
  data?: Record<string, unknown>;
  /** Extra lines of the human summary. */
  lines?: string[];
}

export interface CheckInput {
  layout: ChipLayout;
  graph: ChipGraph;
  profiler: StageProfiler;
  /** A progress bar on stderr (drawn only on a terminal). */
  progress?: CommandContext['progress'];
}

export interface CheckStage {
  /** Profile stage name and label in the text output, e.g. `collisions`. */
  name: string;
  run(input: CheckInput): CheckStageResult | Promise<CheckStageResult>;
}

/** The check stages `fluxlane check` runs, in order. */
export const CHECK_STAGES: CheckStage[] = [PLANNER_CHECK_STAGE];

/** Run check stages in order, each timed under its name; results are concatenated. */
export async function runCheckStages(input: CheckInput, stages: readonly CheckStage[]): Promise<CheckStageResult> {
  const all: CheckStageResult = { violations: [], flags: [], data: {}, lines: [] };
  for (const stage of stages) {
    const result = await input.profiler.timeAsync(stage.name, async () => stage.run(input));
    all.violations.push(...result.violations);
    all.flags.push(...result.flags);
    Object.assign(all.data!, result.data ?? {});
    all.lines!.push(...(result.lines ?? []));
  }
  return all;
}

export interface ChipSummary {
  qubits: number;
  couplings: number;
  degree: { min: number; mean: number; max: number; histogram: number[] };
  components: number;
  componentSizes: number[];
  nextNearestPairs: number;
  /** How the transmons were given: energies (ec + ejMax), frequencies (fMax + anharmonicity), resistance (ec + rn). */
  transmonForms: { energies: number; frequencies: number; resistance: number };
}

export function summariseChip(layout: ChipLayout, graph: ChipGraph): ChipSummary {
  const components = connectedComponents(graph);
  const forms = { energies: 0, frequencies: 0, resistance: 0 };
  for (const q of layout.qubits) forms[q.transmon.kind]++;
  return {
    qubits: graph.order,
    couplings: graph.size,
    degree: degreeStats(graph),
    components: components.length,
    componentSizes: components.map((c) => c.length),
    nextNearestPairs: nextNearestPairs(graph).length,
    transmonForms: forms,
  };
}

function summaryText(layout: ChipLayout, s: ChipSummary, stages: readonly CheckStage[], result: CheckStageResult): string {
  const row = (label: string, value: string) => `  ${label.padEnd(20)} ${value}`;
  const forms = [
    s.transmonForms.energies ? `ec + ejMax ${s.transmonForms.energies}` : '',
    s.transmonForms.frequencies ? `fMax + anharmonicity ${s.transmonForms.frequencies}` : '',
    s.transmonForms.resistance ? `ec + rn ${s.transmonForms.resistance}` : '',
  ].filter(Boolean).join(', ');
  const sizes = s.components > 1 ? ` (sizes ${s.componentSizes.join(', ')})` : '';
  const lines = [
    `${layout.chip} (${layout.file})`,
    row('qubits', `${s.qubits}   (${forms})`),
    row('couplings', String(s.couplings)),
    row('degree', `min ${s.degree.min}, mean ${s.degree.mean.toFixed(2)}, max ${s.degree.max}`),
    row('components', `${s.components}${sizes}`),
    row('next-nearest pairs', String(s.nextNearestPairs)),
    ...(result.lines ?? []),
  ];
  for (const v of result.violations) lines.push(wrapLine(`violation [${v.rule}] ${v.qubits.join(', ')}: ${v.message}`));
  for (const f of result.flags) lines.push(wrapLine(`flag [${f.rule}] ${f.qubits.join(', ')}: ${f.message}`));
  const ran = stages.length > 0 ? `checks run: ${stages.map((st) => st.name).join(', ')}` : 'no collision checks registered yet';
  lines.push(
    result.violations.length === 0
      ? `ok: layout valid; ${ran}; ${result.flags.length} flag(s)`
      : `FAILED: ${result.violations.length} violation(s), ${result.flags.length} flag(s); ${ran}`,
  );
  return lines.join('\n');
}

const CheckOptions = z.object({ maxSeconds: maxSecondsOption().optional() });

export async function checkLayout(ctx: CommandContext, layoutPath: string, stages: readonly CheckStage[] = CHECK_STAGES, raw: Record<string, unknown> = {}): Promise<CommandOutcome> {
  const o = parseOptions(CheckOptions, raw);
  const layout = ctx.loadLayout(layoutPath);
  if (stages.length > 0) {
    enforceChipLimits(layout, 'check');
    enforceWork(plannerWork(layout), o.maxSeconds, 'check');
  }
  const graph = ctx.profiler.time('chip', () => buildChipGraph(layout));
  const summary = ctx.profiler.time('summary', () => summariseChip(layout, graph));
  const result = await runCheckStages({ layout, graph, profiler: ctx.profiler, progress: ctx.progress }, stages);
  const ok = result.violations.length === 0;
  return {
    data: { ok, chip: layout.chip, file: layout.file, summary, ...result.data, violations: result.violations, flags: result.flags },
    text: summaryText(layout, summary, stages, result),
    exitCode: ok ? 0 : 1,
  };
}

export function registerCheck(program: Command, io: CliIo, stages: readonly CheckStage[] = CHECK_STAGES): void {
  withCommonOptions(
    program
      .command('check')
      .description('validate a chip layout, summarise it, and check every collision rule at the best parking assignment, the CZ feasibility of every edge and the crowding margins (no pulse design; exit 1 on any violation)')
      .addArgument(new Argument('<layout>', 'layout YAML file'))
      .option('--max-seconds <s>', MAX_SECONDS_HELP),
  ).action(commandAction<[string]>(io, (ctx, layoutPath, options) => checkLayout(ctx, layoutPath, stages, options)));
}
