/**
 * The mover's sample of the moving-basis models (src/sim/mover-sample.ts) against NumPy: the
 * charge-basis transmon diagonalised at E_J and E_J +- h (test/reference/
 * transmon_wavefunction_derivative.py), its levels and T_mm' = <m|d/dE_J m'> by central
 * differences (truncation error ~h^2, so 1e-7 of |T| is the tolerance). The kept sample is the
 * same numbers as a new one.
 */
import { describe, expect, it } from 'vitest';
import { keptMoverSample, moverSample } from '../../src/sim/mover-sample.js';
import { runPython } from '../support/python.js';

const EC = 0.21;
const EJ = 14.3;
const K = 5;
const NCUT = 20;

describe('moverSample', () => {
  it('levels and the wave-function derivative T match NumPy (eigh and central differences)', () => {
    const ref = runPython<{ energies: number[]; t: number[] }>('transmon_wavefunction_derivative.py', { ec: EC, ej: EJ, levels: K, ncut: NCUT });
    const s = moverSample(EC, EJ, K, NCUT);
    // levels relative to the ground state (the absolute offset is a convention)
    for (let m = 1; m < K; m++) expect(Math.abs(s.energies[m] - s.energies[0] - (ref.energies[m] - ref.energies[0]))).toBeLessThan(1e-9);
    // eigenvector signs are a convention (the models are gauge-free): |T| entry by entry, and T antisymmetric
    let scale = 0;
    for (const x of ref.t) scale = Math.max(scale, Math.abs(x));
    for (let m = 0; m < K; m++)
      for (let q = 0; q < K; q++) {
        expect(Math.abs(Math.abs(s.tm[m * K + q]) - Math.abs(ref.t[m * K + q])), `T ${m}${q}`).toBeLessThan(1e-7 * scale);
        expect(Math.abs(s.tm[m * K + q] + s.tm[q * K + m])).toBeLessThan(1e-9 * scale);
      }
    // the squeezing couples levels two apart (parity): T_02 is the largest non-trivial entry
    expect(Math.abs(s.tm[0 * K + 2])).toBeGreaterThan(1e-3 * scale);
    expect(Math.abs(s.tm[0 * K + 1])).toBeLessThan(1e-12 * scale);
  });

  it('a kept sample gives the same numbers as a new one', () => {
    const a = keptMoverSample(EC, EJ, K, NCUT);
    const b = keptMoverSample(EC, EJ, K, NCUT);
    const c = moverSample(EC, EJ, K, NCUT);
    expect(b).toBe(a);
    expect([...a.tm]).toEqual([...c.tm]);
    expect([...a.energies]).toEqual([...c.energies]);
  });
});
