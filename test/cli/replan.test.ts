/**
 * Re-planning from an earlier plan (`plan --from`, src/plan/replan/) and `fluxlane diff`:
 * after a cool-down one qubit's maximum frequency is measured 40 MHz lower (Bowline-5 Q1, parked
 * at its sweet spot 6.32 GHz); the re-plan changes only what must change and diff says why. With
 * --edges only the named edges are planned again. `fluxlane verify` (every rule recomputed from
 * scratch) checks each new plan independently of the re-planner. (Bowline-5 is the demo whose
 * plan holds every rule, error ceilings included; an edge that breaks a rule is always planned
 * again, so a chip with broken rules would not show what is kept.)
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { runFluxlane } from '../support/cli.js';
import { planSchemaErrors } from '../support/plan-schema.js';

const dir = mkdtempSync(join(tmpdir(), 'fluxlane-replan-'));
const read = (p: string) => JSON.parse(readFileSync(join(dir, p), 'utf8'));
const key = (e: any) => e.qubits.join('-');
let before: any;
let after: any;
let replanned: Awaited<ReturnType<typeof runFluxlane>>;

beforeAll(async () => {
  const first = await runFluxlane(['plan', resolve('layouts/bowline-5.yaml'), '-o', 'old'], { cwd: dir });
  expect(first.code, first.out).toBe(0);
  const measured = readFileSync('layouts/bowline-5.yaml', 'utf8').replace(/(\n  Q1:\n(?:    .*\n)*?    fMax: )6\.32 GHz/, '$16.28 GHz');
  expect(measured).toContain('fMax: 6.28 GHz');
  writeFileSync(join(dir, 'measured.yaml'), measured);
  replanned = await runFluxlane(['plan', 'measured.yaml', '--from', 'old/plan.json', '-o', 'new'], { cwd: dir });
  before = read('old/plan.json');
  after = read('new/plan.json');
}, 180_000);

describe('plan MEASURED.yaml --from OLD/plan.json (Bowline-5, Q1 measured 40 MHz lower)', () => {
  it('keeps every parking frequency that still holds; Q1 moves to its new sweet spot because its old one is above its maximum', () => {
    expect(replanned.code, replanned.err + replanned.out).toBe(0);
    const moved = Object.keys(after.qubits).filter((q) => after.qubits[q].parkingFrequency !== before.qubits[q].parkingFrequency);
    expect(moved).toEqual(['Q1']);
    expect(before.qubits.Q1.parkingFrequency).toBe(6.32e9);
    expect(after.qubits.Q1.parkingFrequency).toBe(6.28e9);
    const why = after.replan.changes.find((c: any) => c.subject === 'Q1' && c.kind === 'parking');
    expect(why.rules).toEqual(['window']);
    expect(why.measured.join(' ')).toMatch(/Q1 maximum frequency 6\.3200 GHz -> 6\.2800 GHz/);
  });

  it('re-plans exactly the edge of Q1 and keeps every other edge, design and waveform as it was', () => {
    const old = new Map(before.edges.map((e: any) => [key(e), e]));
    const touching = after.edges.filter((e: any) => e.qubits.includes('Q1')).map(key);
    expect(touching).toEqual(['Q0-Q1']);
    for (const e of after.edges) {
      const o: any = old.get(key(e));
      if (touching.includes(key(e))) {
        expect(after.replan.changes.some((c: any) => c.subject === key(e) && c.kind === 'edge' && /Q1/.test(c.message))).toBe(true);
        continue;
      }
      for (const f of ['mover', 'crossing', 'interactionFrequency', 'spectatorParking', 'rampTime', 'slotDuration', 'feasible']) expect(e[f], `${key(e)} ${f}`).toEqual(o[f]);
      // the design is kept; its budget's spectator share is simulated again where the spectators sit now
      const { budget: nb, ...ng } = e.gate;
      const { budget: ob, ...og } = o.gate;
      expect(ng, key(e)).toEqual(og);
      for (const f of ['coherent', 't1', 'whiteDephasing', 'fluxNoise']) expect(nb[f], `${key(e)} budget ${f}`).toBe(ob[f]);
      // the mover's waveform is the same file; the AWG program agrees to the 12 digits plan.json
      // keeps the parking frequencies in
      expect(readFileSync(join(dir, 'new', e.gate.waveform), 'utf8')).toBe(readFileSync(join(dir, 'old', e.gate.waveform), 'utf8'));
      const rows = (p: string) => readFileSync(join(dir, p, e.gate.awgProgram), 'utf8').split('\n').filter((l) => /^\d/.test(l)).map((l) => l.split(',').map(Number));
      const [a, b] = [rows('old'), rows('new')];
      expect(b.length).toBe(a.length);
      a.forEach((row, j) => row.forEach((x, c) => expect(Math.abs(x - b[j][c]), `${e.gate.awgProgram} sample ${j}`).toBeLessThan(1e-9)));
    }
    expect(after.replan.keptEdges).toBe(3);
    expect(planSchemaErrors(after)).toBe('');
    expect(after.replan.keptDesigns).toBe(3);
  });

  it('the new plan holds: fluxlane verify recomputes every rule on the measured layout and finds none broken', async () => {
    const v = await runFluxlane(['verify', 'measured.yaml', 'new/plan.json', '--json'], { cwd: dir });
    expect(v.code, v.out).toBe(0);
    expect(v.json().checked.waveforms).toBe(4);
  });

  it('fluxlane diff lists what changed and why: the measured maximum, the parking it forced (rule window) and the edge of Q1', async () => {
    const d = await runFluxlane(['diff', 'old/plan.json', 'new/plan.json', '--json'], { cwd: dir });
    expect(d.code).toBe(0);
    const j = d.json();
    expect(j.measured.map((m: any) => m.subject)).toEqual(['Q1']);
    expect(j.measured[0].changes).toContainEqual({ field: 'device.fMax', from: 6.32e9, to: 6.28e9 });
    expect(j.parking.map((p: any) => p.subject)).toEqual(['Q1']);
    expect(j.parking[0].why.join(' ')).toMatch(/rule window.*maximum frequency 6\.3200 GHz -> 6\.2800 GHz/);
    const changed = j.edges.map((e: any) => e.subject);
    expect(changed).toEqual(expect.arrayContaining(['Q0-Q1']));
    for (const e of j.edges) {
      if (e.subject !== 'Q0-Q1') expect(e.changes.map((c: any) => c.field), e.subject).toEqual(['layer']);
      expect(e.why.length, e.subject).toBeGreaterThan(0);
    }
    const text = await runFluxlane(['diff', 'old/plan.json', 'new/plan.json'], { cwd: dir });
    expect(text.out).toMatch(/parking \(1 changed, 4 kept\)/);
    expect(text.out).toMatch(/why: Q1 6\.3200 GHz -> 6\.2800 GHz/);
  });
});

describe('plan LAYOUT --from OLD --edges A-B', () => {
  it('plans only the named edge again and keeps every parking frequency and every other edge (Bowline-5)', async () => {
    const first = await runFluxlane(['plan', resolve('layouts/bowline-5.yaml'), '-o', 'b-old'], { cwd: dir });
    expect(first.code).toBe(0);
    const r = await runFluxlane(['plan', resolve('layouts/bowline-5.yaml'), '--from', 'b-old/plan.json', '--edges', 'Q2-Q0', '-o', 'b-new'], { cwd: dir });
    expect(r.code, r.err).toBe(0);
    const o = read('b-old/plan.json');
    const n = read('b-new/plan.json');
    for (const q of Object.keys(o.qubits)) expect(n.qubits[q].parkingFrequency).toBe(o.qubits[q].parkingFrequency);
    expect(n.replan).toMatchObject({ mode: 'edges', edges: ['Q0-Q2'], keptEdges: 3, keptDesigns: 3 });
    expect(n.replan.changes.map((c: any) => c.message)).toEqual(['Q0-Q2 planned again: named in --edges']);
    for (const e of n.edges) {
      if (key(e) === 'Q0-Q2') continue;
      // the design is kept; its budget is recomputed from the plan read back (parking frequencies
      // kept to 12 digits), so it agrees to rounding
      const { budget: nb, ...ng } = e.gate;
      const { budget: ob, ...og } = o.edges.find((x: any) => key(x) === key(e)).gate;
      expect(ng, key(e)).toEqual(og);
      expect(Math.abs(nb.total - ob.total), key(e)).toBeLessThan(1e-6 * ob.total);
    }
    const v = await runFluxlane(['verify', resolve('layouts/bowline-5.yaml'), 'b-new/plan.json'], { cwd: dir });
    expect(v.code).toBe(0);
    const bad = await runFluxlane(['plan', resolve('layouts/bowline-5.yaml'), '--from', 'b-old/plan.json', '--edges', 'Q1-Q2'], { cwd: dir });
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/option --edges: expected coupled pairs of Bowline-5/);
    const alone = await runFluxlane(['plan', resolve('layouts/bowline-5.yaml'), '--edges', 'Q0-Q1'], { cwd: dir });
    expect(alone.code).toBe(2);
    expect(alone.err).toMatch(/option --edges: expected together with --from/);
  }, 120_000);
});
