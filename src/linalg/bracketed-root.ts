/**
 * Root of a continuous function on a bracket by safeguarded Newton iteration ("rtsafe":
 * Press, Teukolsky, Vetterling and Flannery, Numerical Recipes, 3rd ed., sec. 9.4): a Newton
 * step is taken when it stays inside the current bracket and shrinks |f| fast enough,
 * otherwise the bracket is bisected. The bracket always holds a sign change, so the iteration
 * cannot escape and converges for any continuous f (quadratically once Newton takes over).
 *
 *     find x in [lo, hi] with f(x) = 0,   sign f(lo) != sign f(hi)
 *
 * `fn(x, slope)` returns f(x) and writes f'(x) into `slope.value` (write NaN if unknown: the
 * step is then a bisection). Stops when the bracket is narrower than `xTol`, or |f| <= fTol.
 * Returns NaN when the end values do not bracket a root.
 */
export interface Slope {
  value: number;
}

export type FunctionWithSlope = (x: number, slope: Slope) => number;

export interface BracketedRootOptions {
  /** Absolute tolerance on x. */
  xTol?: number;
  /** Absolute tolerance on f. */
  fTol?: number;
  /** First guess inside [lo, hi] (default: the midpoint). */
  guess?: number;
  /** f(lo) and f(hi) when the caller already knows them (saves two evaluations). */
  fLo?: number;
  fHi?: number;
  maxIterations?: number;
}

export const BRACKETED_ROOT_DEFAULTS = Object.freeze({ xTol: 1e-15, fTol: 0, maxIterations: 200 });

export function bracketedNewton(fn: FunctionWithSlope, lo: number, hi: number, options: BracketedRootOptions = {}): number {
  const xTol = options.xTol ?? BRACKETED_ROOT_DEFAULTS.xTol;
  const fTol = options.fTol ?? BRACKETED_ROOT_DEFAULTS.fTol;
  const maxIt = options.maxIterations ?? BRACKETED_ROOT_DEFAULTS.maxIterations;
  const slope: Slope = { value: Number.NaN };
  const swap = lo > hi;
  const a = swap ? hi : lo;
  const b = swap ? lo : hi;
  const known = (v: number | undefined) => v !== undefined && Number.isFinite(v);
  const fa = known(swap ? options.fHi : options.fLo) ? (swap ? options.fHi! : options.fLo!) : fn(a, slope);
  if (fa === 0) return a;
  const fb = known(swap ? options.fLo : options.fHi) ? (swap ? options.fLo! : options.fHi!) : fn(b, slope);
  if (fb === 0) return b;
  if (!(fa * fb < 0)) return Number.NaN;
  // Orient so that f(a) < 0 < f(b).
  let xNeg = fa < 0 ? a : b;
  let xPos = fa < 0 ? b : a;
  let x = options.guess !== undefined && options.guess > a && options.guess < b ? options.guess : 0.5 * (a + b);
  let stepOld = Math.abs(b - a);
  let step = stepOld;
  let f = fn(x, slope);
  let df = slope.value;
  for (let it = 0; it < maxIt; it++) {
    if (f === 0 || Math.abs(f) <= fTol) return x;
    if (f < 0) xNeg = x;
    else xPos = x;
    const left = Math.min(xNeg, xPos);
    const right = Math.max(xNeg, xPos);
    if (right - left <= xTol) return x;
    const newton = Number.isFinite(df) && df !== 0 ? x - f / df : Number.NaN;
    if (!(newton > left && newton < right) || Math.abs(2 * f) > Math.abs(stepOld * df)) {
      stepOld = step;
      step = 0.5 * (right - left);
      x = left + step;
    } else {
      stepOld = step;
      step = Math.abs(newton - x);
      x = newton;
      if (step <= 0.5 * xTol) return x;
    }
    f = fn(x, slope);
    df = slope.value;
  }
  return x;
}
