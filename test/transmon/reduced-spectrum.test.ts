/**
 * The reduced spectrum (levels and matrix elements as functions of r = E_J / E_C, tabulated once)
 * against a dense NumPy diagonalisation of the full charge-basis Hamiltonian
 * (test/reference/transmon_matrix_elements.py, numpy.linalg.eigh), at E_C = 1 and at a physical
 * E_C (the scaling E_k = E_C e_k(r) itself), and its inverse maps against its forward map.
 */
import { describe, expect, it } from 'vitest';
import { ReducedSpectrum, sharedReducedSpectrum, type ReducedChannel } from '../../src/transmon/reduced-spectrum.js';
import { runPython } from '../support/python.js';

// r spread over the accepted transmon range (E_JS / E_C 20-2000) and below it (tuned-down SQUIDs)
const rs = [10.3, 17.7, 31.4, 55.5, 96.2, 151.9, 288.8, 612.3, 1244.4, 2890.1];
const ec = 0.213;
const cases = rs.map((r) => ({ ec, ej: r * ec, levels: 6, cutoff: 40 }));
const ref = runPython<{ results: { energies: number[]; charge: number[] }[] }>('transmon_matrix_elements.py', { cases }).results;

describe('ReducedSpectrum', () => {
  const t = sharedReducedSpectrum();

  it('levels E_k - E_0 = E_C e_k(r) within 1e-10 (relative) and |<i|n|k>| within 1e-9 of numpy.linalg.eigh', () => {
    rs.forEach((r, c) => {
      const st = t.at(r);
      const e = ref[c].energies;
      const levels = [st.e1, st.e2, st.e3, st.e4, st.e5];
      levels.forEach((x, k) => {
        const exact = (e[k + 1] - e[0]) / ec;
        expect(Math.abs(x - exact) / exact, `r=${r} e${k + 1}`).toBeLessThan(1e-10);
      });
      const n = (i: number, j: number) => Math.abs(ref[c].charge[i * 6 + j]);
      const pairs: [number, number, number][] = [[st.n01, 0, 1], [st.n03, 0, 3], [st.n12, 1, 2], [st.n23, 2, 3], [st.n05, 0, 5], [st.n14, 1, 4]];
      for (const [x, i, j] of pairs) expect(Math.abs(x - n(i, j)) / Math.max(n(i, j), 1e-3), `r=${r} n${i}${j}`).toBeLessThan(1e-9);
    });
  });

  it('de1/dr matches a central difference of the NumPy levels (Hellmann-Feynman slope) within 1e-6', () => {
    const d = 1e-3;
    const fd = runPython<{ results: { energies: number[] }[] }>('transmon_matrix_elements.py', {
      cases: rs.flatMap((r) => [{ ec: 1, ej: r * (1 + d), levels: 2, cutoff: 40 }, { ec: 1, ej: r * (1 - d), levels: 2, cutoff: 40 }]),
    }).results;
    rs.forEach((r, c) => {
      const up = fd[2 * c].energies;
      const down = fd[2 * c + 1].energies;
      const slope = (up[1] - up[0] - (down[1] - down[0])) / (2 * d * r);
      expect(Math.abs(t.at(r).de1dr - slope) / slope, `r=${r}`).toBeLessThan(1e-6);
    });
  });

  it('rFor inverts every monotone channel to 1e-12 and answers null outside [rLo, rHi]', () => {
    const channels: ReducedChannel[] = ['e1', 'e12', 'e2', 'e3', 'e4', 'e5', 'e2-1', 'e3-1', 'e4-1', 'e5-1'];
    for (const c of channels) {
      for (const r of [6.1, 25, 80.5, 400, 3000]) {
        const y = t.value(c, r);
        expect(Math.abs(t.rFor(c, y)! - r) / r, `${c} at r=${r}`).toBeLessThan(1e-12);
      }
    }
    expect(t.rFor('e1', t.value('e1', 50), 60, 100)).toBeNull();
    expect(t.rFor('e1', t.value('e1', 50), 20, 40)).toBeNull();
    expect(t.rFor('e1', t.value('e1', 50), 20, 50)).toBeCloseTo(50, 9);
  });

  it('a coarser grid is less accurate (the test can tell a bad table)', () => {
    const coarse = new ReducedSpectrum({ points: 200 });
    const exact = (ref[0].energies[2] - ref[0].energies[0]) / ec;
    expect(Math.abs(coarse.at(rs[0]).e2 - exact) / exact).toBeGreaterThan(1e-9);
  });
});
