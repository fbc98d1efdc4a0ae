/**
 * `fluxlane generate square|heavy-hex --rows R --cols C [--seed S] [--groups K] [--name N] [-o FILE]`:
 * a synthetic chip layout with a seeded parameter spread (src/chip/generate.ts), printed or
 * written to FILE. Same options -> byte-identical file.
 */

import { Argument, type Command } from 'commander';
import * as z from 'zod';
import { GENERATE_DEFAULTS, GENERATE_LIMITS, generateLayout } from '../../chip/generate.js';
import type { LatticeKind } from '../../chip/lattice.js';
import { layoutToYaml } from '../../layout/write.js';
import { InputError } from '../../util/errors.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { checkOutputFile } from '../output-write.js';
import { integerOption, parseOptions, withCommonOptions } from '../options.js';

export const LATTICES: readonly LatticeKind[] = ['square', 'heavy-hex'];

const GenerateOptionsSchema = z.object({
  rows: integerOption(1, GENERATE_LIMITS.maxSide),
  cols: integerOption(1, GENERATE_LIMITS.maxSide),
  seed: integerOption(0, 0xffffffff),
  groups: integerOption(1, 8),
  name: z
    .string()
    .regex(/^[^\n\r]{1,80}$/, { error: () => 'a name of 1 to 80 characters on one line' })
    .optional(),
  output: z.string().min(1, { error: () => 'a file name' }).optional(),
});

export function generateCommand(ctx: CommandContext, lattice: LatticeKind, raw: Record<string, unknown>): CommandOutcome {
  const o = parseOptions(GenerateOptionsSchema, raw);
  if (o.output !== undefined) checkOutputFile(o.output, ctx.io.cwd, '--output');
  if (o.rows * o.cols > GENERATE_LIMITS.maxCells) {
    throw new InputError({
      message: `options --rows and --cols: expected at most ${GENERATE_LIMITS.maxCells} cells in all, found ${o.rows} x ${o.cols} = ${o.rows * o.cols}`,
    });
  }
  const commandLine = [
    lattice,
    `--rows ${o.rows}`,
    `--cols ${o.cols}`,
    `--seed ${o.seed}`,
    o.groups !== GENERATE_DEFAULTS.groups ? `--groups ${o.groups}` : '',
    o.name !== undefined ? `--name ${JSON.stringify(o.name)}` : '',
  ].filter(Boolean).join(' ');
  const doc = ctx.profiler.time('generate', () =>
    generateLayout({ kind: lattice, rows: o.rows, cols: o.cols, seed: o.seed, groups: o.groups, name: o.name, commandLine }),
  );
  const yaml = ctx.profiler.time('yaml', () => layoutToYaml(doc));
  const data: Record<string, unknown> = {
    chip: doc.chip,
    lattice,
    rows: o.rows,
    cols: o.cols,
    seed: o.seed,
    groups: o.groups,
    qubits: doc.qubits.length,
    couplings: doc.couplings.length,
    output: o.output ?? null,
  };
  if (o.output === undefined) {
    return { data: { ...data, layout: yaml }, text: yaml.trimEnd(), exitCode: 0 };
  }
  return {
    data,
    text: `wrote ${o.output}: ${doc.chip}, ${doc.qubits.length} qubits, ${doc.couplings.length} couplings`,
    exitCode: 0,
    files: [{ path: o.output, contents: yaml }],
  };
}

export function registerGenerate(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('generate')
      .description('make a synthetic chip layout (square or heavy-hex lattice) with a seeded spread of parameters')
      .addArgument(new Argument('<lattice>', 'lattice of couplings').choices(LATTICES))
      .requiredOption('--rows <n>', 'square: rows of qubits; heavy-hex: rows of hexagonal cells')
      .requiredOption('--cols <n>', 'square: columns of qubits; heavy-hex: columns of hexagonal cells')
      .option('--seed <n>', 'seed of the parameter spread (same seed, same file)', String(GENERATE_DEFAULTS.seed))
      .option('--groups <n>', 'number of maximum-frequency groups (neighbours get different groups)', String(GENERATE_DEFAULTS.groups))
      .option('--name <name>', 'chip name (default: <lattice>-<rows>x<cols>-seed<seed>)')
      .option('-o, --output <file>', 'write the layout to this file instead of printing it'),
  ).action(commandAction<[LatticeKind]>(io, (ctx, lattice, options) => generateCommand(ctx, lattice, options)));
}
