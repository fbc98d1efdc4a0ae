/**
 * The one top-level handler of the CLI. Every command's action goes through `commandAction`,
 * which runs the command body, then (and only then) writes its files, prints its text or JSON,
 * adds the profile, and turns errors into exit codes:
 *
 *   0  fine                      1  a check found violations (CommandOutcome.exitCode)
 *   2  bad input (InputError: one stderr line per diagnostic) or usage (commander, see main.ts)
 *   70 internal error: one line asking for a report; the stack only with FLUXLANE_DEBUG=1
 *
 * Output files are written to a temporary file in the same folder and renamed into place, so a
 * failure never leaves a partial file.
 */

import { randomBytes } from 'node:crypto';
import { mkdirSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { basename, dirname, resolve } from 'node:path';
import type { Command } from 'commander';
import { formatDiagnostic, InputError } from '../util/errors.js';
import { StageProfiler } from '../util/profile.js';
import type { CliIo } from './io.js';
import type { CommandOutcome, OutputFile } from './outcome.js';
import { startProgress, type Progress } from './progress.js';

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
  const json = Boolean(flags.json);
  const profiler = new StageProfiler(Boolean(flags.profile));
  const ctx: CommandContext = {
    io,
    profiler,
    json,
    resolvePath: (p) => resolve(io.cwd, p),
    progress: (label, total) => startProgress(json ? { ...io, stderrIsTTY: false } : io, label, total),
  };
  const started = process.hrtime.bigint();
  let code: number;
  try {
    const outcome = await body(ctx);
    if (outcome.files && outcome.files.length > 0) {
      const files = outcome.files;
      profiler.time('write', () => writeOutputFiles(files, io.cwd));
    }
    const profile = flags.profile
      ? { ...profiler.report(), total: Number(process.hrtime.bigint() - started) * 1e-9 }
      : undefined;
    if (json) {
      io.stdout(`${JSON.stringify(profile ? { ...outcome.data, profile } : outcome.data, null, 2)}\n`);
    } else {
      if (outcome.text !== '') io.stdout(outcome.text.endsWith('\n') ? outcome.text : `${outcome.text}\n`);
      if (profile) io.stderr(formatProfile(profile));
    }
    code = outcome.exitCode;
  } catch (err) {
    code = reportError(io, err, json);
  }
  io.exitCode = code;
  return code;
}

/** Print a thrown error the way the CLI promises; returns the exit code. */
export function reportError(io: CliIo, err: unknown, json: boolean): number {
  if (err instanceof InputError) {
    for (const d of err.diagnostics) io.stderr(`${formatDiagnostic(d)}\n`);
    if (json) io.stdout(`${JSON.stringify({ ok: false, error: 'input', diagnostics: err.diagnostics }, null, 2)}\n`);
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
 * Write every file to `<dir>/.<name>.<random>.tmp`, then rename all into place. If any write
 * fails, the temporary files are removed and an InputError names the file; nothing is left half
 * written.
 */
export function writeOutputFiles(files: readonly OutputFile[], cwd: string): void {
  const staged: { tmp: string; target: string; shown: string }[] = [];
  try {
    for (const file of files) {
      const target = resolve(cwd, file.path);
      const tmp = resolve(dirname(target), `.${basename(target)}.${randomBytes(6).toString('hex')}.tmp`);
      try {
        mkdirSync(dirname(target), { recursive: true });
        writeFileSync(tmp, file.contents, { flag: 'wx' });
      } catch (err) {
        removeQuietly(tmp);
        throw new InputError({ file: file.path, message: `expected a writable output path, found ${errnoText(err)}` });
      }
      staged.push({ tmp, target, shown: file.path });
    }
    for (const s of staged) {
      try {
        renameSync(s.tmp, s.target);
      } catch (err) {
        throw new InputError({ file: s.shown, message: `expected a writable output path, found ${errnoText(err)}` });
      }
    }
  } finally {
    for (const s of staged) removeQuietly(s.tmp);
  }
}

/** Remove a temporary file if it is there; never throws (the path may not even be a folder's child). */
function removeQuietly(path: string): void {
  try {
    rmSync(path, { force: true });
  } catch {
    // nothing was written there
  }
}

function errnoText(err: unknown): string {
  const code = (err as NodeJS.ErrnoException).code;
  if (code === 'ENOENT') return 'a folder that does not exist';
  if (code === 'EACCES' || code === 'EPERM') return 'no permission to write there';
  if (code === 'EISDIR') return 'a folder';
  if (code === 'ENOTDIR' || code === 'EEXIST') return 'a file where a folder should be';
  return err instanceof Error ? err.message : String(err);
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
