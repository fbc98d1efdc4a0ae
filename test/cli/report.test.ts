/**
 * `fluxlane report` (src/cli/commands/report.ts) and DIR/report.html of `fluxlane plan -o DIR`:
 * the three ways to the page give the same bytes, --json, exit codes, a missing waveform file,
 * the layout lookup of a plan file, and bad input (exit 2, one clear message, no file written).
 * The page itself is opened in chromium by test/report/browser.test.ts.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { copyFileSync, cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runFluxlane } from '../support/cli.js';

let dir: string;

beforeAll(async () => {
  // Bowline-5 planned once with CZ pulses, its layout copied beside the run folder.
  dir = mkdtempSync(join(tmpdir(), 'fluxlane-report-'));
  mkdirSync(join(dir, 'layouts'));
  copyFileSync('layouts/bowline-5.yaml', join(dir, 'layouts/bowline-5.yaml'));
  const r = await runFluxlane(['plan', 'layouts/bowline-5.yaml', '-o', 'planned'], { cwd: dir });
  expect(r.code).toBe(0);
});

describe('fluxlane report', () => {
  it('plan -o DIR writes DIR/report.html; report PLAN.json and report LAYOUT give the same bytes', async () => {
    expect(readdirSync(join(dir, 'planned'))).toContain('report.html');
    const fromDir = readFileSync(join(dir, 'planned/report.html'), 'utf8');
    const a = await runFluxlane(['report', 'planned/plan.json', '-o', 'from-plan.html', '--json'], { cwd: dir });
    expect(a.err).toBe('');
    expect(a.code).toBe(0);
    const fromPlan = readFileSync(join(dir, 'from-plan.html'), 'utf8');
    expect(fromPlan).toBe(fromDir);
    expect(a.json()).toEqual({
      ok: true, file: 'from-plan.html', bytes: statSync(join(dir, 'from-plan.html')).size, chip: 'Bowline-5', source: 'plan', layout: 'layouts/bowline-5.yaml',
      qubits: 5, edges: 4, layers: 4, violations: 0, flags: expect.any(Number), missingWaveforms: [],
    });
    const b = await runFluxlane(['report', 'layouts/bowline-5.yaml', '-o', 'out/from-layout.html'], { cwd: dir });
    expect(b.code).toBe(0);
    expect(readFileSync(join(dir, 'out/from-layout.html'), 'utf8')).toBe(fromDir);
    expect(b.out).toMatch(/^Bowline-5: report of 5 qubits, 4 couplings, 4 layers from the layout layouts\/bowline-5.yaml; CZ pulses designed\n/);
    expect(b.out).toMatch(/wrote out\/from-layout.html \(\d+ kB\)/);
    expect(b.out).toMatch(/Model estimates: verify on hardware, respect flux-line current limits/);
    // The page carries the four designed waveforms and the gates' numbers.
    const data = JSON.parse(fromDir.match(/<script type="application\/json" id="fluxlane-report-data">(.*?)<\/script>/s)![1]);
    expect(data.edges.map((e: any) => e.waveform?.timeNs.length > 2)).toEqual([true, true, true, true]);
    expect(data.pulses).toBe(true);
  });

  it('a plan whose waveform file is missing still gives a report, saying which file is missing', async () => {
    const copy = join(dir, 'copy');
    cpSync(join(dir, 'planned'), copy, { recursive: true });
    const gone = readdirSync(join(copy, 'waveforms')).filter((f) => f.endsWith('.qubit.csv')).sort()[0];
    rmSync(join(copy, 'waveforms', gone));
    const r = await runFluxlane(['report', 'copy/plan.json', '-o', 'copy.html', '--json'], { cwd: dir });
    expect(r.code).toBe(0);
    expect(r.json().missingWaveforms).toEqual([`copy/waveforms/${gone}`]);
    const html = readFileSync(join(dir, 'copy.html'), 'utf8');
    expect(html).toContain(`The waveform file copy/waveforms/${gone} was not found`);
  });

  it('finds the layout beside the plan or from the current folder, or takes --layout', async () => {
    const elsewhere = mkdtempSync(join(tmpdir(), 'fluxlane-report-cwd-'));
    const plan = join(dir, 'planned/plan.json');
    const lost = await runFluxlane(['report', plan, '-o', 'x.html'], { cwd: elsewhere });
    expect(lost.code).toBe(2);
    expect(lost.err).toMatch(/plan\.json: layout: expected the layout file "layouts\/bowline-5.yaml" beside the plan or in the current folder, found no such file; give it with --layout\n$/);
    expect(existsSync(join(elsewhere, 'x.html'))).toBe(false);
    const given = await runFluxlane(['report', plan, '--layout', resolve('layouts/bowline-5.yaml'), '-o', 'x.html'], { cwd: elsewhere });
    expect(given.code).toBe(0);
    expect(readFileSync(join(elsewhere, 'x.html'), 'utf8')).toBe(readFileSync(join(dir, 'planned/report.html'), 'utf8'));
    // Beside the plan: a plan folder that carries its layout.
    mkdirSync(join(elsewhere, 'p/layouts'), { recursive: true });
    copyFileSync(plan, join(elsewhere, 'p/plan.json'));
    copyFileSync('layouts/bowline-5.yaml', join(elsewhere, 'p/layouts/bowline-5.yaml'));
    const beside = await runFluxlane(['report', 'p/plan.json', '-o', 'y.html', '--json'], { cwd: elsewhere });
    expect(beside.code).toBe(0);
    expect(beside.json().layout).toBe('p/layouts/bowline-5.yaml');
  });

  it('bad input exits 2 with one clear message and writes no file', async () => {
    const bad = mkdtempSync(join(tmpdir(), 'fluxlane-report-bad-'));
    writeFileSync(join(bad, 'notaplan.json'), '{\n  "hello": 1\n}\n');
    writeFileSync(join(bad, 'broken.json'), '{\n  "format": "fluxlane-plan",\n  "qubits": {,\n}\n');
    writeFileSync(join(bad, 'chip.yaml'), 'chip: X\nqubits:\n  Q1:\n    pos: [0, 0]\n    fMax: 5 GHz\n    anharmonicity: -200 MHz\n    t1: 50 us\n    ejmax: 3\ncouplings: []\n');
    const plan = JSON.parse(readFileSync(join(dir, 'planned/plan.json'), 'utf8'));
    plan.edges.pop();
    writeFileSync(join(bad, 'short.json'), JSON.stringify(plan, null, 2));
    const cases: [string[], RegExp][] = [
      [['report', 'notaplan.json', '-o', 'r.html'], /^notaplan\.json:1:1: expected a plan written by fluxlane plan \(an object with "format": "fluxlane-plan"\), found format null\n$/],
      [['report', 'broken.json', '-o', 'r.html'], /^broken\.json:3:\d+: expected JSON \(a plan\.json written by fluxlane plan\), found a syntax error/],
      [['report', 'short.json', '--layout', resolve('layouts/bowline-5.yaml'), '-o', 'r.html'], /^short\.json:\d+:\d+: edges: expected an edge for every coupling of .*bowline-5\.yaml, found none for Q0-Q4\n$/],
      [['report', 'chip.yaml', '-o', 'r.html'], /^chip\.yaml:3:3: qubits\.Q1: expected one transmon model/],
      [['report', 'missing.yaml', '-o', 'r.html'], /^missing\.yaml/],
      [['report', join(dir, 'planned/plan.json'), '--seed', '3', '--no-pulses', '-o', 'r.html'], /^option --seed: expected only with a layout to plan, found it with the plan file .*\noption --no-pulses: expected only with a layout/],
      [['report', resolve('layouts/bowline-5.yaml'), '--layout', 'x.yaml', '-o', 'r.html'], /^option --layout: expected only with a plan\.json input/],
      [['report', resolve('layouts/bowline-5.yaml')], /required option '-o, --output <file>' not specified/],
    ];
    for (const [argv, message] of cases) {
      const r = await runFluxlane(argv, { cwd: bad });
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.err, argv.join(' ')).toMatch(message);
      expect(r.err).not.toMatch(/internal error|\n\s+at /);
    }
    expect(readdirSync(bad).sort()).toEqual(['broken.json', 'chip.yaml', 'notaplan.json', 'short.json']);
    const j = await runFluxlane(['report', 'notaplan.json', '-o', 'r.html', '--json'], { cwd: bad });
    expect(j.json()).toMatchObject({ ok: false, error: 'input', diagnostics: [{ file: 'notaplan.json', line: 1, column: 1 }] });
  });

  it('a plan that breaks rules gives its report and exit 1 (Reef-49, no pulses)', async () => {
    const r = await runFluxlane(['report', resolve('layouts/reef-49.yaml'), '--no-pulses', '-o', 'reef.html', '--json'], { cwd: dir });
    expect(r.code).toBe(1);
    const j = r.json();
    expect(j.ok).toBe(false);
    expect(j.violations).toBeGreaterThan(0);
    expect(j).toMatchObject({ qubits: 49, edges: 84, source: 'layout' });
    const html = readFileSync(join(dir, 'reef.html'), 'utf8');
    const data = JSON.parse(html.match(/<script type="application\/json" id="fluxlane-report-data">(.*?)<\/script>/s)![1]);
    expect(data.violations).toHaveLength(j.violations);
    expect(data.pulses).toBe(false);
    expect(data.edges.every((e: any) => e.gate === null && e.waveform === null)).toBe(true);
    expect(data.edges.filter((e: any) => e.error?.source === 'planner').length).toBeGreaterThan(0);
  });
});

