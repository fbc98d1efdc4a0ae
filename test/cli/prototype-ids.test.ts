/**
 * Qubit ids that name members of Object.prototype (`__proto__`, `constructor`, `valueOf`,
 * `toString`, `hasOwnProperty`) are ordinary ids in every command: no internal error, and the
 * JSON output holds each of them as a key (test/corpus/layout/prototype-ids.yaml, a chain).
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runFluxlane } from '../support/cli.js';

const LAYOUT = resolve('test/corpus/layout/prototype-ids.yaml');
const IDS = ['__proto__', 'constructor', 'valueOf', 'toString', 'hasOwnProperty'];

describe('qubit ids named like Object.prototype members', () => {
  it('plan with pulses writes every id as a key, and verify recomputes that plan', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-proto-'));
    const p = await runFluxlane(['plan', LAYOUT, '-o', 'out', '--threads', '1'], { cwd: dir });
    expect(p.err).toBe('');
    expect([0, 1]).toContain(p.code);
    const plan = JSON.parse(readFileSync(join(dir, 'out/plan.json'), 'utf8'));
    expect(Object.keys(plan.qubits)).toEqual(IDS);
    for (const q of IDS) expect(plan.qubits[q].parkingFrequency).toBeGreaterThan(1e9);
    expect(plan.edges.map((e: any) => e.qubits.join('-'))).toEqual(['__proto__-constructor', 'constructor-valueOf', 'valueOf-toString', 'toString-hasOwnProperty']);
    const v = await runFluxlane(['verify', LAYOUT, join(dir, 'out/plan.json'), '--json']);
    expect(v.err).toBe('');
    expect(v.code).toBe(p.code);
    expect(v.json().checked.waveforms).toBe(plan.edges.filter((e: any) => e.gate?.waveform).length);
    // a plan that lacks the qubit "__proto__" is refused as such, not mistaken for one that has it
    delete plan.qubits.__proto__;
    writeFileSync(join(dir, 'out/plan.json'), JSON.stringify(plan));
    const missing = await runFluxlane(['verify', LAYOUT, join(dir, 'out/plan.json')]);
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/found none for __proto__/);
  }, 60_000);

  it('check, spectrum, pair, gate and simulate take them as ids', async () => {
    const check = await runFluxlane(['check', LAYOUT, '--json']);
    expect([0, 1]).toContain(check.code);
    expect(Object.keys(check.json().parking)).toEqual(IDS);
    const spectrum = await runFluxlane(['spectrum', LAYOUT, '--qubit', 'constructor', '--points', '3', '--json']);
    expect(spectrum.code).toBe(0);
    expect(spectrum.json().qubit).toBe('constructor');
    const pair = await runFluxlane(['pair', LAYOUT, '--edge', 'valueOf-toString', '--json']);
    expect(pair.code).toBe(0);
    expect(Object.keys(pair.json().f01)).toEqual(['valueOf', 'toString']);
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-proto-'));
    const gate = await runFluxlane(['gate', LAYOUT, '--edge', '__proto__-constructor', '--waveform', 'w.csv', '--json'], { cwd: dir });
    expect(gate.err).toBe('');
    expect(gate.json().edge).toEqual(['__proto__', 'constructor']);
    if (gate.code === 0) {
      const sim = await runFluxlane(['simulate', LAYOUT, '--edge', '__proto__-constructor', '--trajectory', 'w.csv', '--spectator', 'valueOf', '--json'], { cwd: dir });
      expect(sim.code).toBe(0);
      expect(sim.json().spectators).toEqual(['valueOf']);
    }
  }, 60_000);
});
