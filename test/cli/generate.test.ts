import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runFluxlane } from '../support/cli.js';
import { parseLayoutText } from '../../src/layout/load.js';

const tmp = () => mkdtempSync(join(tmpdir(), 'fluxlane-gen-'));

describe('fluxlane generate', () => {
  it('generate square --rows 3 --cols 4 -o FILE writes a layout the parser accepts', async () => {
    const dir = tmp();
    const r = await runFluxlane(['generate', 'square', '--rows', '3', '--cols', '4', '-o', 'g.yaml'], { cwd: dir });
    expect(r.code).toBe(0);
    expect(r.out).toBe('wrote g.yaml: square-3x4-seed1, 12 qubits, 17 couplings\n');
    const layout = parseLayoutText(readFileSync(join(dir, 'g.yaml'), 'utf8'), 'g.yaml');
    expect(layout.qubits).toHaveLength(12);
    expect(layout.couplings).toHaveLength(3 * 3 + 2 * 4);
    expect(readdirSync(dir)).toEqual(['g.yaml']); // no temporary file left behind
  });

  it('without -o prints the layout; with --json it is in "layout" and counts are numbers', async () => {
    const r = await runFluxlane(['generate', 'heavy-hex', '--rows', '1', '--cols', '2']);
    expect(r.code).toBe(0);
    expect(parseLayoutText(r.out, 'stdout').qubits).toHaveLength(21);
    const j = (await runFluxlane(['generate', 'heavy-hex', '--rows', '1', '--cols', '2', '--json'])).json();
    expect(j).toMatchObject({ lattice: 'heavy-hex', rows: 1, cols: 2, seed: 1, groups: 2, qubits: 21, couplings: 22, output: null });
    expect(j.layout).toBe(r.out);
  });

  it('the same seed gives a byte-identical file; another seed a different one', async () => {
    const dir = tmp();
    for (const [name, seed] of [['a.yaml', '7'], ['b.yaml', '7'], ['c.yaml', '8']]) {
      const r = await runFluxlane(['generate', 'square', '--rows', '6', '--cols', '5', '--seed', seed, '-o', name], { cwd: dir });
      expect(r.code).toBe(0);
    }
    const [a, b, c] = ['a.yaml', 'b.yaml', 'c.yaml'].map((f) => readFileSync(join(dir, f)));
    expect(a.equals(b)).toBe(true);
    expect(a.equals(c)).toBe(false);
  });

  it('--name and --groups reach the file', async () => {
    const r = await runFluxlane(['generate', 'square', '--rows', '2', '--cols', '2', '--name', 'Test chip', '--groups', '3']);
    const layout = parseLayoutText(r.out, 'x');
    expect(layout.chip).toBe('Test chip');
    expect(r.out).toMatch(/^# Synthetic square chip made by fluxlane generate square --rows 2 --cols 2 --seed 1 --groups 3 --name "Test chip"\./);
  });

  it.each([
    ['square', '5', '5', 25],
    ['square', '10', '10', 100],
    ['heavy-hex', '3', '3', 68],
  ])('a generated %s %s x %s chip with the default options plans with every rule holding, the error ceilings included', async (kind, rows, cols, qubits) => {
    const dir = tmp();
    expect((await runFluxlane(['generate', kind, '--rows', rows, '--cols', cols, '-o', 'g.yaml'], { cwd: dir })).code).toBe(0);
    const r = await runFluxlane(['check', 'g.yaml', '--json'], { cwd: dir });
    const j = r.json();
    // src/chip/generate.ts: the defaults are chosen so that the nominal plan holds every rule
    // (gate-error 1 %, idle-error 2 % per cycle: README "What ok means")
    expect(j.violations.map((v: any) => v.message)).toEqual([]);
    expect(j.ok).toBe(true);
    expect(r.code).toBe(0);
    for (const e of j.edges) expect(e.predictedError).toBeLessThan(0.01);
    for (const q of Object.values(j.parking) as any[]) expect(q.idleError).toBeLessThan(0.02);
    expect(j.summary.qubits).toBe(qubits);
  });

  it.each([
    [['generate', 'square', '--rows', '0', '--cols', '3'], 'option --rows: expected an integer from 1 to 500, found "0"\n'],
    [['generate', 'square', '--rows', '2', '--cols', 'x'], 'option --cols: expected an integer from 1 to 500, found "x"\n'],
    [['generate', 'square', '--rows', '2', '--cols', '2', '--seed', '-1'], 'option --seed: expected an integer from 0 to 4294967295, found "-1"\n'],
    [['generate', 'square', '--rows', '500', '--cols', '500'], 'options --rows and --cols: expected at most 20000 cells in all, found 500 x 500 = 250000\n'],
  ])('bad option values exit 2 with a message naming the option: %j', async (argv, message) => {
    const r = await runFluxlane(argv);
    expect(r.code).toBe(2);
    expect(r.err).toBe(message);
    expect(r.out).toBe('');
  });

  it('an unknown lattice or a missing required option is a usage error (exit 2, commander message)', async () => {
    const hex = await runFluxlane(['generate', 'hex', '--rows', '2', '--cols', '2']);
    expect(hex.code).toBe(2);
    expect(hex.err).toMatch(/error: command-argument value 'hex' is invalid for argument 'lattice'/);
    const missing = await runFluxlane(['generate', 'square', '--rows', '2']);
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/error: required option '--cols <n>' not specified/);
  });

  it('an output path in a missing folder is created; a path through a file exits 2 and leaves nothing', async () => {
    const dir = tmp();
    const ok = await runFluxlane(['generate', 'square', '--rows', '2', '--cols', '2', '-o', 'sub/dir/g.yaml'], { cwd: dir });
    expect(ok.code).toBe(0);
    expect(readFileSync(join(dir, 'sub/dir/g.yaml'), 'utf8')).toMatch(/^# Synthetic square chip/);
    const bad = await runFluxlane(['generate', 'square', '--rows', '2', '--cols', '2', '-o', 'sub/dir/g.yaml/x.yaml'], { cwd: dir });
    expect(bad.code).toBe(2);
    expect(bad.err).toBe(`sub/dir/g.yaml/x.yaml: expected a writable output path, found a file where a folder should be (${join(dir, 'sub/dir/g.yaml')})\n`);
    expect(readdirSync(join(dir, 'sub/dir'))).toEqual(['g.yaml']);
  });
});
