/**
 * Convergence of the transmon levels in the charge cutoff N, against a large-cutoff (N = 80)
 * LAPACK solution of the same Hamiltonian (scipy.linalg.eigh_tridiagonal via
 * test/reference/transmon_mathieu.py), and the cutoff rule chargeCutoffFor(E_J/E_C).
 * README physics conventions sec. 1: N = 20 converges to better than 1e-10 GHz for E_J/E_C up to ~150.
 */
import { describe, expect, it } from 'vitest';
import { chargeCutoffFor } from '../../src/transmon/charge-cutoff.js';
import { transmonLevels } from '../../src/transmon/levels.js';
import { runPython } from '../support/python.js';

const EC = 0.3; // a large E_C makes the GHz errors largest
const ratios = [10, 20, 50, 100, 150, 300, 600, 1000, 2000];
const ref = runPython<{ results: { dense: number[] }[] }>('transmon_mathieu.py', {
  cases: ratios.map((r) => ({ ec: EC, ej: r * EC, levels: 8, ng: 0.25 })).concat(ratios.map((r) => ({ ec: EC, ej: r * EC, levels: 8, ng: 0 }))),
}).results;
const reference = (r: number) => ref[ratios.length + ratios.indexOf(r)].dense;

function worstError(r: number, nCut: number, levels = 8): number {
  const e = transmonLevels(EC, r * EC, { levels, chargeCutoff: nCut }).energies;
  const d = reference(r);
  let worst = 0;
  for (let m = 0; m < levels; m++) worst = Math.max(worst, Math.abs(e[m] - d[m]));
  return worst;
}

describe('charge cutoff N', () => {
  it('N = 20 gives the lowest 8 levels to better than 1e-10 GHz for E_J/E_C <= 150 (in fact <= 300)', () => {
    for (const r of ratios.filter((x) => x <= 300)) expect(worstError(r, 20), `E_J/E_C=${r}`).toBeLessThanOrEqual(1e-10);
  });

  it('the error falls with N (N = 10 is visibly short at E_J/E_C = 150, N = 15 nearly converged)', () => {
    const e10 = worstError(150, 10);
    const e15 = worstError(150, 15);
    const e20 = worstError(150, 20);
    expect(e10).toBeGreaterThan(1e-5);
    expect(e15).toBeLessThan(e10 * 1e-3);
    expect(e20).toBeLessThanOrEqual(Math.max(e15, 1e-12));
  });

  it('chargeCutoffFor(E_J/E_C) keeps the lowest 8 levels within 1e-10 GHz up to E_J/E_C = 2000, where N = 20 alone fails', () => {
    for (const r of ratios) {
      const n = chargeCutoffFor(r);
      expect(n).toBeGreaterThanOrEqual(20);
      expect(worstError(r, n), `E_J/E_C=${r}, N=${n}`).toBeLessThanOrEqual(1e-10);
    }
    expect(worstError(2000, 20)).toBeGreaterThan(1e-6);
  });

  it('an offset charge n_g = 1/4 converges the same way (full-matrix path)', () => {
    for (const r of [20, 100, 150]) {
      const e = transmonLevels(EC, r * EC, { levels: 8, chargeCutoff: 20, offsetCharge: 0.25 }).energies;
      const d = ref[ratios.indexOf(r)].dense;
      for (let m = 0; m < 8; m++) expect(Math.abs(e[m] - d[m]), `E_J/E_C=${r} m=${m}`).toBeLessThanOrEqual(1e-10);
    }
  });
});
