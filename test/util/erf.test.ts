/** erf and erfc against SciPy (scipy.special, test/reference/special_erfc.py). */
import { describe, expect, it } from 'vitest';
import { erf, erfc } from '../../src/util/erf.js';
import { runPython } from '../support/python.js';

describe('erf, erfc', () => {
  const xs = Array.from({ length: 161 }, (_, k) => -8 + 0.1 * k + 0.0137);
  const ref = runPython<{ erf: number[]; erfc: number[] }>('special_erfc.py', { x: xs });

  it('erf agrees with scipy.special.erf to 5e-15 absolute', () => {
    xs.forEach((x, k) => expect(Math.abs(erf(x) - ref.erf[k])).toBeLessThan(5e-15));
  });

  it('erfc agrees with scipy.special.erfc to 1e-13 relative, also deep in the tail (x up to 8, erfc ~ 1e-29)', () => {
    xs.forEach((x, k) => expect(Math.abs(erfc(x) - ref.erfc[k]) / ref.erfc[k]).toBeLessThan(1e-13));
    expect(ref.erfc[xs.length - 1]).toBeLessThan(1e-28);
  });
});
