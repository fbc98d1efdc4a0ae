/**
 * The transmon spectrum in units of E_C, tabulated once for every transmon there is.
 *
 * The Hamiltonian 4 E_C n^2 - E_J cos(phi) (README physics conventions sec. 1, n_g = 0) is E_C
 * times a function of r = E_J / E_C alone, so every level difference is E_C e_k(r) and every
 * matrix element <i|n|k>, <i|cos phi|k> is a function of r only (Koch et al., Phys. Rev. A 76,
 * 042319 (2007)). One table of r then answers any transmon at any flux: f01 = E_C e_1(r) with
 * r = E_J(Phi) / E_C. A chip of transmons whose parameters are drawn again and again (fabrication
 * spread, src/yield) needs no new eigen solves at all.
 *
 * Channels, on a grid uniform in u = sqrt(r) (f01 ~ sqrt(8 r) E_C - E_C, so nearly uniform in
 * frequency): e_k = (E_k - E_0) / E_C for k = 1..5, with exact slopes de_k/dr = -(<k|cos phi|k> -
 * <0|cos phi|0>) (Hellmann-Feynman: dE_k/dE_J = -<k|cos phi|k>); and |<i|n|k>| for (i, k) = (0,1),
 * (0,3), (1,2), (2,3), (0,5), (1,4), with slopes from fourth-order finite differences on the grid.
 * Between grid points: cubic Hermite interpolation in u. Inverse maps (the r at which a level
 * combination takes a value) are a binary search for the cell and a safeguarded Newton solve on
 * the cubic; every combination used grows monotonically with r.
 *
 * Range: r from R_MIN to R_MAX (E_JS / E_C of accepted transmons is 20-2000, and a SQUID tuned
 * down reaches d E_JS / E_C); points are computed with the charge cutoff of r = 1000 at least
 * (src/transmon/charge-cutoff.ts), converged to ~1e-12 E_C. Accuracy against the exact parity
 * eigenbasis: test/transmon/reduced-spectrum.test.ts (relative 1e-10 in the levels and 1e-9 in the
 * matrix elements over 10 <= r <= 3000 with the default grid; build ~40 ms).
 */
import { chargeCutoffFor } from './charge-cutoff.js';
import { chargeMatrixFromParity, cosPhiMatrixFromParity, parityEigenbasis } from './parity-eigenbasis.js';
import { finiteDifferenceSlopes, hermite, hermiteInverse, hermiteSlope, hermiteWeights } from '../linalg/cubic-hermite.js';

/** Scratch of the cubic Hermite weights (single-threaded use, filled and read in one call). */
const HERMITE_WEIGHTS = new Float64Array(4);

/** Level differences (E_k - E_0) / E_C and matrix elements at one r. */
export interface ReducedState {
  r: number;
  /** (E_k - E_0) / E_C, k = 1..5. */
  e1: number;
  e2: number;
  e3: number;
  e4: number;
  e5: number;
  /** |<i|n|k>|. */
  n01: number;
  n03: number;
  n12: number;
  n23: number;
  n05: number;
  n14: number;
  /** d e_1 / d r = dE_01 / dE_J (dimensionless). */
  de1dr: number;
}

export function emptyReducedState(): ReducedState {
  return { r: 0, e1: 0, e2: 0, e3: 0, e4: 0, e5: 0, n01: 0, n03: 0, n12: 0, n23: 0, n05: 0, n14: 0, de1dr: 0 };
}

/**
 * Monotone combinations of levels the inverse maps accept: `e1` (f01), `e12` (f12 = e2 - e1),
 * `eK` (E_K - E_0) and `eK-1` (E_K - E_0 - f01) for K = 2..5.
 */
export type ReducedChannel = 'e1' | 'e12' | 'e2' | 'e3' | 'e4' | 'e5' | 'e2-1' | 'e3-1' | 'e4-1' | 'e5-1';

export interface ReducedSpectrumOptions {
  /** Grid points (uniform in sqrt(r)). */
  points: number;
  rMin: number;
  rMax: number;
}

export const REDUCED_SPECTRUM_DEFAULTS: Readonly<ReducedSpectrumOptions> = Object.freeze({ points: 4000, rMin: 4, rMax: 3600 });

/** Channels: 0-4 e1..e5, 5 n01, 6 n03, 7 n12, 8 n23, 9 n05, 10 n14. */
const CHANNELS = 11;
const LEVELS = 5;

const COMBINATIONS: Record<ReducedChannel, [number, number]> = {
  e1: [0, -1],
  e12: [1, 0],
  e2: [1, -1],
  e3: [2, -1],
  e4: [3, -1],
  e5: [4, -1],
  'e2-1': [1, 0],
  'e3-1': [2, 0],
  'e4-1': [3, 0],
  'e5-1': [4, 0],
};

export class ReducedSpectrum {
  readonly rMin: number;
  readonly rMax: number;
  readonly points: number;
  private readonly u0: number;
  private readonly h: number;
  /** Values by channel (CHANNELS x points, row-major) and d(value)/du. */
  private readonly v: Float64Array;
  private readonly dv: Float64Array;
  /** Combination samples and slopes for the inverse maps (built on first use). */
  private readonly combos = new Map<ReducedChannel, { y: Float64Array; dy: Float64Array }>();

  constructor(options: Partial<ReducedSpectrumOptions> = {}) {
    const o = { ...REDUCED_SPECTRUM_DEFAULTS, ...options };
    if (!(Number.isInteger(o.points) && o.points >= 16) || !(o.rMin > 0 && o.rMax > o.rMin)) {
      throw new RangeError(`ReducedSpectrum: need points >= 16 and 0 < rMin < rMax (got ${o.points}, ${o.rMin}, ${o.rMax})`);
    }
    this.rMin = o.rMin;
    this.rMax = o.rMax;
    this.points = o.points;
    const m = o.points;
    this.u0 = Math.sqrt(o.rMin);
    this.h = (Math.sqrt(o.rMax) - this.u0) / (m - 1);
    this.v = new Float64Array(CHANNELS * m);
    this.dv = new Float64Array(CHANNELS * m);
    const ch = new Float64Array(36);
    const cs = new Float64Array(36);
    for (let k = 0; k < m; k++) {
      const u = this.u0 + k * this.h;
      const r = u * u;
      const b = parityEigenbasis(1, r, 6, chargeCutoffFor(Math.max(r, 1000)), true);
      chargeMatrixFromParity(b, ch);
      cosPhiMatrixFromParity(b, cs);
      const e = b.energies;
      for (let p = 1; p <= LEVELS; p++) {
        this.v[(p - 1) * m + k] = e[p] - e[0];
        this.dv[(p - 1) * m + k] = -(cs[p * 6 + p] - cs[0]) * 2 * u;
      }
      const n = (i: number, j: number) => Math.abs(ch[i * 6 + j]);
      this.v[5 * m + k] = n(0, 1);
      this.v[6 * m + k] = n(0, 3);
      this.v[7 * m + k] = n(1, 2);
      this.v[8 * m + k] = n(2, 3);
      this.v[9 * m + k] = n(0, 5);
      this.v[10 * m + k] = n(1, 4);
    }
    for (let c = LEVELS; c < CHANNELS; c++) finiteDifferenceSlopes(this.v, this.dv, c * m, m, this.h);
  }

  /** True when r lies in the table. */
  covers(r: number): boolean {
    return r >= this.rMin && r <= this.rMax;
  }

  /** State at r (clamped to the table), written into `out`. */
  at(r: number, out: ReducedState = emptyReducedState()): ReducedState {
    const rc = Math.min(this.rMax, Math.max(this.rMin, r));
    const x = (Math.sqrt(rc) - this.u0) / this.h;
    const cell = Math.min(this.points - 2, Math.max(0, Math.floor(x)));
    const t = x - cell;
    this.fill(cell, t, out);
    out.r = rc;
    return out;
  }

  /**
   * The r at which channel `c` equals `target` (between rLo and rHi, both inside the table), or
   * null when it lies outside [c(rLo), c(rHi)] (with `slack` in the channel's units).
   */
  rFor(c: ReducedChannel, target: number, rLo = this.rMin, rHi = this.rMax, slack = 0): number | null {
    const { y, dy } = this.combo(c);
    const lo = Math.max(this.rMin, rLo);
    const hi = Math.min(this.rMax, rHi);
    const yLo = this.valueAt(y, dy, lo);
    const yHi = this.valueAt(y, dy, hi);
    if (target < yLo - slack || target > yHi + slack) return null;
    if (target <= yLo) return lo;
    if (target >= yHi) return hi;
    return this.invert(y, dy, target, lo, hi);
  }

  /**
   * As rFor, for a target the caller knows to lie strictly between the channel's values at rLo and
   * rHi (both inside the table): no range checks.
   */
  rInside(c: ReducedChannel, target: number, rLo: number, rHi: number): number {
    const { y, dy } = this.combo(c);
    return this.invert(y, dy, target, rLo, rHi);
  }

  private invert(y: Float64Array, dy: Float64Array, target: number, lo: number, hi: number): number {
    const m = this.points;
    const h = this.h;
    // the cell: an interpolation guess (every channel is nearly linear in u), then a walk
    const first = Math.min(m - 2, Math.max(0, Math.floor((Math.sqrt(lo) - this.u0) / h)));
    const last = Math.min(m - 2, Math.max(first, Math.ceil((Math.sqrt(hi) - this.u0) / h) - 1));
    let a = first + Math.floor(((target - y[first]) / (y[last + 1] - y[first])) * (last + 1 - first));
    a = Math.min(last, Math.max(first, a));
    while (a > first && y[a] > target) a--;
    while (a < last && y[a + 1] <= target) a++;
    const y0 = y[a];
    const y1 = y[a + 1];
    const d0 = dy[a] * h;
    const d1 = dy[a + 1] * h;
    const t = hermiteInverse(y0, y1, d0, d1, target, Math.min(1, Math.max(0, (target - y0) / (y1 - y0))), 1e-15, 40);
    const u = this.u0 + (a + t) * h;
    return Math.min(hi, Math.max(lo, u * u));
  }

  /** d e_k / d r (= d(E_k - E_0)/dE_J) for k = 1..5 at r (clamped to the table), into `out`. */
  levelSlopes(r: number, out: Float64Array = new Float64Array(LEVELS)): Float64Array {
    const rc = Math.min(this.rMax, Math.max(this.rMin, r));
    const u = Math.sqrt(rc);
    const x = (u - this.u0) / this.h;
    const cell = Math.min(this.points - 2, Math.max(0, Math.floor(x)));
    const t = x - cell;
    const m = this.points;
    const h = this.h;
    for (let p = 0; p < LEVELS; p++) {
      const k = p * m + cell;
      out[p] = hermiteSlope(this.v[k], this.v[k + 1], this.dv[k] * h, this.dv[k + 1] * h, t) / h / (2 * u);
    }
    return out;
  }

  /** The channel's value at r (clamped to the table). */
  value(c: ReducedChannel, r: number): number {
    const { y, dy } = this.combo(c);
    return this.valueAt(y, dy, r);
  }

  private valueAt(y: Float64Array, dy: Float64Array, r: number): number {
    const rc = Math.min(this.rMax, Math.max(this.rMin, r));
    const x = (Math.sqrt(rc) - this.u0) / this.h;
    const cell = Math.min(this.points - 2, Math.max(0, Math.floor(x)));
    const t = x - cell;
    return hermite(y[cell], y[cell + 1], dy[cell] * this.h, dy[cell + 1] * this.h, t);
  }

  private combo(c: ReducedChannel): { y: Float64Array; dy: Float64Array } {
    let hit = this.combos.get(c);
    if (hit) return hit;
    const [p, q] = COMBINATIONS[c];
    const m = this.points;
    const y = new Float64Array(m);
    const dy = new Float64Array(m);
    for (let k = 0; k < m; k++) {
      y[k] = this.v[p * m + k] - (q >= 0 ? this.v[q * m + k] : 0);
      dy[k] = this.dv[p * m + k] - (q >= 0 ? this.dv[q * m + k] : 0);
    }
    hit = { y, dy };
    this.combos.set(c, hit);
    return hit;
  }

  private fill(cell: number, t: number, out: ReducedState): void {
    const m = this.points;
    const h = this.h;
    const v = this.v;
    const dv = this.dv;
    const w = hermiteWeights(t, h, HERMITE_WEIGHTS);
    const b00 = w[0];
    const b10 = w[1];
    const b01 = w[2];
    const b11 = w[3];
    let k = cell;
    out.e1 = b00 * v[k] + b10 * dv[k] + b01 * v[k + 1] + b11 * dv[k + 1];
    k += m;
    out.e2 = b00 * v[k] + b10 * dv[k] + b01 * v[k + 1] + b11 * dv[k + 1];
    k += m;
    out.e3 = b00 * v[k] + b10 * dv[k] + b01 * v[k + 1] + b11 * dv[k + 1];
    k += m;
    out.e4 = b00 * v[k] + b10 * dv[k] + b01 * v[k + 1] + b11 * dv[k + 1];
    k += m;
    out.e5 = b00 * v[k] + b10 * dv[k] + b01 * v[k + 1] + b11 * dv[k + 1];
    k += m;
    out.n01 = b00 * v[k] + b10 * dv[k] + b01 * v[k + 1] + b11 * dv[k + 1];
    k += m;
    out.n03 = b00 * v[k] + b10 * dv[k] + b01 * v[k + 1] + b11 * dv[k + 1];
    k += m;
    out.n12 = b00 * v[k] + b10 * dv[k] + b01 * v[k + 1] + b11 * dv[k + 1];
    k += m;
    out.n23 = b00 * v[k] + b10 * dv[k] + b01 * v[k + 1] + b11 * dv[k + 1];
    k += m;
    out.n05 = b00 * v[k] + b10 * dv[k] + b01 * v[k + 1] + b11 * dv[k + 1];
    k += m;
    out.n14 = b00 * v[k] + b10 * dv[k] + b01 * v[k + 1] + b11 * dv[k + 1];
    const u = this.u0 + (cell + t) * h;
    out.de1dr = hermiteSlope(v[cell], v[cell + 1], dv[cell] * h, dv[cell + 1] * h, t) / h / (2 * u);
  }
}

let shared: ReducedSpectrum | undefined;

/** The process-wide table with the default grid (built on first use, ~0.1 s). */
export function sharedReducedSpectrum(): ReducedSpectrum {
  shared ??= new ReducedSpectrum();
  return shared;
}
