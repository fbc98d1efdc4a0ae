/**
 * Golden-section search for a minimum of f on the bracket [a, b] (Kiefer, Proc. AMS 4, 502
 * (1953); Press et al., Numerical Recipes, 3rd ed., sec. 10.2): two interior points at the golden
 * ratio, then `steps` shrinkings of the bracket by (sqrt 5 - 1)/2 ~ 0.618, each with one new
 * evaluation; `stop` (checked before each shrinking) ends it early. Returns the final bracket and
 * its two interior points with their values (the caller keeps whatever else it noted).
 */
export interface GoldenSectionResult {
  a: number;
  b: number;
  c: number;
  fc: number;
  d: number;
  fd: number;
}

export const GOLDEN_RATIO_CONJUGATE = (Math.sqrt(5) - 1) / 2;

export function goldenSection(f: (x: number) => number, a: number, b: number, steps: number, stop?: () => boolean): GoldenSectionResult {
  const r = GOLDEN_RATIO_CONJUGATE;
  let c = b - r * (b - a);
  let d = a + r * (b - a);
  let fc = f(c);
  let fd = f(d);
  for (let it = 0; it < steps && !(stop && stop()); it++) {
    if (fc < fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - r * (b - a);
      fc = f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + r * (b - a);
      fd = f(d);
    }
  }
  return { a, b, c, fc, d, fd };
}
