/**
 * A drawn transmon's tabulated spectrum, answered from the reduced spectrum
 * (src/transmon/reduced-spectrum.ts) instead of new eigen solves: f01 = E_C e_1(r) with
 * r = E_J(Phi) / E_C, and so on for every level and matrix element. It is the planner's
 * SpectrumTable (src/plan/qubit-table.ts) with the same meaning point for point: the planning
 * range runs from E_J / E_C = max(d E_JS, 30 E_C) / E_C up to the upper sweet spot, values are
 * clamped to it, and the inverse maps answer null outside it. Building one costs a few
 * arithmetic operations, so a Monte Carlo sample of a 100-qubit chip needs no eigen solve.
 *
 * Accuracy: that of the reduced table (relative ~1e-10 in the levels); QubitTable's own
 * interpolation is good to ~1e-7 GHz, so both stand for the exact Transmon equally well
 * (test/yield/sampled-spectrum.test.ts).
 */
import { memoLookup, MEMO_SLOTS } from '../util/frequency-memo.js';
import type { TableState } from '../plan/qubit-table.js';
import { QUBIT_TABLE_DEFAULTS, type SpectrumTable } from '../plan/qubit-table.js';
import { fluxForJosephsonEnergy, josephsonEnergySlope } from '../transmon/josephson.js';
import { emptyReducedState, type ReducedChannel, type ReducedSpectrum, type ReducedState } from '../transmon/reduced-spectrum.js';

export class SampledSpectrum implements SpectrumTable {
  fLowGHz = 0;
  fMaxGHz = 0;
  /** r = E_J / E_C at the bottom of the planning range and at the upper sweet spot. */
  rLow = 0;
  rTop = 0;
  ecGHz = 0;
  ejsGHz = 0;
  asymmetry = 0;
  private readonly red = emptyReducedState();
  private readonly scratch: TableState = blankState();
  /**
   * Memos of `at` and `f01ForF12` by frequency (src/util/frequency-memo.ts).
   * A drawn chip's rule evaluation and error budget ask each qubit for some 15-20 distinct
   * frequencies, again and again (each neighbour's parking frequency and f12, crossings, seen
   * from each gate near it): a remembered answer is the same object computing it again gives.
   */
  private readonly memoF = new Float64Array(MEMO_SLOTS);
  /**
   * The remembered states, STATE_FIELDS doubles per slot (a typed array, not an object per slot:
   * an object's double fields are boxed, so copying one out chased a pointer per field; with
   * these arrays a remembered answer costs about a third as much, measured in a profile).
   */
  private readonly memoV = new Float64Array(MEMO_SLOTS * STATE_FIELDS);
  private readonly memo12F = new Float64Array(MEMO_SLOTS);
  private readonly memo12V = new Float64Array(MEMO_SLOTS);

  constructor(
    private readonly table: ReducedSpectrum,
    ecGHz: number,
    ejsGHz: number,
    asymmetry: number,
    fluxNoisePhi0: number | undefined,
    private readonly minEjOverEc: number = QUBIT_TABLE_DEFAULTS.minEjOverEc,
  ) {
    this.reset(ecGHz, ejsGHz, asymmetry, fluxNoisePhi0);
  }

  /** The same object for another transmon (a Monte Carlo run reuses one per qubit). */
  reset(ecGHz: number, ejsGHz: number, asymmetry: number, fluxNoisePhi0: number | undefined): this {
    const table = this.table;
    this.ecGHz = ecGHz;
    this.ejsGHz = ejsGHz;
    this.asymmetry = asymmetry;
    this.rTop = ejsGHz / ecGHz;
    const sMin = Math.min(1, Math.max(asymmetry, (this.minEjOverEc * ecGHz) / ejsGHz));
    this.rLow = sMin * this.rTop;
    if (!table.covers(this.rLow) || !table.covers(this.rTop)) {
      throw new RangeError(`SampledSpectrum: E_J/E_C from ${this.rLow} to ${this.rTop} leaves the reduced table [${table.rMin}, ${table.rMax}]`);
    }
    this.fLowGHz = ecGHz * table.value('e1', this.rLow);
    this.fMaxGHz = ecGHz * table.value('e1', this.rTop);
    this.memoF.fill(NaN);
    this.memo12F.fill(NaN);
    return this;
  }

  covers(fGHz: number): boolean {
    return fGHz >= this.fLowGHz - 1e-12 && fGHz <= this.fMaxGHz + 1e-12;
  }

  /** State at f01 = fGHz (clamped to the planning range), written into `out`. */
  at(fGHz: number, out: TableState = this.scratch): TableState {
    const found = memoLookup(this.memoF, fGHz);
    if (found >= 0) return readState(this.memoV, found * STATE_FIELDS, out);
    const ec = this.ecGHz;
    const r = fGHz <= this.fLowGHz ? this.rLow : fGHz >= this.fMaxGHz ? this.rTop : this.table.rInside('e1', fGHz / ec, this.rLow, this.rTop);
    const s = this.table.at(r, this.red);
    fillState(s, ec, this.rTop, out);
    const k = -1 - found;
    this.memoF[k] = fGHz;
    writeState(out, this.memoV, k * STATE_FIELDS);
    return out;
  }

  /** State at E_J / E_C = r (no clamping beyond the reduced table). */
  atRatio(r: number, out: TableState = this.scratch): TableState {
    fillState(this.table.at(r, this.red), this.ecGHz, this.rTop, out);
    return out;
  }

  f12At(fGHz: number): number {
    return this.at(fGHz).f12;
  }

  fluxAt(fGHz: number): number {
    return this.fluxOfRatio(this.at(fGHz).ejRatio);
  }

  slopeAt(fGHz: number): number {
    const st = this.at(fGHz);
    return st.df01dEj * josephsonEnergySlope(this.ejsGHz, this.asymmetry, this.fluxOfRatio(st.ejRatio));
  }

  /** fluxSlopeOf(at(fGHz)) (SpectrumTable's slope-only question; here simply that). */
  fluxSlopeAtF01(fGHz: number): number {
    return this.fluxSlopeOf(this.at(fGHz));
  }

  /** df01/dPhi (GHz per Phi0) in a state this table returned. */
  fluxSlopeOf(st: TableState): number {
    return st.df01dEj * josephsonEnergySlope(this.ejsGHz, this.asymmetry, this.fluxOfRatio(st.ejRatio));
  }

  f01ForF12(f12GHz: number): number | null {
    const found = memoLookup(this.memo12F, f12GHz);
    if (found >= 0) return Number.isNaN(this.memo12V[found]) ? null : this.memo12V[found];
    const r = this.table.rFor('e12', f12GHz / this.ecGHz, this.rLow, this.rTop, 1e-12 / this.ecGHz);
    const f = r === null ? null : this.ecGHz * this.table.value('e1', r);
    const k = -1 - found;
    this.memo12F[k] = f12GHz;
    this.memo12V[k] = f === null ? NaN : f;
    return f;
  }

  f01ForLevel(level: number, targetGHz: number, minusF01 = false): number | null {
    if (!(level >= 2 && level <= 5)) throw new RangeError(`f01ForLevel: level must be 2..5, got ${level}`);
    const channel = (minusF01 ? `e${level}-1` : `e${level}`) as ReducedChannel;
    const r = this.table.rFor(channel, targetGHz / this.ecGHz, this.rLow, this.rTop, 1e-12 / this.ecGHz);
    return r === null ? null : this.ecGHz * this.table.value('e1', r);
  }

  private fluxOfRatio(s: number): number {
    const d = this.asymmetry;
    return fluxForJosephsonEnergy(1, d, Math.min(1, Math.max(d, s)));
  }
}

function blankState(): TableState {
  return { f01: 0, f12: 0, e2: 0, e3: 0, e4: 0, e5: 0, n01: 0, n03: 0, n12: 0, n23: 0, n05: 0, n14: 0, ejRatio: 1, df01dEj: 0 };
}

function fillState(s: ReducedState, ec: number, rTop: number, out: TableState): void {
  out.f01 = ec * s.e1;
  out.e2 = ec * s.e2;
  out.e3 = ec * s.e3;
  out.e4 = ec * s.e4;
  out.e5 = ec * s.e5;
  out.f12 = out.e2 - out.f01;
  out.n01 = s.n01;
  out.n03 = s.n03;
  out.n12 = s.n12;
  out.n23 = s.n23;
  out.n05 = s.n05;
  out.n14 = s.n14;
  out.ejRatio = s.r / rTop;
  out.df01dEj = s.de1dr;
}

/** Doubles of a TableState in a memo slot (the order of readState and writeState). */
const STATE_FIELDS = 14;

/** The state remembered at v[at..at + STATE_FIELDS), written into `to`. */
function readState(v: Float64Array, at: number, to: TableState): TableState {
  to.f01 = v[at];
  to.f12 = v[at + 1];
  to.e2 = v[at + 2];
  to.e3 = v[at + 3];
  to.e4 = v[at + 4];
  to.e5 = v[at + 5];
  to.n01 = v[at + 6];
  to.n03 = v[at + 7];
  to.n12 = v[at + 8];
  to.n23 = v[at + 9];
  to.n05 = v[at + 10];
  to.n14 = v[at + 11];
  to.ejRatio = v[at + 12];
  to.df01dEj = v[at + 13];
  return to;
}

/** Remember `from` at v[at..at + STATE_FIELDS) (the same doubles readState gives back). */
function writeState(from: TableState, v: Float64Array, at: number): void {
  v[at] = from.f01;
  v[at + 1] = from.f12;
  v[at + 2] = from.e2;
  v[at + 3] = from.e3;
  v[at + 4] = from.e4;
  v[at + 5] = from.e5;
  v[at + 6] = from.n01;
  v[at + 7] = from.n03;
  v[at + 8] = from.n12;
  v[at + 9] = from.n23;
  v[at + 10] = from.n05;
  v[at + 11] = from.n14;
  v[at + 12] = from.ejRatio;
  v[at + 13] = from.df01dEj;
}
