/**
 * Options shared by every command and re-validation of parsed options. commander parses the
 * command line; the values are then checked again with zod here, so a bad value becomes an
 * InputError naming the option: `option --rows: expected an integer from 1 to 500, found abc`.
 *
 * Every option form that more than one command takes is defined once below (phase, ramp time,
 * flux, ramp family, seed, threads, --max-seconds), so `--phase pi/2` means the same in `gate`
 * and in `plan`. A command checks all its options with `parseOptions` before any work starts.
 */

import type { Command } from 'commander';
import * as z from 'zod';
import { parseQuantity } from '../layout/units.js';
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

/**
 * A text option turned into a value by `parse` (undefined: refused with `phrase`, the text after
 * "expected" in the message).
 */
function parsedOption<T>(phrase: string, parse: (text: string) => T | undefined) {
  return z.string({ error: () => phrase }).transform((text, ctx) => {
    const v = parse(text);
    if (v === undefined) {
      ctx.issues.push({ code: 'custom', message: phrase, input: text });
      return z.NEVER;
    }
    return v;
  });
}

const NUMBER = /^[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?$/;

/**
 * A target conditional phase in rad: `pi`, `-pi/2`, `3pi/4`, `3*pi/4`, `1.5708`, `90 deg`; in
 * [-pi, pi] (-pi is pi) and not 0. Returns undefined for anything else.
 */
export function parsePhaseText(text: string): number | undefined {
  const t = text.trim().toLowerCase();
  let v = NaN;
  const m = /^([-+]?(?:\d+\.?\d*|\.\d+)?)\s*\*?\s*pi(?:\s*\/\s*(\d+(?:\.\d+)?))?$/.exec(t);
  if (m) v = ((m[1] === '' || m[1] === '+' ? 1 : m[1] === '-' ? -1 : Number(m[1])) * Math.PI) / (m[2] ? Number(m[2]) : 1);
  else if (/^[-+]?(\d+\.?\d*|\.\d+)\s*deg$/.test(t)) v = (Number(t.replace('deg', '')) * Math.PI) / 180;
  else if (NUMBER.test(t)) v = Number(t);
  if (!Number.isFinite(v) || v === 0 || Math.abs(v) > Math.PI + 1e-12) return undefined;
  return v;
}

export const PHASE_PHRASE = 'a conditional phase in (-pi, pi], not 0, such as pi, pi/2, 1.5 or 90 deg';

/** `--phase`: a conditional phase (parsePhaseText). */
export function phaseOption() {
  return parsedOption(PHASE_PHRASE, parsePhaseText);
}

/** Longest ramp a CZ option may ask for (ns). */
export const MAX_RAMP_NS = 1000;

/** A ramp time: "12 ns", "0.012 us" or a bare number of ns, in (0, 1000] ns. */
export function parseRampText(text: string): number | undefined {
  let ns = NaN;
  if (NUMBER.test(text.trim())) ns = Number(text.trim());
  else {
    const r = parseQuantity(text, 'time');
    if (r.ok) ns = r.value;
  }
  return ns > 0 && ns <= MAX_RAMP_NS ? ns : undefined;
}

export const RAMP_PHRASE = `a ramp time such as "10 ns" (above 0, at most ${MAX_RAMP_NS} ns)`;

/** `--ramp`: a ramp time in ns (parseRampText). */
export function rampOption() {
  return parsedOption(RAMP_PHRASE, parseRampText);
}

export const FLUX_PHRASE = 'a flux in Phi0 from -0.5 to 0.5 (e.g. 0.25 or "0.25 Phi0")';

/** One flux value in Phi0 (optional "Phi0" suffix), in [-0.5, 0.5]; never -0. */
export function parseFluxText(text: string): number | undefined {
  const m = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(?:Phi0)?\s*$/.exec(text);
  const value = m ? Number(m[1]) : NaN;
  if (!Number.isFinite(value) || Math.abs(value) > 0.5) return undefined;
  return value === 0 ? 0 : value;
}

/** A flux option (parseFluxText). */
export function fluxOption() {
  return parsedOption(FLUX_PHRASE, parseFluxText);
}

/** `--family`: one of the gate stage's ramp family names. */
export function familyOption(names: readonly string[]) {
  const phrase = `a ramp family: one of ${names.join(', ')}`;
  return parsedOption(phrase, (text) => (names.includes(text) ? text : undefined));
}

/** `--seed`: an unsigned 32-bit integer. */
export function seedOption() {
  return integerOption(0, 0xffffffff);
}

/** `--threads`: worker threads. */
export function threadsOption() {
  return integerOption(1, 64);
}

/** Largest --max-seconds accepted (one day). */
export const MAX_SECONDS_LIMIT = 86_400;

/** --help text of --max-seconds. */
export const MAX_SECONDS_HELP = 'refuse up front work estimated to take longer than this (default 300 s; see README "Guarantees and limits")';

/** `--max-seconds`: the work a command may take before it is refused up front (see src/cli/work-limits.ts). */
export function maxSecondsOption() {
  const phrase = `a number of seconds above 0, at most ${MAX_SECONDS_LIMIT}`;
  return parsedOption(phrase, (text) => {
    const t = text.trim();
    if (!NUMBER.test(t)) return undefined;
    const v = Number(t);
    return v > 0 && v <= MAX_SECONDS_LIMIT ? v : undefined;
  });
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
    const found = value === undefined ? 'nothing' : Array.isArray(value) && issue.path.length > 1 ? JSON.stringify(value[Number(issue.path[1])]) : JSON.stringify(value);
    return { message: `option ${flagName(key)}: expected ${issue.message}, found ${found}` };
  });
  throw new InputError(diagnostics);
}
