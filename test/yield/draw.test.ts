/**
 * The fabrication draws (src/yield/draw.ts): each sample depends on (seed, index) only, and the
 * drawn parameters follow the documented model. With E_C = E_C0 / (1 + s z), P(E_C <= x) =
 * 1 - Phi((E_C0 / x - 1) / s); the same for each junction's E_J; and G / (G0 (E_C,A / E_C,A0)
 * (E_C,B / E_C,B0)) = 1 + s_g z. Empirical CDFs of 4,000 draws against scipy.stats.norm.cdf within
 * 4 binomial standard errors.
 */
import { describe, expect, it } from 'vitest';
import { nominalChip } from '../../src/yield/chip-model.js';
import { chipFromDeviates, drawChip, sampleDeviates } from '../../src/yield/draw.js';
import { handChip } from '../support/plan-chips.js';
import { runPython } from '../support/python.js';

const layout = handChip('Draws', {
  A: { fMax: '6.2 GHz', asymmetry: 0.3 },
  B: { fMax: '5.1 GHz', asymmetry: 0.2 },
}, [['A', 'B', '12 MHz']]);
const spread = { rn: 0.04, ec: 0.03, g: 0.05 };
const chip = nominalChip(layout, spread);
const N = 4000;
const draws = Array.from({ length: N }, (_, i) => drawChip(chip, 11, i));

describe('drawChip(chip, seed, index)', () => {
  it('depends on (seed, index) only', () => {
    const a = drawChip(chip, 11, 17);
    expect(a).toEqual(draws[17]);
    expect(chipFromDeviates(chip, 17, sampleDeviates(11, 17, 2, 1))).toEqual(a);
    expect(drawChip(chip, 12, 17)).not.toEqual(a);
  });

  it('E_C, each junction E_J and G follow the documented model (empirical CDF vs scipy.stats.norm.cdf)', () => {
    const ec0 = chip.ecGHz[0];
    const j10 = chip.ej1GHz[0];
    const g0 = chip.gChargeGHz[0];
    const ec = draws.map((d) => d.ecGHz[0]);
    const j1 = draws.map((d) => (d.ejsGHz[0] * (1 + d.asymmetry[0])) / 2); // the larger junction (nominal d = 0.3 keeps it larger)
    const g = draws.map((d) => d.gChargeGHz[0] / (g0 * (d.ecGHz[0] / chip.ecGHz[0]) * (d.ecGHz[1] / chip.ecGHz[1])));
    const points = [-1.5, -0.4, 0.3, 1.2];
    // model: X <= x  <=>  z >= (X0 / x - 1) / s  for X = X0 / (1 + s z); g ratio <= y  <=>  z <= (y - 1) / s_g
    const xsEc = points.map((p) => ec0 / (1 + spread.ec * p));
    const xsJ = points.map((p) => j10 / (1 + spread.rn * p));
    const ys = points.map((p) => 1 + spread.g * p);
    const z = [...xsEc.map((x) => (ec0 / x - 1) / spread.ec), ...xsJ.map((x) => (j10 / x - 1) / spread.rn), ...ys.map((y) => (y - 1) / spread.g)];
    const cdf = runPython<{ cdf: number[] }>('normal_cdf.py', { x: z }).cdf;
    const check = (values: number[], xs: number[], expected: number[], what: string) => {
      xs.forEach((x, k) => {
        const p = values.filter((v) => v <= x).length / N;
        const se = Math.sqrt((expected[k] * (1 - expected[k])) / N);
        expect(Math.abs(p - expected[k]), `${what} <= ${x}: ${p} vs ${expected[k]}`).toBeLessThan(4 * se);
      });
    };
    check(ec, xsEc, cdf.slice(0, 4).map((c) => 1 - c), 'E_C');
    check(j1, xsJ, cdf.slice(4, 8).map((c) => 1 - c), 'E_J1');
    check(g, ys, cdf.slice(8, 12), 'G ratio');
  });

  it('a qubit\'s measured spread from the layout replaces the command\'s', () => {
    const measured = handChip('Measured', { A: { fMax: '6.2 GHz' }, B: { fMax: '5.1 GHz' } }, [['A', 'B', '12 MHz']]);
    measured.qubits[0].spread = { rn: 0, ec: 0 };
    const m = nominalChip(measured, spread);
    expect(m.spreads.measured).toEqual({ rn: ['A'], ec: ['A'] });
    const d = drawChip(m, 3, 5);
    expect(d.ecGHz[0]).toBe(m.ecGHz[0]);
    expect(d.ejsGHz[0]).toBeCloseTo(m.ej1GHz[0] + m.ej2GHz[0], 12);
    expect(d.ecGHz[1]).not.toBe(m.ecGHz[1]);
  });
});
