/**
 * A drawn transmon whose spectrum questions are answered from the reduced spectrum
 * (src/transmon/reduced-spectrum.ts: the transmon's levels and charge matrix elements in units
 * of E_C against r = E_J / E_C, one table for every transmon) instead of new eigen solves.
 *
 * The planner's rule evaluations and the error budget ask a transmon for its spectrum at a flux
 * (f01, f12 and their flux slopes), the flux of a frequency, the flux curvature of f01 (second
 * order flux noise at a sweet spot) and |<0|n|1>|; for a drawn chip of a Monte Carlo yield run
 * each of those was an eigen solve (a root search for the inverse maps), and together they were
 * most of a sample's time. This subclass answers them from the table wherever r lies inside it
 * and falls back to the exact Transmon where it does not (very small E_J at the lower sweet spot
 * of a nearly symmetric SQUID); the eigenbasis, charge-basis and level calls (exact coupled pairs,
 * simulations) stay exact.
 *
 * Accuracy, as tested (test/yield/tabulated-transmon.test.ts): f01 and f12 within 1e-9 relative
 * of SciPy's Mathieu values (the table itself is good to ~1e-10), df01/dPhi within 1e-6 of a
 * finite difference of them; the inverse maps within 1e-9 Phi0, the curvature (a central
 * difference of the tabulated slope, as the exact one is of the exact slope) within 1e-5
 * relative and |<0|n|1>| within 1e-9 relative of the exact Transmon.
 */
import { fluxForJosephsonEnergy } from '../transmon/josephson.js';
import { emptyReducedState, type ReducedSpectrum } from '../transmon/reduced-spectrum.js';
import type { SpectrumPoint } from '../transmon/spectrum.js';
import { Transmon } from '../transmon/transmon.js';

type TransmonArgs = ConstructorParameters<typeof Transmon>;

export class TabulatedTransmon extends Transmon {
  /**
   * Scratch of the table look-ups and the answers of spectrum and fluxCurvatureGHz by flux (made
   * on first use): a drawn chip's rule evaluation and error budget ask each transmon for the same
   * few fluxes again and again (some 2,600 spectrum calls on ~520 fluxes per 10 x 10 sample). A
   * remembered answer is the object computing it again gives (spectrum hands out copies). One
   * field: each field a subclass adds is defined on every instance after Transmon's own, and four
   * of them made building a transmon cost microseconds.
   */
  private readonly work: TabulatedWork;

  /**
   * `work`: scratch and memos to take over from a transmon no longer used (a Monte Carlo run
   * keeps one per qubit, so a sample allocates none; its memos are emptied here).
   */
  constructor(
    private readonly table: ReducedSpectrum,
    id: TransmonArgs[0],
    params: TransmonArgs[1],
    options?: TransmonArgs[2],
    work?: TabulatedWork,
  ) {
    super(id, params, options);
    this.work = work ? work.reset() : new TabulatedWork();
  }

  override get tabulatedSpectrum(): boolean {
    return true;
  }

  private ratio(flux: number): number {
    return this.ejGHz(flux) / this.ecGHz;
  }

  override f01(flux: number): number {
    const r = this.ratio(flux);
    if (!this.table.covers(r)) return super.f01(flux);
    return this.ecGHz * this.table.at(r, this.work.state).e1;
  }

  override spectrum(flux: number): SpectrumPoint {
    return { ...this.sharedSpectrum(flux) };
  }

  /**
   * spectrum(flux) without the copy: the remembered point itself, to be read, never changed
   * (src/plan/exact-memo.ts spectrumMemo hands it out; its callers only read). Valid while this
   * transmon is in use (a reused `work` empties the memo, it never changes a point).
   */
  sharedSpectrum(flux: number): Readonly<SpectrumPoint> {
    const memo = (this.work.spectra ??= new FluxMemo());
    const slot = memo.find(flux);
    if (slot >= 0 && memo.points[slot]) return memo.points[slot]!;
    const p = this.computeSpectrum(flux);
    memo.points[memo.store(flux, slot)] = p;
    return p;
  }

  /** (the exact Transmon's central difference of the slope, of this class's slopes; remembered by flux) */
  override fluxCurvatureGHz(flux: number): number {
    const memo = (this.work.curvatures ??= new FluxMemo());
    const slot = memo.find(flux);
    if (slot >= 0) return memo.values[slot];
    const c = super.fluxCurvatureGHz(flux);
    memo.values[memo.store(flux, slot)] = c;
    return c;
  }

  private computeSpectrum(flux: number): SpectrumPoint {
    const ej = this.ejGHz(flux);
    const r = ej / this.ecGHz;
    if (!this.table.covers(r)) return super.spectrum(flux);
    const s = this.table.at(r, this.work.state);
    const sl = this.table.levelSlopes(r, this.work.slopes);
    const dej = this.ejSlopeGHz(flux);
    const f01 = this.ecGHz * s.e1;
    const f12 = this.ecGHz * (s.e2 - s.e1);
    return { flux, ejGHz: ej, f01GHz: f01, f12GHz: f12, anharmonicityGHz: f12 - f01, df01dFluxGHz: sl[0] * dej, df12dFluxGHz: (sl[1] - sl[0]) * dej };
  }

  override chargeElement01(flux: number): number {
    const r = this.ratio(flux);
    if (!this.table.covers(r)) return super.chargeElement01(flux);
    return this.table.at(r, this.work.state).n01;
  }

  /**
   * (remembered by frequency: every gate's rules ask for its mover's flux at its parking and
   * interaction frequencies; a stored NaN stands for null, and an answer of NaN is not stored)
   */
  override fluxForF01OrNull(fGHz: number): number | null {
    const memo = (this.work.fluxes ??= new FluxMemo());
    const slot = memo.find(fGHz);
    if (slot >= 0) return Number.isNaN(memo.values[slot]) ? null : memo.values[slot];
    const x = this.inverse('e1', fGHz, this.fMinGHz, this.fMaxGHz) ?? (this.tableSpansRange() ? null : super.fluxForF01OrNull(fGHz));
    if (x === null || !Number.isNaN(x)) memo.values[memo.store(fGHz, slot)] = x ?? NaN;
    return x;
  }

  override fluxForF12OrNull(fGHz: number): number | null {
    return this.inverse('e12', fGHz, this.f12MinGHz, this.f12MaxGHz) ?? (this.tableSpansRange() ? null : super.fluxForF12OrNull(fGHz));
  }

  /** The table holds the whole tunable range, E_J from d E_JS to E_JS. */
  private tableSpansRange(): boolean {
    const rTop = this.ejsGHz / this.ecGHz;
    return this.table.covers(rTop) && this.table.covers(this.asymmetry * rTop);
  }

  /** Flux 0 <= Phi <= 1/2 where the channel equals fGHz (null out of [lo, hi] or when the table does not span the range). */
  private inverse(c: 'e1' | 'e12', fGHz: number, lo: number, hi: number): number | null {
    if (!this.tableSpansRange()) return null;
    const slack = 1e-12 * Math.max(1, Math.abs(fGHz));
    if (fGHz < lo - slack || fGHz > hi + slack) return null;
    const rTop = this.ejsGHz / this.ecGHz;
    const r = this.table.rFor(c, fGHz / this.ecGHz, this.asymmetry * rTop, rTop, slack / this.ecGHz);
    if (r === null) return null;
    const x = fluxForJosephsonEnergy(this.ejsGHz, this.asymmetry, Math.min(this.ejsGHz, Math.max(this.asymmetry * this.ejsGHz, r * this.ecGHz)));
    return Number.isFinite(x) ? x : null;
  }
}

/** A TabulatedTransmon's scratch and memos (see its `work`). */
export class TabulatedWork {
  readonly state = emptyReducedState();
  readonly slopes = new Float64Array(5);
  spectra: FluxMemo | undefined = undefined;
  curvatures: FluxMemo | undefined = undefined;
  /** fluxForF01OrNull by frequency (a FluxMemo keyed by f01 instead of flux). */
  fluxes: FluxMemo | undefined = undefined;

  /** Empty the memos (for another transmon). */
  reset(): this {
    this.spectra?.keys.fill(NaN);
    this.curvatures?.keys.fill(NaN);
    this.fluxes?.keys.fill(NaN);
    return this;
  }
}

const FLUX_MEMO_SLOTS = 64;
const FLUX_MEMO_MASK = FLUX_MEMO_SLOTS - 1;
const FLUX_MEMO_PROBES = 4;
const BITS = new Float64Array(1);
const WORDS = new Uint32Array(BITS.buffer);

/**
 * A small hash table keyed by flux (the key's bits, multiplicative hash; probed FLUX_MEMO_PROBES
 * deep, a full probe run replaces its first slot).
 */
class FluxMemo {
  readonly keys = new Float64Array(FLUX_MEMO_SLOTS).fill(NaN);
  readonly points: (SpectrumPoint | undefined)[] = new Array<SpectrumPoint | undefined>(FLUX_MEMO_SLOTS);
  readonly values = new Float64Array(FLUX_MEMO_SLOTS);
  private home = 0;
  private free = -1;

  /** The slot holding `x`, or -1 (then store() puts `x` where the probe left room). */
  find(x: number): number {
    BITS[0] = x;
    const home = Math.imul(WORDS[0] ^ Math.imul(WORDS[1], 0x85ebca6b), 0x9e3779b1) >>> 26;
    this.home = home;
    this.free = -1;
    for (let p = 0; p < FLUX_MEMO_PROBES; p++) {
      const k = (home + p) & FLUX_MEMO_MASK;
      const key = this.keys[k];
      if (key === x) return k;
      if (this.free < 0 && key !== key) this.free = k;
    }
    return -1;
  }

  /** The slot for `x` after find(x) answered -1 (its key written). */
  store(x: number, found: number): number {
    const k = found >= 0 ? found : this.free >= 0 ? this.free : this.home;
    this.keys[k] = x;
    return k;
  }
}
