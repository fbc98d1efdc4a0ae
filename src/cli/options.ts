/**
 * Options shared by every command and re-validation of parsed options. commander parses the
 * command line; the values are then checked again with zod here, so a bad value becomes an
 * InputError naming the option: `option --rows: expected an integer from 1 to 500, found abc`.
 */

import type { Command } from 'commander';
import { z } from 'zod';
import { InputError, type Diagnostic } from '../util/errors.js';

/** Add --json and --profile (every command has them). */
export function withCommonOptions(command: Command): Command {
  return command
    .option('--json', 'print machine-readable JSON (SI units: Hz, s, rad; flux in Phi0)')
    .option('--profile', 'add the seconds spent per stage (stderr, or "profile" in --json)');
}

/** An option holding an integer in [min, max], written as decimal digits. */
export function integerOption(min: number, max: number) {
  const phrase = `an integer from ${min} to ${max}`;
  return z
    .string({ error: () => phrase })
    .regex(/^[-+]?\d+$/, { error: () => phrase })
    .transform(Number)
    .pipe(z.number().int().min(min, { error: () => phrase }).max(max, { error: () => phrase }));
}

/** `camelCase` option key -> `--kebab-case` flag, for messages. */
export function flagName(key: string): string {
  return `--${key.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`;
}

/**
 * Check parsed options against a zod object schema. Unknown keys are ignored (commander's own
 * flags such as --json live there too). Throws one InputError naming every bad option.
 */
export function parseOptions<S extends z.ZodType>(schema: S, options: Record<string, unknown>): z.output<S> {
  const result = schema.safeParse(options);
  if (result.success) return result.data;
  const diagnostics: Diagnostic[] = result.error.issues.map((issue) => {
    const key = String(issue.path[0] ?? '');
    const value = options[key];
    const found = value === undefined ? 'nothing' : JSON.stringify(value);
    return { message: `option ${flagName(key)}: expected ${issue.message}, found ${found}` };
  });
  throw new InputError(diagnostics);
}
