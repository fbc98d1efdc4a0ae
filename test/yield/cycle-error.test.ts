/**
 * The hook between a plan's cycle error and the yield (src/yield/cycle-error.ts), and the
 * distribution the result reports (src/yield/summary.ts cycleErrorDistribution): quantiles
 * against numpy.quantile (linear interpolation), the decade histogram, and null when no plan
 * states a cycle error.
 */
import { describe, expect, it } from 'vitest';
import { cycleErrorFailure, cycleErrorOf } from '../../src/yield/cycle-error.js';
import type { SampleOutcome } from '../../src/yield/outcome.js';
import { cycleErrorDistribution } from '../../src/yield/summary.js';
import { Random } from '../../src/util/random.js';
import { expectClose } from '../support/close.js';
import { runPython } from '../support/python.js';

const outcome = (index: number, cycleError: number | null): SampleOutcome => ({ index, ok: true, rules: [], qubits: [], edges: [], reason: null, cycleError });

describe('cycle error', () => {
  it('is read from a plan that states it (cycle.error), null otherwise; over the ceiling it is a failure', () => {
    expect(cycleErrorOf({ cycle: { duration: 1000, error: 0.0123, gates: 0.01, idles: 0.0023 } })).toBe(0.0123);
    expect(cycleErrorOf({})).toBeNull();
    expect(cycleErrorOf({ cycle: null })).toBeNull();
    expect(cycleErrorOf({ cycle: { error: Number.NaN } })).toBeNull();
    expect(cycleErrorFailure(0.02, 0.01)).toMatchObject({ rule: 'cycle-error' });
    expect(cycleErrorFailure(0.005, 0.01)).toBeNull();
    expect(cycleErrorFailure(0.02, null)).toBeNull();
    expect(cycleErrorFailure(null, 0.01)).toBeNull();
  });

  it('its distribution: quantiles and mean as numpy gives them, a decade histogram, null without values', () => {
    const rng = new Random(5);
    const values = Array.from({ length: 501 }, () => 10 ** rng.between(-5.5, -0.5));
    const d = cycleErrorDistribution([...values.map((v, i) => outcome(i, v)), outcome(501, null)]) as Record<string, any>;
    const ref = runPython<{ quantiles: number[]; mean: number }>('quantiles.py', { values, q: [0, 0.05, 0.5, 0.95, 1] });
    expect(d.samples).toBe(501);
    expectClose(d.min, ref.quantiles[0], 1e-11, 'min');
    expectClose(d.p05, ref.quantiles[1], 1e-11, 'p05');
    expectClose(d.median, ref.quantiles[2], 1e-11, 'median');
    expectClose(d.p95, ref.quantiles[3], 1e-11, 'p95');
    expectClose(d.max, ref.quantiles[4], 1e-11, 'max');
    expectClose(d.mean, ref.mean, 1e-11, 'mean');
    expect(d.histogram.edges).toEqual([1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 1e-1, 1]);
    expect(d.histogram.counts.reduce((a: number, b: number) => a + b, 0)).toBe(501);
    expect(d.histogram.counts[1]).toBe(values.filter((v) => v >= 1e-5 && v < 1e-4).length);
    expect(cycleErrorDistribution([outcome(0, null)])).toBeNull();
  });
});
