/**
 * parityEigenbasis (parity blocks, twisted-factorisation vectors, block matrix elements) against
 * a dense NumPy diagonalisation of the full charge-basis Hamiltonian (numpy.linalg.eigh in the
 * parity eigenspaces, via
 * test/reference/transmon_matrix_elements.py): energies, <m|n|m'> and <m|cos phi|m'> with the
 * documented sign convention; and against transmonLevels + chargeMatrix/cosPhiMatrix.
 */
import { describe, expect, it } from 'vitest';
import { chargeMatrixFromParity, cosPhiMatrixFromParity, parityEigenbasis, type ParityEigenbasis } from '../../src/transmon/parity-eigenbasis.js';
import { transmonLevels } from '../../src/transmon/levels.js';
import { chargeMatrix, cosPhiMatrix } from '../../src/transmon/matrix-elements.js';
import { expectAllClose } from '../support/close.js';
import { runPython } from '../support/python.js';

const cases = [
  { ec: 0.21, ej: 18.4, levels: 6, cutoff: 20 },
  { ec: 0.25, ej: 5, levels: 8, cutoff: 20 },
  { ec: 0.19, ej: 40, levels: 6, cutoff: 20 },
  { ec: 0.3, ej: 0.6, levels: 6, cutoff: 15 }, // charge regime, poor Newton guesses
  { ec: 0.2, ej: 0, levels: 5, cutoff: 10 }, // E_J = 0 (symmetric SQUID at half flux)
];
const ref = runPython<{ results: { energies: number[]; charge: number[]; cosPhi: number[] }[] }>('transmon_matrix_elements.py', { cases }).results;

describe('parityEigenbasis(ec, ej, K, N)', () => {
  it('energies, charge and cos(phi) matrices match numpy.linalg.eigh on the full charge basis to 1e-11', () => {
    cases.forEach((c, i) => {
      const b = parityEigenbasis(c.ec, c.ej, c.levels, c.cutoff);
      const label = `E_C=${c.ec} E_J=${c.ej}`;
      expectAllClose(b.energies, ref[i].energies, 1e-11, `${label} energies`);
      if (c.ej === 0) return; // degenerate levels (4 E_C twice): vectors not unique
      expectAllClose(chargeMatrixFromParity(b), ref[i].charge, 1e-11, `${label} charge`);
      expectAllClose(cosPhiMatrixFromParity(b), ref[i].cosPhi, 1e-11, `${label} cos phi`);
    });
  });

  it('agrees with transmonLevels + chargeMatrix/cosPhiMatrix (same basis and signs) to 1e-13', () => {
    for (const c of cases.slice(0, 4)) {
      const b = parityEigenbasis(c.ec, c.ej, c.levels, c.cutoff);
      const lv = transmonLevels(c.ec, c.ej, { levels: c.levels, chargeCutoff: c.cutoff, vectors: true });
      expectAllClose(b.energies, lv.energies, 1e-13, 'energies');
      expectAllClose(chargeMatrixFromParity(b), chargeMatrix(lv), 1e-13, 'charge');
      expectAllClose(cosPhiMatrixFromParity(b), cosPhiMatrix(lv), 1e-13, 'cos phi');
    }
  });

  it('gives the same bits whatever was solved before, at this cutoff or another (work buffers are kept per cutoff)', () => {
    // each question asked first on its own, then again after solves at other cutoffs and sizes
    const questions = [
      { ec: 0.21, ej: 18.4, k: 6, n: 20 }, { ec: 0.25, ej: 5, k: 3, n: 12 }, { ec: 0.19, ej: 40, k: 2, n: 31 },
      { ec: 0.3, ej: 0.6, k: 5, n: 15 }, { ec: 0.2, ej: 14, k: 6, n: 20 }, { ec: 0.22, ej: 9, k: 4, n: 12 },
    ];
    const bits = (b: ParityEigenbasis) => [...b.energies, ...b.blockVectors];
    const first = questions.map((q) => bits(parityEigenbasis(q.ec, q.ej, q.k, q.n)));
    for (let round = 0; round < 3; round++) {
      for (let i = questions.length - 1; i >= 0; i--) {
        const q = questions[(i * 5 + round) % questions.length];
        const again = bits(parityEigenbasis(q.ec, q.ej, q.k, q.n));
        const want = first[questions.indexOf(q)];
        expect(again.length).toBe(want.length);
        again.forEach((x, j) => expect(Object.is(x, want[j]), `${JSON.stringify(q)} entry ${j}`).toBe(true));
      }
    }
  });

  it('fills a given result exactly as it builds a new one (a larger one, holding other numbers, included)', () => {
    for (const c of cases.slice(0, 4)) {
      for (const k of [1, 2, 3, 5]) {
        const fresh = parityEigenbasis(c.ec, c.ej, k, c.cutoff);
        const into = { levels: 0, chargeCutoff: 0, energies: new Float64Array(k + 2).fill(NaN), blockVectors: new Float64Array((k + 1) * (c.cutoff + 1)).fill(NaN) };
        const got = parityEigenbasis(c.ec, c.ej, k, c.cutoff, true, into);
        expect(got).toBe(into);
        expect(got.levels).toBe(k);
        expect(got.chargeCutoff).toBe(c.cutoff);
        expect(Array.from(got.energies.subarray(0, k))).toEqual(Array.from(fresh.energies));
        expect(Array.from(got.blockVectors.subarray(0, k * (c.cutoff + 1)))).toEqual(Array.from(fresh.blockVectors));
        expect(Array.from(chargeMatrixFromParity(got))).toEqual(Array.from(chargeMatrixFromParity(fresh)));
      }
    }
    expect(() => parityEigenbasis(0.2, 15, 3, 20, true, { levels: 0, chargeCutoff: 0, energies: new Float64Array(3), blockVectors: new Float64Array(10) })).toThrow(RangeError);
  });

  it('without vectors returns energies only, and rejects bad input', () => {
    const b = parityEigenbasis(0.2, 15, 3, 20, false);
    expect(b.blockVectors.length).toBe(0);
    expect(() => chargeMatrixFromParity(b)).toThrow(RangeError);
    expect(() => parityEigenbasis(0.2, 15, 50, 20)).toThrow(RangeError);
    expect(() => parityEigenbasis(-1, 15, 3, 20)).toThrow(RangeError);
  });
});
