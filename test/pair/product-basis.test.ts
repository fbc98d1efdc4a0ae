/**
 * Product basis (src/pair/product-basis.ts): productHamiltonian against the same Hamiltonian
 * built with numpy.kron (test/reference/product_hamiltonian.py) for two and three transmons;
 * index/label round trips; parity sectors that block-diagonalise H (README physics conventions sec. 2).
 */
import { describe, expect, it } from 'vitest';
import { paritySectors, productHamiltonian, productIndex, productLabel, productLevels, productSpace, subMatrix } from '../../src/pair/product-basis.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { expectAllClose } from '../support/close.js';
import { runPython } from '../support/python.js';

const q = [
  new Transmon('A', { ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 }),
  new Transmon('B', { ecGHz: 0.2, ejsGHz: 22, asymmetry: 0.3 }),
  new Transmon('C', { ecGHz: 0.23, ejsGHz: 16, asymmetry: 0.2 }),
];

describe('productHamiltonian(space, parts, couplings)', () => {
  it('equals the numpy.kron construction to 1e-14 for a pair (K = 5, 4) and a chain of three (K = 3)', () => {
    const setups = [
      { dims: [5, 4], couplings: [{ a: 0, b: 1, gCharge: 0.013 }] },
      { dims: [3, 3, 3], couplings: [{ a: 0, b: 1, gCharge: 0.011 }, { a: 1, b: 2, gCharge: 0.009 }] },
    ];
    for (const s of setups) {
      const parts = s.dims.map((k, i) => q[i].chargeBasis(0.1 * i, k));
      const ref = runPython<{ h: number[]; size: number }>('product_hamiltonian.py', {
        parts: parts.map((p) => ({ energies: [...p.energies], charge: [...p.charge] })),
        couplings: s.couplings,
      });
      const space = productSpace(s.dims);
      expect(space.size).toBe(ref.size);
      expectAllClose(productHamiltonian(space, parts, s.couplings), ref.h, 1e-14, `dims ${s.dims}`);
    }
  });

  it('indexes |ij> as i K_B + j and round-trips labels', () => {
    const space = productSpace([6, 6]);
    expect(productIndex(space, [1, 1])).toBe(7);
    expect(productIndex(space, [2, 0])).toBe(12);
    expect(productLabel(space, 12)).toBe('20');
    for (let i = 0; i < space.size; i++) expect(productIndex(space, productLevels(space, i))).toBe(i);
    expect(productLabel(productSpace([12, 3]), productIndex(productSpace([12, 3]), [10, 2]))).toBe('10,2');
    expect(() => productIndex(space, [6, 0])).toThrow(RangeError);
  });

  it('has no matrix elements between the even and odd excitation-parity sectors', () => {
    const space = productSpace([6, 6]);
    const parts = [q[0].chargeBasis(0.2, 6), q[1].chargeBasis(0.05, 6)];
    const h = productHamiltonian(space, parts, [{ a: 0, b: 1, gCharge: 0.02 }]);
    const { even, odd } = paritySectors(space);
    expect(even.length + odd.length).toBe(36);
    for (const r of even) for (const c of odd) expect(h[r * 36 + c]).toBe(0);
    const block = subMatrix(h, 36, even);
    expect(block[0]).toBe(h[0]);
  });
});
