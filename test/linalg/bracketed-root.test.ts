/**
 * bracketedNewton (safeguarded Newton, Numerical Recipes sec. 9.4) on functions with known roots:
 * cos x = x (the Dottie number 0.7390851332151607, from memory / OEIS A003957), x^2 = 2, a
 * function whose slope vanishes at the root bracket end (Newton alone would fail), and a slope
 * reported as NaN (pure bisection).
 */
import { describe, expect, it } from 'vitest';
import { bracketedNewton } from '../../src/linalg/bracketed-root.js';
import { expectClose } from '../support/close.js';

describe('bracketedNewton(fn, lo, hi)', () => {
  it('solves cos x = x to 1e-15 (Dottie number)', () => {
    const x = bracketedNewton((t, s) => {
      s.value = -Math.sin(t) - 1;
      return Math.cos(t) - t;
    }, 0, 1);
    expectClose(x, 0.7390851332151607, 1e-15, 'Dottie');
  });

  it('solves x^2 = 2 from a far guess', () => {
    const x = bracketedNewton((t, s) => {
      s.value = 2 * t;
      return t * t - 2;
    }, 0, 10, { guess: 9.9 });
    expectClose(x, Math.SQRT2, 1e-15, 'sqrt 2');
  });

  it('survives a zero slope inside the bracket (f = (x - 1)^3 + 0.001 (x - 1), root 1)', () => {
    const x = bracketedNewton((t, s) => {
      s.value = 3 * (t - 1) ** 2 + 0.001;
      return (t - 1) ** 3 + 0.001 * (t - 1);
    }, -3, 2, { guess: -3 + 1e-9 });
    expectClose(x, 1, 1e-13, 'cubic');
  });

  it('bisects when the slope is unknown', () => {
    const x = bracketedNewton((t, s) => {
      s.value = NaN;
      return Math.exp(t) - 3;
    }, 0, 2);
    expectClose(x, Math.log(3), 1e-14, 'ln 3');
  });

  it('returns NaN when the ends do not bracket a sign change, and an end when f vanishes there', () => {
    expect(bracketedNewton((t) => t * t + 1, -1, 1)).toBeNaN();
    expect(bracketedNewton((t) => t - 1, 1, 3)).toBe(1);
  });
});
