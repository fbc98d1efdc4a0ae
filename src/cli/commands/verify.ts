/**
 * `fluxlane verify LAYOUT PLAN.json`: recompute every rule and every claim of a plan from the
 * layout and the files it names (src/plan/verify.ts, src/plan/verify-claims.ts) and say which does
 * not hold. Exit 0: it holds; 1: a rule is broken or a claim does not hold; 2: bad input (an
 * unreadable file, JSON syntax or structure errors with file:line:column, a plan that does not
 * match the layout's qubits and couplings, an unreadable waveform file).
 */
import { dirname } from 'node:path';
import { Argument, type Command } from 'commander';
import { planWaveformBytes, readPlanFile } from '../../plan/plan-read.js';
import { verifyPlan } from '../../plan/verify.js';
import { toFindingJson } from '../../plan/rules/findings.js';
import { plain, prob, toSeconds } from '../../plan/format.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { MAX_SECONDS_HELP, maxSecondsOption, parseOptions, withCommonOptions } from '../options.js';
import { enforceChipLimits, enforceWork, verifyWork } from '../work-limits.js';
import * as z from 'zod';

const VerifyOptions = z.object({ maxSeconds: maxSecondsOption().optional() });

export function verifyCommand(ctx: CommandContext, layoutPath: string, planPath: string, raw: Record<string, unknown> = {}): CommandOutcome {
  const o = parseOptions(VerifyOptions, raw);
  const layout = ctx.loadLayout(layoutPath);
  enforceChipLimits(layout, 'verify');
  const full = ctx.resolvePath(planPath);
  const plan = ctx.profiler.time('read plan', () => readPlanFile(full, planPath, layout));
  enforceWork(verifyWork(layout, planWaveformBytes(dirname(full), plan)), o.maxSeconds, 'verify');
  const result = ctx.profiler.time('verify', () => verifyPlan(layout, plan, { dir: dirname(full), shownDir: dirname(planPath) }));
  const lines = [
    `${layout.chip}: plan ${planPath} against ${layout.file}`,
    `  checked ${result.checked.qubits} qubits, ${result.checked.edges} edges, ${result.checked.layers} layers, ${result.checked.waveforms} waveform file(s) (re-simulated), ${result.checked.claims} claims`,
    `  reference cycle (recomputed): ${result.cycle.durationNs.toFixed(1)} ns, predicted error ${prob(result.cycle.error)} = gates ${prob(result.cycle.gates)} + idles ${prob(result.cycle.idles)} (sums of average infidelities; model estimates)${result.cycle.uncounted > 0 ? `; ${result.cycle.uncounted} edge(s) without a feasible gate not counted, so a lower bound` : ''}`,
    ...result.violations.map((v) => `violation [${v.rule}] ${v.qubits.join(', ')}: ${v.message}`),
    ...result.flags.map((f) => `flag [${f.rule}] ${f.qubits.join(', ')}: ${f.message}`),
    result.ok ? `ok: the plan holds (every rule and claim recomputed); ${result.flags.length} flag(s)` : `FAILED: the plan breaks ${result.violations.length} rule condition(s) or claim(s)`,
  ];
  return {
    data: {
      ok: result.ok,
      chip: layout.chip,
      layout: layout.file,
      plan: planPath,
      checked: result.checked,
      missingWaveforms: result.missingWaveforms,
      cycle: { duration: toSeconds(result.cycle.durationNs), error: plain(result.cycle.error), gates: plain(result.cycle.gates), idles: plain(result.cycle.idles), uncountedEdges: result.cycle.uncounted },
      violations: result.violations.map(toFindingJson),
      flags: result.flags.map(toFindingJson),
    },
    text: lines.join('\n'),
    exitCode: result.ok ? 0 : 1,
  };
}

export function registerVerify(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('verify')
      .description('recompute every rule and claim of a plan.json from the layout and the waveform files it names (for example a plan edited by hand) and say which does not hold')
      .addArgument(new Argument('<layout>', 'layout YAML file'))
      .addArgument(new Argument('<plan>', 'plan.json written by fluxlane plan'))
      .option('--max-seconds <s>', MAX_SECONDS_HELP),
  ).action(commandAction<[string, string]>(io, (ctx, layoutPath, planPath, options) => verifyCommand(ctx, layoutPath, planPath, options)));
}
