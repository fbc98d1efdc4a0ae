/**
 * Landau-Zener transfer (src/plan/landau-zener.ts) against a direct integration of the two-level
 * Schrodinger equation with SciPy (test/reference/landau_zener.py: solve_ivp, DOP853, adiabatic
 * start and end), and the formula's limits (Landau 1932, Zener 1932; textbook).
 */
import { describe, expect, it } from 'vitest';
import { landauZenerMinimumRate, landauZenerTransfer } from '../../src/plan/landau-zener.js';
import { expectClose } from '../support/close.js';
import { runPython } from '../support/python.js';

const CASES = [
  { g: 0.001, v: 0.05 }, // a defect passed by a fast CZ ramp: small transfer
  { g: 0.003, v: 0.1 },
  { g: 0.0002, v: 0.02 }, // a mediated next-nearest crossing
  { g: 0.01, v: 0.05 }, // a direct neighbour: large transfer
];

describe('landauZenerTransfer', () => {
  it('landauZenerTransfer(g, v) matches a direct two-level integration (SciPy solve_ivp) to 0.1 %', () => {
    const ref = runPython<{ results: number[] }>('landau_zener.py', { cases: CASES });
    CASES.forEach((c, k) => {
      const p = landauZenerTransfer(c.g, c.v);
      // relative tolerance on the probability itself (values are 1e-4 .. 0.08)
      expect(Math.abs(p - ref.results[k]) / ref.results[k], `g=${c.g} v=${c.v}: ${p} vs ${ref.results[k]}`).toBeLessThan(1e-3);
    });
  });

  it('is 0 without coupling, 1 for a standing crossing, and 4 pi^2 g^2 / v for fast sweeps (textbook limits)', () => {
    expect(landauZenerTransfer(0, 0.1)).toBe(0);
    expect(landauZenerTransfer(0.01, 0)).toBe(1);
    const g = 1e-4;
    const v = 1;
    expectClose(landauZenerTransfer(g, v), 4 * Math.PI ** 2 * g * g / v, 1e-6, 'fast limit');
    expect(landauZenerTransfer(0.02, 0.001)).toBeGreaterThan(0.999999);
  });

  it('landauZenerMinimumRate(g, limit) is the rate at which the transfer equals the limit', () => {
    for (const g of [0.0005, 0.002, 0.01]) {
      const v = landauZenerMinimumRate(g, 1e-3);
      expectClose(landauZenerTransfer(g, v), 1e-3, 1e-12, `g=${g}`);
      expect(landauZenerTransfer(g, v * 0.9)).toBeGreaterThan(1e-3);
    }
    expect(() => landauZenerMinimumRate(0.01, 0)).toThrow(RangeError);
  });
});
