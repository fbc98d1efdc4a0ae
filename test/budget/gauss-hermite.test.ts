/**
 * Gauss-Hermite rules (src/budget/gauss-hermite.ts) against NumPy's hermegauss
 * (test/reference/gauss_hermite.py) and the normal moments E[X^2k] = (2k - 1)!! sigma^2k
 * (handbook: Abramowitz and Stegun 26.2.x; common practice).
 */
import { describe, expect, it } from 'vitest';
import { gaussHermiteRule, normalExpectation } from '../../src/budget/gauss-hermite.js';
import { runPython } from '../support/python.js';
import { expectClose } from '../support/close.js';

describe('gaussHermiteRule(n)', () => {
  it('matches numpy.polynomial.hermite_e.hermegauss (weights normalised) to 1e-12 for n = 1..12, 20', () => {
    const sizes = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 20];
    const ref = runPython<{ rules: { n: number; nodes: number[]; weights: number[] }[] }>('gauss_hermite.py', { n: sizes });
    for (const r of ref.rules) {
      const ours = gaussHermiteRule(r.n);
      for (let k = 0; k < r.n; k++) {
        expectClose(ours.nodes[k], r.nodes[k], 1e-12, `n=${r.n} node ${k}`);
        expectClose(ours.weights[k], r.weights[k], 1e-12, `n=${r.n} weight ${k}`);
      }
    }
  });

  it('the 3-point rule is 0, +-sqrt(3) with weights 2/3, 1/6, 1/6 (closed form)', () => {
    const r = gaussHermiteRule(3);
    expectClose(r.nodes[2], Math.sqrt(3), 1e-14, 'node');
    expect(r.nodes[1]).toBe(0);
    expectClose(r.weights[1], 2 / 3, 1e-14, 'centre weight');
    expectClose(r.weights[0], 1 / 6, 1e-14, 'side weight');
  });

  it('normalExpectation integrates the even moments (2k-1)!! sigma^2k exactly up to degree 2n - 1', () => {
    const sigma = 1.7e-5;
    for (const n of [3, 5, 9]) {
      let dfact = 1;
      for (let k = 1; 2 * k <= 2 * n - 1; k++) {
        dfact *= 2 * k - 1;
        const got = normalExpectation((x) => (x / sigma) ** (2 * k), sigma, n);
        expectClose(got, dfact, 1e-11, `n=${n} E[X^${2 * k}]`);
      }
      expect(Math.abs(normalExpectation((x) => x ** 3, sigma, n))).toBeLessThan(1e-30);
    }
  });

  it('refuses sizes outside [1, 40]', () => {
    expect(() => gaussHermiteRule(0)).toThrow(RangeError);
    expect(() => gaussHermiteRule(2.5)).toThrow(RangeError);
  });
});
