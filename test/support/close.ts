/**
 * Tolerance checks of the form |a - b| <= rtol * max(1, |a|, |b|) (the project's standard),
 * with a failure message that shows the input label, expected, actual, difference and tolerance.
 */
import { expect } from 'vitest';

export function closeEnough(actual: number, expected: number, rtol: number): boolean {
  return Math.abs(actual - expected) <= rtol * Math.max(1, Math.abs(actual), Math.abs(expected));
}

/** Assert one number. */
export function expectClose(actual: number, expected: number, rtol: number, label = ''): void {
  if (!closeEnough(actual, expected, rtol)) {
    const diff = Math.abs(actual - expected);
    const tol = rtol * Math.max(1, Math.abs(actual), Math.abs(expected));
    expect.fail(`${label}: expected ${expected}, got ${actual}, |diff| = ${diff.toExponential(3)} > tol ${tol.toExponential(3)} (rtol ${rtol})`);
  }
}

/** Assert two arrays of equal length element by element. */
export function expectAllClose(actual: ArrayLike<number>, expected: ArrayLike<number>, rtol: number, label = ''): void {
  expect(actual.length, `${label}: length`).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) expectClose(actual[i], expected[i], rtol, `${label}[${i}]`);
}

/** Largest |a - b| / max(1, |a|, |b|) over two arrays (for reporting measured accuracy). */
export function maxRelativeError(actual: ArrayLike<number>, expected: ArrayLike<number>): number {
  let worst = 0;
  for (let i = 0; i < expected.length; i++) {
    const a = actual[i];
    const b = expected[i];
    worst = Math.max(worst, Math.abs(a - b) / Math.max(1, Math.abs(a), Math.abs(b)));
  }
  return worst;
}
