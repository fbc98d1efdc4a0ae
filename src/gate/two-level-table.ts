/**
 * The edge's crossing two-level model (src/gate/context.ts) tabulated once along the mover's
 * flux, from the parking point to past the crossing, so ramp families can evaluate Delta, J,
 * theta and the gap at any flux cheaply (cubic Hermite with Catmull-Rom slopes; the functions
 * are smooth on this interval).
 */
import { exchangeAt, twoLevelAt, type EdgeContext, type TwoLevelPoint } from './context.js';

export class TwoLevelTable {
  readonly flux: Float64Array;
  readonly delta: Float64Array;
  readonly j: Float64Array;
  /** the 01-10 exchange pair (src/gate/context.ts exchangeAt) */
  readonly exDelta: Float64Array;
  readonly exJ: Float64Array;

  constructor(ctx: EdgeContext, fluxFrom: number, fluxTo: number, points = 257) {
    this.flux = new Float64Array(points);
    this.delta = new Float64Array(points);
    this.j = new Float64Array(points);
    this.exDelta = new Float64Array(points);
    this.exJ = new Float64Array(points);
    for (let k = 0; k < points; k++) {
      const x = fluxFrom + ((fluxTo - fluxFrom) * k) / (points - 1);
      const p = twoLevelAt(ctx, x);
      const e = exchangeAt(ctx, x);
      this.flux[k] = x;
      this.delta[k] = p.deltaGHz;
      this.j[k] = p.jGHz;
      this.exDelta[k] = e.deltaGHz;
      this.exJ[k] = e.jGHz;
    }
  }

  /** The 01-10 exchange pair at flux x. */
  exchange(x: number): TwoLevelPoint {
    const d = this.interp(this.exDelta, x);
    const j = this.interp(this.exJ, x);
    return { deltaGHz: d, jGHz: j, theta: Math.atan2(2 * j, d), gapGHz: Math.sqrt(d * d + 4 * j * j) };
  }

  private interp(values: Float64Array, x: number): number {
    const f = this.flux;
    const n = f.length;
    const h = (f[n - 1] - f[0]) / (n - 1);
    let i = Math.floor((x - f[0]) / h);
    if (i < 0) i = 0;
    if (i > n - 2) i = n - 2;
    const t = (x - f[i]) / h;
    const m0 = i > 0 ? 0.5 * (values[i + 1] - values[i - 1]) : values[i + 1] - values[i];
    const m1 = i + 2 < n ? 0.5 * (values[i + 2] - values[i]) : values[i + 1] - values[i];
    const t2 = t * t;
    const t3 = t2 * t;
    return (2 * t3 - 3 * t2 + 1) * values[i] + (t3 - 2 * t2 + t) * m0 + (-2 * t3 + 3 * t2) * values[i + 1] + (t3 - t2) * m1;
  }

  at(x: number): TwoLevelPoint {
    const d = this.interp(this.delta, x);
    const j = this.interp(this.j, x);
    return { deltaGHz: d, jGHz: j, theta: Math.atan2(2 * j, d), gapGHz: Math.sqrt(d * d + 4 * j * j) };
  }

  /** The flux between a and b where theta(flux) = target (theta is monotonic there), by bisection. */
  fluxForTheta(target: number, a: number, b: number): number {
    let lo = a;
    let hi = b;
    const fa = this.at(a).theta - target;
    for (let it = 0; it < 100; it++) {
      const mid = 0.5 * (lo + hi);
      const fm = this.at(mid).theta - target;
      if (fm === 0) return mid;
      if (Math.sign(fm) === Math.sign(fa)) lo = mid;
      else hi = mid;
      if (Math.abs(hi - lo) < 1e-15) break;
    }
    return 0.5 * (lo + hi);
  }
}
