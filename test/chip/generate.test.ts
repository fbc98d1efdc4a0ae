import { describe, expect, it } from 'vitest';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { parseLayoutText } from '../../src/layout/load.js';
import { buildChipGraph } from '../../src/chip/graph.js';
import { connectedComponents } from '../../src/chip/stats.js';

describe('generateLayout', () => {
  it.each([
    ['square', 1, 1], ['square', 2, 7], ['square', 10, 10], ['heavy-hex', 1, 1], ['heavy-hex', 3, 4], ['heavy-hex', 6, 6],
  ] as const)('generated %s %i x %i parses, is connected and keeps the parameter ranges', (kind, rows, cols) => {
    const layout = parseLayoutText(layoutToYaml(generateLayout({ kind, rows, cols, seed: 3 })), 'g.yaml');
    expect(connectedComponents(buildChipGraph(layout))).toHaveLength(1);
    for (const q of layout.qubits) {
      const t = q.transmon;
      expect(t.kind).toBe('frequencies');
      if (t.kind !== 'frequencies') continue;
      // the documented range of maximum frequencies (README, fluxlane generate)
      expect(t.fMaxGHz).toBeGreaterThanOrEqual(4.9);
      expect(t.fMaxGHz).toBeLessThanOrEqual(6.6);
      expect(-t.anharmonicityGHz).toBeGreaterThanOrEqual(0.2);
      expect(-t.anharmonicityGHz).toBeLessThanOrEqual(0.24);
      expect(t.asymmetry).toBeGreaterThanOrEqual(0.2);
      expect(t.asymmetry).toBeLessThanOrEqual(0.5);
      // the documented ranges (README, fluxlane generate; src/chip/generate.ts GENERATE_DEFAULTS): T1 60-250 us, g 7-9 MHz,
      // flux noise 1-3 uPhi0/sqrt(Hz)
      expect(q.t1Ns).toBeGreaterThanOrEqual(60_000);
      expect(q.t1Ns).toBeLessThanOrEqual(250_000);
      expect(q.fluxNoisePhi0).toBeGreaterThanOrEqual(1e-6);
      expect(q.fluxNoisePhi0).toBeLessThanOrEqual(3e-6);
      expect(q.readoutGHz! - t.fMaxGHz).toBeGreaterThan(0.3);
      // parking window: the top 50 MHz below the upper sweet spot (f_max printed to 1 MHz)
      expect(q.windowGHz).toBeDefined();
      expect(q.windowGHz![1]).toBeCloseTo(t.fMaxGHz, 9);
      expect(t.fMaxGHz - q.windowGHz![0]).toBeCloseTo(0.05, 9);
      // defects 0.6-1.5 GHz below f_max (f_max and the defect printed to 1 MHz each)
      for (const d of q.tls) {
        expect(t.fMaxGHz - d.atGHz).toBeGreaterThanOrEqual(0.6 - 0.0011);
        expect(t.fMaxGHz - d.atGHz).toBeLessThanOrEqual(1.5 + 0.0011);
      }
      for (const d of q.tls) expect(d.widthGHz).toBeLessThanOrEqual(0.002);
    }
    for (const c of layout.couplings) {
      expect(c.gGHz).toBeGreaterThanOrEqual(0.007);
      expect(c.gGHz).toBeLessThanOrEqual(0.009);
    }
  });

  it.each([['square', 12, 12], ['heavy-hex', 4, 4]] as const)('%s %i x %i: coupled neighbours sit in different groups over 1.2 GHz apart; qubits sharing a neighbour in one group on different levels', (kind, rows, cols) => {
    const layout = parseLayoutText(layoutToYaml(generateLayout({ kind, rows, cols, seed: 5 })), 'g.yaml');
    const fMax = new Map(layout.qubits.map((q) => [q.id, q.transmon.kind === 'frequencies' ? q.transmon.fMaxGHz : NaN]));
    const gaps = layout.couplings.map((c) => Math.abs(fMax.get(c.a)! - fMax.get(c.b)!));
    // group bands: 6.42-6.60 and 4.90-5.08 GHz
    expect(Math.min(...gaps)).toBeGreaterThan(1.2);
    const neighbours = new Map<string, string[]>(layout.qubits.map((q) => [q.id, []]));
    for (const c of layout.couplings) {
      neighbours.get(c.a)!.push(c.b);
      neighbours.get(c.b)!.push(c.a);
    }
    // levels 45 MHz apart, +-5 MHz jitter and 3 MHz normal scatter: next-nearest neighbours stay > 20 MHz apart
    // (the planner detunes those closer than detuningNext0101 = 30 MHz)
    let nnn = 0;
    for (const [q, list] of neighbours) {
      for (const s of list) {
        for (const k of neighbours.get(s)!) {
          if (k === q) continue;
          nnn++;
          expect(Math.abs(fMax.get(q)! - fMax.get(k)!)).toBeGreaterThan(0.02);
        }
      }
    }
    expect(nnn).toBeGreaterThan(100);
  });

  it('parkingWindowGHz 0 leaves the windows out; tlsBelowMaxGHz places the defects; the other draws stay the same', () => {
    const base = parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 4, cols: 4, seed: 9 })), 'a.yaml');
    const open = parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 4, cols: 4, seed: 9, parkingWindowGHz: 0, tlsFraction: 1, tlsBelowMaxGHz: [0.1, 0.2] })), 'b.yaml');
    for (let i = 0; i < base.qubits.length; i++) {
      const a = base.qubits[i];
      const b = open.qubits[i];
      expect(b.windowGHz).toBeUndefined();
      if (a.transmon.kind !== 'frequencies' || b.transmon.kind !== 'frequencies') throw new Error('generated qubits are given by frequencies');
      // the same stream of draws: the options change no other parameter
      expect(b.transmon.fMaxGHz).toBe(a.transmon.fMaxGHz);
      expect(b.t1Ns).toBe(a.t1Ns);
      expect(b.tls).toHaveLength(1);
      // f_max and the defect printed to 1 MHz each
      expect(b.transmon.fMaxGHz - b.tls[0].atGHz).toBeGreaterThanOrEqual(0.1 - 0.0011);
      expect(b.transmon.fMaxGHz - b.tls[0].atGHz).toBeLessThanOrEqual(0.2 + 0.0011);
    }
  });

  it('same seed -> byte-identical YAML; other seed -> different parameters, same structure', () => {
    const a = layoutToYaml(generateLayout({ kind: 'heavy-hex', rows: 3, cols: 3, seed: 11 }));
    const b = layoutToYaml(generateLayout({ kind: 'heavy-hex', rows: 3, cols: 3, seed: 11 }));
    const c = layoutToYaml(generateLayout({ kind: 'heavy-hex', rows: 3, cols: 3, seed: 12 }));
    expect(a).toBe(b);
    expect(a).not.toBe(c);
    expect(a.match(/^ {2}Q\d+:$/gm)).toEqual(c.match(/^ {2}Q\d+:$/gm));
  });

  it('makes a 1,000+ qubit chip quickly', () => {
    const started = performance.now();
    const doc = generateLayout({ kind: 'square', rows: 40, cols: 40 });
    const text = layoutToYaml(doc);
    const ms = performance.now() - started;
    expect(doc.qubits).toHaveLength(1600);
    expect(text.length).toBeGreaterThan(100_000);
    expect(ms).toBeLessThan(3000);
  });
});
