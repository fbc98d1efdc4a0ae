/**
 * The one top-level handler of the CLI. Every command's action goes through `commandAction`,
 * which runs the command body, then (and only then) writes its files, prints its text or JSON,
 * adds the profile, and turns errors into exit codes:
 *
 *   0  fine                      1  a check found violations (CommandOutcome.exitCode)
 *   2  bad input (InputError: one stderr line per diagnostic) or usage (commander, see main.ts)
 *   70 internal error: one line asking for a report; the stack only with FLUXLANE_DEBUG=1
 *
 * Output files are written to a temporary file in the same folder and renamed into place, and an
 * output folder is written whole beside the old one and swapped in (src/cli/output-write.ts), with
 * SIGINT, SIGTERM and SIGHUP held meanwhile: a failure or an interrupt never leaves a partial file
 * or a mix of old and new files.
 *
 * Warnings (unusual layout values, src/layout/plausible.ts) gathered while the command ran go to
 * stderr, one line each, and into the JSON output as "warnings"; they never change the exit code.
 */

import { resolve } from 'node:path';
import type { Command } from 'commander';
import type { ChipLayout } from '../layout/types.js';
import { formatDiagnostic, InputError, type Diagnostic } from '../util/errors.js';
import { StageProfiler } from '../util/profile.js';
import type { CliIo } from './io.js';
import type { CommandOutcome } from './outcome.js';
import { withSignalsHeld, writeOutputFiles, writeOutputFolder } from './output-write.js';
import { startProgress, type Progress } from './progress.js';

export { writeOutputFiles } from './output-write.js';

export const EXIT = Object.freeze({ ok: 0, violations: 1, input: 2, internal: 70 });

export interface CommandContext {
  io: CliIo;
  /** Time stages with `ctx.profiler.time('stage', () => ...)`; shown with --profile. */
  profiler: StageProfiler;
  /** True with --json (commands rarely need it: the handler chooses what to print). */
  json: boolean;
  /** A path given by the user, resolved against the io's cwd. */
  resolvePath(path: string): string;
  /** A progress bar on stderr (drawn only on a terminal, and never with --json). */
  progress(label: string, total: number): Progress;
  /** Read a layout named by the user (stage 'layout' of the profile); its warnings are kept for the output. */
  loadLayout(path: string): ChipLayout;
  /** Add a warning (printed on stderr and under "warnings" in --json; the exit code stays). */
  warn(warning: Diagnostic): void;
}

export interface CommonFlags {
  json?: boolean;
  profile?: boolean;
}

/** Run one command body and print its outcome; returns the exit code (also stored in io.exitCode). */
export async function runCommand(
  io: CliIo,
  flags: CommonFlags,
  body: (ctx: CommandContext) => Promise<CommandOutcome> | CommandOutcome,
): Promise<number> {
  // (the layout stage, with zod and the yaml package, is loaded here, when a command runs:
  // `fluxlane --version` and `--help` never load it)
  const { loadLayoutFile } = await import('../layout/load.js');
  const json = Boolean(flags.json);
  const profiler = new StageProfiler(Boolean(flags.profile));
  const warnings: Diagnostic[] = [];
  const ctx: CommandContext = {
    io,
    profiler,
    json,
    resolvePath: (p) => resolve(io.cwd, p),
    progress: (label, total) => startProgress(json ? { ...io, stderrIsTTY: false } : io, label, total),
    loadLayout: (p) => {
      const layout = profiler.time('layout', () => loadLayoutFile(resolve(io.cwd, p), p));
      warnings.push(...(layout.warnings ?? []));
      return layout;
    },
    warn: (w) => void warnings.push(w),
  };
  const started = process.hrtime.bigint();
  let code: number;
  try {
    const outcome = await body(ctx);
    const { files, folder } = outcome;
    if ((files && files.length > 0) || folder) {
      profiler.time('write', () =>
        withSignalsHeld(() => {
          if (files && files.length > 0) writeOutputFiles(files, io.cwd, io.env);
          if (folder) writeOutputFolder(folder, io.cwd, io.env);
        }),
      );
    }
    for (const w of warnings) io.stderr(`${formatDiagnostic(w)}\n`);
    const profile = flags.profile
      ? { ...profiler.report(), total: Number(process.hrtime.bigint() - started) * 1e-9 }
      : undefined;
    if (json) {
      const data = warnings.length > 0 ? { ...outcome.data, warnings } : outcome.data;
      io.stdout(`${JSON.stringify(profile ? { ...data, profile } : data, null, 2)}\n`);
    } else {
      if (outcome.text !== '') io.stdout(outcome.text.endsWith('\n') ? outcome.text : `${outcome.text}\n`);
      if (profile) io.stderr(formatProfile(profile));
    }
    code = outcome.exitCode;
  } catch (err) {
    for (const w of warnings) io.stderr(`${formatDiagnostic(w)}\n`);
    code = reportError(io, err, json, warnings);
  }
  io.exitCode = code;
  return code;
}

/** Print a thrown error the way the CLI promises; returns the exit code. */
export function reportError(io: CliIo, err: unknown, json: boolean, warnings: readonly Diagnostic[] = []): number {
  if (err instanceof InputError) {
    for (const d of err.diagnostics) io.stderr(`${formatDiagnostic(d)}\n`);
    const extra = warnings.length > 0 ? { warnings } : {};
    if (json) io.stdout(`${JSON.stringify({ ok: false, error: 'input', diagnostics: err.diagnostics, ...extra }, null, 2)}\n`);
    return EXIT.input;
  }
  const message = err instanceof Error ? err.message.split('\n')[0] : String(err);
  io.stderr(`internal error: ${message} (please report; FLUXLANE_DEBUG=1 shows the stack)\n`);
  if (io.env.FLUXLANE_DEBUG === '1' && err instanceof Error && err.stack) io.stderr(`${err.stack}\n`);
  if (json) io.stdout(`${JSON.stringify({ ok: false, error: 'internal', message }, null, 2)}\n`);
  return EXIT.internal;
}

/** `profile (s): layout 0.0123, chip 0.0010, total 0.0140` */
export function formatProfile(profile: Record<string, number>): string {
  const parts = Object.entries(profile).map(([stage, s]) => `${stage} ${s.toFixed(4)}`);
  return `profile (s): ${parts.join(', ')}\n`;
}

/**
 * Adapter from commander's action signature `(...args, options, command)` to a command body.
 *
 *   .action(commandAction(io, async (ctx, layoutPath: string, options) => { ... return outcome; }))
 *
 * `options` is commander's parsed options object; validate it again (options.ts) before use.
 */
export function commandAction<A extends unknown[]>(
  io: CliIo,
  body: (ctx: CommandContext, ...args: [...A, Record<string, unknown>]) => Promise<CommandOutcome> | CommandOutcome,
): (...raw: unknown[]) => Promise<void> {
  return async (...raw: unknown[]) => {
    const command = raw[raw.length - 1] as Command;
    const options = command.opts() as Record<string, unknown>;
    const args = raw.slice(0, -2) as A;
    await runCommand(io, options as CommonFlags, (ctx) => body(ctx, ...args, options));
  };
}
