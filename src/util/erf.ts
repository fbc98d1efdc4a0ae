/**
 * The error function (to ~5e-15 absolute) and its complement (to ~1e-13 relative, tested against
 * scipy.special in test/util/erf.test.ts):
 *  - |x| < 2.5: the Maclaurin series of erf (Abramowitz and Stegun 7.1.5), whose alternating
 *    terms cost at most ~3 digits there;
 *  - beyond (erfc: from 1.5): the continued fraction of erfc (A&S 7.1.14) by Lentz's method, which converges in a
 *    few dozen terms and keeps erfc's relative accuracy far into the tail (no 1 - erf cancellation).
 */

function erfSeries(x: number): number {
  let term = x;
  let sum = x;
  const x2 = x * x;
  for (let n = 1; n < 120; n++) {
    term *= -x2 / n;
    const add = term / (2 * n + 1);
    sum += add;
    if (Math.abs(add) < 1e-17 * Math.abs(sum)) break;
  }
  return (2 / Math.sqrt(Math.PI)) * sum;
}

/** erfc(a) for a >= 1.5 by the continued fraction erfc(a) = exp(-a^2)/sqrt(pi) / (a + (1/2)/(a + 1/(a + (3/2)/(a + ...)))). */
function erfcTail(a: number): number {
  let f = a;
  let c = a;
  let d = 0;
  for (let k = 1; k < 300; k++) {
    const coef = k / 2;
    d = a + coef * d;
    d = d === 0 ? 1e-300 : 1 / d;
    c = a + coef / c;
    if (c === 0) c = 1e-300;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.exp(-a * a) / Math.sqrt(Math.PI) / f;
}

export function erf(x: number): number {
  const ax = Math.abs(x);
  if (ax < 2.5) return erfSeries(x);
  const t = erfcTail(ax);
  return x > 0 ? 1 - t : t - 1;
}

/** 1 - erf(x), accurate in the upper tail. */
export function erfc(x: number): number {
  // the continued fraction from x = 1.5 (where it still converges within its 300 terms), so
  // that erfc keeps its relative accuracy where 1 - erf would cancel
  if (x >= 1.5) return erfcTail(x);
  if (x <= -2.5) return 2 - erfcTail(-x);
  return 1 - erfSeries(x);
}
