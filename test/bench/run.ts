/**
 * Benchmark runner: `npm run bench` (= tsx test/bench/run.ts). Discovers every
 * test/bench/*.bench.ts, imports it, and runs each exported benchmark:
 *
 *     export const myBench: Benchmark = {
 *       name: 'what one call does',
 *       target: 20,               // optional: median time per call must stay below this (microseconds)
 *       setup() { ... },          // optional, once before timing
 *       run() { ... },            // one call; vary its inputs so nothing is cached between calls
 *     };
 *
 * A benchmark with `runs` may return a promise from run() (worker threads, child processes): each
 * call is then timed until it settles.
 *
 * Method: warm up for ~0.3 s (JIT), then time batches of calls (each batch >= ~10 ms) for
 * ~1.5 s or at least 7 batches; report the median and the minimum of the per-call times over
 * batches. Long benchmarks (whole-chip plans, seconds per call) set `runs` instead: `warmup`
 * untimed calls (default 1), then exactly `runs` timed calls, median and minimum over those; their
 * `run`, `setup` and `report` may return promises (awaited: e.g. a browser drawing a page). Arguments: substrings filter benchmarks by name or file; `--json` prints JSON;
 * `--strict` exits 1 when a median misses its target (timings on a shared machine vary ~2x, so
 * the default exit code is 0). Each file runs in a fresh Node process of its own (same loader
 * flags), so one file's heap and compiled code do not slow down the next one's.
 */
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

export interface Benchmark {
  name: string;
  /** Upper limit for the median time per call (microseconds). */
  target?: number;
  setup?: () => void | Promise<void>;
  /** One call; a promise is awaited (then `runs` must be set: fixed runs only). */
  run: () => unknown;
  /** Fixed number of timed calls (for calls that take seconds); default: adaptive batches. */
  runs?: number;
  /** Untimed calls before the timed ones when `runs` is set (default 1). */
  warmup?: number;
  /** Extra measured facts printed after the timing (accuracy, ratios to other tools ...). */
  report?: () => string | Promise<string>;
}

export interface BenchResult {
  file: string;
  name: string;
  medianUs: number;
  minUs: number;
  /** Longest call (fixed runs only: benchmarks with `runs`). */
  maxUs?: number;
  calls: number;
  target?: number;
  underTarget?: boolean;
  note?: string;
}

const WARMUP_S = 0.3;
const BUDGET_S = 1.5;
const MIN_BATCHES = 7;
const BATCH_S = 0.01;

function isBenchmark(x: unknown): x is Benchmark {
  return typeof x === 'object' && x !== null && typeof (x as Benchmark).name === 'string' && typeof (x as Benchmark).run === 'function';
}

function now(): number {
  return Number(process.hrtime.bigint()) * 1e-9;
}

let sink: unknown;

export async function measure(b: Benchmark): Promise<{ medianUs: number; minUs: number; maxUs?: number; calls: number }> {
  await b.setup?.();
  if (b.runs !== undefined) return measureFixed(b, b.runs, b.warmup ?? 1);
  // Warm-up, and a first estimate of the time per call.
  let calls = 0;
  const t0 = now();
  while (now() - t0 < WARMUP_S || calls < 3) {
    sink = b.run();
    calls++;
  }
  const perCall = (now() - t0) / calls;
  const batch = Math.max(1, Math.ceil(BATCH_S / perCall));
  const samples: number[] = [];
  let total = 0;
  const start = now();
  while (samples.length < MIN_BATCHES || now() - start < BUDGET_S) {
    const s = now();
    for (let i = 0; i < batch; i++) sink = b.run();
    samples.push((now() - s) / batch);
    total += batch;
    if (samples.length >= 200) break;
  }
  samples.sort((x, y) => x - y);
  const mid = samples.length >> 1;
  const median = samples.length % 2 ? samples[mid] : 0.5 * (samples[mid - 1] + samples[mid]);
  return { medianUs: median * 1e6, minUs: samples[0] * 1e6, calls: total };
}

/** `warmup` untimed calls, then `runs` timed calls one by one (a returned promise is awaited). */
async function measureFixed(b: Benchmark, runs: number, warmup: number): Promise<{ medianUs: number; minUs: number; maxUs: number; calls: number }> {
  for (let i = 0; i < warmup; i++) sink = await b.run();
  const samples: number[] = [];
  for (let i = 0; i < Math.max(1, runs); i++) {
    const s = now();
    sink = await b.run();
    samples.push(now() - s);
  }
  samples.sort((x, y) => x - y);
  const mid = samples.length >> 1;
  const median = samples.length % 2 ? samples[mid] : 0.5 * (samples[mid - 1] + samples[mid]);
  return { medianUs: median * 1e6, minUs: samples[0] * 1e6, maxUs: samples[samples.length - 1] * 1e6, calls: samples.length };
}

function formatUs(us: number): string {
  if (us >= 1e6) return `${(us / 1e6).toFixed(2)} s`;
  if (us >= 1e3) return `${(us / 1e3).toFixed(2)} ms`;
  return `${us.toFixed(2)} us`;
}

const CHILD_FLAG = '--one-file';

async function runFile(dir: string, file: string, filters: string[]): Promise<BenchResult[]> {
  const mod = (await import(pathToFileURL(join(dir, file)).href)) as Record<string, unknown>;
  const results: BenchResult[] = [];
  for (const b of Object.values(mod).filter(isBenchmark)) {
    if (filters.length > 0 && !filters.some((f) => b.name.includes(f) || file.includes(f))) continue;
    const m = await measure(b);
    const r: BenchResult = { file, name: b.name, ...m };
    if (b.target !== undefined) {
      r.target = b.target;
      r.underTarget = m.medianUs < b.target;
    }
    if (b.report) r.note = await b.report();
    results.push(r);
  }
  return results;
}

function printResult(r: BenchResult): void {
  const verdict = r.target === undefined ? '' : `  target < ${formatUs(r.target)}: ${r.underTarget ? 'ok' : 'MISSED'}`;
  const max = r.maxUs !== undefined && r.calls > 1 ? `  max ${formatUs(r.maxUs)}` : '';
  process.stdout.write(`${r.file}  ${r.name}\n    median ${formatUs(r.medianUs)}  min ${formatUs(r.minUs)}${max}  (${r.calls} calls)${verdict}\n`);
  if (r.note) process.stdout.write(`    ${r.note}\n`);
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const json = args.includes('--json');
  const strict = args.includes('--strict');
  const dir = dirname(fileURLToPath(import.meta.url));
  const child = args.indexOf(CHILD_FLAG);
  if (child >= 0) {
    // one file, results as JSON on stdout for the parent
    const filters = args.filter((a, i) => !a.startsWith('--') && i !== child + 1);
    process.stdout.write(`${JSON.stringify(await runFile(dir, args[child + 1], filters))}\n`);
    return;
  }
  const filters = args.filter((a) => !a.startsWith('--'));
  const files = readdirSync(dir)
    .filter((f) => f.endsWith('.bench.ts'))
    .sort();
  const results: BenchResult[] = [];
  for (const file of files) {
    const out = spawnSync(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), CHILD_FLAG, file, ...filters], {
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'inherit'],
      maxBuffer: 64 * 1024 * 1024,
    });
    if (out.status !== 0) throw new Error(`benchmark file ${file} failed (exit ${out.status})`);
    const lines = out.stdout.split('\n').filter((l) => l.trim() !== '');
    const mine = JSON.parse(lines[lines.length - 1]) as BenchResult[];
    results.push(...mine);
    if (!json) mine.forEach(printResult);
  }
  if (json) process.stdout.write(`${JSON.stringify({ node: process.version, results }, null, 2)}\n`);
  if (void sink, strict && results.some((r) => r.underTarget === false)) process.exitCode = 1;
}

const invokedDirectly = process.argv[1] !== undefined && fileURLToPath(import.meta.url) === process.argv[1];
if (invokedDirectly) await main();
