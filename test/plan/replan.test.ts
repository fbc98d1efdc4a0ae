/**
 * Pieces of re-planning (src/plan/replan/): measured changes against an earlier plan's device
 * parameters, rules and couplings; layers that keep kept gates where they were.
 */
import { describe, expect, it } from 'vitest';
import { planChip } from '../../src/plan/plan.js';
import { buildPlanContext } from '../../src/plan/context.js';
import { parseLayoutText, loadLayoutFile } from '../../src/layout/load.js';
import { readFileSync } from 'node:fs';
import { planJson } from '../../src/report/plan-json.js';
import { readPlanChecked } from '../../src/plan/plan-read.js';
const readPlan = (text: string, file: string, layout: Parameters<typeof readPlanChecked>[2]) => readPlanChecked(text, file, layout).document;
import { changeText, measuredChanges } from '../../src/plan/replan/measured-changes.js';
import { keptLayers } from '../../src/plan/replan/kept-layers.js';
import { gatesConflict, movedQubits, planLayers } from '../../src/plan/layers.js';

const file = 'layouts/bowline-5.yaml';
const layout = loadLayoutFile(file, file);
const plan = planChip(layout);
const text = JSON.stringify(planJson(plan, { file, seed: 1, pulses: false }));
const earlier = readPlan(text, 'plan.json', layout);

describe('measuredChanges', () => {
  it('finds nothing against the layout the plan was made from', () => {
    const m = measuredChanges(plan.ctx, earlier);
    expect(m.known).toBe(true);
    expect(m.qubits.flat()).toEqual([]);
    expect(m.couplings.filter(Boolean)).toEqual([]);
    expect(m.rules).toEqual([]);
  });

  it('names a changed T1, coupling and rule, and marks values the layout derives (E_C, E_J of an fMax qubit) as derived', () => {
    const src = readFileSync(file, 'utf8');
    const q1 = layout.qubits.find((q) => q.id === 'Q1')!;
    expect(q1.transmon.kind).toBe('frequencies');
    const changed = src
      .replace(/(\n  Q1:\n(?:    .*\n)*?    fMax: )[^\n]+/, '$16.30 GHz')
      .replace(/(\n  Q1:\n(?:    .*\n)*?    t1: )[^\n]+/, '$140 us')
      .replace(/maxGate: [^\n]*/, 'maxGate: 90 ns')
      .replace('- [Q0, Q2, 9.8 MHz]', '- [Q0, Q2, 10.1 MHz]');
    expect(changed).not.toBe(src);
    const ctx = buildPlanContext(parseLayoutText(changed, 'measured.yaml'));
    const m = measuredChanges(ctx, earlier);
    const q = m.qubits[ctx.index.get('Q1')!];
    const fmax = q.find((c) => c.field === 'fMax')!;
    expect(Math.abs((fmax.from as number) - 6.32e9)).toBeLessThan(1);
    expect(Math.abs((fmax.to as number) - 6.3e9)).toBeLessThan(1);
    expect(Math.abs((q.find((c) => c.field === 't1')!.to as number) - 40e-6)).toBeLessThan(1e-15);
    expect(q.find((c) => c.field === 'ec')?.derived).toBe(true);
    expect(q.find((c) => c.field === 'fMax')?.derived).toBeUndefined();
    expect(changeText(q.find((c) => c.field === 'fMax')!)).toBe('maximum frequency 6.3200 GHz -> 6.3000 GHz');
    expect(m.rules.map((r) => r.field)).toEqual(['maxGate']);
    expect(m.couplings.filter(Boolean).map((c) => [c!.subject, c!.to])).toEqual([['Q0-Q2', 10.1e6]]);
    for (const [i, list] of m.qubits.entries()) if (ctx.ids[i] !== 'Q1') expect(list).toEqual([]);
  });

  it('a plan without device parameters counts as unknown', () => {
    const bare = JSON.parse(text);
    for (const q of Object.values<any>(bare.qubits)) delete q.device;
    expect(measuredChanges(plan.ctx, readPlan(JSON.stringify(bare), 'old.json', layout)).known).toBe(false);
  });
});

describe('keptLayers', () => {
  it('keeps each gate in its earlier layer while it conflicts with nothing there, puts the rest in the first layer with room, and no layer holds a conflict', () => {
    const big = planChip(loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'));
    const f12 = big.states.map((s) => s.f12GHz);
    const fresh = planLayers(big.ctx, big.edges, f12, big.parking.parkingGHz);
    const earlier = fresh.layerOf.map((l, k) => (k % 3 === 0 ? undefined : l));
    const kept = keptLayers(big.ctx, big.edges, f12, big.parking.parkingGHz, earlier, fresh.conflicts);
    earlier.forEach((l, k) => l !== undefined && expect(kept.layerOf[k]).toBe(l));
    const moved = big.edges.map((e) => movedQubits(big.ctx, e, f12, big.parking.parkingGHz));
    for (const layer of kept.layers) {
      for (let a = 0; a < layer.length; a++) for (let b = a + 1; b < layer.length; b++) expect(gatesConflict(big.ctx, big.edges[layer[a]], moved[layer[a]], big.edges[layer[b]], moved[layer[b]])).toBe(false);
    }
    expect(kept.layers.flat().sort((x, y) => x - y)).toEqual(big.edges.map((_, k) => k));
    // an edge with no earlier layer goes into the first layer where it fits
    earlier.forEach((l, k) => {
      if (l !== undefined) return;
      for (let m = 0; m < kept.layerOf[k]; m++) {
        expect(kept.layers[m].some((j) => j !== k && gatesConflict(big.ctx, big.edges[k], moved[k], big.edges[j], moved[j]))).toBe(true);
      }
    });
  });
});
