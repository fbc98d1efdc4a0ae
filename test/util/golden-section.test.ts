/** The golden-section kernel (src/util/golden-section.ts) against SciPy's bounded Brent minimiser (test/reference/golden_minimum.py). */
import { describe, expect, it } from 'vitest';
import { goldenSection, GOLDEN_RATIO_CONJUGATE } from '../../src/util/golden-section.js';
import { runPython } from '../support/python.js';

const FUNCTIONS: Record<string, (x: number) => number> = {
  'shifted-sine': (x) => (x - 0.3) ** 2 + 0.1 * Math.sin(3 * x),
  quartic: (x) => (x - 1.234) ** 4 + 0.5 * (x - 1.234) ** 2 + 2.0,
  'log-cosh': (x) => Math.log(Math.cosh(2.0 * (x + 0.77))) + 0.05 * x,
};
const cases = [
  { name: 'shifted-sine', lo: -1, hi: 2 },
  { name: 'quartic', lo: 0, hi: 3 },
  { name: 'log-cosh', lo: -2, hi: 1 },
];

describe('goldenSection', () => {
  const ref = runPython<{ x: number[] }>('golden_minimum.py', { cases });

  it('finds the minimiser SciPy finds, to 1e-7 (the precision of a minimum, ~sqrt(machine epsilon))', () => {
    cases.forEach((c, k) => {
      const g = goldenSection(FUNCTIONS[c.name], c.lo, c.hi, 80);
      const x = g.fc < g.fd ? g.c : g.d;
      expect(Math.abs(x - ref.x[k]), c.name).toBeLessThan(1e-7);
    });
  });

  it('shrinks the bracket by (sqrt 5 - 1)/2 per step, with one evaluation per step after the first two (Numerical Recipes sec. 10.2)', () => {
    let calls = 0;
    const g = goldenSection((x) => (calls++, (x - 0.4) ** 2), 0, 1, 20);
    expect(calls).toBe(22);
    expect(g.b - g.a).toBeCloseTo(GOLDEN_RATIO_CONJUGATE ** 20, 12);
    expect(g.a).toBeLessThanOrEqual(0.4);
    expect(g.b).toBeGreaterThanOrEqual(0.4);
  });

  it('stops when asked (checked before each shrinking)', () => {
    let calls = 0;
    const g = goldenSection((x) => (calls++, x * x), -1, 1, 20, () => calls >= 3);
    expect(calls).toBe(3); // two interior points, one shrinking, then stop
    expect(g.b - g.a).toBeCloseTo(2 * GOLDEN_RATIO_CONJUGATE, 12);
  });
});
