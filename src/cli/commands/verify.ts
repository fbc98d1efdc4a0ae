/**
 * `fluxlane verify LAYOUT PLAN.json`: recompute every rule of a plan from scratch
 * (src/plan/verify.ts) and say whether it holds. Exit 0: it holds; 1: a rule is broken; 2: bad
 * input (an unreadable file, JSON syntax or schema errors with file:line:column, a plan that does
 * not match the layout's qubits and couplings).
 */
import { readFileSync } from 'node:fs';
import { dirname } from 'node:path';
import { Argument, type Command } from 'commander';
import { loadLayoutFile } from '../../layout/load.js';
import { InputError } from '../../util/errors.js';
import { readPlan } from '../../plan/plan-read.js';
import { verifyPlan } from '../../plan/verify.js';
import { toFindingJson } from '../../plan/rules/findings.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { withCommonOptions } from '../options.js';

export function verifyCommand(ctx: CommandContext, layoutPath: string, planPath: string): CommandOutcome {
  const layout = ctx.profiler.time('layout', () => loadLayoutFile(ctx.resolvePath(layoutPath), layoutPath));
  const full = ctx.resolvePath(planPath);
  let text: string;
  try {
    text = readFileSync(full, 'utf8');
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new InputError({ file: planPath, message: `expected a readable plan file, found ${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'a folder' : String(code ?? err)}` });
  }
  const plan = ctx.profiler.time('read plan', () => readPlan(text, planPath, layout));
  const result = ctx.profiler.time('verify', () => verifyPlan(layout, plan, { dir: dirname(full) }));
  const lines = [
    `${layout.chip}: plan ${planPath} against ${layout.file}`,
    `  checked ${result.checked.qubits} qubits, ${result.checked.edges} edges, ${result.checked.layers} layers, ${result.checked.waveforms} waveform file(s)`,
    ...result.missingWaveforms.map((w) => `  waveform ${w} not found: its sweeps were checked with the ramp-time estimate`),
    ...result.violations.map((v) => `violation [${v.rule}] ${v.qubits.join(', ')}: ${v.message}`),
    ...result.flags.map((f) => `flag [${f.rule}] ${f.qubits.join(', ')}: ${f.message}`),
    result.ok ? `ok: the plan holds (every rule recomputed); ${result.flags.length} flag(s)` : `FAILED: the plan breaks ${result.violations.length} rule condition(s)`,
  ];
  return {
    data: {
      ok: result.ok,
      chip: layout.chip,
      layout: layout.file,
      plan: planPath,
      checked: result.checked,
      missingWaveforms: result.missingWaveforms,
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
      .description('recompute every rule of a plan.json (for example one edited by hand) and say whether it holds')
      .addArgument(new Argument('<layout>', 'layout YAML file'))
      .addArgument(new Argument('<plan>', 'plan.json written by fluxlane plan')),
  ).action(commandAction<[string, string]>(io, (ctx, layoutPath, planPath) => verifyCommand(ctx, layoutPath, planPath)));
}
