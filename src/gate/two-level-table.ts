/**
 * The edge's crossing two-level model (src/gate/context.ts) tabulated once along the mover's
 * flux, from the parking point to past the crossing, so ramp families can evaluate Delta, J,
 * theta and the gap at any flux cheaply (cubic Hermite with Catmull-Rom slopes; the functions
 * are smooth on this interval).
 */
import { josephsonEnergySlope } from '../transmon/josephson.js';
import { exchangeAt, twoLevelAt, type EdgeContext, type TwoLevelPoint } from './context.js';

export class TwoLevelTable {
  readonly flux: Float64Array;
  readonly delta: Float64Array;
  readonly j: Float64Array;
  /** the 01-10 exchange pair (src/gate/context.ts exchangeAt) */
  readonly exDelta: Float64Array;
  readonly exJ: Float64Array;
  /**
   * the other crossing of the 2-excitation manifold (11-02 when the gate uses 11-20 and vice
   * versa), and the mover's own squeezing adiabaticity sum_{(m,m+2) = (0,2),(1,3)}
   * |dE_J/dPhi| |<m|cos phi|m+2>| / (E_{m+2} - E_m)^2 (per Phi0, 1/GHz)
   */
  readonly otherDelta: Float64Array;
  readonly otherJ: Float64Array;
  readonly squeezeMu: Float64Array;

  constructor(ctx: EdgeContext, fluxFrom: number, fluxTo: number, points = 257) {
    this.flux = new Float64Array(points);
    this.delta = new Float64Array(points);
    this.j = new Float64Array(points);
    this.exDelta = new Float64Array(points);
    this.exJ = new Float64Array(points);
    this.otherDelta = new Float64Array(points);
    this.otherJ = new Float64Array(points);
    this.squeezeMu = new Float64Array(points);
    const other: EdgeContext = { ...ctx, crossing: ctx.crossing === '11-20' ? '11-02' : '11-20' };
    for (let k = 0; k < points; k++) {
      const x = fluxFrom + ((fluxTo - fluxFrom) * k) / (points - 1);
      const p = twoLevelAt(ctx, x);
      const e = exchangeAt(ctx, x);
      const o = twoLevelAt(other, x);
      this.flux[k] = x;
      this.delta[k] = p.deltaGHz;
      this.j[k] = p.jGHz;
      this.exDelta[k] = e.deltaGHz;
      this.exJ[k] = e.jGHz;
      this.otherDelta[k] = o.deltaGHz;
      this.otherJ[k] = o.jGHz;
      const b = ctx.mover.eigenbasis(x, 4);
      const slope = Math.abs(josephsonEnergySlope(ctx.mover.ejsGHz, ctx.mover.asymmetry, x));
      let mu = 0;
      for (const m of [0, 1]) {
        const gap = b.energies[m + 2] - b.energies[m];
        mu += (slope * Math.abs(b.cosPhi[m * 4 + m + 2])) / (gap * gap);
      }
      this.squeezeMu[k] = mu;
    }
  }

  /** The other crossing of the 2-excitation manifold at flux x. */
  otherCrossing(x: number): TwoLevelPoint {
    const d = this.interp(this.otherDelta, x);
    const j = this.interp(this.otherJ, x);
    return { deltaGHz: d, jGHz: j, theta: Math.atan2(2 * j, d), gapGHz: Math.sqrt(d * d + 4 * j * j) };
  }

  /** The mover's squeezing adiabaticity parameter at flux x (per Phi0). */
  squeezing(x: number): number {
    return this.interp(this.squeezeMu, x);
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
