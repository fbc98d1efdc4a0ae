/**
 * Memos of exact transmon results the planner asks for again and again with the same arguments
 * (a mover's flux at its parking and interaction frequencies in every rule evaluation, the
 * spectrum at a parking or interaction flux in every error estimate). Keyed by the plan context,
 * so they last as long as the chip's planning does; the values are exactly those of the
 * transmon's own calls, so no figure changes. A transmon whose spectrum is a table look-up
 * (Transmon.tabulatedSpectrum) is asked directly: remembering would cost more than asking.
 */
import type { PlanContext } from './context.js';
import type { SpectrumPoint } from '../transmon/spectrum.js';

/**
 * One memo per kind: for each qubit a map from the argument (a number key: distinct doubles are
 * distinct keys, 0 and -0 one key, as their decimal strings were before) to the result. Number
 * keys, not strings: building a string from a double cost more than the lookup it served.
 */
class QubitMemo<V> {
  private readonly perQubit: (Map<number, V> | undefined)[] = [];
  private size = 0;

  get(q: number, x: number): V | undefined {
    return this.perQubit[q]?.get(x);
  }

  set(q: number, x: number, value: V): V {
    // bounds its memory on long or hostile runs: starts over at MEMO_LIMIT entries
    if (this.size >= MEMO_LIMIT) {
      this.perQubit.length = 0;
      this.size = 0;
    }
    let m = this.perQubit[q];
    if (!m) this.perQubit[q] = m = new Map();
    m.set(x, value);
    this.size++;
    return value;
  }
}

interface Memo {
  flux: QubitMemo<number | null>;
  spectrum: QubitMemo<SpectrumPoint>;
  curvature: QubitMemo<number>;
  slope: QubitMemo<number>;
}

const memos = new WeakMap<PlanContext, Memo>();

/** Entries a memo keeps before it starts over (bounds its memory on long or hostile runs). */
export const MEMO_LIMIT = 200_000;

function memoOf(ctx: PlanContext): Memo {
  let m = memos.get(ctx);
  if (!m) memos.set(ctx, (m = { flux: new QubitMemo(), spectrum: new QubitMemo(), curvature: new QubitMemo(), slope: new QubitMemo() }));
  return m;
}

/** ctx.transmons[q].fluxForF01OrNull(fGHz), remembered. */
export function fluxForF01Memo(ctx: PlanContext, q: number, fGHz: number): number | null {
  if (ctx.transmons[q].tabulatedSpectrum) return ctx.transmons[q].fluxForF01OrNull(fGHz);
  const m = memoOf(ctx).flux;
  let v = m.get(q, fGHz);
  if (v === undefined) v = m.set(q, fGHz, ctx.transmons[q].fluxForF01OrNull(fGHz));
  return v;
}

/** A transmon that lends out its own remembered spectrum points (src/yield/tabulated-transmon.ts). */
interface SharedSpectrumSource {
  sharedSpectrum(flux: number): Readonly<SpectrumPoint>;
}

/**
 * ctx.transmons[q].spectrum(flux), remembered (treat the result as read-only). A tabulated
 * transmon that remembers its points itself lends its own (the values spectrum() copies out).
 */
export function spectrumMemo(ctx: PlanContext, q: number, flux: number): SpectrumPoint {
  const t = ctx.transmons[q];
  if (t.tabulatedSpectrum) {
    const shared = (t as Partial<SharedSpectrumSource>).sharedSpectrum;
    return shared ? (shared.call(t, flux) as SpectrumPoint) : t.spectrum(flux);
  }
  const m = memoOf(ctx).spectrum;
  let v = m.get(q, flux);
  if (v === undefined) v = m.set(q, flux, ctx.transmons[q].spectrum(flux));
  return v;
}

/**
 * spectrumMemo(ctx, q, flux).df01dFluxGHz, the same number, remembered on its own: an exact
 * transmon computes it from two levels (Transmon.f01FluxSlope) instead of the whole spectrum. For
 * the spectator-move term, which asks for the slope at each screened spectator point (a new flux
 * each time) and at parking.
 */
export function fluxSlopeMemo(ctx: PlanContext, q: number, flux: number): number {
  if (ctx.transmons[q].tabulatedSpectrum) return spectrumMemo(ctx, q, flux).df01dFluxGHz;
  const m = memoOf(ctx).slope;
  let v = m.get(q, flux);
  if (v === undefined) v = m.set(q, flux, ctx.transmons[q].f01FluxSlope(flux));
  return v;
}

/** ctx.transmons[q].fluxCurvatureGHz(flux), remembered. */
export function fluxCurvatureMemo(ctx: PlanContext, q: number, flux: number): number {
  if (ctx.transmons[q].tabulatedSpectrum) return ctx.transmons[q].fluxCurvatureGHz(flux);
  const m = memoOf(ctx).curvature;
  let v = m.get(q, flux);
  if (v === undefined) v = m.set(q, flux, ctx.transmons[q].fluxCurvatureGHz(flux));
  return v;
}
