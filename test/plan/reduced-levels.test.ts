/**
 * A QubitTable filled from the reduced spectrum (src/plan/reduced-levels.ts) against the
 * QubitTable of exact eigen solves (the transmon stage's parity eigenbasis, itself checked against
 * NumPy in test/transmon): every interpolated quantity at points across the planning range.
 */
import { describe, expect, it } from 'vitest';
import { QubitTable } from '../../src/plan/qubit-table.js';
import { sharedReducedSpectrum } from '../../src/transmon/reduced-spectrum.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { reducedQubitTable } from '../../src/plan/reduced-levels.js';

describe('reducedQubitTable', () => {
  it.each([
    [0.213, 24.1, 0.31],
    [0.18, 31.7, 0.05],
    [0.26, 11.2, 0.55],
  ])('E_C %f, E_JS %f, d %f: the same table as exact eigen solves to 1e-9 GHz (levels) and 1e-8 (matrix elements)', (ec, ejs, d) => {
    const t = new Transmon('Q', { ecGHz: ec, ejsGHz: ejs, asymmetry: d }, { coherenceSpec: { t1Ns: 5e4, fluxNoisePhi0: 2e-6 } });
    const exact = new QubitTable(t);
    const fast = reducedQubitTable(t, sharedReducedSpectrum());
    expect(Math.abs(fast.fLowGHz - exact.fLowGHz)).toBeLessThan(1e-9);
    expect(Math.abs(fast.fMaxGHz - exact.fMaxGHz)).toBeLessThan(1e-9);
    for (let k = 0; k <= 10; k++) {
      const f = exact.fLowGHz + ((exact.fMaxGHz - exact.fLowGHz) * k) / 10;
      const a = { ...exact.at(f) };
      const b = { ...fast.at(f) };
      for (const key of ['f01', 'f12', 'e2', 'e3', 'e4', 'e5'] as const) expect(Math.abs(a[key] - b[key]), `${key} at ${f}`).toBeLessThan(1e-9);
      for (const key of ['n01', 'n03', 'n12', 'n23', 'n05', 'n14', 'ejRatio'] as const) expect(Math.abs(a[key] - b[key]), `${key} at ${f}`).toBeLessThan(1e-8);
      expect(Math.abs(a.df01dEj - b.df01dEj), `df01/dE_J at ${f}`).toBeLessThan(1e-8);
      if (k > 0 && k < 10) expect(Math.abs(exact.f01ForF12(a.f12)! - fast.f01ForF12(a.f12)!), `f01ForF12 at ${f}`).toBeLessThan(1e-9);
    }
  });
});
