/**
 * Static ZZ of a pair against the mover's frequency across its tunable range, with the partner
 * parked (README physics conventions secs. 2 and 6). Points are uniform in the mover's f01 from its
 * f_min to its f_max (ends included); each frequency is mapped to the mover's flux on
 * 0 <= Phi <= 1/2 and the exact dressed ZZ and exchange coupling g are evaluated there. The
 * partner's eigenbasis is computed once (CoupledPair caches it).
 *
 * ZZ diverges and changes sign at the 11-20 and 11-02 crossings (labels follow the bare
 * character, src/pair/dressed-spectrum.ts); a point exactly on a crossing is a legitimate value.
 */
import type { CoupledPair } from './pair.js';

export interface ZzSweepOptions {
  /** Number of points (>= 2). */
  points?: number;
  /** Frequency range of the mover (GHz); default its full tunable range. */
  fromGHz?: number;
  toGHz?: number;
}

export const ZZ_SWEEP_DEFAULTS = Object.freeze({ points: 201 });

export interface ZzSweepPoint {
  moverFlux: number;
  moverF01GHz: number;
  zzGHz: number;
  /** Exchange coupling g at these fluxes (GHz). */
  gGHz: number;
}

/** `mover` is 'a' or 'b' of the pair; the partner sits at `partnerFlux`. */
export function zzSweep(pair: CoupledPair, mover: 'a' | 'b', partnerFlux: number, options: ZzSweepOptions = {}): ZzSweepPoint[] {
  const n = options.points ?? ZZ_SWEEP_DEFAULTS.points;
  if (!Number.isInteger(n) || n < 2) throw new RangeError(`zzSweep: points must be an integer >= 2, got ${n}`);
  const q = mover === 'a' ? pair.a : pair.b;
  const lo = options.fromGHz ?? q.fMinGHz;
  const hi = options.toGHz ?? q.fMaxGHz;
  const out: ZzSweepPoint[] = [];
  for (let i = 0; i < n; i++) {
    const f = lo + ((hi - lo) * i) / (n - 1);
    const flux = q.fluxForF01(f);
    const [fa, fb] = mover === 'a' ? [flux, partnerFlux] : [partnerFlux, flux];
    out.push({ moverFlux: flux, moverF01GHz: f, zzGHz: pair.zz(fa, fb), gGHz: pair.exchangeCoupling(fa, fb) });
  }
  return out;
}
