/**
 * `fluxlane verify` (src/cli/commands/verify.ts, src/plan/verify.ts): every plan the planner
 * writes passes; a plan with one parking frequency moved onto a collision fails naming the rule;
 * bad files exit 2 with file:line:column.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runFluxlane } from '../support/cli.js';

const DEMOS = ['layouts/bowline-5.yaml', 'layouts/clove-17.yaml', 'layouts/hitch-30.yaml', 'layouts/reef-49.yaml'];

async function planned(file: string): Promise<{ dir: string; path: string; plan: any; code: number }> {
  const dir = mkdtempSync(join(tmpdir(), 'fluxlane-verify-'));
  const r = await runFluxlane(['plan', resolve(file), '--no-pulses', '-o', 'out'], { cwd: dir });
  const path = join(dir, 'out/plan.json');
  return { dir, path, plan: JSON.parse(readFileSync(path, 'utf8')), code: r.code };
}

describe('fluxlane verify', () => {
  it.each(DEMOS)('recomputes the plan of %s and finds exactly what the planner found', async (file) => {
    const { path, plan, code } = await planned(file);
    const r = await runFluxlane(['verify', file, path, '--json']);
    const j = r.json();
    expect(r.code).toBe(code);
    expect(j.ok).toBe(plan.ok);
    const key = (v: any) => `${v.rule}|${v.edge ?? ''}|${v.qubits.join(',')}`;
    expect(j.violations.map(key).sort()).toEqual(plan.violations.map(key).sort());
    expect(j.flags.map(key).sort()).toEqual(plan.flags.map(key).sort());
    expect(j.checked.edges).toBe(plan.edges.length);
  });

  it('a plan with one parking frequency moved onto a collision fails, naming the rule and the qubits', async () => {
    const { path, plan } = await planned('layouts/clove-17.yaml');
    // X1 and X3 share D2: put them 5 MHz apart (next-nearest neighbours need 30 MHz), both inside their ranges.
    plan.qubits.X1.parkingFrequency = 5.2e9;
    plan.qubits.X3.parkingFrequency = 5.205e9;
    writeFileSync(path, JSON.stringify(plan, null, 2));
    const r = await runFluxlane(['verify', 'layouts/clove-17.yaml', path, '--json']);
    expect(r.code).toBe(1);
    const j = r.json();
    expect(j.ok).toBe(false);
    const v = j.violations.find((x: any) => x.rule === 'next-01-01');
    expect(v).toMatchObject({ qubits: ['X1', 'X3'], threshold: 3e7, unit: 'Hz' });
    expect(v.value).toBeCloseTo(5e6, 0);
    // The gates whose partner moved no longer sit on their crossing.
    expect(j.violations.some((x: any) => x.rule === 'cz-crossing')).toBe(true);
    const text = await runFluxlane(['verify', 'layouts/clove-17.yaml', path]);
    expect(text.out).toMatch(/violation \[next-01-01\] X1, X3: X1 \(5\.\d{3} GHz\) and X3 \(5\.\d{3} GHz\) share D2 and are 5\.0 MHz apart; next-nearest neighbours need 30\.0 MHz/);
    expect(text.out).toMatch(/FAILED: the plan breaks \d+ rule condition\(s\)/);
  });

  it('two gates that conflict put in one layer fail with layer-conflict', async () => {
    const { path, plan } = await planned('layouts/bowline-5.yaml');
    for (const e of plan.edges) e.layer = 0; // every gate of the star touches Q0
    writeFileSync(path, JSON.stringify(plan));
    const j = (await runFluxlane(['verify', 'layouts/bowline-5.yaml', path, '--json'])).json();
    expect(j.violations.filter((v: any) => v.rule === 'layer-conflict')).toHaveLength(6); // C(4, 2)
  });

  it('a JSON syntax error exits 2 with file:line:column', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-verify-'));
    writeFileSync(join(dir, 'plan.json'), '{\n  "format": "fluxlane-plan",\n  "version": 1,\n  "qubits": { , }\n}\n');
    const r = await runFluxlane(['verify', resolve('layouts/bowline-5.yaml'), 'plan.json'], { cwd: dir });
    expect(r.code).toBe(2);
    expect(r.err).toBe('plan.json:4:15: JSON syntax: expected a key in double quotes, found ","\n');
  });

  it('schema problems exit 2 with the position and path of each, and a plan for another chip is refused', async () => {
    const { dir, path, plan } = await planned('layouts/bowline-5.yaml');
    writeFileSync(join(dir, 'intact.json'), JSON.stringify(plan));
    delete plan.qubits.Q2.parkingFrequency;
    plan.edges[1].crossing = '11-21';
    writeFileSync(path, JSON.stringify(plan, null, 2));
    const r = await runFluxlane(['verify', 'layouts/bowline-5.yaml', path]);
    expect(r.code).toBe(2);
    const lines = r.err.trimEnd().split('\n');
    expect(lines.some((l) => /plan\.json:\d+:\d+: qubits\.Q2: missing key "parkingFrequency": expected a parking frequency in Hz \(a positive number\)$/.test(l))).toBe(true);
    expect(lines.some((l) => /plan\.json:\d+:\d+: edges\[1\]\.crossing: expected "11-20" or "11-02", found "11-21"/.test(l))).toBe(true);
    const other = await runFluxlane(['verify', 'layouts/clove-17.yaml', join(dir, 'intact.json')]);
    expect(other.code).toBe(2);
    expect(other.err).toMatch(/expected a parking frequency for every qubit of layouts\/clove-17\.yaml, found none for D1/);
    const missing = await runFluxlane(['verify', 'layouts/bowline-5.yaml', 'no/such/plan.json']);
    expect(missing.code).toBe(2);
    expect(missing.err).toBe('no/such/plan.json: expected a readable plan file, found no such file\n');
  });
});
