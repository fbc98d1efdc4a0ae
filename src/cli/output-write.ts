/**
 * Writing a command's output so that nothing is ever left half written:
 *
 *   - a file: written to a temporary sibling `.<name>.fluxlane-<pid>-<random>.tmp`, then renamed
 *     into place (writeOutputFiles);
 *   - an output folder (`plan -o DIR`): written whole to a sibling `.<name>.fluxlane-new-<pid>-<random>`,
 *     then swapped in: the old folder is renamed away (`.<name>.fluxlane-old-<pid>-<random>`), the
 *     new one renamed in, the old one removed (writeOutputFolder). A folder is replaced only when
 *     it is fluxlane output (it holds the marker OUTPUT_MARKER, or a plan.json of format
 *     fluxlane-plan written before the marker existed) or empty; any other folder is refused
 *     unless the user passes --force (checkOutputFolder, called before any work starts).
 *
 * Interrupts: the whole write phase is synchronous and runs with SIGINT, SIGTERM and SIGHUP held
 * (withSignalsHeld): a signal that arrives meanwhile is acted on when the phase has finished,
 * so an interrupted run leaves the old outputs or the new ones, never a mix, never a temporary
 * file. Outside the write phase the signals keep their default (immediate) effect: nothing has
 * been written yet. Whatever a killed process (SIGKILL, power loss) leaves behind is cleaned at
 * the next write to the same place (cleanStaleSiblings: temporary siblings of dead processes are
 * removed, and a folder renamed away but not replaced is renamed back).
 *
 * Folders are made one level at a time (makeDirs), never with a recursive mkdir, which on Node 20
 * does not return for a path such as /proc/x/y.
 */
import { randomBytes } from 'node:crypto';
import { closeSync, existsSync, lstatSync, mkdirSync, openSync, readdirSync, readSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, resolve, sep } from 'node:path';
import { InputError } from '../util/errors.js';
import type { OutputFile, OutputFolder } from './outcome.js';

/** The marker file of a fluxlane output folder (its text names the command that wrote it). */
export const OUTPUT_MARKER = '.fluxlane-output';

/** The signals held during the write phase. */
export const HELD_SIGNALS: readonly NodeJS.Signals[] = ['SIGINT', 'SIGTERM', 'SIGHUP'];

/** Test hook: FLUXLANE_WRITE_PAUSE_MS pauses this long (synchronously) after each step of a write. */
function pauseForTests(env: Record<string, string | undefined>): void {
  const ms = Number(env.FLUXLANE_WRITE_PAUSE_MS ?? 0);
  if (ms > 0 && ms <= 10_000) Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

/**
 * Run `write` (synchronous) with SIGINT, SIGTERM and SIGHUP held; a signal received meanwhile is
 * raised again once `write` has returned or thrown (the process then ends as that signal says).
 * In a process that had its own handlers for them (an embedding program), those stay and get it.
 */
export function withSignalsHeld<T>(write: () => T): T {
  const received: NodeJS.Signals[] = [];
  const hold = (signal: NodeJS.Signals): void => {
    received.push(signal);
  };
  const had = new Map(HELD_SIGNALS.map((s) => [s, process.listenerCount(s)]));
  for (const s of HELD_SIGNALS) process.on(s, hold);
  holding++;
  try {
    return write();
  } finally {
    // A signal that arrived during the synchronous write is delivered in the poll phase of the
    // event loop; keep holding until a poll phase has passed (removing the last listener earlier
    // would drop it): the second check phase from now comes after one. Then act on it.
    setImmediate(() =>
      setImmediate(() => {
        for (const s of HELD_SIGNALS) process.off(s, hold);
        holding--;
        if (received.length > 0) reraise(received[0], had.get(received[0]) ?? 0);
        if (holding === 0) for (const callback of waiting.splice(0)) callback();
      }),
    );
  }
}

/** Write phases whose signals are still held (withSignalsHeld), and what waits for their release. */
let holding = 0;
const waiting: (() => void)[] = [];

/**
 * Call `callback` once no write phase holds signals any more: at once when none does, else after
 * the last one has acted on a signal it held (a re-raised signal with its default action ends the
 * process first). The command's own exit waits for it (src/cli/main.ts), so that an interrupt
 * held during the write phase still ends the process as that signal says.
 */
export function afterHeldSignals(callback: () => void): void {
  if (holding === 0) callback();
  else waiting.push(callback);
}

function reraise(signal: NodeJS.Signals, otherListeners: number): void {
  if (otherListeners > 0) {
    process.emit(signal, signal);
    return;
  }
  process.kill(process.pid, signal);
}

/** A folder and the ones above it, one level at a time; InputError naming the path on failure. */
export function makeDirs(dir: string, shown: string): void {
  const missing: string[] = [];
  let d = resolve(dir);
  for (;;) {
    let st;
    try {
      st = statSync(d);
    } catch (err) {
      const code = (err as NodeJS.ErrnoException).code;
      if (code !== 'ENOENT') throw new InputError({ file: shown, message: `expected a writable output path, found ${errnoText(err)}` });
      missing.push(d);
      const up = dirname(d);
      if (up === d) break;
      d = up;
      continue;
    }
    if (!st.isDirectory()) throw new InputError({ file: shown, message: `expected a writable output path, found a file where a folder should be (${d})` });
    break;
  }
  for (const m of missing.reverse()) {
    try {
      mkdirSync(m);
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'EEXIST' && statSync(m).isDirectory()) continue;
      throw new InputError({ file: shown, message: `expected a writable output path, found ${errnoText(err)} (making ${m})` });
    }
  }
}

/** Text of a file system error for "found ...". */
export function errnoText(err: unknown): string {
  const code = (err as NodeJS.ErrnoException).code;
  if (code === 'ENOENT') return 'a folder that does not exist';
  if (code === 'EACCES' || code === 'EPERM' || code === 'EROFS') return 'no permission to write there';
  if (code === 'EISDIR') return 'a folder';
  if (code === 'ENOTDIR' || code === 'EEXIST') return 'a file where a folder should be';
  if (code === 'ENOSPC') return 'a full disk';
  return err instanceof Error ? err.message : String(err);
}

function removeQuietly(path: string): void {
  try {
    rmSync(path, { force: true, recursive: true });
  } catch {
    // nothing was written there
  }
}

function tempName(target: string, kind: 'tmp' | 'new' | 'old'): string {
  const tag = `fluxlane-${kind === 'tmp' ? '' : `${kind}-`}${process.pid}-${randomBytes(4).toString('hex')}`;
  return join(dirname(target), `.${basename(target)}.${tag}${kind === 'tmp' ? '.tmp' : ''}`);
}

const SIBLING = /^\.(.+)\.fluxlane-(?:(new|old)-)?(\d+)-[0-9a-f]{8}(\.tmp)?$/;

function processAlive(pid: number): boolean {
  if (pid === process.pid) return true;
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Clean what an earlier run killed while writing `target` left beside it: temporary files and
 * folders of processes that no longer run are removed; a folder renamed away whose replacement
 * never arrived is renamed back first.
 */
export function cleanStaleSiblings(target: string): void {
  const parent = dirname(target);
  const name = basename(target);
  let entries: string[];
  try {
    entries = readdirSync(parent);
  } catch {
    return;
  }
  for (const entry of entries) {
    const m = SIBLING.exec(entry);
    if (!m || m[1] !== name || processAlive(Number(m[3]))) continue;
    const path = join(parent, entry);
    if (m[2] === 'old' && !existsSync(target)) {
      try {
        renameSync(path, target);
        continue;
      } catch {
        // fall through: remove it
      }
    }
    removeQuietly(path);
  }
}

/**
 * Write every file to a temporary sibling, then rename all into place. If any write fails, the
 * temporary files are removed and an InputError names the file; nothing is left half written.
 */
export function writeOutputFiles(files: readonly OutputFile[], cwd: string, env: Record<string, string | undefined> = {}): void {
  const staged: { tmp: string; target: string; shown: string }[] = [];
  try {
    for (const file of files) {
      const target = resolve(cwd, file.path);
      makeDirs(dirname(target), file.path);
      cleanStaleSiblings(target);
      const tmp = tempName(target, 'tmp');
      try {
        writeFileSync(tmp, file.contents, { flag: 'wx' });
      } catch (err) {
        removeQuietly(tmp);
        throw new InputError({ file: file.path, message: `expected a writable output path, found ${errnoText(err)}` });
      }
      staged.push({ tmp, target, shown: file.path });
      pauseForTests(env);
    }
    for (const s of staged) {
      try {
        if (existsSync(s.target) && lstatSync(s.target).isDirectory()) throw Object.assign(new Error('folder'), { code: 'EISDIR' });
        renameSync(s.tmp, s.target);
      } catch (err) {
        throw new InputError({ file: s.shown, message: `expected a writable output path, found ${errnoText(err)}` });
      }
      pauseForTests(env);
    }
  } finally {
    for (const s of staged) removeQuietly(s.tmp);
  }
}

/** What is at an output folder's path. */
export type FolderState = 'absent' | 'empty' | 'fluxlane' | 'foreign' | 'file';

/** Whether `dir` is missing, empty, fluxlane output, something else, or not a folder. */
export function folderState(dir: string): FolderState {
  let st;
  try {
    st = lstatSync(dir);
  } catch {
    return 'absent';
  }
  if (!st.isDirectory()) return 'file';
  const entries = readdirSync(dir);
  if (entries.length === 0) return 'empty';
  if (entries.includes(OUTPUT_MARKER)) return 'fluxlane';
  if (entries.includes('plan.json') && startsWithPlanFormat(join(dir, 'plan.json'))) return 'fluxlane';
  return 'foreign';
}

/** True when a plan.json written by fluxlane plan before the marker existed is there. */
function startsWithPlanFormat(file: string): boolean {
  try {
    const fd = openSync(file, 'r');
    try {
      const buf = Buffer.alloc(256);
      const n = readSync(fd, buf, 0, 256, 0);
      return /^\uFEFF?\s*\{\s*"format"\s*:\s*"fluxlane-plan"/.test(buf.subarray(0, n).toString('utf8'));
    } finally {
      closeSync(fd);
    }
  } catch {
    return false;
  }
}

/**
 * Check, before any work starts, that an output folder can be written: its parent is (or can be
 * made) a folder, and what is there is absent, empty or fluxlane output (any other non-empty
 * folder only with `force`). Throws InputError naming the folder and what to do.
 */
export function checkOutputFolder(path: string, cwd: string, force: boolean, flag = '--output-dir', inputs: readonly string[] = []): void {
  const target = resolve(cwd, path);
  if (target === dirname(target)) throw new InputError({ file: path, message: `option ${flag}: expected a folder to write into, found the root of the file system` });
  const inside = (p: string): boolean => p === target || p.startsWith(target.endsWith(sep) ? target : target + sep);
  if (inside(resolve(cwd))) throw new InputError({ file: path, message: `option ${flag}: expected a folder apart from the current one, found the current folder or one above it (it would be replaced whole)` });
  const held = inputs.find((f) => inside(resolve(cwd, f)));
  if (held !== undefined) throw new InputError({ file: path, message: `option ${flag}: expected a folder that holds none of the inputs, found ${held} inside it (it would be replaced whole)` });
  const state = folderState(target);
  if (state === 'file') throw new InputError({ file: path, message: `option ${flag}: expected a folder, found a file (remove it or choose another folder)` });
  if (state === 'foreign' && !force) {
    throw new InputError({ file: path, message: `option ${flag}: expected a new or empty folder, or one fluxlane wrote, found a folder with other files; it would be replaced whole: add --force to replace it, or choose another folder` });
  }
  checkWritableParent(dirname(target), path);
}

/** Check, before any work starts, that a single output file can be written there. */
export function checkOutputFile(path: string, cwd: string, flag: string): void {
  const target = resolve(cwd, path);
  try {
    if (lstatSync(target).isDirectory()) throw new InputError({ file: path, message: `option ${flag}: expected a file name, found a folder` });
  } catch (err) {
    if (err instanceof InputError) throw err;
  }
  checkWritableParent(dirname(target), path);
}

/** The nearest existing ancestor of `dir` must be a folder this process may write into. */
function checkWritableParent(dir: string, shown: string): void {
  let d = dir;
  for (;;) {
    let st;
    try {
      st = statSync(d);
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'ENOENT') throw new InputError({ file: shown, message: `expected a writable output path, found ${errnoText(err)}` });
      const up = dirname(d);
      if (up === d) return;
      d = up;
      continue;
    }
    if (!st.isDirectory()) throw new InputError({ file: shown, message: `expected a writable output path, found a file where a folder should be (${d})` });
    const probe = join(d, `.fluxlane-probe-${process.pid}-${randomBytes(4).toString('hex')}`);
    try {
      mkdirSync(probe);
      rmSync(probe, { recursive: true, force: true });
    } catch (err) {
      const what = (err as NodeJS.ErrnoException).code === 'ENOENT' ? 'a folder in which nothing can be created' : errnoText(err);
      throw new InputError({ file: shown, message: `expected a writable output path, found ${what} (${d})` });
    }
    return;
  }
}

/**
 * Write an output folder whole and swap it in place of the old one (see the banner). The folder
 * gets the marker OUTPUT_MARKER. Throws InputError (and leaves the old folder as it was) when
 * anything cannot be written.
 */
export function writeOutputFolder(folder: OutputFolder, cwd: string, env: Record<string, string | undefined> = {}): void {
  const target = resolve(cwd, folder.path);
  const shown = folder.path;
  checkOutputFolder(folder.path, cwd, folder.force ?? false);
  makeDirs(dirname(target), shown);
  cleanStaleSiblings(target);
  const staging = tempName(target, 'new');
  let old: string | null = null;
  try {
    try {
      mkdirSync(staging);
    } catch (err) {
      throw new InputError({ file: shown, message: `expected a writable output folder, found ${errnoText(err)}` });
    }
    const marker = { format: 'fluxlane-output', command: folder.command, note: 'This folder was written by fluxlane; the next run writing here replaces it whole.' };
    for (const file of [{ path: OUTPUT_MARKER, contents: `${JSON.stringify(marker, null, 2)}\n` }, ...folder.files]) {
      const full = resolve(staging, file.path);
      if (!full.startsWith(staging + '/')) throw new Error(`output file ${file.path} is outside its folder`);
      try {
        makeDirs(dirname(full), shown);
        writeFileSync(full, file.contents, { flag: 'wx' });
      } catch (err) {
        if (err instanceof InputError) throw err;
        throw new InputError({ file: `${shown}/${file.path}`, message: `expected a writable output path, found ${errnoText(err)}` });
      }
      pauseForTests(env);
    }
    if (existsSync(target)) {
      old = tempName(target, 'old');
      try {
        renameSync(target, old);
      } catch (err) {
        old = null;
        throw new InputError({ file: shown, message: `expected an output folder fluxlane may replace, found ${errnoText(err)}` });
      }
      pauseForTests(env);
    }
    try {
      renameSync(staging, target);
    } catch (err) {
      if (old !== null) renameSync(old, target);
      old = null;
      throw new InputError({ file: shown, message: `expected a writable output folder, found ${errnoText(err)}` });
    }
    pauseForTests(env);
  } finally {
    removeQuietly(staging);
    if (old !== null) removeQuietly(old);
  }
}
