/**
 * `fluxlane diff OLD.json NEW.json [--json]`: what changed between two plans and why
 * (src/report/plan-diff.ts): measured device parameters and rules, parking, each edge's decisions
 * and designed gate; the reasons a re-plan (`plan --from OLD`) recorded, else the measured changes
 * behind them. Exit 0 (differences are not violations); 2 on bad input.
 */
import { readFileSync } from 'node:fs';
import { Argument, type Command } from 'commander';
import { readPlanDocument } from '../../plan/plan-read.js';
import { planDiff, planDiffText } from '../../report/plan-diff.js';
import { InputError } from '../../util/errors.js';
import { wrapLine } from '../../util/wrap.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { withCommonOptions } from '../options.js';

function readDocument(ctx: CommandContext, file: string): Record<string, unknown> {
  let text: string;
  try {
    text = readFileSync(ctx.resolvePath(file), 'utf8');
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new InputError({ file, message: `expected a readable plan file, found ${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'a folder' : String(code ?? err)}` });
  }
  return readPlanDocument(text, file);
}

export function diffCommand(ctx: CommandContext, oldFile: string, newFile: string): CommandOutcome {
  const before = ctx.profiler.time('read', () => readDocument(ctx, oldFile));
  const after = ctx.profiler.time('read', () => readDocument(ctx, newFile));
  const d = ctx.profiler.time('diff', () => planDiff(before, after));
  return {
    data: { old: oldFile, new: newFile, ...d },
    text: planDiffText(d, oldFile, newFile, wrapLine),
    exitCode: 0,
  };
}

export function registerDiff(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('diff')
      .description('what changed between two plans (measured values, rules, parking, edges, designs) and why')
      .addArgument(new Argument('<old>', 'the earlier plan.json'))
      .addArgument(new Argument('<new>', 'the later plan.json (e.g. made with plan --from OLD)')),
  ).action(commandAction<[string, string]>(io, (ctx, oldFile, newFile) => diffCommand(ctx, oldFile, newFile)));
}
