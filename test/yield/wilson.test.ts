/** The Wilson score interval against scipy.stats.binomtest(k, n).proportion_ci(method='wilson'). */
import { describe, expect, it } from 'vitest';
import { wilsonInterval, Z_95 } from '../../src/yield/wilson.js';
import { expectClose } from '../support/close.js';
import { runPython } from '../support/python.js';

const cases: [number, number][] = [[0, 1], [1, 1], [0, 10], [10, 10], [7, 20], [1, 1000], [500, 1000], [9990, 10000], [3, 7], [123, 4567]];
const ref = runPython<{ intervals: [number, number][]; z: number }>('wilson_interval.py', { cases, confidence: 0.95 });

describe('wilsonInterval(k, n)', () => {
  it('z of a 95 % interval is scipy.stats.norm.ppf(0.975)', () => {
    expectClose(Z_95, ref.z, 1e-15, 'z');
  });

  it('matches SciPy within 1e-12 for k = 0 ... n and n = 1 ... 10,000', () => {
    cases.forEach(([k, n], i) => {
      const w = wilsonInterval(k, n);
      expectClose(w.low, ref.intervals[i][0], 1e-12, `${k}/${n} low`);
      expectClose(w.high, ref.intervals[i][1], 1e-12, `${k}/${n} high`);
    });
  });

  it('holds the estimate and narrows as 1/sqrt(n)', () => {
    const a = wilsonInterval(30, 100);
    const b = wilsonInterval(3000, 10000);
    expect(a.low).toBeLessThan(0.3);
    expect(a.high).toBeGreaterThan(0.3);
    expect((a.high - a.low) / (b.high - b.low)).toBeCloseTo(10, 0);
  });

  it('refuses impossible counts', () => {
    expect(() => wilsonInterval(3, 2)).toThrow(RangeError);
    expect(() => wilsonInterval(0, 0)).toThrow(RangeError);
  });
});
