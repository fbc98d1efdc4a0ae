/**
 * Mediated exchange of next-nearest neighbours (src/plan/mediated-coupling.ts) against the exact
 * minimum gap of the single-excitation avoided crossing with the mediators (NumPy eigh, SciPy minimize_scalar,
 * test/reference/mediated_coupling.py). Second-order elimination is accurate to O((g/Delta)^2)
 * relative (Schrieffer-Wolff; Yan et al., Phys. Rev. Applied 10, 054062 (2018)).
 */
import { describe, expect, it } from 'vitest';
import { mediatedExchange } from '../../src/plan/mediated-coupling.js';
import { runPython } from '../support/python.js';

const CASES = [
  { f: 5.0, mediators: [{ f: 6.0, gi: 0.012, gk: 0.015 }] },
  { f: 6.2, mediators: [{ f: 5.1, gi: 0.014, gk: 0.011 }] },
  { f: 6.3, mediators: [{ f: 5.0, gi: 0.013, gk: 0.017 }, { f: 5.4, gi: 0.012, gk: 0.016 }] },
  { f: 5.5, mediators: [{ f: 6.4, gi: 0.01, gk: 0.01 }, { f: 4.7, gi: 0.012, gk: 0.012 }] },
];

describe('mediatedExchange', () => {
  it('sum_S g_iS g_kS / (f - f_S) matches half the exact minimum gap (NumPy) within 3 (g/Delta)^2', () => {
    const ref = runPython<{ results: number[] }>('mediated_coupling.py', { cases: CASES });
    CASES.forEach((c, k) => {
      const g = Math.abs(mediatedExchange(c.f, c.f, c.mediators.map((m) => ({ giGHz: m.gi, gkGHz: m.gk, fGHz: m.f }))));
      const worst = Math.max(...c.mediators.map((m) => Math.max(m.gi, m.gk) / Math.abs(c.f - m.f)));
      // error relative to the sum of the paths' magnitudes (paths through mediators on opposite sides cancel)
      const scale = c.mediators.reduce((s, m) => s + (m.gi * m.gk) / Math.abs(c.f - m.f), 0);
      const rel = Math.abs(g - ref.results[k]) / scale;
      expect(rel, `case ${k}: ${g} vs ${ref.results[k]}`).toBeLessThan(3 * worst * worst + 1e-9);
    });
  });

  it('mediators on opposite sides of the pair partly cancel (signs are kept)', () => {
    const above = mediatedExchange(5.5, 5.5, [{ giGHz: 0.01, gkGHz: 0.01, fGHz: 6.5 }]);
    const below = mediatedExchange(5.5, 5.5, [{ giGHz: 0.01, gkGHz: 0.01, fGHz: 4.5 }]);
    expect(above).toBeCloseTo(-below, 15);
    expect(mediatedExchange(5.5, 5.5, [{ giGHz: 0.01, gkGHz: 0.01, fGHz: 6.5 }, { giGHz: 0.01, gkGHz: 0.01, fGHz: 4.5 }])).toBeCloseTo(0, 15);
  });
});
