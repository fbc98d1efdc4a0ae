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

interface Memo {
  flux: Map<string, number | null>;
  spectrum: Map<string, SpectrumPoint>;
  curvature: Map<string, number>;
}

const memos = new WeakMap<PlanContext, Memo>();

/** Entries a memo keeps before it starts over (bounds its memory on long or hostile runs). */
export const MEMO_LIMIT = 200_000;

function remember<V>(m: Map<string, V>, key: string, value: V): V {
  if (m.size >= MEMO_LIMIT) m.clear();
  m.set(key, value);
  return value;
}

function memoOf(ctx: PlanContext): Memo {
  let m = memos.get(ctx);
  if (!m) memos.set(ctx, (m = { flux: new Map(), spectrum: new Map(), curvature: new Map() }));
  return m;
}

/** ctx.transmons[q].fluxForF01OrNull(fGHz), remembered. */
export function fluxForF01Memo(ctx: PlanContext, q: number, fGHz: number): number | null {
  if (ctx.transmons[q].tabulatedSpectrum) return ctx.transmons[q].fluxForF01OrNull(fGHz);
  const m = memoOf(ctx).flux;
  const key = `${q},${fGHz}`;
  let v = m.get(key);
  if (v === undefined) v = remember(m, key, ctx.transmons[q].fluxForF01OrNull(fGHz));
  return v;
}

/** ctx.transmons[q].spectrum(flux), remembered (treat the result as read-only). */
export function spectrumMemo(ctx: PlanContext, q: number, flux: number): SpectrumPoint {
  if (ctx.transmons[q].tabulatedSpectrum) return ctx.transmons[q].spectrum(flux);
  const m = memoOf(ctx).spectrum;
  const key = `${q},${flux}`;
  let v = m.get(key);
  if (v === undefined) v = remember(m, key, ctx.transmons[q].spectrum(flux));
  return v;
}

/** ctx.transmons[q].fluxCurvatureGHz(flux), remembered. */
export function fluxCurvatureMemo(ctx: PlanContext, q: number, flux: number): number {
  if (ctx.transmons[q].tabulatedSpectrum) return ctx.transmons[q].fluxCurvatureGHz(flux);
  const m = memoOf(ctx).curvature;
  const key = `${q},${flux}`;
  let v = m.get(key);
  if (v === undefined) v = remember(m, key, ctx.transmons[q].fluxCurvatureGHz(flux));
  return v;
}
