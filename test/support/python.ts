/**
 * Run a reference Python script (NumPy / SciPy / QuTiP) from a test.
 *
 * The script reads one JSON document from stdin and prints one JSON document as the last line
 * of its stdout. We use /usr/bin/python3 (Debian's python3 with numpy, scipy and qutip) and
 * fall back to `python3` on the PATH. A missing interpreter, a missing module or a failing
 * script throws an Error with the script's stderr, so the test fails (it never skips).
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const CANDIDATES = ['/usr/bin/python3', 'python3'];

/** The interpreter used for reference scripts. */
export function pythonExecutable(): string {
  for (const c of CANDIDATES) {
    if (c.startsWith('/') ? existsSync(c) : true) return c;
  }
  return 'python3';
}

/** Absolute path of a script in test/reference/. */
export function referenceScript(name: string): string {
  return path.join(path.dirname(fileURLToPath(import.meta.url)), '..', 'reference', name);
}

/**
 * Run `script` (absolute path, or a file name in test/reference/) with `input` as JSON on stdin
 * and return the parsed JSON of the last non-empty stdout line.
 */
export function runPython<T = unknown>(script: string, input: unknown, options: { timeoutMs?: number } = {}): T {
  const file = path.isAbsolute(script) ? script : referenceScript(script);
  if (!existsSync(file)) throw new Error(`runPython: no script ${file}`);
  const exe = pythonExecutable();
  const res = spawnSync(exe, [file], {
    input: JSON.stringify(input),
    encoding: 'utf8',
    maxBuffer: 256 * 1024 * 1024,
    timeout: options.timeoutMs ?? 60_000,
    // one BLAS thread: test files run in parallel on few cores, and threaded BLAS on small
    // matrices only adds contention (unless the caller's environment says otherwise)
    env: { OMP_NUM_THREADS: '1', OPENBLAS_NUM_THREADS: '1', MKL_NUM_THREADS: '1', ...process.env },
  });
  if (res.error) throw new Error(`runPython: cannot run ${exe} ${file}: ${res.error.message}`);
  if (res.status !== 0) {
    const stderr = (res.stderr ?? '').trim();
    const missing = /ModuleNotFoundError: No module named '([^']+)'/.exec(stderr);
    if (missing) throw new Error(`runPython: ${exe} lacks the Python module '${missing[1]}' needed by ${path.basename(file)}`);
    throw new Error(`runPython: ${path.basename(file)} exited with ${res.status}:\n${stderr}`);
  }
  const lines = (res.stdout ?? '').split('\n').filter((l) => l.trim() !== '');
  if (lines.length === 0) throw new Error(`runPython: ${path.basename(file)} printed nothing`);
  return JSON.parse(lines[lines.length - 1]) as T;
}
