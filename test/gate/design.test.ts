/**
 * The CZ designer on a demo edge (Bowline-5 Q1-Q0) and on hand-set cases, against the issue's
 * acceptance criteria and physics: two-level Rabi timing (README physics conventions sec. 2), the first-order
 * decoherence estimate against the Lindblad result, determinism.
 */
import { describe, expect, it } from 'vitest';
import { designCzGate, type GateDesign } from '../../src/gate/design.js';
import { RAMP_FAMILIES } from '../../src/gate/families/index.js';
import { G_LAYOUT, Q0, Q1, layout, qubit } from './support.js';

const base = { mover: Q1, partner: Q0, gGHz: G_LAYOUT, moverParkFlux: 0, partnerFlux: 0, crossing: '11-20' as const, rules: layout.rules };

describe('designCzGate', () => {
  const designs = new Map<string, GateDesign>();
  for (const f of RAMP_FAMILIES) designs.set(f.name, designCzGate({ ...base, family: f.name, noise: true }));

  it('every family reaches |phi_c - pi| < 1e-3 and leakage < 1e-4, coherence-limited (coherent error < 10 % of the decoherence error)', () => {
    for (const [name, d] of designs) {
      expect(d.feasible, name).toBe(true);
      expect(Math.abs(Math.abs(d.conditionalPhase) - Math.PI), name).toBeLessThan(1e-3);
      expect(d.leakage, name).toBeLessThan(1e-4);
      const coherent = 1 - d.fidelity;
      const decoherence = d.fidelity - (d.fidelityNoisy as number);
      expect(coherent, name).toBeLessThan(0.1 * decoherence);
      expect(d.durationNs, name).toBeLessThanOrEqual(layout.rules.maxGateNs + 1 / layout.rules.sampleRateGHz);
    }
  });

  it('the first-order decoherence estimate agrees with the Lindblad result within 20 % (|20> populated during the hold)', () => {
    for (const [name, d] of designs) {
      // fidelityNoisy = Lindblad (T1, white dephasing) minus the quasi-static flux-noise average
      const lindblad = d.fidelity - (d.fidelityNoisy as number) - d.budget!.fluxNoise;
      expect(Math.abs((d.decoherenceEstimate as number) - lindblad) / lindblad, name).toBeLessThan(0.2);
    }
  });

  it('tuning improves the linear ramp error by more than 100x over the untuned ramp (common practice)', () => {
    const d = designs.get('linear')!;
    expect((1 - d.untuned.fidelity) / (1 - d.fidelity)).toBeGreaterThan(100);
  });

  it('the speed limit is 1/(2 sqrt2 g) and the gap is close to 2 sqrt2 g (README physics conventions sec. 2)', () => {
    const d = designs.get('erf')!;
    const g = 1 / (2 * Math.SQRT2 * d.speedLimitNs);
    expect(d.gapGHz / (2 * Math.SQRT2 * g)).toBeGreaterThan(0.9);
    expect(d.gapGHz / (2 * Math.SQRT2 * g)).toBeLessThan(1.1);
    // no CZ can be shorter than its speed limit
    for (const dd of designs.values()) expect(dd.durationNs).toBeGreaterThan(dd.speedLimitNs);
  });

  it('hits another target phase (CPhase(pi/2))', () => {
    const d = designCzGate({ ...base, family: 'erf', targetPhase: Math.PI / 2 });
    expect(d.feasible).toBe(true);
    expect(Math.abs(d.conditionalPhase - Math.PI / 2)).toBeLessThan(1e-3);
    expect(d.leakage).toBeLessThan(1e-4);
  });

  it('reports when no solution exists within the maximum gate duration', () => {
    const tooShort = designCzGate({ ...base, family: 'erf', rampNs: 8, rules: { ...layout.rules, maxGateNs: 12 } });
    expect(tooShort.feasible).toBe(false);
    expect(tooShort.reason).toMatch(/exceed the maximum gate duration 12 ns/);
    // 2 x 8 ns of ramps and 2 x 1.25 ns of settling of the default 1 GHz line leave < 1 ns of hold
    const noPhase = designCzGate({ ...base, family: 'erf', rampNs: 8, rules: { ...layout.rules, maxGateNs: 20 } });
    expect(noPhase.feasible).toBe(false);
    expect(noPhase.reason).toMatch(/no hold time within the maximum gate duration \(20 ns\)/);
  });

  it('uses the 11-02 crossing when asked (mover below the partner, moving up)', () => {
    const mover = qubit('Q0');
    const partner = qubit('Q1');
    const d = designCzGate({ mover, partner, gGHz: G_LAYOUT, moverParkFlux: mover.fluxForF01(4.95), partnerFlux: partner.fluxForF01(5.5), crossing: '11-02', family: 'erf', rules: layout.rules });
    expect(d.feasible).toBe(true);
    expect(Math.abs(Math.abs(d.conditionalPhase) - Math.PI)).toBeLessThan(1e-3);
    expect(d.leakage).toBeLessThan(1e-4);
    // the destination is |alpha_partner| below the partner
    expect(Math.abs(d.crossingFrequencyGHz - (partner.f01(partner.fluxForF01(5.5)) + partner.spectrum(partner.fluxForF01(5.5)).anharmonicityGHz))).toBeLessThan(0.01);
  });

  it('is deterministic: the same request gives the same waveform bit for bit', () => {
    const a = designCzGate({ ...base, family: 'fast-adiabatic' });
    const b = designCzGate({ ...base, family: 'fast-adiabatic' });
    expect(Array.from(a.waveform.flux)).toEqual(Array.from(b.waveform.flux));
  });
});

describe('designCzGate on a 3.2 GHz excursion (Reef-49 Q16 from its sweet spot to Q9 parked near its bottom)', () => {
  it('falls back to faquad when the default family still leaks above 1e-4, and keeps the better design', async () => {
    const { loadLayoutFile } = await import('../../src/layout/load.js');
    const { Transmon } = await import('../../src/transmon/transmon.js');
    const { DEFAULT_FAMILY, FALLBACK_FAMILY, LEAKAGE_GOAL } = await import('../../src/gate/design.js');
    const reef = loadLayoutFile('layouts/reef-49.yaml', 'layouts/reef-49.yaml');
    const q = (id: string) => Transmon.fromLayout(reef.qubits.find((x) => x.id === id)!);
    // parking from the planner (inputs here): Q16 at its sweet spot, Q9 at flux 0.45233 (3.26 GHz)
    const req = { mover: q('Q16'), partner: q('Q9'), gGHz: 0.0176, moverParkFlux: 0, partnerFlux: 0.4523267, crossing: '11-20' as const, rules: { ...reef.rules, maxGateNs: 70 } };
    const plain = designCzGate({ ...req, family: DEFAULT_FAMILY });
    expect(plain.leakage).toBeGreaterThan(LEAKAGE_GOAL);
    const d = designCzGate(req);
    expect(d.family).toBe(FALLBACK_FAMILY);
    expect(d.feasible).toBe(true);
    expect(d.leakage).toBeLessThan(LEAKAGE_GOAL);
    expect(Math.abs(Math.abs(d.conditionalPhase) - Math.PI)).toBeLessThan(1e-3);
  }, 60_000);
});

describe('meetsGoals (the goals a design is retried against)', () => {
  it('leakage at most 1e-4 and a coherent error at most 10 % of the decoherence error (Lindblad when computed, else the idle estimate)', async () => {
    const { meetsGoals } = await import('../../src/gate/design.js');
    const d = (leakage: number, coherent: number, decoherence: number | undefined, idle: number): GateDesign =>
      ({ feasible: true, leakage, fidelity: 1 - coherent, fidelityNoisy: decoherence === undefined ? undefined : 1 - coherent - decoherence, idleErrorEstimate: idle }) as GateDesign;
    expect(meetsGoals(d(5e-5, 1e-4, 1e-2, 0))).toBe(true);
    expect(meetsGoals(d(2e-4, 2e-4, 1e-2, 0))).toBe(false); // leaks
    expect(meetsGoals(d(5e-5, 2e-3, 1e-2, 1e-1))).toBe(false); // 20 % coherent share (the Lindblad value wins over the idle one)
    expect(meetsGoals(d(5e-5, 2e-3, undefined, 3e-2))).toBe(true); // 6.7 % of the idle estimate
    expect(meetsGoals(d(5e-5, 2e-3, undefined, 0))).toBe(true); // no coherence data: the leakage goal alone
    expect(meetsGoals({ ...d(0, 0, 1e-2, 0), feasible: false })).toBe(false);
  });
});

describe('designCzGate on an edge whose full 11-20 cycle nearly fills the duration limit (Reef-49 Q21 to Q14, 70 ns)', () => {
  it('tries shorter ramps for a near-sudden family: the linear ramp at 8 ns leaks above 1e-4, a shorter one does not', async () => {
    const { loadLayoutFile } = await import('../../src/layout/load.js');
    const { Transmon } = await import('../../src/transmon/transmon.js');
    const { LEAKAGE_GOAL, RAMP_RETRY_FACTORS } = await import('../../src/gate/design.js');
    const reef = loadLayoutFile('layouts/reef-49.yaml', 'layouts/reef-49.yaml');
    const q = (id: string) => Transmon.fromLayout(reef.qubits.find((x) => x.id === id)!);
    // parking from the planner (inputs here): Q21 at its sweet spot, Q14 at flux 0.3795785 (4.065 GHz);
    // 70 ns = the 100 ns limit less two 15 ns spectator moves
    const req = { mover: q('Q21'), partner: q('Q14'), gGHz: 0.0102, moverParkFlux: 0, partnerFlux: 0.3795785, crossing: '11-20' as const, family: 'linear', rules: { ...reef.rules, maxGateNs: 70 } };
    const at8 = designCzGate({ ...req, rampNs: 8 });
    expect(at8.leakage).toBeGreaterThan(LEAKAGE_GOAL);
    const d = designCzGate(req);
    expect(d.feasible).toBe(true);
    expect(d.rampNs).toBeLessThan(8);
    expect(RAMP_RETRY_FACTORS.map((f) => 8 * f)).toContain(d.rampNs);
    expect(d.leakage).toBeLessThan(LEAKAGE_GOAL);
    expect(Math.abs(Math.abs(d.conditionalPhase) - Math.PI)).toBeLessThan(1e-3);
    expect(d.durationNs).toBeLessThanOrEqual(70);
  }, 60_000);
});

describe('designCzGate with a band-limited flux line', () => {
  it('designs through a 0.6 GHz Gaussian line filter and the exported (filtered) waveform is what was simulated', async () => {
    const { simulateGate } = await import('../../src/sim/simulate-gate.js');
    const { buildManifoldFrame } = await import('../../src/sim/manifold-frame.js');
    const { edgeSimModel, moverEjRange } = await import('../../src/sim/pair-model.js');
    const rules = { ...layout.rules, fluxBandwidthGHz: 0.6 };
    const d = designCzGate({ ...base, family: 'erf', rules });
    expect(d.feasible).toBe(true);
    expect(Math.abs(Math.abs(d.conditionalPhase) - Math.PI)).toBeLessThan(1e-3);
    expect(d.leakage).toBeLessThan(1e-4);
    const model = edgeSimModel({ mover: Q1, partner: Q0, gGHz: G_LAYOUT, partnerFlux: 0 });
    const again = simulateGate(buildManifoldFrame(model, moverEjRange(Q1, d.waveform)), d.waveform, { targetPhase: Math.PI });
    expect(again.fidelity).toBeCloseTo(d.fidelity, 12);
    // the filtered waveform has no sample-to-sample step larger than the unfiltered (ideal-line) design's
    const unfiltered = designCzGate({ ...base, family: 'erf', rules: { ...layout.rules, fluxBandwidthGHz: undefined } });
    const maxStep = (w: { flux: Float64Array }) => w.flux.slice(1).reduce((m, x, k) => Math.max(m, Math.abs(x - w.flux[k])), 0);
    expect(maxStep(d.waveform)).toBeLessThan(maxStep(unfiltered.waveform));
  });
});
