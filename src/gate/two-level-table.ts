/**
 * The edge's crossing two-level model (src/gate/context.ts) tabulated once along the mover's
 * flux, from the parking point to past the crossing, so ramp families can evaluate Delta, J,
 * theta and the gap at any flux cheaply (cubic Hermite with Catmull-Rom slopes; the functions
 * are smooth on this interval). The other crossing of the 2-excitation manifold (11-02 for an
 * 11-20 gate and vice versa) and the mover's squeezing adiabaticity are tabulated on first use.
 */
import { josephsonEnergySlope } from '../transmon/josephson.js';
import { twoLevelModel, type EdgeContext, type TwoLevelPoint } from './context.js';
import { hermite } from '../linalg/cubic-hermite.js';

export class TwoLevelTable {
  readonly flux: Float64Array;
  readonly delta: Float64Array;
  readonly j: Float64Array;
  private other: { delta: Float64Array; j: Float64Array } | undefined;
  private squeezeMu: Float64Array | undefined;

  constructor(private readonly ctx: EdgeContext, fluxFrom: number, fluxTo: number, points = 129) {
    this.flux = new Float64Array(points);
    this.delta = new Float64Array(points);
    this.j = new Float64Array(points);
    const at = twoLevelModel(ctx);
    for (let k = 0; k < points; k++) {
      const x = fluxFrom + ((fluxTo - fluxFrom) * k) / (points - 1);
      const p = at(x);
      this.flux[k] = x;
      this.delta[k] = p.deltaGHz;
      this.j[k] = p.jGHz;
    }
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
    return hermite(values[i], values[i + 1], m0, m1, t);
  }

  private point(d: number, j: number): TwoLevelPoint {
    return { deltaGHz: d, jGHz: j, theta: Math.atan2(2 * j, d), gapGHz: Math.sqrt(d * d + 4 * j * j) };
  }

  /** The gate's crossing at flux x. */
  at(x: number): TwoLevelPoint {
    return this.point(this.interp(this.delta, x), this.interp(this.j, x));
  }

  /** The mixing angle atan2(2 J, Delta) at flux x (what at(x).theta gives, without the object). */
  theta(x: number): number {
    return Math.atan2(2 * this.interp(this.j, x), this.interp(this.delta, x));
  }

  /** The other crossing of the 2-excitation manifold at flux x. */
  otherCrossing(x: number): TwoLevelPoint {
    if (!this.other) {
      const ctx: EdgeContext = { ...this.ctx, crossing: this.ctx.crossing === '11-20' ? '11-02' : '11-20' };
      const delta = new Float64Array(this.flux.length);
      const j = new Float64Array(this.flux.length);
      const at = twoLevelModel(ctx);
      this.flux.forEach((fx, k) => {
        const p = at(fx);
        delta[k] = p.deltaGHz;
        j[k] = p.jGHz;
      });
      this.other = { delta, j };
    }
    return this.point(this.interp(this.other.delta, x), this.interp(this.other.j, x));
  }

  /**
   * The mover's squeezing adiabaticity parameter at flux x (per Phi0, 1/GHz):
   * sum_{(m, m+2) = (0,2), (1,3)} |dE_J/dPhi| |<m|cos phi|m+2>| / (E_{m+2} - E_m)^2.
   */
  squeezing(x: number): number {
    if (!this.squeezeMu) {
      const mu = new Float64Array(this.flux.length);
      const q = this.ctx.mover;
      this.flux.forEach((fx, k) => {
        const b = q.eigenbasis(fx, 4);
        const slope = Math.abs(josephsonEnergySlope(q.ejsGHz, q.asymmetry, fx));
        for (const m of [0, 1]) {
          const gap = b.energies[m + 2] - b.energies[m];
          mu[k] += (slope * Math.abs(b.cosPhi[m * 4 + m + 2])) / (gap * gap);
        }
      });
      this.squeezeMu = mu;
    }
    return this.interp(this.squeezeMu, x);
  }

  /** The flux between a and b where theta(flux) = target (theta is monotonic there), by bisection. */
  fluxForTheta(target: number, a: number, b: number): number {
    let lo = a;
    let hi = b;
    const fa = this.theta(a) - target;
    for (let it = 0; it < 100; it++) {
      const mid = 0.5 * (lo + hi);
      const fm = this.theta(mid) - target;
      if (fm === 0) return mid;
      if (Math.sign(fm) === Math.sign(fa)) lo = mid;
      else hi = mid;
      if (Math.abs(hi - lo) < 1e-15) break;
    }
    return 0.5 * (lo + hi);
  }
}
