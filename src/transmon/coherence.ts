/**
 * Coherence times of one transmon against flux (README physics conventions sec. 4).
 *
 * T1 is the layout's value (flux-independent in this model). Pure dephasing has a white part
 * (the layout's `tphi`) and a part from 1/f flux noise, first order in the flux slope
 * (Ithier et al., Phys. Rev. B 72, 134519 (2005); Koch et al., Phys. Rev. A 76, 042319 (2007),
 * sec. VI; the derivation below is ours, in their framework):
 *
 *   Flux noise with two-sided spectral density S_Phi(f) = A_Phi^2 / |f| (A_Phi in Phi0, the
 *   layout's `fluxNoise`; equivalently S(omega) = 2 pi A^2 / |omega| as in Koch 2007) shifts the
 *   qubit phase by dphi(t) = 2 pi (df01/dPhi) int_0^t dPhi(t') dt'. For Gaussian noise the
 *   Ramsey coherence is exp(-<dphi^2>/2) with
 *       <dphi^2> = (2 pi df01/dPhi)^2 t^2 int df S_Phi(f) sinc^2(pi f t)
 *               ~ 2 (2 pi A_Phi df01/dPhi)^2 t^2 |ln(2 pi f_ir t)|,
 *   the integral cut off below at the infrared frequency f_ir (set by the total averaging time);
 *   the logarithm is evaluated at the measurement time t = t_m. The decay exp(-(Gamma t)^2) then
 *   falls to 1/e at t = 1/Gamma with
 *
 *       Gamma_phi,1/f = 2 pi A_Phi |df01/dPhi| sqrt(|ln(2 pi f_ir t_m)|)          (1/ns, f01 in GHz)
 *
 *   Defaults f_ir = 1 Hz, t_m = 10 us: sqrt(|ln(2 pi 1e-5)|) = 3.11.
 *   (Defining T_phi instead by <dphi^2> = 1 rad^2 gives a sqrt(2) larger rate; we use the 1/e
 *   convention so that T_phi means the same as for the exponential white part and the Lindblad
 *   operator sqrt(2/T_phi) b^dag b of the simulator.)
 *
 *   1/T_phi(Phi) = 1/T_phi,white + Gamma_phi,1/f(Phi),     1/T2 = 1/(2 T1) + 1/T_phi.
 *
 * Approximations (documented in the README): 1/f noise dephases with a Gaussian, not an
 * exponential, envelope, so a Markovian rate is an approximation that matches the 1/e time;
 * second-order flux noise (the only one left at a sweet spot, where df01/dPhi = 0) is neglected;
 * T_phi = Infinity when there is no dephasing source at all.
 */

export interface CoherenceSpec {
  /** Energy relaxation time (ns). */
  t1Ns: number;
  /** White pure-dephasing time (ns); absent: no white part. */
  tphiNs?: number;
  /** 1/f flux-noise amplitude A_Phi (Phi0), S_Phi(f) = A_Phi^2 / |f|; absent: none. */
  fluxNoisePhi0?: number;
}

export interface CoherenceOptions {
  /** Infrared cutoff f_ir of the 1/f spectrum (Hz). */
  infraredCutoffHz?: number;
  /** Measurement (free evolution) time t_m at which the log factor is evaluated (ns). */
  measurementNs?: number;
}

export const COHERENCE_DEFAULTS = Object.freeze({ infraredCutoffHz: 1, measurementNs: 1e4 });

export interface Coherence {
  t1Ns: number;
  /** Total pure-dephasing time (Infinity if none). */
  tphiNs: number;
  /** 1/T2 = 1/(2 T1) + 1/T_phi. */
  t2Ns: number;
  /** White part of the dephasing rate (1/ns). */
  whiteRatePerNs: number;
  /** 1/f flux-noise part of the dephasing rate (1/ns). */
  fluxNoiseRatePerNs: number;
}

/** sqrt(|ln(2 pi f_ir t_m)|), the log factor of the 1/f dephasing rate. */
export function fluxNoiseLogFactor(options: CoherenceOptions = {}): number {
  const fir = options.infraredCutoffHz ?? COHERENCE_DEFAULTS.infraredCutoffHz;
  const tm = (options.measurementNs ?? COHERENCE_DEFAULTS.measurementNs) * 1e-9;
  return Math.sqrt(Math.abs(Math.log(2 * Math.PI * fir * tm)));
}

/** Gamma_phi,1/f = 2 pi A_Phi |df01/dPhi| sqrt(|ln(2 pi f_ir t_m)|) in 1/ns (slope in GHz per Phi0). */
export function fluxNoiseDephasingRate(df01dFluxGHz: number, fluxNoisePhi0: number, options: CoherenceOptions = {}): number {
  return 2 * Math.PI * fluxNoisePhi0 * Math.abs(df01dFluxGHz) * fluxNoiseLogFactor(options);
}

/** T1, T_phi and T2 for a qubit whose f01 has slope `df01dFluxGHz` at the working flux. */
export function coherenceFor(spec: CoherenceSpec, df01dFluxGHz: number, options: CoherenceOptions = {}): Coherence {
  const white = spec.tphiNs !== undefined ? 1 / spec.tphiNs : 0;
  const flux = spec.fluxNoisePhi0 !== undefined ? fluxNoiseDephasingRate(df01dFluxGHz, spec.fluxNoisePhi0, options) : 0;
  const rate = white + flux;
  const tphiNs = rate > 0 ? 1 / rate : Infinity;
  const t2Ns = 1 / (1 / (2 * spec.t1Ns) + rate);
  return { t1Ns: spec.t1Ns, tphiNs, t2Ns, whiteRatePerNs: white, fluxNoiseRatePerNs: flux };
}
