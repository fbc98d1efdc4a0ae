/**
 * The command's last step: end the process as soon as stdout and stderr have taken everything
 * written to them, instead of letting Node wind down by itself.
 *
 * Why: when the event loop runs dry, Node tears its JavaScript heap down page by page before the
 * process ends (one munmap per 256 kB page, some 600 for a 1,024-qubit `check`). Measured from
 * the last write to stdout to the end of the process, that took 148-254 ms; with process.exit,
 * which ends the process without the teardown, 32 ms (DEVELOPERS.md, Performance log, twelfth
 * round). Nothing is left to do at that point: every command has written its files and stopped
 * its worker threads before its promise settles.
 *
 * Flushing: a stream's write callback runs once the data before it has been handed to the
 * operating system (writes on one stream complete in order), so an empty write with a callback on
 * each stream says when all is out, on every platform (on Linux, writes to files and pipes are
 * synchronous anyway; on others, pipes are not). A write that fails (the reader went away) counts
 * as done.
 */

/** What exitWhenFlushed needs of a stream (process.stdout and process.stderr have it). */
export interface FlushableStream {
  write(chunk: string, callback: (err?: Error | null) => void): boolean;
}

/** Call `exit(code)` once every stream has flushed what was written to it before this call. */
export function exitWhenFlushed(
  code: number,
  streams: readonly FlushableStream[] = [process.stdout, process.stderr],
  exit: (code: number) => void = (c) => process.exit(c),
): void {
  let pending = streams.length;
  if (pending === 0) {
    exit(code);
    return;
  }
  const done = () => {
    if (--pending === 0) exit(code);
  };
  for (const s of streams) {
    try {
      s.write('', done);
    } catch {
      done();
    }
  }
}
