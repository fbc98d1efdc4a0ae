/**
 * The parking search's ZZ estimate (src/plan/zz-second-order.ts) against full second-order
 * perturbation theory over all product states of 6 levels each (test/reference/pair_reference.py
 * "pt2", NumPy, written independently), against the exact dressed ZZ of CoupledPair, and against
 * the dispersive formula of README physics conventions sec. 2 (derived, common practice).
 */
import { describe, expect, it } from 'vitest';
import { Transmon } from '../../src/transmon/transmon.js';
import { CoupledPair } from '../../src/pair/pair.js';
import { QubitTable } from '../../src/plan/qubit-table.js';
import { narrowResonanceZz, secondOrderZz } from '../../src/plan/zz-second-order.js';
import { runPython } from '../support/python.js';

const qa = new Transmon('A', { ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 });
const qb = new Transmon('B', { ecGHz: 0.2, ejsGHz: 22, asymmetry: 0.3 });
const ta = new QubitTable(qa);
const tb = new QubitTable(qb);
const POINTS: [number, number, number][] = [
  [5.0, 4.2, 0.01],
  [4.4, 5.3, 0.012],
  [5.2, 4.6, 0.015],
  [4.0, 5.0, 0.008],
  [5.25, 4.35, 0.014],
];

describe('secondOrderZz', () => {
  const cases = POINTS.map(([fa, fb, g]) => {
    const pair = new CoupledPair(qa, qb, g);
    const a = { ...ta.at(fa) };
    const b = { ...tb.at(fb) };
    const est = secondOrderZz(a, b, pair.gChargeGHz) + narrowResonanceZz(a, b, pair.gChargeGHz);
    return { pair, fa, fb, a, b, est, exact: pair.zz(qa.fluxForF01(fa), qb.fluxForF01(fb)) };
  });

  it('with the narrow terms equals full second-order perturbation theory over 6 levels (NumPy) within 1%', () => {
    const ref = runPython<{ results: { pt2: { zz: number } }[] }>('pair_reference.py', {
      cases: cases.map((c) => ({ ecA: qa.ecGHz, ejA: c.a.ejRatio * qa.ejsGHz, ecB: qb.ecGHz, ejB: c.b.ejRatio * qb.ejsGHz, G: c.pair.gChargeGHz, cutoff: 20, labels: [], ptLevels: 6, exact: false })),
    }).results;
    cases.forEach((c, k) => expect(Math.abs(c.est / ref[k].pt2.zz - 1), `point ${k}: ${c.est} vs PT2 ${ref[k].pt2.zz}`).toBeLessThan(0.01));
  });

  it('is within 3% of the exact dressed ZZ (CoupledPair) in the dispersive regime', () => {
    cases.forEach((c, k) => expect(Math.abs(c.est / c.exact - 1), `point ${k}: ${c.est} vs exact ${c.exact}`).toBeLessThan(0.03));
  });

  it('reduces to 2 g^2 [1/(Delta - alpha_B) - 1/(Delta + alpha_A)] within 8% (dispersive formula, README physics conventions)', () => {
    for (const c of cases) {
      const g = c.pair.exchangeCoupling(qa.fluxForF01(c.fa), qb.fluxForF01(c.fb));
      const delta = c.fa - c.fb;
      const simple = 2 * g * g * (1 / (delta - (c.b.f12 - c.b.f01)) - 1 / (delta + (c.a.f12 - c.a.f01)));
      expect(Math.abs(simple / c.est - 1), `Delta=${delta}`).toBeLessThan(0.08);
    }
  });

  it('is symmetric under exchanging the two transmons and finite where f01_A = f01_B', () => {
    const g = 0.0106;
    const a = { ...ta.at(4.8) };
    const b = { ...tb.at(4.8) };
    expect(Number.isFinite(secondOrderZz(a, b, g))).toBe(true);
    const x = { ...ta.at(5.1) };
    const y = { ...tb.at(4.45) };
    expect(secondOrderZz(x, y, g)).toBeCloseTo(secondOrderZz(y, x, g), 15);
  });

  it('the narrow |11> <-> |40> resonance sits where the exact ZZ spikes (E_4 - E_0 of A = f01_A + f01_B)', () => {
    // A small transmon tuned low (strongly anharmonic), B higher: |11> meets |40> of A.
    const qc = new Transmon('C', { ecGHz: 0.217, ejsGHz: 15, asymmetry: 0.25 });
    const tc = new QubitTable(qc, { minEjOverEc: 20 }); // deep enough for the resonance to fall in B's range
    const low = { ...tc.at(tc.fLowGHz + 0.02) };
    const fb = low.e4 - low.f01;
    if (!(fb < tb.fMaxGHz - 0.06 && fb > tb.fLowGHz)) throw new Error(`test point out of range: ${fb}`);
    const pair = new CoupledPair(qc, qb, 0.015);
    const fluxA = qc.fluxForF01(low.f01);
    const offset = 0.05;
    const near = Math.abs(pair.zz(fluxA, qb.fluxForF01(fb + 0.002)));
    const far = Math.abs(pair.zz(fluxA, qb.fluxForF01(fb + offset)));
    expect(near).toBeGreaterThan(3 * far);
    const nb = { ...tb.at(fb + 0.002) };
    expect(Math.abs(narrowResonanceZz(low, nb, pair.gChargeGHz))).toBeGreaterThan(Math.abs(narrowResonanceZz(low, { ...tb.at(fb + offset) }, pair.gChargeGHz)));
  });
});
