/**
 * The bad-input corpus (test/corpus/): one file per case with its expected outcome beside it.
 *
 *   test/corpus/<kind>/<case>.<yaml|json|csv>   the input (kinds: layout, plan, trajectory)
 *   test/corpus/<kind>/<case>.expected          how fluxlane must answer it
 *   test/corpus/options/<case>.expected         a command line alone
 *
 * An .expected file starts with header lines, then the exact stderr lines:
 *
 *   # run: check {input}          the command line ({input}: the case's input file)
 *   # exit: 2                     the exit code
 *   # stderr: contains            (optional) the lines below must appear; default: stderr is exactly them
 *   # stdout: <text>              (optional, repeatable) stdout must contain the text
 *   # no-position: <why>          (optional) a message about the file may lack line:column
 *
 * Every case is run in-process (runFluxlane) and must also: print no stack trace and no internal
 * error; with exit 2 leave no output file behind; give every message about the input file a
 * line:column unless the case says why not; and put every warning under "warnings" in --json.
 */
import { describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runFluxlane } from '../support/cli.js';

const ROOT = 'test/corpus';
const KINDS = ['layout', 'plan', 'trajectory', 'options'] as const;

interface Case {
  kind: string;
  name: string;
  input: string | null;
  argv: string[];
  exit: number;
  contains: boolean;
  stdout: string[];
  noPosition: boolean;
  lines: string[];
}

function readCase(kind: string, expectedFile: string): Case {
  const name = expectedFile.replace(/\.expected$/, '');
  const inputName = readdirSync(join(ROOT, kind)).find((f) => f.startsWith(`${name}.`) && !f.endsWith('.expected'));
  const input = inputName ? join(ROOT, kind, inputName) : null;
  const text = readFileSync(join(ROOT, kind, expectedFile), 'utf8');
  const c: Case = { kind, name, input, argv: [], exit: -1, contains: false, stdout: [], noPosition: false, lines: [] };
  for (const line of text.replace(/\n$/, '').split('\n')) {
    const h = /^# (run|exit|stderr|stdout|no-position): ?(.*)$/.exec(line);
    if (!h) {
      c.lines.push(line.replaceAll('{input}', input ?? ''));
      continue;
    }
    if (h[1] === 'run') c.argv = h[2].split(' ').filter(Boolean).map((a) => a.replaceAll('{input}', input ?? ''));
    else if (h[1] === 'exit') c.exit = Number(h[2]);
    else if (h[1] === 'stderr') c.contains = h[2] === 'contains';
    else if (h[1] === 'stdout') c.stdout.push(h[2]);
    else c.noPosition = true;
  }
  return c;
}

const CASES: Case[] = KINDS.flatMap((kind) =>
  readdirSync(join(ROOT, kind)).filter((f) => f.endsWith('.expected')).sort().map((f) => readCase(kind, f)),
);

/** Output paths named on a command line, and what is there now. */
function outputsOf(argv: string[]): { path: string; before: string }[] {
  const out: { path: string; before: string }[] = [];
  argv.forEach((a, i) => {
    if (['-o', '--output', '--output-dir', '--waveform'].includes(a) && argv[i + 1]) out.push({ path: argv[i + 1], before: describePath(argv[i + 1]) });
  });
  return out;
}

function describePath(p: string): string {
  if (!existsSync(p)) return 'absent';
  const st = statSync(p);
  return st.isDirectory() ? `folder: ${readdirSync(p).sort().join(', ')}` : `file of ${st.size} bytes, ${st.mtimeMs}`;
}

describe('the bad-input corpus: every case answered as expected', () => {
  it('has cases of every kind, each with its input', () => {
    for (const kind of KINDS) expect(CASES.filter((c) => c.kind === kind).length, kind).toBeGreaterThanOrEqual(8);
    for (const c of CASES) {
      expect(c.argv.length, `${c.kind}/${c.name}: # run`).toBeGreaterThan(0);
      expect(c.exit, `${c.kind}/${c.name}: # exit`).toBeGreaterThanOrEqual(0);
      if (c.kind !== 'options') expect(c.input, `${c.kind}/${c.name}: input file`).not.toBeNull();
    }
  });

  it.each(CASES.map((c) => [`${c.kind}/${c.name}`, c] as const))('%s', async (_, c) => {
    const outputs = outputsOf(c.argv);
    const r = await runFluxlane(c.argv);
    const err = r.err.replace(/\n$/, '').split('\n').filter((l) => l !== '');
    expect(r.err).not.toMatch(/internal error|\n\s+at |\bat .*\.ts:\d+/);
    expect(r.code, r.err).toBe(c.exit);
    if (c.contains) for (const line of c.lines) expect(err).toContain(line);
    else expect(err).toEqual(c.lines);
    for (const s of c.stdout) expect(r.out).toContain(s);
    if (c.exit === 2) for (const o of outputs) expect(describePath(o.path), `output ${o.path}`).toBe(o.before);
    if (c.input && !c.noPosition) {
      for (const line of err.filter((l) => l.startsWith(`${c.input}:`))) expect(line, 'a position').toMatch(/^[^:]+:\d+:\d+: /);
    }
    const warnings = err.filter((l) => l.includes(': warning: '));
    if (warnings.length > 0) {
      const j = await runFluxlane([...c.argv, '--json']);
      expect(j.code).toBe(c.exit);
      const listed = (j.json().warnings as { message: string }[]).map((w) => w.message);
      for (const w of warnings) expect(listed).toContain(w.slice(w.indexOf('warning: ')));
    }
  }, 60_000);
});

describe('a case too large to keep as a file', () => {
  it('check of a generated 10,000-qubit chip is refused up front with its estimate (it took 391 s and 2 GB)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-corpus-'));
    expect((await runFluxlane(['generate', 'square', '--rows', '100', '--cols', '100', '-o', 'big.yaml'], { cwd: dir })).code).toBe(0);
    const started = Date.now();
    const r = await runFluxlane(['check', 'big.yaml'], { cwd: dir });
    expect(r.code).toBe(2);
    expect(r.err).toBe('check: expected work of at most 300 s (--max-seconds), found an estimated 750 s for planning 10000 qubits and 19800 couplings; pass --max-seconds 1125 to run it anyway\n');
    expect(Date.now() - started).toBeLessThan(30_000); // the layout is read (about 4 s here), nothing more
  }, 60_000);
});
