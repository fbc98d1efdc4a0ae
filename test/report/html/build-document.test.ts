/**
 * The chip report's document (src/report/html/build-document.ts) from a real plan of the
 * Bowline-5 demo with designed CZ pulses: what it takes from plan.json and the layout, the order
 * of the predicted-error sources, the error-budget fields read when present and their graceful
 * absence, the waveform reduction budget, and the mover's f01 along its waveform. The f01 values
 * come from the Transmon class, which test/transmon checks against Mathieu characteristic values
 * (Koch et al. 2007); here the hold plateau is checked against the interaction frequency the gate
 * stage reports for the same design.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../../src/layout/load.js';
import type { ChipLayout } from '../../../src/layout/types.js';
import { planChip, type ChipPlan } from '../../../src/plan/plan.js';
import { designPulses } from '../../../src/plan/pulses.js';
import { loadGateDesigner } from '../../../src/plan/gate-seam.js';
import { planJson } from '../../../src/report/plan-json.js';
import { buildReportDocument, pointsPerGate, predictedError, REPORT_DEFAULTS, type GateWaveform } from '../../../src/report/html/build-document.js';
import { waveformsOfPlan } from '../../../src/report/html/plan-waveforms.js';
import { Transmon } from '../../../src/transmon/transmon.js';

let layout: ChipLayout;
let chipPlan: ChipPlan;
let planDoc: Record<string, any>;
let waveforms: Map<string, GateWaveform>;

/** A fresh, editable copy of the plan document (as read back from plan.json). */
const copy = (): Record<string, any> => JSON.parse(JSON.stringify(planDoc));

beforeAll(async () => {
  layout = loadLayoutFile('layouts/bowline-5.yaml', 'layouts/bowline-5.yaml');
  chipPlan = planChip(layout, { seed: 1 });
  const designer = await loadGateDesigner();
  designPulses(chipPlan, designer!, { noise: true });
  planDoc = JSON.parse(JSON.stringify(planJson(chipPlan, { file: layout.file, seed: 1, pulses: true })));
  waveforms = waveformsOfPlan(chipPlan);
});

describe('buildReportDocument on the Bowline-5 plan', () => {
  it('takes every qubit with its position, parking, f12, T1, T2 and margins from the plan and the layout', () => {
    const doc = buildReportDocument({ plan: copy(), layout, waveforms });
    expect(doc.qubits.map((q) => q.id)).toEqual(layout.qubits.map((q) => q.id));
    for (const q of doc.qubits) {
      const src = layout.qubits.find((l) => l.id === q.id)!;
      const p = planDoc.qubits[q.id];
      expect(q.pos).toEqual(src.pos);
      expect(q.parkingGHz).toBeCloseTo(p.parkingFrequency * 1e-9, 7);
      expect(q.f12GHz).toBeCloseTo(p.f12 * 1e-9, 7);
      expect(q.t1Us).toBeCloseTo(src.t1Ns * 1e-3, 6);
      expect(q.t2Us).toBeCloseTo(p.t2 * 1e6, 4);
      expect(q.marginMHz).toBeCloseTo(p.margin * 1e-6, 3);
      expect(q.readoutGHz).toBe(src.readoutGHz ?? null);
      expect(q.defects).toEqual(src.tls.map((d) => ({ atGHz: d.atGHz, widthGHz: d.widthGHz })));
      const t = Transmon.fromLayout(src);
      expect(q.tunableGHz[0]).toBeCloseTo(t.fMinGHz, 7);
      expect(q.tunableGHz[1]).toBeCloseTo(t.fMaxGHz, 7);
      // the idle budget, to the report's 5 significant digits
      for (const k of ['t1', 'dephasing', 'zz', 'thermal', 'total'] as const) expect(Math.abs(q.idle![k]! - p.idle[k])).toBeLessThanOrEqual(5e-5 * Math.abs(p.idle[k]) + 1e-15);
      expect(q.flags).toBe((planDoc.flags as any[]).filter((f) => f.qubits.includes(q.id)).length);
    }
  });

  it('each edge: mover, crossing, interaction, layer, gate metrics, and the predicted error (the budget total)', () => {
    const doc = buildReportDocument({ plan: copy(), layout, waveforms });
    expect(doc.edges).toHaveLength(planDoc.edges.length);
    doc.edges.forEach((e, k) => {
      const p = planDoc.edges[k];
      expect(e.key).toBe(p.qubits.join('-'));
      expect(e.mover).toBe(p.mover);
      expect(e.crossing).toBe(p.crossing);
      expect(e.interactionGHz).toBeCloseTo(p.interactionFrequency * 1e-9, 7);
      expect(e.layer).toBe(p.layer);
      expect(e.durationNs).toBeCloseTo(p.slotDuration * 1e9, 4);
      expect(e.gate!.fidelity).toBeCloseTo(p.gate.fidelity, 8);
      expect(e.gate!.budget).toMatchObject({ total: expect.closeTo(p.gate.budget.total, 6), fluxNoise: expect.closeTo(p.gate.budget.fluxNoise, 8) });
      expect(e.error!.source).toBe('budget');
      expect(e.error!.value).toBeCloseTo(p.gate.budget.total, 6);
    });
    // Layers: which gates run together, each as long as its longest gate.
    for (const l of doc.layers) {
      const longest = Math.max(...l.edges.map((key) => doc.edges.find((e) => e.key === key)!.durationNs!));
      expect(l.durationNs).toBe(longest);
    }
    expect(doc.layeredNs).toBeCloseTo(doc.layers.reduce((s, l) => s + l.durationNs!, 0), 5);
  });

  it("the mover's f01 on the hold plateau is the gate's interaction frequency, and the waveform keeps its ends", () => {
    const doc = buildReportDocument({ plan: copy(), layout, waveforms });
    for (const e of doc.edges) {
      const w = e.waveform!;
      const original = waveforms.get(e.key)!;
      expect(w.originalSamples).toBe(original.timeNs.length);
      expect(w.timeNs[0]).toBe(original.timeNs[0]);
      expect(w.flux[w.flux.length - 1]).toBeCloseTo(original.flux[original.flux.length - 1], 6);
      // The plateau is the sample farthest from parking; there f01 is the destination.
      let far = 0;
      for (let k = 0; k < w.flux.length; k++) if (Math.abs(w.flux[k] - w.flux[0]) > Math.abs(w.flux[far] - w.flux[0])) far = k;
      const interaction = planDoc.edges.find((p: any) => p.qubits.join('-') === e.key).gate.interactionFrequency * 1e-9;
      expect(Math.abs(w.f01GHz[far] - interaction)).toBeLessThan(2e-4);
    }
  });

  it('reads the error budget, idle budgets and the cycle when the plan has them, and prefers the budget for the predicted error', () => {
    const plan = copy();
    const parts = { coherent: 2e-5, t1: 4e-3, whiteDephasing: 1e-3, fluxNoise: 3e-3, spectators: 5e-4, sweptCrossings: 1e-5, spectatorMoves: 0 };
    const total = Object.values(parts).reduce((s, x) => s + x, 0);
    plan.edges[1].gate.budget = { ...parts, total };
    plan.qubits.Q2.idle = { t1: 1e-3, dephasing: 2e-3, zz: 1e-4, thermal: 5e-5, total: 3.15e-3 };
    plan.cycle = { duration: 4.2e-7, error: 0.071, gates: 0.05, idles: 0.021 };
    delete plan.edges[0].gate.budget; // a plan without a budget for this gate
    delete plan.edges[0].budget;
    const doc = buildReportDocument({ plan, layout, waveforms });
    expect(doc.edges[1].error).toEqual({ value: Number(total.toPrecision(5)), source: 'budget' });
    expect(doc.edges[1].gate!.budget).toMatchObject(parts);
    expect(doc.edges[0].error!.source).toBe('noisy');
    expect(doc.qubits.find((q) => q.id === 'Q2')!.idle).toEqual({ t1: 1e-3, dephasing: 2e-3, zz: 1e-4, thermal: 5e-5, total: 3.15e-3 });
    expect(doc.cycle).toEqual({ durationNs: 420, error: 0.071, gates: 0.05, idles: 0.021 });
  });

  it('falls back to 1 - fidelity, then to the planner estimate, and reads a plan missing optional fields', () => {
    const plan = copy();
    delete plan.edges[0].gate.fidelityNoisy;
    delete plan.edges[0].gate.budget;
    delete plan.edges[0].budget;
    plan.edges[1].gate = null;
    delete plan.edges[1].budget;
    for (const q of Object.values(plan.qubits) as any[]) {
      delete q.margin;
      delete q.t2;
      delete q.nearest;
    }
    delete plan.crowding;
    delete plan.layerSummary;
    const doc = buildReportDocument({ plan, layout, waveforms: new Map() });
    expect(doc.edges[0].error).toEqual({ value: Number((1 - planDoc.edges[0].gate.fidelity).toPrecision(5)), source: 'coherent' });
    const chosen = planDoc.edges[1].options.find((o: any) => o.mover === planDoc.edges[1].mover && o.crossing === planDoc.edges[1].crossing);
    expect(doc.edges[1].error).toEqual({ value: Number(chosen.estimatedError.toPrecision(5)), source: 'planner' });
    expect(doc.edges[1].gate).toBeNull();
    expect(doc.qubits.every((q) => q.marginMHz === null && q.t2Us === null && q.nearest === null)).toBe(true);
    expect(doc.crowdedBands).toEqual([]);
    expect(doc.layerLowerBound).toBeNull();
    expect(doc.edges.every((e) => e.waveform === null)).toBe(true);
    expect(predictedError(null, null)).toBeNull();
    expect(predictedError({ budgetTotal: null, fidelityNoisy: null, fidelity: null }, 0.02)).toEqual({ value: 0.02, source: 'planner' });
  });

  it('reduces long waveforms to the per-gate budget and says so; the same inputs give the same document', () => {
    const n = 5000;
    const long: GateWaveform = {
      timeNs: Float64Array.from({ length: n }, (_, i) => i * 0.01),
      flux: Float64Array.from({ length: n }, (_, i) => 0.2 * Math.sin((Math.PI * i) / (n - 1)) ** 2),
    };
    const key = planDoc.edges[0].qubits.join('-');
    const doc = buildReportDocument({ plan: copy(), layout, waveforms: new Map([[key, long]]) });
    expect(doc.edges[0].waveform!.timeNs).toHaveLength(REPORT_DEFAULTS.maxPointsPerGate);
    expect(doc.edges[0].waveform!.originalSamples).toBe(n);
    expect(doc.waveformNote).toMatch(/at most 1200 of their samples/);
    expect(pointsPerGate(1)).toBe(1200);
    expect(pointsPerGate(2000)).toBe(50);
    expect(pointsPerGate(1e6)).toBe(REPORT_DEFAULTS.minPointsPerGate);
    const again = buildReportDocument({ plan: copy(), layout, waveforms: new Map([[key, long]]) });
    expect(JSON.stringify(again)).toBe(JSON.stringify(doc));
  });

  it('always carries the cautions: estimates, verify on hardware, flux-line current limits', () => {
    const doc = buildReportDocument({ plan: copy(), layout, waveforms });
    const text = doc.cautions.join(' ');
    expect(text).toMatch(/model estimate/);
    expect(text).toMatch(/[Vv]erify .* on the hardware/);
    expect(text).toMatch(/flux-line current limits/);
  });
});
