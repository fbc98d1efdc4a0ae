/**
 * Coherence of one transmon against flux (README physics conventions sec. 4).
 *
 * Three sources, each acting the way it does on gate and cycle time scales:
 *  - T1 (the layout's `t1`), Markovian, flux-independent in this model;
 *  - white pure dephasing (the layout's `tphi`), Markovian: coherence exp(-t / T_phi,white);
 *  - 1/f flux noise S_Phi(f) = A_Phi^2 / |f| (two-sided; A_Phi the layout's `fluxNoise`), which is
 *    NOT a rate: over tens of ns to a few us it is a static flux offset per shot, Gaussian with
 *        sigma^2 = 2 A_Phi^2 ln(f_uv / f_ir),    f_uv = 1 / t (the operation's duration),
 *                                                 f_ir = 1 / (the time a calibration is reused)
 *    (Ithier et al., Phys. Rev. B 72, 134519 (2005); Koch et al., Phys. Rev. A 76, 042319 (2007),
 *    sec. VI; from memory). The qubit frequency moves by df = f' delta + f'' delta^2 / 2, so an idle
 *    of length t picks up the phase 2 pi t df. Its coherence, averaged over delta ~ N(0, sigma^2),
 *    with the mean frequency shift f'' sigma^2 / 2 removed (the lab calibrates its frame to the
 *    average frequency), is in closed form (Gaussian integral of exp(i (a x + b x^2))):
 *        c(t) = (1 - 2 i beta sigma^2)^(-1/2) exp(-alpha^2 sigma^2 / (2 (1 - 2 i beta sigma^2))) exp(-i beta sigma^2),
 *        alpha = 2 pi t f',  beta = pi t f''.
 *    With f'' = 0 this is the Gaussian decay exp(-(2 pi f' sigma t)^2 / 2); at a sweet spot (f' = 0)
 *    the second-order term remains and is kept. We use Re c (the in-phase part; |Im c| is of
 *    order beta^2 sigma^4).
 *
 * The reported T_phi and T2 are the 1/e times of the Ramsey envelopes (pure dephasing alone, and
 * with exp(-t / (2 T1))), solved numerically; with only white dephasing they are tphi and
 * 1 / (1/(2 T1) + 1/tphi). They describe the qubit, they are not rates any computation uses:
 * gates and idles use the quasi-static average directly (src/budget/).
 */
import { bracketedNewton } from '../linalg/bracketed-root.js';

export interface CoherenceSpec {
  /** Energy relaxation time (ns). */
  t1Ns: number;
  /** White pure-dephasing time (ns); absent: no white part. */
  tphiNs?: number;
  /** 1/f flux-noise amplitude A_Phi (Phi0), S_Phi(f) = A_Phi^2 / |f|; absent: none. */
  fluxNoisePhi0?: number;
}

export interface CoherenceOptions {
  /**
   * The time over which a calibration is reused (ns): f_ir = 1 / this. Slower flux drifts are
   * recalibrated away; faster ones are noise.
   */
  averagingTimeNs?: number;
}

/** Defaults: a calibration reused for 1 s (f_ir = 1 Hz, the infrared cutoff customary in 1/f dephasing estimates; from memory). */
export const COHERENCE_DEFAULTS = Object.freeze({ averagingTimeNs: 1e9 });

export interface Coherence {
  t1Ns: number;
  /** 1/e time of the pure-dephasing Ramsey envelope (white and quasi-static 1/f; Infinity if none). */
  tphiNs: number;
  /** 1/e time of the Ramsey envelope exp(-t/(2 T1)) x pure dephasing. */
  t2Ns: number;
  /** White part of the dephasing rate (1/ns): 1 / tphi. */
  whiteRatePerNs: number;
  /** 1/f amplitude A_Phi (Phi0), 0 when none. */
  fluxNoisePhi0: number;
  /** df01/dPhi and d2f01/dPhi2 at the working flux (GHz per Phi0, per Phi0^2). */
  df01dFluxGHz: number;
  d2f01dFlux2GHz: number;
}

/**
 * Standard deviation of the quasi-static flux offset, sigma = A sqrt(2 ln(T_avg / T)), for an
 * operation of duration T (ns) and a calibration reused for T_avg (ns); 0 when T >= T_avg.
 */
export function quasiStaticFluxSigma(fluxNoisePhi0: number, durationNs: number, averagingTimeNs: number = COHERENCE_DEFAULTS.averagingTimeNs): number {
  if (!(fluxNoisePhi0 > 0) || !(durationNs > 0) || !(averagingTimeNs > durationNs)) return 0;
  return fluxNoisePhi0 * Math.sqrt(2 * Math.log(averagingTimeNs / durationNs));
}

/**
 * In-phase coherence Re c of an idle of t ns at a flux where f01 has slope `d1` (GHz/Phi0) and
 * curvature `d2` (GHz/Phi0^2), for a static Gaussian offset of standard deviation `sigma` (Phi0),
 * mean frequency shift removed (see the banner).
 */
export function quasiStaticCoherence(tNs: number, d1: number, d2: number, sigma: number): number {
  if (!(sigma > 0) || tNs <= 0) return 1;
  const alpha = 2 * Math.PI * tNs * d1;
  const beta = Math.PI * tNs * d2;
  const s2 = sigma * sigma;
  // z = 1 - 2 i beta s2 = r e^{i th}; z^(-1/2) = r^(-1/2) e^(-i th/2)
  const zi = -2 * beta * s2;
  const r = Math.sqrt(1 + zi * zi);
  const th = Math.atan2(zi, 1);
  // -alpha^2 s2 / (2 z) = -alpha^2 s2 conj(z) / (2 |z|^2)
  const k = (-alpha * alpha * s2) / (2 * r * r);
  const expRe = k * 1; // times Re conj(z) = 1
  const expIm = k * -zi; // times Im conj(z) = -zi
  const mag = Math.exp(expRe) / Math.sqrt(r);
  const phase = -th / 2 + expIm - beta * s2;
  return mag * Math.cos(phase);
}

/**
 * Pure-dephasing Ramsey coherence after t ns: exp(-t / tphi) times the quasi-static 1/f part
 * with sigma for an operation of that length.
 */
export function dephasingCoherence(spec: CoherenceSpec, tNs: number, d1: number, d2: number, options: CoherenceOptions = {}): number {
  const white = spec.tphiNs !== undefined ? Math.exp(-tNs / spec.tphiNs) : 1;
  const a = spec.fluxNoisePhi0 ?? 0;
  const sigma = quasiStaticFluxSigma(a, tNs, options.averagingTimeNs ?? COHERENCE_DEFAULTS.averagingTimeNs);
  return white * quasiStaticCoherence(tNs, d1, d2, sigma);
}

/** T1, the 1/e times of the Ramsey envelopes, and the inputs of the quasi-static model at one working point. */
export function coherenceFor(spec: CoherenceSpec, d1: number, d2: number, options: CoherenceOptions = {}): Coherence {
  const white = spec.tphiNs !== undefined ? 1 / spec.tphiNs : 0;
  const a = spec.fluxNoisePhi0 ?? 0;
  const pure = (t: number): number => dephasingCoherence(spec, t, d1, d2, options);
  const withT1 = (t: number): number => Math.exp(-t / (2 * spec.t1Ns)) * pure(t);
  return {
    t1Ns: spec.t1Ns,
    tphiNs: oneOverETime(pure, spec.tphiNs ?? Infinity),
    t2Ns: oneOverETime(withT1, Math.min(2 * spec.t1Ns, spec.tphiNs ?? Infinity)),
    whiteRatePerNs: white,
    fluxNoisePhi0: a,
    df01dFluxGHz: d1,
    d2f01dFlux2GHz: d2,
  };
}

/**
 * The time where a decreasing envelope falls to 1/e; `upper` bounds it (the time without the
 * quasi-static part, Infinity for none). Infinity when it never falls there.
 */
function oneOverETime(envelope: (t: number) => number, upper: number): number {
  const target = Math.exp(-1);
  let hi = Number.isFinite(upper) ? upper : 1e4;
  // grow the bracket until the envelope is below 1/e (or give up: no decay)
  let tries = 0;
  while (envelope(hi) > target) {
    hi *= 4;
    if (++tries > 40 || hi > 1e15) return Infinity;
  }
  return bracketedNewton((t, s) => {
    s.value = NaN;
    return envelope(t) - target;
  }, 0, hi, { xTol: 1e-13 * hi });
}
