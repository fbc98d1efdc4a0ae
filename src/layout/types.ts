/**
 * The validated chip layout: what the layout stage hands to every later stage.
 *
 * Inside fluxlane, quantities are plain numbers with the unit in the name:
 * frequencies and energies in GHz (E/h), times in ns, flux in units of Phi0,
 * resistances in kOhm. Units are parsed only at the edges (layout file, CLI options).
 */

/** Where a value came from in the layout file (for error messages of later stages). */
export interface SourceRef {
  file: string;
  /** 1-based. */
  line: number;
  column: number;
  /** Dotted path inside the document, e.g. `qubits.Q1.fMax`. */
  path: string;
}

/**
 * The transmon model exactly as the user gave it. The transmon stage converts every form
 * into (E_C, E_JS, d) on the exact spectrum (src/transmon/resolve.ts).
 */
export type TransmonSpec =
  | {
      /** `ec` + `ejMax` (+ `asymmetry`, default 0). */
      kind: 'energies';
      ecGHz: number;
      ejMaxGHz: number;
      asymmetry: number;
    }
  | {
      /** `fMax` + `anharmonicity` (+ `asymmetry` or `fMin`); anharmonicity is negative. */
      kind: 'frequencies';
      fMaxGHz: number;
      anharmonicityGHz: number;
      asymmetry?: number;
      fMinGHz?: number;
    }
  | {
      /**
       * `ec` + `rn` (Ambegaokar-Baratoff). A single resistance is the SQUID's total normal-state
       * resistance (both junctions in parallel) and takes `asymmetry` (default 0); a pair
       * `[r1, r2]` gives the two junctions, from which E_JS and d follow.
       */
      kind: 'resistance';
      ecGHz: number;
      rnKOhm: number | [number, number];
      asymmetry?: number;
    };

export interface TlsDefect {
  /** Frequency of the two-level defect. */
  atGHz: number;
  /** Half-width of the band to keep clear around it (also taken as its coupling 2g = width). */
  widthGHz: number;
}

export interface QubitLayout {
  id: string;
  pos: [number, number];
  transmon: TransmonSpec;
  /** Energy relaxation time. */
  t1Ns: number;
  /** White (flux-independent) pure-dephasing time; absent means no white part. */
  tphiNs?: number;
  /** 1/f flux-noise amplitude A_Phi in Phi0 (the sqrt(S(1 Hz)) of the flux noise, i.e. Phi0/sqrt(Hz)). */
  fluxNoisePhi0?: number;
  /** Allowed parking band [lo, hi]. */
  windowGHz?: [number, number];
  /** Fixed parking frequency the plan must keep. */
  parkGHz?: number;
  tls: TlsDefect[];
  /** Readout resonator frequency. */
  readoutGHz?: number;
  /**
   * Measured fabrication spreads of this qubit (relative, 1 sigma): `rn` of each junction's
   * normal-state resistance, `ec` of its shunt capacitance (so of E_C). Used by `fluxlane yield`
   * in place of its command-line spreads.
   */
  spread?: { rn?: number; ec?: number };
  /** Free text from the layout's `note:` (kept for reports). */
  note?: string;
  /** Where the qubit's id stands in the layout file. */
  source: SourceRef;
}

export interface CouplingLayout {
  a: string;
  b: string;
  /** 01-10 exchange coupling with both qubits at maximum frequency (README physics conventions sec. 2). */
  gGHz: number;
  source: SourceRef;
}

/**
 * Collision thresholds and limits. Defaults live in shared/rules.json (documented there and in
 * the README); a layout's `rules:` overrides any of them.
 */
export interface Rules {
  /** Largest allowed |static ZZ| at idle on a coupled pair. */
  zzLimitGHz: number;
  /** Nearest neighbours at idle: |f01_i - f01_j| >= this. */
  detuning0101GHz: number;
  /** Nearest neighbours at idle: |f01_i - f12_j| and |f12_i - f01_j| >= this. */
  detuning0112GHz: number;
  /** Next-nearest neighbours (sharing a neighbour) at idle: |f01_i - f01_k| >= this. */
  detuningNext0101GHz: number;
  /** Extra clearance beyond a TLS's own width. */
  tlsClearanceGHz: number;
  /** |f01 - f_readout| >= this. */
  readoutDetuningGHz: number;
  /**
   * During a CZ, the largest allowed admixture (g_c / Delta)^2 of the mover's levels it occupies
   * (|1>, |2>) with a spectator's, for every transition pair that can meet (src/plan/rules/cz-evaluate.ts).
   */
  spectatorAdmixture: number;
  /** Largest allowed Landau-Zener transfer through a swept crossing. */
  sweptTransferLimit: number;
  /** Longest allowed CZ (ramps and hold). */
  maxGateNs: number;
  /** AWG sample rate of the flux lines. */
  sampleRateGHz: number;
  /** Gaussian flux-line filter bandwidth (-3 dB); absent means an ideal line. */
  fluxBandwidthGHz?: number;
  /** Largest flux excursion of a CZ's mover from its parking flux (Phi0). */
  maxFluxExcursion: number;
  /** Largest predicted error (average infidelity) of one CZ, its whole budget. */
  gateErrorLimit: number;
  /** Largest leakage the spectators of one CZ may add. */
  spectatorLeakageLimit: number;
  /** Largest predicted idle error of one qubit over one reference cycle. */
  idleErrorLimit: number;
  /** Time of the reference cycle outside its CZ layers (single-qubit gates, readout, reset), ns. */
  cycleOverheadNs: number;
  /** The time over which a calibration is reused (ns): sets the quasi-static 1/f flux-noise spread. */
  noiseAveragingTimeNs: number;
  /** Effective qubit temperature (K) for thermal excitation while idle. */
  qubitTemperatureK: number;
  /** Relative junction-resistance spread from fabrication (1 sigma), e.g. 0.02. */
  resistanceSpread: number;
  /** Flag a qubit whose margin is below this many fabrication spreads. */
  marginFlagSpreads: number;
  /** Keep moved spectators this many fabrication spreads inside their tunable range (0: anywhere). */
  spectatorRangeMarginSpreads: number;
}

export interface ChipLayout {
  /** The layout file as the user named it (for messages). */
  file: string;
  chip: string;
  description?: string;
  /** In file order. Ids are unique. */
  qubits: QubitLayout[];
  /** In file order; no duplicates, no self couplings, only known qubits. */
  couplings: CouplingLayout[];
  /** Defaults merged with the layout's overrides. */
  rules: Rules;
  /**
   * Values that are valid but unusual (src/layout/plausible.ts), e.g. a g of 0.3 GHz: one
   * diagnostic each (file:line:column: path: warning: ...). The CLI prints them on stderr and
   * under "warnings" in --json output; they never change the exit code.
   */
  warnings?: LayoutWarning[];
}

/** A warning about a layout value: where it is and what is unusual about it. */
export interface LayoutWarning {
  file?: string;
  line?: number;
  column?: number;
  path?: string;
  message: string;
}
