/**
 * A transmon's spectrum tabulated once over its planning range, so the parking search can ask
 * "what are f12, the charge matrix elements and the flux slope at f01 = f?" in a
 * fraction of a microsecond instead of solving the charge-basis problem each time.
 *
 * Grid: M points uniform in u = sqrt(E_J / E_JS) from u_min to 1 (f01 ~ sqrt(8 E_J E_C) - E_C,
 * Koch et al., Phys. Rev. A 76, 042319 (2007), so the points are nearly uniform in frequency).
 * At each point the exact levels E_1 - E_0 ... E_5 - E_0 and |<i|n|k>| for
 * (i, k) = (0,1), (0,3), (1,2), (2,3), (0,5), (1,4) come from the transmon stage's parity-block eigenbasis
 * (src/transmon/parity-eigenbasis.ts). Between points: cubic Hermite interpolation in u, with
 * the level slopes exact from the Hellmann-Feynman theorem (dE_m/dE_J = -<m|cos phi|m>) and the
 * matrix-element slopes from fourth-order finite differences on the grid. f01 is monotone in u,
 * so f01 -> u is a bracketed Newton solve inside one cell. Accuracy (test/plan/qubit-table.test.ts,
 * against the exact Transmon): better than 1e-7 GHz in f12 with the default 32 points.
 *
 * Planning range: from u_min = sqrt(max(d, minEjOverEc E_C / E_JS)) to u = 1 (the upper sweet
 * spot). Below E_J / E_C = 30 the charge dispersion grows fast (Koch 2007, Eq. 2.18: for
 * E_C = 0.2 GHz about 0.45 MHz for the first excited level at E_J / E_C = 30, 4.6 MHz at 20, and
 * some ten times more for the second, which a CZ populates), so the n_g = 0 spectrum the model
 * uses stops standing for the device; the planner does not park or tune a qubit there
 * (documented in the README).
 *
 * Search-only: every number the planner reports and every rule it checks in the end comes from
 * the exact Transmon (src/plan/exact-state.ts); this table only steers the search.
 */
import { memoLookup, MEMO_SLOTS } from '../util/frequency-memo.js';
import { fluxForJosephsonEnergy, josephsonEnergySlope } from '../transmon/josephson.js';
import { chargeMatrixFromParity, cosPhiMatrixFromParity, parityEigenbasis } from '../transmon/parity-eigenbasis.js';
import type { Transmon } from '../transmon/transmon.js';
import { finiteDifferenceSlopes, hermite, hermiteInverse, hermiteSlope, hermiteWeights } from '../linalg/cubic-hermite.js';

/** Scratch of the cubic Hermite weights (single-threaded use, filled and read in one call). */
const HERMITE_WEIGHTS = new Float64Array(4);

export interface QubitTableOptions {
  /** Grid points (>= 8). */
  points: number;
  /** Lowest E_J / E_C the planner tunes to. */
  minEjOverEc: number;
}

export const QUBIT_TABLE_DEFAULTS: Readonly<QubitTableOptions> = Object.freeze({ points: 32, minEjOverEc: 30 });

/** Interpolated state of a transmon at one f01 (GHz; matrix elements are |<i|n|k>|). */
export interface TableState {
  f01: number;
  f12: number;
  /** E_2 - E_0 ... E_5 - E_0. */
  e2: number;
  e3: number;
  e4: number;
  e5: number;
  n01: number;
  n03: number;
  n12: number;
  n23: number;
  n05: number;
  n14: number;
  /** E_J / E_JS. */
  ejRatio: number;
  /** df01 / dE_J (dimensionless, GHz per GHz). */
  df01dEj: number;
}

export function emptyTableState(): TableState {
  return { f01: 0, f12: 0, e2: 0, e3: 0, e4: 0, e5: 0, n01: 0, n03: 0, n12: 0, n23: 0, n05: 0, n14: 0, ejRatio: 1, df01dEj: 0 };
}

/**
 * What the planner's stages ask of a tabulated spectrum (QubitTable's public face). Other
 * implementations may stand in (src/yield/sampled-spectrum.ts answers it from the reduced
 * spectrum for chips drawn with fabrication spread).
 */
export type SpectrumTable = Pick<
  QubitTable,
  'fLowGHz' | 'fMaxGHz' | 'covers' | 'at' | 'f12At' | 'fluxAt' | 'slopeAt' | 'fluxSlopeOf' | 'fluxSlopeAtF01' | 'f01ForF12' | 'f01ForLevel'
>;

/**
 * The levels and matrix elements of a transmon at one E_J, as a table's grid point needs them:
 * E_k - E_0 (k = 1..5), their slopes d(E_k - E_0)/dE_J (Hellmann-Feynman), and |<i|n|k>|.
 */
export interface LevelPoint {
  levels: Float64Array;
  slopes: Float64Array;
  n01: number;
  n03: number;
  n12: number;
  n23: number;
  n05: number;
  n14: number;
}

/** Fills `out` for a transmon of charging energy ecGHz at E_J = ejGHz (charge cutoff nCut). */
export type LevelSource = (ecGHz: number, ejGHz: number, nCut: number, out: LevelPoint) => void;

export function emptyLevelPoint(): LevelPoint {
  return { levels: new Float64Array(5), slopes: new Float64Array(5), n01: 0, n03: 0, n12: 0, n23: 0, n05: 0, n14: 0 };
}

const exactCharge = new Float64Array(36);
const exactCos = new Float64Array(36);

/** The default source: the transmon stage's exact parity-block eigenbasis (src/transmon/parity-eigenbasis.ts). */
export const exactLevelSource: LevelSource = (ecGHz, ejGHz, nCut, out) => {
  const b = parityEigenbasis(ecGHz, ejGHz, 6, nCut, true);
  chargeMatrixFromParity(b, exactCharge);
  cosPhiMatrixFromParity(b, exactCos);
  const e = b.energies;
  for (let p = 1; p <= LEVEL_CHANNELS; p++) {
    out.levels[p - 1] = e[p] - e[0];
    out.slopes[p - 1] = -(exactCos[p * 6 + p] - exactCos[0]);
  }
  const n = (i: number, j: number) => Math.abs(exactCharge[i * 6 + j]);
  out.n01 = n(0, 1);
  out.n03 = n(0, 3);
  out.n12 = n(1, 2);
  out.n23 = n(2, 3);
  out.n05 = n(0, 5);
  out.n14 = n(1, 4);
};

/** Channels: 0-4 E_1..E_5 - E_0, 5 n01, 6 n03, 7 n12, 8 n23, 9 n05, 10 n14. */
const CHANNELS = 11;
const LEVEL_CHANNELS = 5;

export class QubitTable {
  readonly transmon: Transmon;
  /** Lowest f01 the planner uses (GHz). */
  readonly fLowGHz: number;
  /** f01 at the upper sweet spot (GHz). */
  readonly fMaxGHz: number;
  readonly uMin: number;
  private readonly m: number;
  private readonly h: number;
  /** Values: CHANNELS x m, row-major by channel. */
  private readonly v: Float64Array;
  /** d(value)/du. */
  private readonly dv: Float64Array;
  private readonly scratch = emptyTableState();
  /** f12 samples and slopes (for the inverse f12 -> f01). */
  private readonly w12: Float64Array;
  /** E_level - E_0 (and minus f01) samples and slopes, level 2..5, for f01ForLevel. */
  private readonly levelValues: Float64Array[] = [];
  private readonly levelSlopes: Float64Array[] = [];
  private readonly dw12: Float64Array;

  /**
   * `source` gives the levels at each grid point (default: exact eigen solves; src/yield passes
   * the reduced spectrum, src/transmon/reduced-spectrum.ts, for chips drawn by the thousand).
   */
  constructor(transmon: Transmon, options: Partial<QubitTableOptions> = {}, source: LevelSource = exactLevelSource) {
    const o = { ...QUBIT_TABLE_DEFAULTS, ...options };
    if (!(Number.isInteger(o.points) && o.points >= 8)) throw new RangeError(`QubitTable: points must be an integer >= 8, got ${o.points}`);
    this.transmon = transmon;
    const ejs = transmon.ejsGHz;
    const sMin = Math.min(1, Math.max(transmon.asymmetry, (o.minEjOverEc * transmon.ecGHz) / ejs));
    this.uMin = Math.sqrt(sMin);
    this.m = o.points;
    this.h = (1 - this.uMin) / (this.m - 1);
    // (every array of the table, its memos included, is a view of one buffer: a 1,024-qubit chip
    // builds 1,024 tables, and one backing store each instead of ~26 is what the garbage collector
    // and the allocator then track)
    const slabLength = 2 * CHANNELS * this.m + 2 * this.m + 16 * this.m + MEMO_SLOTS * (STATE_FIELDS + 5);
    const slab = new Float64Array(slabLength);
    let used = 0;
    const take = (length: number): Float64Array => {
      const view = slab.subarray(used, used + length);
      used += length;
      return view;
    };
    this.memoF = take(MEMO_SLOTS).fill(NaN);
    this.memoV = take(MEMO_SLOTS * STATE_FIELDS);
    this.fluxMemoF = take(MEMO_SLOTS).fill(NaN);
    this.fluxMemo = take(MEMO_SLOTS);
    this.f12MemoIn = take(MEMO_SLOTS).fill(NaN);
    this.f12MemoOut = take(MEMO_SLOTS);
    this.v = take(CHANNELS * this.m);
    this.dv = take(CHANNELS * this.m);
    const m = this.m;
    const point = emptyLevelPoint();
    for (let k = 0; k < m; k++) {
      const u = this.h > 0 ? this.uMin + k * this.h : 1;
      const ej = u * u * ejs;
      source(transmon.ecGHz, ej, transmon.chargeCutoff, point);
      const dEjdu = 2 * u * ejs;
      for (let p = 1; p <= LEVEL_CHANNELS; p++) {
        this.v[(p - 1) * m + k] = point.levels[p - 1];
        this.dv[(p - 1) * m + k] = point.slopes[p - 1] * dEjdu;
      }
      this.v[5 * m + k] = point.n01;
      this.v[6 * m + k] = point.n03;
      this.v[7 * m + k] = point.n12;
      this.v[8 * m + k] = point.n23;
      this.v[9 * m + k] = point.n05;
      this.v[10 * m + k] = point.n14;
    }
    for (let c = LEVEL_CHANNELS; c < CHANNELS; c++) finiteDifferenceSlopes(this.v, this.dv, c * m, m, this.h);
    this.w12 = take(m);
    this.dw12 = take(m);
    for (let k = 0; k < m; k++) {
      this.w12[k] = this.v[m + k] - this.v[k];
      this.dw12[k] = this.dv[m + k] - this.dv[k];
    }
    for (let level = 2; level <= 5; level++) {
      const c = level - 1;
      for (const minus of [0, 1]) {
        const y = take(m);
        const dy = take(m);
        for (let k = 0; k < m; k++) {
          y[k] = this.v[c * m + k] - minus * this.v[k];
          dy[k] = this.dv[c * m + k] - minus * this.dv[k];
        }
        this.levelValues.push(y);
        this.levelSlopes.push(dy);
      }
    }
    this.fLowGHz = this.v[0];
    this.fMaxGHz = this.v[m - 1];
    if (used !== slabLength) throw new Error(`QubitTable: ${used} of ${slabLength} buffer entries laid out`);
  }

  /** True when f lies in the planning range [fLow, fMax]. */
  covers(fGHz: number): boolean {
    return fGHz >= this.fLowGHz - 1e-12 && fGHz <= this.fMaxGHz + 1e-12;
  }

  /**
   * State at f01 = fGHz (clamped to the planning range). Writes into `out` (default: an internal
   * scratch object, overwritten by the next call) and returns it.
   */
  at(fGHz: number, out: TableState = this.scratch): TableState {
    // a remembered answer (the state computed for the same frequency before) is copied out
    const found = memoLookup(this.memoF, fGHz);
    if (found >= 0) return readState(this.memoV, found * STATE_FIELDS, out);
    this.locate(fGHz);
    const cell = INVERSE.cell;
    const t = INVERSE.t;
    const m = this.m;
    const h = this.h;
    const v = this.v;
    const dv = this.dv;
    const w = hermiteWeights(t, h, HERMITE_WEIGHTS);
    const b00 = w[0];
    const b10 = w[1];
    const b01 = w[2];
    const b11 = w[3];
    const v0 = v;
    let k = cell;
    out.f01 = b00 * v0[k] + b10 * dv[k] + b01 * v0[k + 1] + b11 * dv[k + 1];
    k += m;
    out.e2 = b00 * v0[k] + b10 * dv[k] + b01 * v0[k + 1] + b11 * dv[k + 1];
    k += m;
    out.e3 = b00 * v0[k] + b10 * dv[k] + b01 * v0[k + 1] + b11 * dv[k + 1];
    k += m;
    out.e4 = b00 * v0[k] + b10 * dv[k] + b01 * v0[k + 1] + b11 * dv[k + 1];
    k += m;
    out.e5 = b00 * v0[k] + b10 * dv[k] + b01 * v0[k + 1] + b11 * dv[k + 1];
    k += m;
    out.n01 = b00 * v0[k] + b10 * dv[k] + b01 * v0[k + 1] + b11 * dv[k + 1];
    k += m;
    out.n03 = b00 * v0[k] + b10 * dv[k] + b01 * v0[k + 1] + b11 * dv[k + 1];
    k += m;
    out.n12 = b00 * v0[k] + b10 * dv[k] + b01 * v0[k + 1] + b11 * dv[k + 1];
    k += m;
    out.n23 = b00 * v0[k] + b10 * dv[k] + b01 * v0[k + 1] + b11 * dv[k + 1];
    k += m;
    out.n05 = b00 * v0[k] + b10 * dv[k] + b01 * v0[k + 1] + b11 * dv[k + 1];
    k += m;
    out.n14 = b00 * v0[k] + b10 * dv[k] + b01 * v0[k + 1] + b11 * dv[k + 1];
    out.f12 = out.e2 - out.f01;
    out.ejRatio = LOCATED.ejRatio;
    out.df01dEj = LOCATED.df01dEj;
    const slot = -1 - found;
    this.memoF[slot] = fGHz;
    writeState(out, this.memoV, slot * STATE_FIELDS);
    return out;
  }

  /** f12 at f01 = fGHz. */
  f12At(fGHz: number): number {
    return this.at(fGHz).f12;
  }

  /** Flux (0 <= Phi <= 1/2) at f01 = fGHz. */
  fluxAt(fGHz: number): number {
    // remembered answers (the parking cost asks for the flux excursion from one fixed end to each
    // point it tries, and for the same crossings again): the flux computed before for this frequency
    const found = memoLookup(this.fluxMemoF, fGHz);
    if (found >= 0) return this.fluxMemo[found];
    const s = this.at(fGHz).ejRatio;
    const flux = fluxForJosephsonEnergy(1, this.transmon.asymmetry, Math.min(1, Math.max(this.transmon.asymmetry, s)));
    const slot = -1 - found;
    this.fluxMemoF[slot] = fGHz;
    this.fluxMemo[slot] = flux;
    return flux;
  }

  /** Keys (NaN when free, as emptyMemoKeys makes them) and values of fluxAt's memo. */
  private readonly fluxMemoF: Float64Array;
  private readonly fluxMemo: Float64Array;

  /** df01/dPhi (GHz per Phi0) at f01 = fGHz. */
  slopeAt(fGHz: number): number {
    const st = this.at(fGHz);
    const flux = fluxForJosephsonEnergy(1, this.transmon.asymmetry, Math.min(1, Math.max(this.transmon.asymmetry, st.ejRatio)));
    return st.df01dEj * josephsonEnergySlope(this.transmon.ejsGHz, this.transmon.asymmetry, flux);
  }

  /**
   * fluxSlopeOf(at(fGHz)) without the rest of the state: the same cell inversion, E_J ratio and
   * df01/dE_J as `at` computes them (the same operations, so the same bits), for scans that need
   * only the slope (the idle-error bands: 401 points per qubit). Leaves `at`'s memo alone.
   */
  fluxSlopeAtF01(fGHz: number): number {
    this.locate(fGHz);
    const d = this.transmon.asymmetry;
    const flux = fluxForJosephsonEnergy(1, d, Math.min(1, Math.max(d, LOCATED.ejRatio)));
    return LOCATED.df01dEj * josephsonEnergySlope(this.transmon.ejsGHz, d, flux);
  }

  /**
   * The cell and position of f01 = fGHz (invertCell, left in INVERSE) and there the E_J ratio and
   * df01/dE_J (left in LOCATED): what `at` and fluxSlopeAtF01 both start from.
   */
  private locate(fGHz: number): void {
    invertCell(this.v, this.dv, this.h, fGHz, this.m);
    const cell = INVERSE.cell;
    const t = INVERSE.t;
    const h = this.h;
    const v = this.v;
    const dv = this.dv;
    const u = this.uMin + (cell + t) * h;
    LOCATED.ejRatio = u * u;
    const df01du = h > 0 ? hermiteSlope(v[cell], v[cell + 1], dv[cell] * h, dv[cell + 1] * h, t) / h : 0;
    LOCATED.df01dEj = df01du / (2 * u * this.transmon.ejsGHz);
  }

  /** df01/dPhi (GHz per Phi0, <= 0 on the working branch) in a state this table returned. */
  fluxSlopeOf(st: TableState): number {
    const d = this.transmon.asymmetry;
    const flux = fluxForJosephsonEnergy(1, d, Math.min(1, Math.max(d, st.ejRatio)));
    return st.df01dEj * josephsonEnergySlope(this.transmon.ejsGHz, d, flux);
  }

  /**
   * The f01 at which this transmon's f12 equals `f12GHz`, or null when that lies outside the
   * planning range (f12 grows monotonically with E_J, like f01).
   */
  f01ForF12(f12GHz: number): number | null {
    const m = this.m;
    const w = this.w12;
    if (f12GHz < w[0] - 1e-12 || f12GHz > w[m - 1] + 1e-12) return null;
    // remembered answers (the planner asks again for the same neighbours): the value computed before
    const found = memoLookup(this.f12MemoIn, f12GHz);
    if (found >= 0) return this.f12MemoOut[found];
    invertCell(w, this.dw12, this.h, f12GHz);
    const cell = INVERSE.cell;
    const v = this.v;
    const dv = this.dv;
    const out = hermite(v[cell], v[cell + 1], dv[cell] * this.h, dv[cell + 1] * this.h, INVERSE.t);
    const slot = -1 - found;
    this.f12MemoIn[slot] = f12GHz;
    this.f12MemoOut[slot] = out;
    return out;
  }

  private readonly f12MemoIn: Float64Array;
  private readonly f12MemoOut: Float64Array;

  /**
   * The f01 at which E_level - E_0 - (minusF01 ? f01 : 0) equals `targetGHz` (level 2..5), or null
   * outside the planning range. Every such combination grows with E_J.
   */
  f01ForLevel(level: number, targetGHz: number, minusF01 = false): number | null {
    if (!(level >= 2 && level <= 5)) throw new RangeError(`f01ForLevel: level must be 2..5, got ${level}`);
    const k = (level - 2) * 2 + (minusF01 ? 1 : 0);
    const y = this.levelValues[k];
    const dy = this.levelSlopes[k];
    const m = this.m;
    if (targetGHz < y[0] - 1e-12 || targetGHz > y[m - 1] + 1e-12) return null;
    invertCell(y, dy, this.h, targetGHz);
    const cell = INVERSE.cell;
    return hermite(this.v[cell], this.v[cell + 1], this.dv[cell] * this.h, this.dv[cell + 1] * this.h, INVERSE.t);
  }

  /**
   * Memo of `at` by frequency (src/util/frequency-memo.ts), values STATE_FIELDS numbers per slot.
   * The search asks for the same points again and again (a neighbour's crossing
   * from the gate cost, the flux excursion and the spectator term in turn); a remembered answer is
   * the state computing it again gives, to the last bit (at is a function of the frequency alone).
   */
  private readonly memoF: Float64Array;
  private readonly memoV: Float64Array;
}

/** Numbers of a TableState as the memo stores them. */
const STATE_FIELDS = 14;

function writeState(s: TableState, to: Float64Array, o: number): void {
  to[o] = s.f01;
  to[o + 1] = s.f12;
  to[o + 2] = s.e2;
  to[o + 3] = s.e3;
  to[o + 4] = s.e4;
  to[o + 5] = s.e5;
  to[o + 6] = s.n01;
  to[o + 7] = s.n03;
  to[o + 8] = s.n12;
  to[o + 9] = s.n23;
  to[o + 10] = s.n05;
  to[o + 11] = s.n14;
  to[o + 12] = s.ejRatio;
  to[o + 13] = s.df01dEj;
}

function readState(from: Float64Array, o: number, s: TableState): TableState {
  s.f01 = from[o];
  s.f12 = from[o + 1];
  s.e2 = from[o + 2];
  s.e3 = from[o + 3];
  s.e4 = from[o + 4];
  s.e5 = from[o + 5];
  s.n01 = from[o + 6];
  s.n03 = from[o + 7];
  s.n12 = from[o + 8];
  s.n23 = from[o + 9];
  s.n05 = from[o + 10];
  s.n14 = from[o + 11];
  s.ejRatio = from[o + 12];
  s.df01dEj = from[o + 13];
  return s;
}

/** Where invertCell leaves its answer (single-threaded use, read right after the call). */
const INVERSE = { cell: 0, t: 0 };

/** Where QubitTable.locate leaves the E_J ratio and df01/dE_J (read right after the call). */
const LOCATED = { ejRatio: 1, df01dEj: 0 };

/**
 * Cell and local coordinate t in [0, 1] where the Hermite interpolant of the increasing samples
 * y[0..m-1] (slopes dy per unit u, spacing h) equals `target` (clamped to the ends):
 * binary search for the cell, then safeguarded Newton on the cubic (hermiteInverse). Leaves them in INVERSE.
 */
function invertCell(y: Float64Array, dy: Float64Array, h: number, target: number, m: number = y.length): void {
  if (m < 2 || h === 0 || target <= y[0]) {
    INVERSE.cell = 0;
    INVERSE.t = 0;
    return;
  }
  if (target >= y[m - 1]) {
    INVERSE.cell = m - 2;
    INVERSE.t = 1;
    return;
  }
  let lo = 0;
  let hi = m - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (y[mid] <= target) lo = mid;
    else hi = mid;
  }
  const y0 = y[lo];
  const y1 = y[lo + 1];
  INVERSE.cell = lo;
  INVERSE.t = hermiteInverse(y0, y1, dy[lo] * h, dy[lo + 1] * h, target, (target - y0) / (y1 - y0), 1e-14, 30);
}
