/**
 * `Transmon`: one flux-tunable transmon with its parameters resolved once, answering everything
 * later stages ask about it (README physics conventions secs. 1 and 4). This is the transmon
 * stage's main API; the planner, the pair stage and the simulator call it.
 *
 *     const q = Transmon.fromLayout(layout.qubits[0]);   // resolves the TransmonSpec (InputError on bad physics)
 *     q.fMaxGHz, q.fMinGHz, q.anharmonicityMaxGHz         // tunable range (Phi = 0 and Phi = 1/2)
 *     q.ejGHz(flux)                                        // E_J(Phi)
 *     q.f01(flux)                                          // f01 only (fastest)
 *     q.spectrum(flux)                                     // f01, f12, alpha, df01/dPhi, df12/dPhi
 *     q.fluxForF01(fGHz)                                   // inverse on 0 <= Phi <= 1/2; InputError outside the range
 *     q.fluxForF01OrNull(fGHz), q.fluxForF12OrNull(fGHz)   // null outside the range
 *     q.levels(flux, k, vectors?)                          // lowest k levels (and charge-basis wave functions)
 *     q.eigenbasis(flux, k)                                // energies, <m|n|m'>, <m|cos phi|m'>, wave functions
 *     q.chargeBasis(flux, k)                               // energies and <m|n|m'> only (pair spectra)
 *     q.chargeElement01(flux)                              // |<0|n|1>|, sets g(Phi) (src/pair/coupling.ts)
 *     q.coherence(flux)                                    // T1, T_phi(Phi), T2(Phi) (src/transmon/coherence.ts)
 *
 * Units: GHz, ns, flux in Phi0. Any real flux is accepted (E_J is even and 1-periodic); inverse
 * maps return the branch 0 <= Phi <= 1/2. Levels are at offset charge n_g = 0. The charge
 * cutoff is chosen from E_JS/E_C (src/transmon/charge-cutoff.ts) unless given.
 * Objects are immutable; methods allocate their small results (no shared mutable state).
 */
import type { QubitLayout, SourceRef } from '../layout/types.js';
import type { Diagnostic } from '../util/errors.js';
import { chargeCutoffFor } from './charge-cutoff.js';
import { COHERENCE_DEFAULTS, coherenceFor, type Coherence, type CoherenceOptions, type CoherenceSpec } from './coherence.js';
import { fluxForFrequency, fluxForFrequencyOrNull } from './flux-for-frequency.js';
import { josephsonEnergy, josephsonEnergySlope } from './josephson.js';
import { transmonLevels, type TransmonLevels } from './levels.js';
import { chargeMatrix, cosPhiMatrix } from './matrix-elements.js';
import { chargeMatrixFromParity, parityEigenbasis } from './parity-eigenbasis.js';
import { lowestLevels } from './level-memo.js';
import { resolveTransmon, type ResolveOptions } from './resolve.js';
import { f01FluxSlopeAt, f12At, spectrumAt, type SpectrumPoint, type TransmonParams } from './spectrum.js';

export interface TransmonOptions {
  /** Charge cutoff N; default chargeCutoffFor(E_JS / E_C). */
  chargeCutoff?: number;
  /** Quasi-static 1/f flux-noise options (the calibration's averaging time). */
  coherence?: CoherenceOptions;
  /** Options of resolveTransmon (used by fromLayout). */
  resolve?: ResolveOptions;
  /**
   * The tunable range when the caller already has it (e.g. from the reduced spectrum,
   * src/transmon/reduced-spectrum.ts, for chips drawn by the thousand); default: solved here.
   */
  range?: SweetSpotLevels;
}

/** f01, f12 and the anharmonicity at the two sweet spots. */
export interface SweetSpotLevels {
  fMaxGHz: number;
  fMinGHz: number;
  anharmonicityMaxGHz: number;
  f12MaxGHz: number;
  f12MinGHz: number;
}

/** A transmon's eigenbasis at one flux, in the form coupled models need. */
export interface TransmonEigenbasis {
  flux: number;
  ejGHz: number;
  /** E_0 ... E_{K-1} (GHz, absolute). */
  energies: Float64Array;
  /** K x K <m|n|m'> (row-major; real, zero unless m + m' is odd). */
  charge: Float64Array;
  /** K x K <m|cos phi|m'> (dH/dE_J = -cos phi). */
  cosPhi: Float64Array;
  /** K x (2N+1) charge-basis wave functions (src/transmon/levels.ts sign convention). */
  vectors: Float64Array;
  chargeCutoff: number;
}

/** A transmon as plain data (Transmon.descriptor, Transmon.fromDescriptor). */
export interface TransmonDescriptor {
  id: string;
  params: TransmonParams;
  chargeCutoff: number;
  coherence: CoherenceOptions;
  coherenceSpec?: CoherenceSpec;
  source?: SourceRef;
}

export class Transmon {
  readonly id: string;
  readonly ecGHz: number;
  readonly ejsGHz: number;
  readonly asymmetry: number;
  readonly chargeCutoff: number;
  /** f01 at Phi = 0 (upper sweet spot). */
  readonly fMaxGHz: number;
  /** f01 at Phi = 1/2 (lower sweet spot). */
  readonly fMinGHz: number;
  /** Anharmonicity at Phi = 0. */
  readonly anharmonicityMaxGHz: number;
  /** f12 at Phi = 0 and at Phi = 1/2. */
  readonly f12MaxGHz: number;
  readonly f12MinGHz: number;
  /** T1, white T_phi and 1/f amplitude, when known. */
  readonly coherenceSpec: CoherenceSpec | undefined;
  /** Where the qubit is defined (for messages), when known. */
  readonly source: SourceRef | undefined;
  private readonly coherenceOptions: CoherenceOptions;

  constructor(id: string, params: TransmonParams, options: TransmonOptions & { coherenceSpec?: CoherenceSpec; source?: SourceRef } = {}) {
    if (!(params.ecGHz > 0) || !(params.ejsGHz > 0) || !(params.asymmetry >= 0 && params.asymmetry < 1)) {
      throw new RangeError(`Transmon ${id}: bad parameters E_C=${params.ecGHz}, E_JS=${params.ejsGHz}, d=${params.asymmetry}`);
    }
    this.id = id;
    this.ecGHz = params.ecGHz;
    this.ejsGHz = params.ejsGHz;
    this.asymmetry = params.asymmetry;
    this.chargeCutoff = options.chargeCutoff ?? chargeCutoffFor(params.ejsGHz / params.ecGHz);
    this.coherenceSpec = options.coherenceSpec;
    this.source = options.source;
    this.coherenceOptions = { ...options.coherence };
    if (options.range) {
      ({ fMaxGHz: this.fMaxGHz, anharmonicityMaxGHz: this.anharmonicityMaxGHz, fMinGHz: this.fMinGHz, f12MaxGHz: this.f12MaxGHz, f12MinGHz: this.f12MinGHz } = options.range);
      return;
    }
    const top = spectrumAt(params, 0, { chargeCutoff: this.chargeCutoff });
    const bottom = spectrumAt(params, 0.5, { chargeCutoff: this.chargeCutoff });
    this.fMaxGHz = top.f01GHz;
    this.anharmonicityMaxGHz = top.anharmonicityGHz;
    this.fMinGHz = bottom.f01GHz;
    this.f12MaxGHz = top.f12GHz;
    this.f12MinGHz = bottom.f12GHz;
  }

  /** Resolve a layout qubit (InputError naming the qubit and its source on bad physics). */
  static fromLayout(q: QubitLayout, options: TransmonOptions = {}): Transmon {
    const params = resolveTransmon(q.transmon, q.id, q.source, options.resolve);
    const coherenceSpec: CoherenceSpec = { t1Ns: q.t1Ns };
    if (q.tphiNs !== undefined) coherenceSpec.tphiNs = q.tphiNs;
    if (q.fluxNoisePhi0 !== undefined) coherenceSpec.fluxNoisePhi0 = q.fluxNoisePhi0;
    return new Transmon(q.id, params, { ...options, coherenceSpec, source: q.source });
  }

  /**
   * Everything that defines this transmon, as plain data (structured-clonable, JSON-safe):
   * `Transmon.fromDescriptor` rebuilds an identical one, e.g. in a worker thread.
   */
  descriptor(): TransmonDescriptor {
    const d: TransmonDescriptor = { id: this.id, params: this.params, chargeCutoff: this.chargeCutoff, coherence: { ...this.coherenceOptions } };
    if (this.coherenceSpec) d.coherenceSpec = { ...this.coherenceSpec };
    if (this.source) d.source = { ...this.source };
    return d;
  }

  static fromDescriptor(d: TransmonDescriptor): Transmon {
    return new Transmon(d.id, d.params, { chargeCutoff: d.chargeCutoff, coherence: d.coherence, coherenceSpec: d.coherenceSpec, source: d.source });
  }

  /**
   * True when spectrum, f01, the inverse maps and the curvature are table look-ups (a subclass
   * such as the yield stage's TabulatedTransmon), so callers need not remember their answers.
   */
  get tabulatedSpectrum(): boolean {
    return false;
  }

  get params(): TransmonParams {
    return { ecGHz: this.ecGHz, ejsGHz: this.ejsGHz, asymmetry: this.asymmetry };
  }

  /** E_J(Phi) (GHz). */
  ejGHz(flux: number): number {
    return josephsonEnergy(this.ejsGHz, this.asymmetry, flux);
  }

  /** dE_J/dPhi (GHz per Phi0). */
  ejSlopeGHz(flux: number): number {
    return josephsonEnergySlope(this.ejsGHz, this.asymmetry, flux);
  }

  /** f01 at `flux` (GHz). */
  f01(flux: number): number {
    const L = lowestLevels(this.ecGHz, this.ejGHz(flux), this.chargeCutoff, 2, false);
    return L.e1 - L.e0;
  }

  /** f01, f12, anharmonicity and flux slopes at `flux`. */
  spectrum(flux: number): SpectrumPoint {
    return spectrumAt(this.params, flux, { chargeCutoff: this.chargeCutoff });
  }

  /**
   * df01/dPhi at `flux`: spectrum(flux).df01dFluxGHz, bit for bit, from two levels instead of
   * three (src/transmon/spectrum.ts f01FluxSlopeAt). A subclass whose spectrum is a table look-up
   * (tabulatedSpectrum) answers from its own spectrum.
   */
  f01FluxSlope(flux: number): number {
    if (this.tabulatedSpectrum) return this.spectrum(flux).df01dFluxGHz;
    return f01FluxSlopeAt(this.params, flux, { chargeCutoff: this.chargeCutoff });
  }

  /** f12 at `flux`: spectrum(flux).f12GHz, bit for bit, without eigenvectors (a tabulated subclass: from its spectrum). */
  f12(flux: number): number {
    if (this.tabulatedSpectrum) return this.spectrum(flux).f12GHz;
    return f12At(this.params, flux, { chargeCutoff: this.chargeCutoff });
  }

  /** Lowest `k` levels at `flux` (n_g = 0). */
  levels(flux: number, k: number, vectors = false): TransmonLevels {
    return transmonLevels(this.ecGHz, this.ejGHz(flux), { levels: k, chargeCutoff: this.chargeCutoff, vectors });
  }

  /** Energies, charge and cos(phi) matrices of the lowest `k` levels at `flux`. */
  eigenbasis(flux: number, k: number): TransmonEigenbasis {
    const lv = this.levels(flux, k, true);
    return {
      flux,
      ejGHz: this.ejGHz(flux),
      energies: lv.energies,
      charge: chargeMatrix(lv),
      cosPhi: cosPhiMatrix(lv),
      vectors: lv.vectors,
      chargeCutoff: lv.chargeCutoff,
    };
  }

  /** Energies and charge matrix only (what a capacitive coupling needs; cheaper than eigenbasis). */
  chargeBasis(flux: number, k: number): { energies: Float64Array; charge: Float64Array } {
    const b = parityEigenbasis(this.ecGHz, this.ejGHz(flux), k, this.chargeCutoff, true);
    return { energies: b.energies, charge: chargeMatrixFromParity(b) };
  }

  /** |<0|n|1>| at `flux`. */
  chargeElement01(flux: number): number {
    const b = parityEigenbasis(this.ecGHz, this.ejGHz(flux), 2, this.chargeCutoff, true);
    return Math.abs(chargeMatrixFromParity(b)[1]);
  }

  /** True when f01 = fGHz is reachable (fMin <= f <= fMax, with round-off slack). */
  reaches(fGHz: number): boolean {
    const slack = 1e-12 * Math.max(1, Math.abs(fGHz));
    return fGHz >= this.fMinGHz - slack && fGHz <= this.fMaxGHz + slack;
  }

  /** Flux 0 <= Phi <= 1/2 with f01 = fGHz; InputError naming the qubit when out of range. */
  fluxForF01(fGHz: number, where?: Omit<Diagnostic, 'message'>): number {
    return fluxForFrequency(this.params, fGHz, this.id, { chargeCutoff: this.chargeCutoff, range: [this.fMinGHz, this.fMaxGHz], ...(where ? { where } : {}) });
  }

  /** Flux 0 <= Phi <= 1/2 with f01 = fGHz, or null when out of range. */
  fluxForF01OrNull(fGHz: number): number | null {
    return fluxForFrequencyOrNull(this.params, fGHz, { chargeCutoff: this.chargeCutoff, range: [this.fMinGHz, this.fMaxGHz] });
  }

  /** Flux 0 <= Phi <= 1/2 with f12 = fGHz, or null when out of range. */
  fluxForF12OrNull(fGHz: number): number | null {
    return fluxForFrequencyOrNull(this.params, fGHz, { chargeCutoff: this.chargeCutoff, transition: 'f12', range: [this.f12MinGHz, this.f12MaxGHz] });
  }

  /**
   * d2f01/dPhi2 (GHz per Phi0^2): central difference of the analytic slope df01/dPhi
   * (Hellmann-Feynman) with h = 1e-4 Phi0, error O(h^2) times the fourth derivative (tested
   * against a Richardson extrapolation of f01 itself).
   */
  fluxCurvatureGHz(flux: number): number {
    const h = 1e-4;
    return (this.f01FluxSlope(flux + h) - this.f01FluxSlope(flux - h)) / (2 * h);
  }

  /** The time over which a calibration is reused (ns), which sets the quasi-static flux-noise spread. */
  get averagingTimeNs(): number {
    return this.coherenceOptions.averagingTimeNs ?? COHERENCE_DEFAULTS.averagingTimeNs;
  }

  /**
   * T1, the 1/e times of the Ramsey envelopes (T_phi, T2) and the inputs of the quasi-static flux
   * noise model at `flux` (src/transmon/coherence.ts); needs coherence data (fromLayout or
   * constructor option). `slopeGHz` saves a spectrum evaluation when the caller has df01/dPhi.
   */
  coherence(flux: number, slopeGHz?: number): Coherence {
    if (!this.coherenceSpec) throw new RangeError(`Transmon ${this.id}: no coherence data (T1, T_phi, flux noise)`);
    const slope = slopeGHz ?? this.f01FluxSlope(flux);
    const curvature = this.coherenceSpec.fluxNoisePhi0 ? this.fluxCurvatureGHz(flux) : 0;
    return coherenceFor(this.coherenceSpec, slope, curvature, this.coherenceOptions);
  }
}
