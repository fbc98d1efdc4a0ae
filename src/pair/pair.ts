/**
 * `CoupledPair`: two transmons with a capacitive coupling, the pair stage's main API
 * (README physics conventions sec. 2). Built once per edge; answers dressed spectra, static ZZ and
 * exchange couplings at any pair of fluxes, reusing each transmon's eigenbasis when its flux
 * repeats (so a sweep of one qubit computes the other's levels once).
 *
 *     const pair = new CoupledPair(qa, qb, gGHz);          // g from the layout (both at Phi = 0)
 *     pair.gChargeGHz                                       // G of G n_A n_B
 *     pair.exchangeCoupling(fluxA, fluxB)                   // g(Phi_A, Phi_B)
 *     pair.zz(fluxA, fluxB)                                 // static ZZ (GHz), energies only (fast path)
 *     pair.spectrum(fluxA, fluxB, { vectors })              // labelled dressed levels (+ states)
 *
 * K levels per transmon (default 6, at least 4 for spectra; test/pair shows convergence in K).
 * Order of labels |ij> = |i>_A |j>_B. Pairs of one thread share work buffers (sharedScratch);
 * each worker thread has its own.
 */
import type { Transmon } from '../transmon/transmon.js';
import { chargeCouplingForPair, exchangeFromChargeCoupling } from './coupling.js';
import {
  dressedComputationalEnergies,
  dressedSpectrum,
  dressedSpectrumScratch,
  staticZz,
  type CouplingBasis,
  type DressedSpectrum,
  type DressedSpectrumScratch,
} from './dressed-spectrum.js';

export interface CoupledPairOptions {
  /** Levels per transmon K (>= 4). */
  levels?: number;
  /**
   * The charge coupling G, when the caller has it: chargeCouplingForPair(a, b, g) of these very
   * transmons and g, the same number (src/plan/context.ts finds each transmon's element once).
   */
  gChargeGHz?: number;
  /**
   * Where this pair's transmons keep their last computed eigenbasis for every pair that shares the
   * slot (src/plan/context.ts: one per qubit, so each qubit's basis at a flux is solved once for
   * all its pairs); each pair still remembers its own last one first. The same bases either way.
   */
  slotA?: BasisSlot;
  slotB?: BasisSlot;
}

/** A transmon's last computed eigenbasis, shared by the pairs given the slot. */
export interface BasisSlot {
  last?: CachedBasis;
}

export const COUPLED_PAIR_DEFAULTS = Object.freeze({ levels: 6 });

/**
 * One set of work buffers per K for every pair of this thread: each call fills what it reads
 * (the sector matrices, orders and reductions are written in full before use) and copies its
 * results out, and no pair's call runs inside another's, so sharing them gives the same numbers
 * (tested) without ~10 kB of fresh buffers per pair (a 1,024-qubit chip builds ~2,000 pairs).
 */
const scratchByLevels = new Map<number, DressedSpectrumScratch>();

function sharedScratch(k: number): DressedSpectrumScratch {
  let s = scratchByLevels.get(k);
  if (!s) scratchByLevels.set(k, (s = dressedSpectrumScratch(k)));
  return s;
}

export interface PairSpectrum extends DressedSpectrum {
  fluxA: number;
  fluxB: number;
  /** Exchange coupling g at these fluxes (GHz). */
  gGHz: number;
  /** Static ZZ (GHz). */
  zzGHz: number;
  /** Dressed energy of |ij> (GHz, absolute). */
  energy(i: number, j: number): number;
}

export interface CachedBasis extends CouplingBasis {
  flux: number;
  /** Levels solved (the pair's K). */
  levels: number;
  n01: number;
}

export class CoupledPair {
  readonly a: Transmon;
  readonly b: Transmon;
  /** The layout's g (both qubits at Phi = 0). */
  readonly gMaxGHz: number;
  /** Charge coupling G. */
  readonly gChargeGHz: number;
  readonly levels: number;
  private readonly scratch: DressedSpectrumScratch;
  private readonly slotA: BasisSlot | undefined;
  private readonly slotB: BasisSlot | undefined;
  private cacheA: CachedBasis | undefined;
  private cacheB: CachedBasis | undefined;
  private readonly e4 = new Float64Array(4);

  constructor(a: Transmon, b: Transmon, gGHz: number, options: CoupledPairOptions = {}) {
    const k = options.levels ?? COUPLED_PAIR_DEFAULTS.levels;
    if (!Number.isInteger(k) || k < 4) throw new RangeError(`CoupledPair: levels must be an integer >= 4, got ${k}`);
    if (!(Number.isFinite(gGHz) && gGHz >= 0)) throw new RangeError(`CoupledPair: g must be >= 0, got ${gGHz}`);
    this.a = a;
    this.b = b;
    this.gMaxGHz = gGHz;
    this.levels = k;
    this.gChargeGHz = options.gChargeGHz ?? chargeCouplingForPair(a, b, gGHz);
    this.scratch = sharedScratch(k);
    this.slotA = options.slotA;
    this.slotB = options.slotB;
  }

  /** A's eigenbasis (K levels) at `flux` (cached for the last flux, here and in the shared slot). */
  basisA(flux: number): CachedBasis {
    if (!this.cacheA || this.cacheA.flux !== flux) this.cacheA = this.basisFromSlot(this.a, flux, this.slotA);
    return this.cacheA;
  }

  basisB(flux: number): CachedBasis {
    if (!this.cacheB || this.cacheB.flux !== flux) this.cacheB = this.basisFromSlot(this.b, flux, this.slotB);
    return this.cacheB;
  }

  private basisFromSlot(q: Transmon, flux: number, slot: BasisSlot | undefined): CachedBasis {
    const last = slot?.last;
    if (last && last.flux === flux && last.levels === this.levels) return last;
    const basis = this.computeBasis(q, flux);
    if (slot) slot.last = basis;
    return basis;
  }

  /** g(Phi_A, Phi_B) = G |<0|n|1>_A| |<0|n|1>_B|. */
  exchangeCoupling(fluxA: number, fluxB: number): number {
    return exchangeFromChargeCoupling(this.gChargeGHz, this.basisA(fluxA).n01, this.basisB(fluxB).n01);
  }

  /** Static ZZ zeta = E_11 - E_10 - E_01 + E_00 (GHz). */
  zz(fluxA: number, fluxB: number): number {
    const e = dressedComputationalEnergies(this.basisA(fluxA), this.basisB(fluxB), this.gChargeGHz, this.levels, this.scratch, this.e4);
    return e[3] - e[2] - e[1] + e[0];
  }

  /** Labelled dressed spectrum at (Phi_A, Phi_B). */
  spectrum(fluxA: number, fluxB: number, options: { vectors?: boolean } = {}): PairSpectrum {
    const ba = this.basisA(fluxA);
    const bb = this.basisB(fluxB);
    const s = dressedSpectrum(ba, bb, this.gChargeGHz, this.levels, { scratch: this.scratch, vectors: options.vectors === true });
    const k = this.levels;
    return {
      ...s,
      fluxA,
      fluxB,
      gGHz: exchangeFromChargeCoupling(this.gChargeGHz, ba.n01, bb.n01),
      zzGHz: staticZz(s),
      energy(i: number, j: number): number {
        if (!(i >= 0 && i < k && j >= 0 && j < k)) throw new RangeError(`PairSpectrum.energy: |${i}${j}> outside K=${k}`);
        return s.dressed[i * k + j];
      },
    };
  }

  private computeBasis(q: Transmon, flux: number): CachedBasis {
    const { energies, charge } = q.chargeBasis(flux, this.levels);
    return { flux, levels: this.levels, energies, charge, n01: Math.abs(charge[1]) };
  }
}
