/**
 * Where the CLI reads and writes: the real process, or memory (tests). Commands never touch
 * `process` directly; they get a CliIo, so every command runs in-process in a test.
 */

export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  /** True when stderr is a terminal (progress bars are drawn only then). */
  stderrIsTTY: boolean;
  /** Folder relative paths are resolved against. */
  cwd: string;
  env: Record<string, string | undefined>;
  /** Set by the handler after each command (0 ok, 1 check failed, 2 bad input or usage, 70 internal). */
  exitCode: number;
}

export function processIo(): CliIo {
  return {
    stdout: (text) => void process.stdout.write(text),
    stderr: (text) => void process.stderr.write(text),
    stderrIsTTY: Boolean(process.stderr.isTTY),
    cwd: process.cwd(),
    env: process.env,
    exitCode: 0,
  };
}

export interface MemoryIo extends CliIo {
  out: string;
  err: string;
}

/** An io that keeps what is written (for tests and for embedding). */
export function memoryIo(options: Partial<Pick<CliIo, 'cwd' | 'env' | 'stderrIsTTY'>> = {}): MemoryIo {
  const io: MemoryIo = {
    out: '',
    err: '',
    stdout: (text) => {
      io.out += text;
    },
    stderr: (text) => {
      io.err += text;
    },
    stderrIsTTY: options.stderrIsTTY ?? false,
    cwd: options.cwd ?? process.cwd(),
    env: options.env ?? {},
    exitCode: 0,
  };
  return io;
}
