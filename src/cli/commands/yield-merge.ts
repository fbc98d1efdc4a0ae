/**
 * `fluxlane yield-merge PARTS... [-o RESULT.json] [--json]`: join the parts of a sharded yield run
 * (`fluxlane yield --shard K/N -o part-K.json`, e.g. one per task of a Slurm job array) into the
 * result one run of all samples gives, byte for byte (src/yield/part.ts). Parts of different
 * runs, repeated or missing shards are refused with one message each (exit 2).
 */
import { readFileSync } from 'node:fs';
import { Argument, type Command } from 'commander';
import * as z from 'zod';
import { InputError } from '../../util/errors.js';
import { mergeParts, readPart, type YieldPart } from '../../yield/part.js';
import { yieldText } from '../../yield/yield-text.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { parseOptions, withCommonOptions } from '../options.js';

const MergeOptions = z.object({ output: z.string().min(1, { error: () => 'a file name' }).optional() });

export function yieldMergeCommand(ctx: CommandContext, files: string[], raw: Record<string, unknown>): CommandOutcome {
  const o = parseOptions(MergeOptions, raw);
  const parts: { file: string; part: YieldPart }[] = [];
  const problems: InputError[] = [];
  ctx.profiler.time('read parts', () => {
    for (const file of files) {
      try {
        let text: string;
        try {
          text = readFileSync(ctx.resolvePath(file), 'utf8');
        } catch (err) {
          const code = (err as NodeJS.ErrnoException).code;
          throw new InputError({ file, message: `expected a readable yield part, found ${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'a folder' : String(code ?? err)}` });
        }
        parts.push({ file, part: readPart(text, file) });
      } catch (err) {
        if (err instanceof InputError) problems.push(err);
        else throw err;
      }
    }
  });
  if (problems.length > 0) throw new InputError(problems.flatMap((e) => e.diagnostics));
  const result = ctx.profiler.time('merge', () => mergeParts(parts));
  const written = o.output ? `\nwrote ${o.output} (${parts.length} part(s))` : '';
  return {
    data: result,
    text: `${yieldText(result)}${written}`,
    exitCode: 0,
    files: o.output ? [{ path: o.output, contents: `${JSON.stringify(result, null, 2)}\n` }] : undefined,
  };
}

export function registerYieldMerge(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('yield-merge')
      .description('join the parts of a sharded yield run (fluxlane yield --shard K/N -o part.json) into the result one run of all samples gives')
      .addArgument(new Argument('<parts...>', 'part files, one per shard, in any order'))
      .option('-o, --output <file>', 'write the result as JSON to this file'),
  ).action(commandAction<[string[]]>(io, (ctx, files, options) => yieldMergeCommand(ctx, files, options)));
}
