/**
 * Property tests of the whole command line (fast-check, seeded and bounded; FLUXLANE_FUZZ_SEED
 * explores other seeds, FLUXLANE_FUZZ_RUNS scales the number of cases): on random layouts, plan
 * files and trajectories every command answers with exit 0, 1 or 2, never a stack trace or an
 * internal error, never an output file when the exit code is 2; and every plan the planner
 * writes for a random chip passes `verify` (its rules and every claim recomputed), with exactly
 * the findings the planner reported.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { cpSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { parse, stringify } from 'yaml';
import { runFluxlane, type CliRun } from '../support/cli.js';

const SEED = Number(process.env.FLUXLANE_FUZZ_SEED ?? 20261202);
const SCALE = Math.max(0.1, Number(process.env.FLUXLANE_FUZZ_RUNS ?? 100) / 100);
const runs = (n: number): number => Math.max(1, Math.round(n * SCALE));

/** The answer every command owes: a known exit code, no stack trace, no internal error. */
function answered(r: CliRun, what: string): void {
  expect([0, 1, 2], `${what}\n${r.err}`).toContain(r.code);
  expect(r.err, what).not.toMatch(/internal error|\n\s+at |\bat .*\.[tj]s:\d+/);
  if (r.code === 2) expect(r.err.trim().length, what).toBeGreaterThan(0);
}

type Json = unknown;
function paths(value: Json, prefix: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  out.push(prefix);
  if (Array.isArray(value)) value.forEach((v, i) => paths(v, [...prefix, i], out));
  else if (value !== null && typeof value === 'object') for (const [k, v] of Object.entries(value)) paths(v, [...prefix, k], out);
  return out;
}
function setAt(root: any, path: (string | number)[], value: Json | undefined): void {
  if (path.length === 0) return;
  const parent = path.slice(0, -1).reduce<any>((v, k) => v[k], root);
  const key = path[path.length - 1];
  if (value === undefined) {
    if (Array.isArray(parent)) parent.splice(Number(key), 1);
    else delete parent[key];
  } else parent[key] = value;
}

const weird = fc.oneof(
  fc.constant(null), fc.boolean(), fc.double(), fc.integer(), fc.constant(Number.NaN), fc.constant(1e308), fc.constant(-0),
  fc.string({ maxLength: 8 }), fc.constant('__proto__'), fc.constant('constructor'), fc.array(fc.integer(), { maxLength: 3 }),
  fc.constantFrom('5 GHz', '20 us', '3 uPhi0', '8 kOhm', '-210 MHz', '1e300 MHz', '1e-300 s', '0.3 GHz', '50 ms', '1 PHz', '0 Hz', '100 s', '1 ns'),
);
/** A number scaled by a random factor (plausible slips: x1000, /1000, sign, zero). */
const factor = fc.constantFrom(1e-6, 1e-3, 0.1, 0.5, 0.9, 1.1, 2, 10, 1e3, 1e6, -1, 0);

describe('every command answers random input with exit 0, 1 or 2', () => {
  const work = mkdtempSync(join(tmpdir(), 'fluxlane-fuzz-'));

  it('layouts: values replaced or removed, numbers scaled (check, and plan -o into a fresh folder)', async () => {
    const sources = ['layouts/bowline-5.yaml', 'test/corpus/pair.yaml'].map((f) => readFileSync(f, 'utf8'));
    await fc.assert(
      fc.asyncProperty(
        fc.nat(),
        fc.array(fc.tuple(fc.nat(), fc.option(weird, { nil: undefined })), { maxLength: 3 }),
        fc.array(fc.tuple(fc.nat(), factor), { maxLength: 3 }),
        fc.boolean(),
        async (which, edits, scales, plan) => {
          const doc = parse(sources[which % sources.length]);
          for (const [pick, value] of edits) {
            const all = paths(doc);
            setAt(doc, all[pick % all.length], value);
          }
          let text = stringify(doc);
          for (const [pick, f] of scales) {
            const at = [...text.matchAll(/(?<=[\s[,:])-?\d+(?:\.\d+)?(?= ?(?:GHz|MHz|us|µs|μs|kOhm|uPhi0|ns))/g)];
            if (at.length === 0) break;
            const m = at[pick % at.length];
            text = text.slice(0, m.index) + String(Number(m[0]) * f) + text.slice(m.index! + m[0].length);
          }
          writeFileSync(join(work, 'fuzz.yaml'), text);
          const r = await runFluxlane(plan ? ['plan', 'fuzz.yaml', '--no-pulses', '-o', 'out', '--max-seconds', '20'] : ['check', 'fuzz.yaml', '--max-seconds', '20'], { cwd: work });
          answered(r, text);
          if (plan) {
            expect(existsSync(join(work, 'out')), 'an output folder only when the exit code is 0 or 1').toBe(r.code !== 2);
            expect(readdirSync(work).filter((e) => e.startsWith('.')), 'nothing temporary left').toEqual([]);
            rmSync(join(work, 'out'), { recursive: true, force: true }); // the next case starts without a folder
          }
        },
      ),
      { seed: SEED, numRuns: runs(80) },
    );
  }, 120_000);

  describe('plan files and their waveforms', () => {
    let planned = '';
    beforeAll(async () => {
      planned = mkdtempSync(join(tmpdir(), 'fluxlane-fuzz-plan-'));
      const r = await runFluxlane(['plan', resolve('test/corpus/pair.yaml'), '-o', 'p', '--threads', '1'], { cwd: planned });
      expect(r.code).toBe(0);
    }, 60_000);

    it('verify on plan.json with values replaced or removed, text edited, waveform samples changed', async () => {
      const layout = resolve('test/corpus/pair.yaml');
      const original = readFileSync(join(planned, 'p/plan.json'), 'utf8');
      const wave = readFileSync(join(planned, 'p/waveforms/A-B.qubit.csv'), 'utf8');
      const piece = fc.constantFrom('{', '}', '[', ']', ',', ':', '"', '\\', '\uFEFF', '\u0000', 'null', '1e999', '-', '\r', ' ', '"__proto__"');
      await fc.assert(
        fc.asyncProperty(
          fc.array(fc.tuple(fc.nat(), fc.option(weird, { nil: undefined })), { maxLength: 3 }),
          fc.array(fc.tuple(fc.nat(), piece), { maxLength: 2 }),
          fc.array(fc.tuple(fc.nat(), fc.constantFrom('t', 'x'), factor), { maxLength: 3 }),
          async (edits, inserts, waveEdits) => {
            const dir = mkdtempSync(join(work, 'plan-'));
            cpSync(join(planned, 'p'), dir, { recursive: true });
            const doc = JSON.parse(original);
            for (const [pick, value] of edits) {
              const all = paths(doc);
              setAt(doc, all[pick % all.length], value);
            }
            let text = JSON.stringify(doc, null, 2);
            for (const [at, ins] of inserts) {
              const i = at % (text.length + 1);
              text = text.slice(0, i) + ins + text.slice(i);
            }
            writeFileSync(join(dir, 'plan.json'), text);
            const rows = wave.trimEnd().split('\n');
            const first = rows.findIndex((r) => r.startsWith('time_ns')) + 1; // after the # comments and the header
            for (const [pick, col, f] of waveEdits) {
              const k = first + (pick % (rows.length - first));
              const [t, x] = rows[k].split(',').map(Number);
              rows[k] = col === 't' ? `${t * f},${x}` : `${t},${x * f}`;
            }
            writeFileSync(join(dir, 'waveforms/A-B.qubit.csv'), `${rows.join('\n')}\n`);
            answered(await runFluxlane(['verify', layout, join(dir, 'plan.json'), '--max-seconds', '20']), text.slice(0, 2000));
          },
        ),
        { seed: SEED, numRuns: runs(40) },
      );
    }, 120_000);
  });

  it('simulate on random trajectories (short, long, steep, out of range, unordered)', async () => {
    const sample = fc.tuple(fc.oneof(fc.double({ min: 0, max: 200, noNaN: true }), fc.constantFrom(1e9, 2e9, -1, 1e300)), fc.oneof(fc.double({ min: -0.5, max: 0.5, noNaN: true }), fc.constantFrom(0.7, -3, 1e-300)));
    await fc.assert(
      fc.asyncProperty(fc.array(sample, { maxLength: 8 }), fc.boolean(), fc.boolean(), async (samples, sorted, close) => {
        const list = sorted ? [...samples].sort((a, b) => a[0] - b[0]) : samples;
        const rows = list.map(([t, x]) => `${t},${x}`);
        if (close && list.length > 0) rows.push(`${Math.max(...list.map((s) => s[0])) + 5},${list[0][1]}`);
        writeFileSync(join(work, 'traj.csv'), `time_ns,flux\n${rows.join('\n')}\n`);
        answered(await runFluxlane(['simulate', resolve('test/corpus/pair.yaml'), '--edge', 'A-B', '--trajectory', 'traj.csv', '--max-seconds', '5'], { cwd: work }), rows.join(' '));
      }),
      { seed: SEED, numRuns: runs(40) },
    );
  }, 120_000);
});

/** A random small chip with plausible parameters: a chain or a star of 2 to 5 qubits. */
const chipArb = fc.record({
  n: fc.integer({ min: 2, max: 5 }),
  star: fc.boolean(),
  qubits: fc.array(
    fc.record({
      fMax: fc.double({ min: 4.6, max: 6.9, noNaN: true }),
      alpha: fc.integer({ min: 180, max: 250 }),
      asymmetry: fc.double({ min: 0.15, max: 0.6, noNaN: true }),
      t1: fc.integer({ min: 20, max: 200 }),
      fluxNoise: fc.double({ min: 1, max: 5, noNaN: true }),
    }),
    { minLength: 5, maxLength: 5 },
  ),
  g: fc.array(fc.double({ min: 6, max: 20, noNaN: true }), { minLength: 4, maxLength: 4 }),
});

type Chip = { n: number; star: boolean; qubits: { fMax: number; alpha: number; asymmetry: number; t1: number; fluxNoise: number }[]; g: number[] };

function chipYaml(c: Chip): string {
  const lines = ['chip: Fuzz', 'qubits:'];
  for (let i = 0; i < c.n; i++) {
    const q = c.qubits[i];
    lines.push(`  Q${i}: { pos: [${i}, 0], fMax: ${q.fMax.toFixed(3)} GHz, anharmonicity: -${q.alpha} MHz, asymmetry: ${q.asymmetry.toFixed(2)}, t1: ${q.t1} us, fluxNoise: ${q.fluxNoise.toFixed(1)} uPhi0 }`);
  }
  lines.push('couplings:');
  for (let i = 1; i < c.n; i++) lines.push(`  - [Q${c.star ? 0 : i - 1}, Q${i}, ${c.g[i - 1].toFixed(1)} MHz]`);
  return `${lines.join('\n')}\n`;
}

describe('every plan the planner writes passes verify', () => {
  const key = (v: any) => `${v.rule}|${v.edge ?? ''}|${v.qubits.join(',')}`;

  async function planAndVerify(yaml: string, pulses: boolean): Promise<void> {
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-fuzz-pv-'));
    writeFileSync(join(dir, 'chip.yaml'), yaml);
    const p = await runFluxlane(['plan', 'chip.yaml', '-o', 'out', '--threads', '1', ...(pulses ? [] : ['--no-pulses'])], { cwd: dir });
    answered(p, yaml);
    if (p.code === 2) return;
    const plan = JSON.parse(readFileSync(join(dir, 'out/plan.json'), 'utf8'));
    const v = await runFluxlane(['verify', 'chip.yaml', 'out/plan.json', '--json'], { cwd: dir });
    answered(v, yaml);
    const j = v.json();
    expect(j.violations.filter((x: any) => x.rule === 'plan-claim' || x.rule === 'layer-index'), yaml).toEqual([]);
    expect(j.violations.map(key).sort(), yaml).toEqual(plan.violations.map(key).sort());
    expect(v.code, yaml).toBe(p.code);
    if (pulses) expect(j.checked.waveforms).toBe(existsSync(join(dir, 'out/waveforms')) ? readdirSync(join(dir, 'out/waveforms')).filter((f) => f.endsWith('.qubit.csv')).length : 0);
  }

  it('random chains and stars, without pulses', async () => {
    await fc.assert(fc.asyncProperty(chipArb, async (c) => planAndVerify(chipYaml(c), false)), { seed: SEED, numRuns: runs(16) });
  }, 120_000);

  it('generated square and heavy-hex chips (fluxlane generate, random seeds), without pulses', async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(['square', '--rows', '3', '--cols', '3'], ['heavy-hex', '--rows', '1', '--cols', '1']), fc.integer({ min: 0, max: 1_000_000 }), async (lattice, seed) => {
        const g = await runFluxlane(['generate', ...lattice, '--seed', String(seed)]);
        expect(g.code).toBe(0);
        await planAndVerify(g.out, false);
      }),
      { seed: SEED, numRuns: runs(4) },
    );
  }, 120_000);

  it('random chains and stars, with designed pulses re-simulated', async () => {
    await fc.assert(fc.asyncProperty(chipArb.map((c) => ({ ...c, n: Math.min(c.n, 3) })), async (c) => planAndVerify(chipYaml(c), true)), { seed: SEED, numRuns: runs(4) });
  }, 180_000);
});
