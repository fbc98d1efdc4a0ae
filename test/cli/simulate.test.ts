import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { runFluxlane } from '../support/cli.js';
import { loadLayoutFile } from '../../src/layout/load.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { buildManifoldFrame } from '../../src/sim/manifold-frame.js';
import { edgeSimModel, moverEjRange } from '../../src/sim/pair-model.js';
import { simulateGate } from '../../src/sim/simulate-gate.js';
import { formatTrajectoryCsv } from '../../src/sim/trajectory.js';

const LAYOUT = 'layouts/bowline-5.yaml';
const dir = mkdtempSync(path.join(tmpdir(), 'fluxlane-sim-'));

function writeCsv(name: string, text: string): string {
  const file = path.join(dir, name);
  writeFileSync(file, text);
  return file;
}

const RAMP = (() => {
  const t: number[] = [];
  const f: number[] = [];
  for (let k = 0; k <= 16; k++) {
    t.push(k * 0.5);
    f.push(0.2 * (0.5 - 0.5 * Math.cos((Math.PI * k) / 16)));
  }
  for (let k = 1; k <= 16; k++) {
    t.push(8 + 10 + k * 0.5);
    f.push(0.2 * (0.5 - 0.5 * Math.cos((Math.PI * (16 - k)) / 16)));
  }
  return { timeNs: Float64Array.from(t), flux: Float64Array.from(f) };
})();

describe('fluxlane simulate', () => {
  it('--json prints the contract of issue 4 with the same numbers the library computes', async () => {
    const file = writeCsv('ramp.csv', formatTrajectoryCsv(RAMP));
    const r = await runFluxlane(['simulate', LAYOUT, '--edge', 'Q1-Q0', '--trajectory', file, '--json']);
    expect(r.code).toBe(0);
    const j = r.json();
    for (const key of ['conditionalPhase', 'leakage', 'fidelity', 'virtualZ', 'M', 'populations']) expect(j).toHaveProperty(key);
    expect(j.M).toHaveLength(4);
    expect(j.M[0]).toHaveLength(4);
    expect(Object.keys(j.populations).sort()).toEqual(['02', '20']);
    expect(j.fidelityNoisy).toBeUndefined();
    // the library path with the same model
    const layout = loadLayoutFile(LAYOUT, LAYOUT);
    const q1 = Transmon.fromLayout(layout.qubits.find((q) => q.id === 'Q1')!);
    const q0 = Transmon.fromLayout(layout.qubits.find((q) => q.id === 'Q0')!);
    const g = layout.couplings.find((c) => [c.a, c.b].sort().join() === 'Q0,Q1')!.gGHz;
    const model = edgeSimModel({ mover: q1, partner: q0, gGHz: g, partnerFlux: 0, moverLevels: 6, partnerLevels: 4 });
    const sim = simulateGate(buildManifoldFrame(model, moverEjRange(q1, RAMP)), RAMP);
    expect(j.conditionalPhase).toBeCloseTo(sim.conditionalPhase, 10);
    expect(j.fidelity).toBeCloseTo(sim.fidelity, 10);
    expect(j.M[3][3][0]).toBeCloseTo(sim.m.re[15], 10);
  });

  it('--noise adds fidelityNoisy below the coherent fidelity', async () => {
    const file = writeCsv('ramp2.csv', formatTrajectoryCsv(RAMP));
    const r = await runFluxlane(['simulate', LAYOUT, '--edge', 'Q1-Q0', '--trajectory', file, '--noise', '--json']);
    expect(r.code).toBe(0);
    const j = r.json();
    expect(j.fidelityNoisy).toBeLessThan(j.fidelity);
    expect(j.decoherenceEstimate).toBeGreaterThan(0);
  });

  it('a trajectory that does not return to its parking flux is bad input (exit 2, file:line:col)', async () => {
    const file = writeCsv('bad.csv', 'time_ns,flux\n0,0\n1,0.1\n2,0.05\n');
    const r = await runFluxlane(['simulate', LAYOUT, '--edge', 'Q1-Q0', '--trajectory', file]);
    expect(r.code).toBe(2);
    expect(r.err).toContain(`${file}:4:1: expected the trajectory to end at its starting (parking) flux 0, found 0.05`);
    expect(r.err).not.toMatch(/at .*\.ts:\d+/);
  });

  it('a missing trajectory file, an unknown edge and a bad --static-flux are bad input', async () => {
    expect((await runFluxlane(['simulate', LAYOUT, '--edge', 'Q1-Q0', '--trajectory', path.join(dir, 'nope.csv')])).code).toBe(2);
    const file = writeCsv('ok.csv', formatTrajectoryCsv(RAMP));
    const e = await runFluxlane(['simulate', LAYOUT, '--edge', 'Q1-Q2', '--trajectory', file]);
    expect(e.code).toBe(2);
    expect(e.err).toContain('not coupled');
    const s = await runFluxlane(['simulate', LAYOUT, '--edge', 'Q1-Q0', '--trajectory', file, '--static-flux', '0.7']);
    expect(s.code).toBe(2);
    expect(s.err).toContain('option --static-flux');
  });

  it('--help describes the command', async () => {
    const r = await runFluxlane(['simulate', '--help']);
    expect(r.code).toBe(0);
    expect(r.out).toContain('--trajectory');
  });
});
