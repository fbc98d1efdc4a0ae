/**
 * Per-edge CZ design through the gate stage (src/plan/pulses.ts, src/plan/gate-seam.ts): the
 * request carries the plan's mover, crossing and parking fluxes; the designed waveform starts and
 * ends at the parking point (README physics conventions sec. 6); the designed gate is re-checked at its own
 * destination and at the waveform's real sweep rates (Landau-Zener, tested against SciPy in
 * test/plan/landau-zener.test.ts); the worst spectator is the one with the largest g / Delta.
 */
import { describe, expect, it } from 'vitest';
import { planChip } from '../../src/plan/plan.js';
import { checkDesign, designPulses, designPulsesInParallel, gateRequest, worstSpectator } from '../../src/plan/pulses.js';
import { loadGateDesigner, type GateDesign } from '../../src/plan/gate-seam.js';
import { planJson } from '../../src/report/plan-json.js';
import { loadLayoutFile } from '../../src/layout/load.js';
import { landauZenerTransfer } from '../../src/plan/landau-zener.js';
import { handChip } from '../support/plan-chips.js';

const chip = handChip('pulses', { A: { fMax: '6.3 GHz', alpha: '-220 MHz' }, B: { fMax: '5.5 GHz', park: '5.5 GHz' } }, [['A', 'B', '12 MHz']], { zzLimit: '3 MHz' });

describe('designPulses with the gate stage', () => {
  it('designs the planned CZ: same mover, crossing and parking fluxes; waveform from and back to parking', async () => {
    const designer = await loadGateDesigner();
    expect(designer, 'src/gate/design.ts exports designCzGate').not.toBeNull();
    const plan = planChip(chip);
    const e = plan.edges[0];
    const req = gateRequest(plan, e, { noise: false });
    expect(req.mover.id).toBe('A');
    expect(req.partner.id).toBe('B');
    expect(req.crossing).toBe(e.crossing);
    expect(req.moverParkFlux).toBe(plan.states[0].flux);
    expect(req.partnerFlux).toBe(plan.states[1].flux);
    expect(req.noise).toBe(false);
    designPulses(plan, designer!, { noise: false });
    const g = plan.gates![0]!;
    expect(g.design.feasible).toBe(true);
    expect(Math.abs(Math.abs(g.design.conditionalPhase) - Math.PI)).toBeLessThan(1e-2);
    const wf = g.design.waveform;
    expect(wf.flux[0]).toBeCloseTo(plan.states[0].flux, 12);
    expect(wf.flux[wf.flux.length - 1]).toBeCloseTo(plan.states[0].flux, 12);
    // The destination is within a few MHz of the planned crossing (the designer's offset).
    expect(Math.abs(g.design.interactionFrequencyGHz - e.interactionGHz)).toBeLessThan(0.05);
    const json = planJson(plan, { file: 'pulses.yaml', seed: 1, pulses: true });
    const edge = (json.edges as any[])[0];
    expect(edge.gate).toMatchObject({ edge: ['A', 'B'], mover: 'A', feasible: true, waveform: 'waveforms/A-B.qubit.csv', awgProgram: 'waveforms/A-B.awg.csv' });
    expect(edge.interactionFrequency).toBeCloseTo(g.design.interactionFrequencyGHz * 1e9, 0);
    expect(plan.violations).toEqual(g.findings);
  });

  it('designPulsesInParallel gives the plan designPulses gives, byte for byte, also with a designer error on an edge (Bowline-5, 2 workers)', async () => {
    const designer = (await loadGateDesigner())!;
    const layout = loadLayoutFile('layouts/bowline-5.yaml', 'layouts/bowline-5.yaml');
    for (const options of [{}, { family: 'no-such-family' }]) {
      const a = planChip(layout, { seed: 1 });
      designPulses(a, designer, options);
      const b = planChip(layout, { seed: 1 });
      const ticks: number[] = [];
      const r = await designPulsesInParallel(b, designer, { threads: 2, minDesigns: 1 }, options, (d) => ticks.push(d));
      expect(r.fallback).toBeUndefined();
      expect(ticks).toHaveLength(4);
      expect(JSON.stringify(planJson(b, { file: 'x', seed: 1, pulses: true }))).toBe(JSON.stringify(planJson(a, { file: 'x', seed: 1, pulses: true })));
      expect(b.gates!.map((g) => g!.design.waveform)).toEqual(a.gates!.map((g) => g!.design.waveform));
    }
    // the error reached the plan as that edge's failed design
    const c = planChip(layout, { seed: 1 });
    await designPulsesInParallel(c, designer, { threads: 2, minDesigns: 1 }, { family: 'no-such-family' });
    expect(c.gates![0]!.design.feasible).toBe(false);
    expect(c.gates![0]!.design.reason).toMatch(/the gate stage failed on this edge: unknown ramp family no-such-family/);
  }, 120_000);
});

describe('checkDesign', () => {
  // A spectator S whose f01 lies on A's way down: with a fixed temporary point far below, A's
  // sweep passes nothing; with S left at parking the sweep crosses it.
  const three = handChip('swept', { A: { fMax: '6.3 GHz', alpha: '-220 MHz', tls: [{ at: '6.0 GHz', width: '4 MHz' }] }, B: { fMax: '5.5 GHz', park: '5.5 GHz' } }, [['A', 'B', '12 MHz']], { zzLimit: '3 MHz', sweptTransferLimit: 0.001 });
  const plan = planChip(three);
  const e = plan.edges[0];
  const mover = plan.ctx.transmons[e.mover];
  const park = plan.states[e.mover].flux;
  const dest = mover.fluxForF01(e.interactionGHz);
  const design = (rampNs: number): GateDesign => {
    // a linear ramp in flux there and back, 1 ns hold, sampled every 0.1 ns
    const n = Math.round(rampNs / 0.1);
    const t: number[] = [];
    const x: number[] = [];
    for (let k = 0; k <= n; k++) { t.push(k * 0.1); x.push(park + ((dest - park) * k) / n); }
    for (let k = 1; k <= n; k++) { t.push(rampNs + 1 + k * 0.1); x.push(dest + ((park - dest) * k) / n); }
    return {
      mover: 'A', family: 'linear', rampNs, holdNs: 1, durationNs: 2 * rampNs + 1, interactionFrequencyGHz: e.interactionGHz, crossingOffsetGHz: 0,
      conditionalPhase: Math.PI, leakage: 0, fidelity: 1, virtualZ: { a: 0, b: 0 }, speedLimitNs: e.speedLimitNs,
      untuned: { conditionalPhase: Math.PI, leakage: 0, fidelity: 1 }, waveform: { timeNs: Float64Array.from(t), flux: Float64Array.from(x) }, feasible: true,
      crossingFlux: dest, crossingFrequencyGHz: e.interactionGHz, gapGHz: 2 * e.crossingCouplingGHz, populations: { '20': 0, '02': 0 }, idleErrorEstimate: 0, evaluations: 0,
    };
  };

  it('flags the defect A sweeps through when the waveform passes it slowly, at the waveform\'s own rate', () => {
    const slow = checkDesign(plan, e, design(200)).findings;
    const f = slow.find((x) => x.rule === 'cz-swept-tls');
    expect(f, JSON.stringify(slow)).toBeDefined();
    // The transfer reported is the Landau-Zener value at |df01/dt| there (g = width / 2 = 2 MHz).
    const rate = (f!.details!.rateHzPerS as number) * 1e-18;
    expect(f!.value).toBeCloseTo(landauZenerTransfer(0.002, rate), 12);
    const fast = checkDesign(plan, e, design(2)).findings;
    expect(fast.find((x) => x.rule === 'cz-swept-tls')).toBeUndefined();
  });

  it('reports an infeasible design with the gate stage\'s reason', () => {
    const bad = { ...design(5), feasible: false, reason: 'no hold reaches pi within 100 ns' };
    expect(checkDesign(plan, e, bad).findings.map((x) => x.message)).toContain('no CZ design for A-B within 100.0 ns: no hold reaches pi within 100 ns');
  });
});

describe('gateRequest', () => {
  it('passes the worst spectator as a third transmon only with spectators on, and the user ramp and family', () => {
    const plan = planChip(loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'));
    const e = plan.edges[0];
    expect(gateRequest(plan, e, {}).spectators).toBeUndefined();
    const req = gateRequest(plan, e, { spectators: true, family: 'erf', rampNs: 12, targetPhase: Math.PI / 2 });
    expect(req.spectators).toHaveLength(1);
    expect(req.spectators![0].transmon.id).toBe(worstSpectator(plan, e)!.transmon.id);
    expect(req).toMatchObject({ family: 'erf', rampNs: 12, targetPhase: Math.PI / 2, noise: true });
    // A gate with spectator moves keeps two of the plan's ramps out of the designer's budget (the
    // designer itself keeps the waveform's rounding to the sample grid inside the limit).
    const moved = plan.edges.find((x) => x.parked.length > 0)!;
    expect(gateRequest(plan, moved, {}).rules.maxGateNs).toBeCloseTo(plan.ctx.rules.maxGateNs - 2 * moved.rampNs, 12);
    const still = plan.edges.find((x) => x.parked.length === 0)!;
    expect(gateRequest(plan, still, {}).rules.maxGateNs).toBe(plan.ctx.rules.maxGateNs);
  });
});

describe('worstSpectator', () => {
  it('is the neighbour of the mover or partner with the largest g / Delta during the gate', () => {
    const plan = planChip(loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'));
    const e = plan.edges[0];
    const w = worstSpectator(plan, e)!;
    const ctx = plan.ctx;
    let best = { id: '', score: -1 };
    const parked = new Map(e.parked.map((p) => [p.qubit, p]));
    for (const [side, q] of [['mover', e.mover], ['partner', e.partner]] as const) {
      for (const s of ctx.neighbours[q]) {
        if (s === e.mover || s === e.partner || (side === 'partner' && ctx.neighbours[e.mover].includes(s))) continue;
        const f01 = parked.get(s)?.fGHz ?? plan.states[s].f01GHz;
        const f12 = parked.get(s)?.f12GHz ?? plan.states[s].f12GHz;
        const d = side === 'mover'
          ? Math.min(Math.abs(e.interactionGHz - f01), Math.abs(e.moverF12AtInteractionGHz - f01), Math.abs(e.interactionGHz - f12))
          : Math.min(Math.abs(plan.states[e.partner].f01GHz - f01), Math.abs(plan.states[e.partner].f12GHz - f01), Math.abs(plan.states[e.partner].f01GHz - f12));
        const g = ctx.edges[ctx.edgeBetween(q, s)].gGHz;
        if (g / d > best.score) best = { id: ctx.ids[s], score: g / d };
      }
    }
    expect(w.transmon.id).toBe(best.id);
  });
});
