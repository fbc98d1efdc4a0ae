/**
 * V8 settings of the command's own process (set at start-up, before the stages load).
 *
 * Interrupt budget: how much bytecode a function runs before V8 looks at optimising it (V8's
 * default 67,584 in Node 20). A large chip's `check` keeps V8's optimising compiler busy on its
 * background thread (the process used ~1.55 cores for a 1,024-qubit check, ~2 s of it compiling
 * and collecting on the second core; with `--single-threaded` the same run took 7.0 s instead of
 * 5.1 s): functions that run a little are optimised, deoptimised and optimised again. With a
 * budget of 250,000 the process used ~1.35-1.4 cores, and the medians of three sessions of turns
 * fell by 7-11 % (DEVELOPERS.md, Performance log, eleventh round). Results do not depend on it:
 * every tier computes the same IEEE doubles (test/cli/v8-tuning.test.ts compares the output with
 * V8's default budget byte for byte).
 *
 * A setting the user gave node on its command line is left as given (NODE_OPTIONS is looked at too,
 * though node accepts only a few V8 flags there).
 */
import { setFlagsFromString } from 'node:v8';

export const V8_SETTINGS: readonly { flag: string; value: string }[] = [{ flag: '--interrupt-budget', value: '250000' }];

/** The settings applied: those the user did not give node themselves. */
export function tuneV8(execArgv: readonly string[] = process.execArgv, nodeOptions = process.env.NODE_OPTIONS ?? '', set: (flags: string) => void = setFlagsFromString): string[] {
  // the names of the options given, `_` read as `-` (node takes --interrupt-budget and
  // --interrupt_budget alike); whole names, so that --interrupt-budget-factor-for-... is another
  const given = new Set([...execArgv, ...nodeOptions.split(/\s+/)].map((a) => a.split('=')[0].replace(/_/g, '-')));
  const applied: string[] = [];
  for (const { flag, value } of V8_SETTINGS) {
    if (given.has(flag)) continue;
    set(`${flag}=${value}`);
    applied.push(`${flag}=${value}`);
  }
  return applied;
}
