/**
 * transmonLevels against outside references:
 * - Mathieu characteristic values from SciPy (scipy.special.mathieu_a / mathieu_b; Koch et al.,
 *   Phys. Rev. A 76, 042319 (2007), Eq. 2.5), at n_g = 0 and n_g = 1/2, via
 *   test/reference/transmon_mathieu.py. SciPy's own accuracy is checked first against a
 *   large-cutoff (N = 80) LAPACK solution of the same Hamiltonian.
 * - Koch 2007 asymptotics f01 ~ sqrt(8 E_J E_C) - E_C and alpha ~ -E_C (Eq. 2.11), whose
 *   neglected terms are of order E_C sqrt(E_C/E_J) (from memory).
 * - Koch 2007 charge dispersion eps_m (Eq. 2.18), an asymptotic formula with relative error of
 *   order sqrt(E_C/E_J) (measured here; ~3% for m = 0 at E_J/E_C = 100).
 * - A generic offset charge against scipy.linalg.eigh_tridiagonal on the full matrix.
 */
import { describe, expect, it } from 'vitest';
import { transmonLevels } from '../../src/transmon/levels.js';
import { expectAllClose, expectClose, maxRelativeError } from '../support/close.js';
import { runPython } from '../support/python.js';

interface Case {
  ec: number;
  ej: number;
  levels: number;
  ng: number;
}
const ratios = [1, 5, 20, 50, 100, 150, 300];
const cases: Case[] = [];
for (const r of ratios)
  for (const ec of [0.2, 0.31]) {
    cases.push({ ec, ej: r * ec, levels: 8, ng: 0 });
    cases.push({ ec, ej: r * ec, levels: 8, ng: 0.5 });
  }
const generic: Case[] = [
  { ec: 0.25, ej: 5, levels: 6, ng: 0.3 },
  { ec: 0.2, ej: 10, levels: 6, ng: -0.17 },
  { ec: 0.3, ej: 1.5, levels: 6, ng: 0.9 },
];
const ref = runPython<{ results: { mathieu: number[] | null; dense: number[] }[] }>('transmon_mathieu.py', { cases: [...cases, ...generic] }).results;

describe('transmonLevels(ec, ej) against Mathieu characteristic values', () => {
  it('SciPy mathieu_a/mathieu_b themselves agree with an N = 80 charge-basis solution to 1e-12 relative (so SciPy is not the limit)', () => {
    cases.forEach((c, i) => {
      const m = ref[i].mathieu!;
      expect(maxRelativeError(m, ref[i].dense), `E_J/E_C=${c.ej / c.ec} n_g=${c.ng}`).toBeLessThanOrEqual(1e-12);
    });
  });

  it('levels(ec, ej) match Mathieu values to 1e-11 relative at n_g = 0 for 1 <= E_J/E_C <= 300 (requirement: 1e-9)', () => {
    cases.forEach((c, i) => {
      if (c.ng !== 0) return;
      const e = transmonLevels(c.ec, c.ej, { levels: c.levels }).energies;
      expectAllClose(e, ref[i].mathieu!, 1e-11, `E_J/E_C=${c.ej / c.ec} E_C=${c.ec}`);
    });
  });

  it('levels(ec, ej, {offsetCharge: 1/2}) match the half-integer Mathieu values {a_1, b_1, a_3, b_3, ...} to 1e-11 relative', () => {
    cases.forEach((c, i) => {
      if (c.ng !== 0.5) return;
      const e = transmonLevels(c.ec, c.ej, { levels: c.levels, offsetCharge: 0.5 }).energies;
      expectAllClose(e, ref[i].mathieu!, 1e-11, `n_g=1/2 E_J/E_C=${c.ej / c.ec}`);
    });
  });

  it('a generic offset charge matches scipy.linalg.eigh_tridiagonal (N = 80) to 1e-11 relative', () => {
    generic.forEach((c, i) => {
      const e = transmonLevels(c.ec, c.ej, { levels: c.levels, offsetCharge: c.ng }).energies;
      expectAllClose(e, ref[cases.length + i].dense, 1e-11, `n_g=${c.ng}`);
    });
  });
});

describe('transmonLevels in the transmon regime against Koch 2007 asymptotics', () => {
  it('f01 ~ sqrt(8 E_J E_C) - E_C and alpha ~ -E_C, with corrections of order E_C sqrt(E_C/E_J) that shrink as predicted', () => {
    const ec = 0.22;
    const scaled: { r: number; df: number; da: number }[] = [];
    for (const r of [50, 100, 200, 400, 800]) {
      const e = transmonLevels(ec, r * ec, { levels: 3, chargeCutoff: 40 }).energies;
      const f01 = e[1] - e[0];
      const alpha = e[2] - 2 * e[1] + e[0];
      const unit = ec * Math.sqrt(1 / r); // E_C sqrt(E_C / E_J)
      const df = (f01 - (Math.sqrt(8 * r) * ec - ec)) / unit;
      const da = (alpha + ec) / unit;
      // Size of the neglected terms: at most ~1.5 E_C sqrt(E_C/E_J) (measured 0.4 for f01, 0.9-1.1 for alpha).
      expect(Math.abs(df), `f01 correction at E_J/E_C=${r}`).toBeLessThanOrEqual(1.5);
      expect(Math.abs(da), `alpha correction at E_J/E_C=${r}`).toBeLessThanOrEqual(1.5);
      // Both corrections are negative (levels lie below the asymptotic ones).
      expect(df).toBeLessThan(0);
      expect(da).toBeLessThan(0);
      scaled.push({ r, df, da });
    }
    // The scaled corrections tend to constants: successive values within 15% of each other.
    for (let i = 1; i < scaled.length; i++) {
      expectClose(scaled[i].df, scaled[i - 1].df, 0.15 * Math.abs(scaled[i - 1].df), `f01 scaling ${scaled[i].r}`);
      expectClose(scaled[i].da, scaled[i - 1].da, 0.15 * Math.abs(scaled[i - 1].da), `alpha scaling ${scaled[i].r}`);
    }
  });

  it('charge dispersion E_m(n_g = 1/2) - E_m(0) follows Koch Eq. 2.18 within its asymptotic accuracy c_m sqrt(E_C/E_J)', () => {
    const ec = 0.25;
    const cM = [0.5, 1.5, 3]; // allowed relative error = c_m / sqrt(E_J/E_C) (measured: 0.32, 1.2, 2.5)
    const previous = [Infinity, Infinity, Infinity];
    for (const r of [20, 30, 50, 80, 100]) {
      const ej = r * ec;
      const e0 = transmonLevels(ec, ej, { levels: 3 }).energies;
      const eh = transmonLevels(ec, ej, { levels: 3, offsetCharge: 0.5 }).energies;
      for (let m = 0; m < 3; m++) {
        const exact = eh[m] - e0[m];
        let fact = 1;
        for (let j = 2; j <= m; j++) fact *= j;
        const koch = ((-1) ** m * ec * 2 ** (4 * m + 5) * Math.sqrt(2 / Math.PI) * (ej / (2 * ec)) ** (m / 2 + 0.75) * Math.exp(-Math.sqrt((8 * ej) / ec))) / fact;
        const rel = Math.abs(exact / koch - 1);
        expect(Math.sign(exact), `sign of eps_${m} at E_J/E_C=${r}`).toBe(Math.sign(koch));
        expect(rel, `eps_${m} at E_J/E_C=${r}: exact ${exact}, Koch ${koch}`).toBeLessThanOrEqual(cM[m] / Math.sqrt(r));
        // Asymptotic: the relative error falls as E_J/E_C grows.
        expect(rel).toBeLessThan(previous[m]);
        previous[m] = rel;
      }
    }
  });
});

describe('transmonLevels eigenvectors', () => {
  it('are normalised, alternate in charge parity and follow the documented sign convention (c_0 > 0 even, c_1 > 0 odd)', () => {
    const nCut = 20;
    const dim = 2 * nCut + 1;
    const lv = transmonLevels(0.2, 12, { levels: 6, vectors: true });
    for (let m = 0; m < 6; m++) {
      const v = lv.vectors.subarray(m * dim, (m + 1) * dim);
      let s = 0;
      for (let j = 0; j < dim; j++) s += v[j] * v[j];
      expectClose(s, 1, 1e-13, `norm ${m}`);
      const parity = m % 2 === 0 ? 1 : -1;
      for (let k = 1; k <= nCut; k++) expectClose(v[nCut - k], parity * v[nCut + k], 1e-15, `parity ${m} k=${k}`);
      expect(m % 2 === 0 ? v[nCut] : v[nCut + 1]).toBeGreaterThan(0);
    }
  });

  it('satisfy H c = E c in the charge basis to 1e-12 ||H||', () => {
    const ec = 0.2;
    const ej = 12;
    const nCut = 20;
    const dim = 2 * nCut + 1;
    for (const ng of [0, 0.3]) {
      const lv = transmonLevels(ec, ej, { levels: 5, vectors: true, offsetCharge: ng });
      for (let m = 0; m < 5; m++) {
        const v = lv.vectors.subarray(m * dim, (m + 1) * dim);
        let worst = 0;
        for (let j = 0; j < dim; j++) {
          const n = j - nCut - ng;
          let y = 4 * ec * n * n * v[j] - lv.energies[m] * v[j];
          if (j > 0) y -= (ej / 2) * v[j - 1];
          if (j < dim - 1) y -= (ej / 2) * v[j + 1];
          worst = Math.max(worst, Math.abs(y));
        }
        expect(worst, `residual level ${m} n_g=${ng}`).toBeLessThanOrEqual(1e-12 * 4 * ec * nCut * nCut);
      }
    }
  });

  it('rejects bad arguments with a RangeError', () => {
    expect(() => transmonLevels(0, 10, { levels: 3 })).toThrow(RangeError);
    expect(() => transmonLevels(0.2, 10, { levels: 50 })).toThrow(RangeError);
  });
});
