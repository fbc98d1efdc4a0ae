/**
 * The exact avoided crossing of a CZ (README physics conventions sec. 2): the mover flux where the
 * dressed |11> and the leakage state (|20> for 11-20, |02> for 11-02) come closest, found by
 * golden-section search of their splitting in the simulator's own dressed spectrum (the same
 * model the gate is simulated in), around the bare-frequency resonance.
 */
import { dressedStatesAt } from '../sim/dressed-states.js';
import type { ManifoldFrame } from '../sim/manifold-frame.js';
import type { CrossingName } from './context.js';

export interface ExactCrossing {
  /** Mover flux at the minimum splitting. */
  flux: number;
  /** The minimum splitting (GHz), ~ 2 sqrt2 g for 11-20. */
  gapGHz: number;
}

/** Splitting of dressed 11 and the leakage state at mover flux x (spectators in ground). */
export function crossingSplitting(frame: ManifoldFrame, crossing: CrossingName, ejOf: (x: number) => number, x: number): number {
  const spect = new Array(Math.max(0, frame.model.transmons.length - 2)).fill(0);
  const states = dressedStatesAt(frame, ejOf(x));
  const find = (ab: number[]): number => {
    const label = [...ab, ...spect];
    const s = states.find((st) => st.label.every((m, i) => m === label[i]));
    if (!s) throw new RangeError(`crossing: no dressed state ${label.join('')}`);
    return s.energy;
  };
  return Math.abs(find(crossing === '11-20' ? [2, 0] : [0, 2]) - find([1, 1]));
}

/** Golden-section minimum of the splitting on [a, b] (the bare resonance lies inside). */
export function exactCrossing(frame: ManifoldFrame, crossing: CrossingName, ejOf: (x: number) => number, a: number, b: number): ExactCrossing {
  const r = (Math.sqrt(5) - 1) / 2;
  let lo = Math.min(a, b);
  let hi = Math.max(a, b);
  let c = hi - r * (hi - lo);
  let d = lo + r * (hi - lo);
  let fc = crossingSplitting(frame, crossing, ejOf, c);
  let fd = crossingSplitting(frame, crossing, ejOf, d);
  for (let it = 0; it < 60 && hi - lo > 1e-10; it++) {
    if (fc < fd) {
      hi = d;
      d = c;
      fd = fc;
      c = hi - r * (hi - lo);
      fc = crossingSplitting(frame, crossing, ejOf, c);
    } else {
      lo = c;
      c = d;
      fc = fd;
      d = lo + r * (hi - lo);
      fd = crossingSplitting(frame, crossing, ejOf, d);
    }
  }
  const flux = 0.5 * (lo + hi);
  return { flux, gapGHz: crossingSplitting(frame, crossing, ejOf, flux) };
}
