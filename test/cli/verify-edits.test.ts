/**
 * `fluxlane verify` against a demo plan with designed pulses, edited by hand in each way that
 * once passed unnoticed: every edit is caught (exit 1) and the message names the claim that does
 * not hold. The unedited plan passes (exit 0).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { cpSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runFluxlane } from '../support/cli.js';

const LAYOUT = resolve('layouts/bowline-5.yaml');
let planned = '';

beforeAll(async () => {
  planned = mkdtempSync(join(tmpdir(), 'fluxlane-edits-'));
  const r = await runFluxlane(['plan', LAYOUT, '-o', 'plan', '--threads', '1'], { cwd: planned });
  expect(r.code).toBe(0);
}, 60_000);

/** A copy of the planned folder with `edit` applied; returns verify's outcome. */
async function verifyEdited(edit: (dir: string, plan: any) => void): Promise<{ code: number; json: any; out: string }> {
  const dir = mkdtempSync(join(tmpdir(), 'fluxlane-edit-'));
  cpSync(join(planned, 'plan'), dir, { recursive: true });
  const plan = JSON.parse(readFileSync(join(dir, 'plan.json'), 'utf8'));
  edit(dir, plan);
  writeFileSync(join(dir, 'plan.json'), JSON.stringify(plan, null, 2));
  const r = await runFluxlane(['verify', LAYOUT, join(dir, 'plan.json'), '--json']);
  const text = await runFluxlane(['verify', LAYOUT, join(dir, 'plan.json')]);
  expect(r.err).toBe('');
  return { code: r.code, json: r.json(), out: text.out };
}

/** Rewrite a waveform file sample by sample. */
function editWaveform(dir: string, file: string, f: (t: number, x: number) => [number, number]): void {
  const path = join(dir, file);
  // comment lines (#) and the header stay; each sample row is rewritten
  const lines = readFileSync(path, 'utf8').trimEnd().split('\n');
  const out = lines.map((r) => (r.startsWith('#') || r.startsWith('time_ns') ? r : f(...(r.split(',').map(Number) as [number, number])).join(',')));
  writeFileSync(path, `${out.join('\n')}\n`);
}

const claims = (j: any): string[] => j.violations.filter((v: any) => v.rule === 'plan-claim').map((v: any) => v.details.claim);
const rules = (j: any): string[] => j.violations.map((v: any) => v.rule);

describe('fluxlane verify catches hand edits of a plan with pulses', () => {
  it('the plan as written holds, with every gate re-simulated', async () => {
    const r = await verifyEdited(() => {});
    expect(r.code).toBe(0);
    expect(r.json.checked.waveforms).toBe(4);
    expect(r.json.checked.claims).toBeGreaterThan(80);
  });

  it('a plan designed for pi/2 with a spectator simulated re-simulates on the same model and holds', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-edits-'));
    const p = await runFluxlane(['plan', LAYOUT, '-o', 'p', '--phase', 'pi/2', '--spectators', '--threads', '1'], { cwd: dir });
    expect(p.code).toBe(0);
    const plan = JSON.parse(readFileSync(join(dir, 'p/plan.json'), 'utf8'));
    expect(plan.edges[0].gate.targetPhase).toBeCloseTo(Math.PI / 2, 10); // 12 significant digits in plan.json
    expect(plan.edges[0].gate.simulatedSpectators).toHaveLength(1);
    const v = await runFluxlane(['verify', LAYOUT, join(dir, 'p/plan.json'), '--json']);
    expect(v.code).toBe(0);
    // without the record of the spectator the re-simulation differs from the claims
    delete plan.edges[0].gate.simulatedSpectators;
    writeFileSync(join(dir, 'p/plan.json'), JSON.stringify(plan));
    const w = await runFluxlane(['verify', LAYOUT, join(dir, 'p/plan.json'), '--json']);
    expect(w.code).toBe(1);
    expect(claims(w.json()).some((c) => c.startsWith('edges[0].gate.'))).toBe(true);
  }, 60_000);

  it.each([50e6, 500e6])('an interaction frequency moved by %d Hz', async (shift) => {
    const r = await verifyEdited((_, plan) => {
      plan.edges[0].interactionFrequency += shift;
      plan.edges[0].gate.interactionFrequency += shift;
    });
    expect(r.code).toBe(1);
    expect(claims(r.json)).toEqual(expect.arrayContaining(['edges[0].interactionFrequency', 'edges[0].gate.interactionFrequency']));
    expect(r.out).toMatch(/edges\[0\]\.interactionFrequency \(.*plan\.json:\d+:\d+\): the plan claims interaction frequency \d\.\d{6} GHz; the waveform's plateau gives \d\.\d{6} GHz/);
  });

  it('a waveform flattened to zero flux', async () => {
    const r = await verifyEdited((dir) => {
      editWaveform(dir, 'waveforms/Q0-Q1.qubit.csv', (t) => [t, 0]); // Q1 parks at its sweet spot, flux 0
      editWaveform(dir, 'waveforms/Q0-Q4.qubit.csv', (t) => [t, 0]); // Q4 parks at 6.45 GHz, flux 0.094
    });
    expect(r.code).toBe(1);
    const c = claims(r.json);
    expect(c).toEqual(expect.arrayContaining(['edges[0].gate.interactionFrequency', 'edges[0].gate.conditionalPhase', 'edges[0].gate.fidelity']));
    expect(c).toContain('qubits.Q4.parkingFrequency'); // the flattened Q4 waveform no longer starts at its parking point
  });

  it('a waveform stretched 5x in time', async () => {
    let duration = NaN;
    const r = await verifyEdited((dir, plan) => {
      duration = plan.edges[1].gate.duration;
      editWaveform(dir, 'waveforms/Q0-Q2.qubit.csv', (t, x) => [5 * t, x]);
    });
    expect(r.code).toBe(1);
    const d = r.json.violations.find((v: any) => v.rule === 'cz-duration');
    expect(d.edge).toBe('Q0-Q2');
    expect(d.value).toBeCloseTo(5 * duration, 12); // the samples' duration, against maxGate 80 ns
    expect(claims(r.json)).toEqual(expect.arrayContaining(['edges[1].gate.duration', 'edges[1].slotDuration', 'edges[1].gate.conditionalPhase']));
  });

  it('a waveform scaled 1.25x in flux', async () => {
    const r = await verifyEdited((dir) => editWaveform(dir, 'waveforms/Q0-Q3.qubit.csv', (t, x) => [t, 1.25 * x]));
    expect(r.code).toBe(1);
    expect(claims(r.json)).toEqual(expect.arrayContaining(['edges[2].interactionFrequency', 'edges[2].moverInteractionFlux', 'edges[2].gate.fidelity', 'edges[2].gate.leakage']));
  });

  it('a gate fidelity edited to 0.2', async () => {
    const r = await verifyEdited((_, plan) => {
      plan.edges[3].gate.fidelity = 0.2;
    });
    expect(r.code).toBe(1);
    expect(claims(r.json)).toEqual(['edges[3].gate.fidelity']);
    expect(r.out).toMatch(/edges\[3\]\.gate\.fidelity \(.*plan\.json:\d+:\d+\): the plan claims coherent fidelity 0\.2; the waveform re-simulated gives 0\.9999\d+ \(tolerance 1e-7\)/);
  });

  it('layers[] rewritten to put every gate in one layer', async () => {
    const r = await verifyEdited((_, plan) => {
      plan.layers = [{ index: 0, edges: plan.edges.map((e: any) => e.qubits) }];
    });
    expect(r.code).toBe(1);
    expect(rules(r.json)).toContain('layer-index');
    // the star's four gates share Q0: every pair the list puts together conflicts, C(4, 2) = 6
    expect(r.json.violations.filter((v: any) => v.rule === 'layer-conflict' && v.message.startsWith('layers[0]:'))).toHaveLength(6);
  });

  it('every edge put in one layer on both sides (edges[].layer and layers[]) conflicts', async () => {
    const r = await verifyEdited((_, plan) => {
      for (const e of plan.edges) e.layer = 0;
      plan.layers = [{ index: 0, edges: plan.edges.map((e: any) => e.qubits) }];
      plan.layerSummary.count = 1;
    });
    expect(r.code).toBe(1);
    // a consistent edit: the layer indices and the summary agree, the conflicts do not go away;
    // the shorter cycle changes the claimed cycle and idle budgets, and nothing else
    expect(rules(r.json).filter((x) => x !== 'plan-claim')).toEqual(Array(6).fill('layer-conflict'));
    for (const c of claims(r.json)) expect(c).toMatch(/^(cycle\.|qubits\.Q\d\.idle\.)/);
    expect(claims(r.json)).toEqual(expect.arrayContaining(['cycle.duration', 'cycle.error']));
  });

  it('an edge in layer 1e9', async () => {
    const r = await verifyEdited((_, plan) => {
      plan.edges[1].layer = 1e9;
    });
    expect(r.code).toBe(1);
    const v = r.json.violations.filter((x: any) => x.rule === 'layer-index');
    expect(v.map((x: any) => x.details.claim)).toEqual(expect.arrayContaining(['edges[1].layer']));
    expect(v[0].message).toMatch(/Q0-Q2 is in layer 1000000000, but the plan's gates fill 4 layer\(s\), so the layers run from 0 to 3/);
  });
});
