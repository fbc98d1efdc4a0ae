/**
 * Dressed spectrum of two capacitively coupled transmons (README physics conventions sec. 2):
 *
 *     H = H_A (x) 1 + 1 (x) H_B + G n_A (x) n_B
 *
 * in the product basis |ij> (i < K levels of A, j < K of B, index i K + j, order |AB>), each
 * transmon in its own eigenbasis at its flux (src/pair/product-basis.ts conventions).
 *
 * Labels. At n_g = 0, H conserves the total excitation parity (i + j mod 2), so it splits into an
 * even and an odd sector (src/pair/product-basis.ts). Each sector is diagonalised separately.
 * Within a sector, levels do not cross as the coupling is switched on from zero (von Neumann and
 * Wigner, Phys. Z. 30, 467 (1929): for a one-parameter family, crossings need a symmetry, and
 * parity is the only one here), so the k-th lowest dressed level of a sector continues from the
 * k-th lowest bare product state of that sector and carries its label (ties broken by index).
 * This agrees with the largest-overlap label wherever that is unambiguous, and stays defined at
 * and near avoided crossings, where overlaps are close to 1/2: the label follows the bare
 * (diabatic) character, so dressed |11> jumps by the gap as a bare 11-20 or 11-02 crossing is
 * passed, and the static ZZ changes sign there (test/pair/dressed-spectrum.test.ts).
 *
 * Static ZZ: zeta = E_11 - E_10 - E_01 + E_00 (dressed).
 *
 * Cost: two sector eigenproblems of size K^2/2 (Householder + QL for all energies; Householder +
 * a few Newton roots for the computational energies only; Jacobi when eigenvectors are requested).
 */
import { symmetricEigen } from '../linalg/symmetric-eigen.js';
import { symmetricEigenvalues, symmetricEigenvaluesScratch, type SymmetricEigenvaluesScratch } from '../linalg/symmetric-eigenvalues.js';
import { symmetricTridiagonalReduction } from '../linalg/symmetric-tridiagonal-reduction.js';
import { tridiagonalLowestEigenvalues } from '../linalg/tridiagonal-lowest-eigenvalues.js';

/** One transmon's eigenbasis as the pair needs it: K energies and the K x K charge matrix. */
export interface CouplingBasis {
  energies: ArrayLike<number>;
  charge: ArrayLike<number>;
}

export interface DressedSpectrum {
  /** Levels kept per transmon. */
  levels: number;
  /** Bare product energies E^A_i + E^B_j by product index i K + j (GHz, absolute). */
  bare: Float64Array;
  /** Dressed energy of the state labelled |ij>, by product index i K + j (GHz, absolute). */
  dressed: Float64Array;
  /**
   * When requested: (K^2) x (K^2) row-major, column p is the dressed state labelled p, in the
   * product basis (real; sign: largest component positive).
   */
  vectors?: Float64Array;
}

export interface DressedSpectrumOptions {
  vectors?: boolean;
  /** Reusable buffers (from dressedSpectrumScratch(K)); results are copied out. */
  scratch?: DressedSpectrumScratch;
}

export interface DressedSpectrumScratch {
  levels: number;
  /** Product indices of the even and odd sector. */
  sectors: [Int32Array, Int32Array];
  order: Int32Array;
  h: Float64Array;
  w: Float64Array;
  bare: Float64Array;
  guess: Float64Array;
  eig: [SymmetricEigenvaluesScratch, SymmetricEigenvaluesScratch];
}

export function dressedSpectrumScratch(k: number): DressedSpectrumScratch {
  const even: number[] = [];
  const odd: number[] = [];
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) ((i + j) % 2 === 0 ? even : odd).push(i * k + j);
  const n = Math.max(even.length, odd.length);
  return {
    levels: k,
    sectors: [Int32Array.from(even), Int32Array.from(odd)],
    order: new Int32Array(n),
    h: new Float64Array(n * n),
    w: new Float64Array(n),
    bare: new Float64Array(k * k),
    guess: new Float64Array(n),
    eig: [symmetricEigenvaluesScratch(even.length), symmetricEigenvaluesScratch(odd.length)],
  };
}

/** Bare product energies E^A_i + E^B_j (index i K + j). */
function bareEnergies(a: CouplingBasis, b: CouplingBasis, k: number, out: Float64Array): Float64Array {
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) out[i * k + j] = a.energies[i] + b.energies[j];
  return out;
}

/**
 * Sort the sector's states by bare energy into s.order (stable) and write the sector Hamiltonian
 * in that order into s.h (n x n, n = sector size). Returns n.
 */
function buildSector(a: CouplingBasis, b: CouplingBasis, gChargeGHz: number, k: number, bare: Float64Array, sector: number, s: DressedSpectrumScratch): number {
  const idx = s.sectors[sector];
  const n = idx.length;
  const order = s.order;
  for (let p = 0; p < n; p++) {
    const x = idx[p];
    const ex = bare[x];
    let q = p - 1;
    while (q >= 0 && bare[order[q]] > ex) {
      order[q + 1] = order[q];
      q--;
    }
    order[q + 1] = x;
  }
  const ka = a.energies.length;
  const kb = b.energies.length;
  const na = a.charge;
  const nb = b.charge;
  const h = s.h;
  for (let p = 0; p < n; p++) {
    const xp = order[p];
    const ip = (xp / k) | 0;
    const jp = xp - ip * k;
    h[p * n + p] = bare[xp];
    for (let q = p + 1; q < n; q++) {
      const xq = order[q];
      const iq = (xq / k) | 0;
      const jq = xq - iq * k;
      const v = gChargeGHz * na[ip * ka + iq] * nb[jp * kb + jq];
      h[p * n + q] = v;
      h[q * n + p] = v;
    }
  }
  return n;
}

function checkInputs(a: CouplingBasis, b: CouplingBasis, k: number): void {
  const ka = a.energies.length;
  const kb = b.energies.length;
  if (!(k >= 2) || ka < k || kb < k || a.charge.length !== ka * ka || b.charge.length !== kb * kb) {
    throw new RangeError(`dressedSpectrum: need >= K levels per transmon with square charge matrices (K=${k})`);
  }
}

/** Dressed energies (and optionally states) labelled by the bare product states. */
export function dressedSpectrum(a: CouplingBasis, b: CouplingBasis, gChargeGHz: number, k: number, options: DressedSpectrumOptions = {}): DressedSpectrum {
  checkInputs(a, b, k);
  const s = options.scratch && options.scratch.levels === k ? options.scratch : dressedSpectrumScratch(k);
  const size = k * k;
  const bare = bareEnergies(a, b, k, new Float64Array(size));
  const dressed = new Float64Array(size);
  const vectors = options.vectors ? new Float64Array(size * size) : undefined;
  for (let sector = 0; sector < 2; sector++) {
    const n = buildSector(a, b, gChargeGHz, k, bare, sector, s);
    const order = s.order;
    const h = s.h.subarray(0, n * n);
    if (!vectors) {
      const w = symmetricEigenvalues(h, n, s.w, s.eig[sector]);
      for (let p = 0; p < n; p++) dressed[order[p]] = w[p];
    } else {
      const e = symmetricEigen(h, n);
      for (let p = 0; p < n; p++) {
        const label = order[p];
        dressed[label] = e.values[p];
        // Column p of e.vectors, components in sector order -> product indices.
        let big = 0;
        for (let r = 1; r < n; r++) if (Math.abs(e.vectors[r * n + p]) > Math.abs(e.vectors[big * n + p])) big = r;
        const sign = e.vectors[big * n + p] >= 0 ? 1 : -1;
        for (let r = 0; r < n; r++) vectors[order[r] * size + label] = sign * e.vectors[r * n + p];
      }
    }
  }
  const out: DressedSpectrum = { levels: k, bare, dressed };
  if (vectors) out.vectors = vectors;
  return out;
}

/**
 * Dressed E_00, E_01, E_10, E_11 only (the fast path of the static ZZ): each sector is reduced to
 * tridiagonal form (Householder) and only its lowest eigenvalues up to the rank of the wanted
 * labels are found, by Newton from the bare energies with a Sturm check
 * (src/linalg/tridiagonal-lowest-eigenvalues.ts). Same labels as dressedSpectrum.
 * Returns [E_00, E_01, E_10, E_11] in `out`.
 */
export function dressedComputationalEnergies(
  a: CouplingBasis,
  b: CouplingBasis,
  gChargeGHz: number,
  k: number,
  scratch?: DressedSpectrumScratch,
  out: Float64Array = new Float64Array(4),
): Float64Array {
  checkInputs(a, b, k);
  const s = scratch && scratch.levels === k ? scratch : dressedSpectrumScratch(k);
  const bare = bareEnergies(a, b, k, s.bare);
  const wanted: readonly (readonly number[])[] = [
    [0, k + 1], // even sector: 00, 11
    [1, k], // odd sector: 01, 10
  ];
  for (let sector = 0; sector < 2; sector++) {
    const n = buildSector(a, b, gChargeGHz, k, bare, sector, s);
    const order = s.order;
    let rank = 0;
    for (let p = 0; p < n; p++) if (wanted[sector].includes(order[p])) rank = Math.max(rank, p);
    const count = rank + 1;
    const { d, e, work } = s.eig[sector];
    symmetricTridiagonalReduction(s.h, n, d, e, work);
    for (let p = 0; p < count; p++) s.guess[p] = bare[order[p]];
    tridiagonalLowestEigenvalues(d, e, n, count, s.w, s.guess);
    for (let p = 0; p < count; p++) {
      const label = order[p];
      if (label === 0) out[0] = s.w[p];
      else if (label === 1) out[1] = s.w[p];
      else if (label === k) out[2] = s.w[p];
      else if (label === k + 1) out[3] = s.w[p];
    }
  }
  return out;
}

/** Static ZZ zeta = E_11 - E_10 - E_01 + E_00 from a dressed spectrum (GHz). */
export function staticZz(s: DressedSpectrum): number {
  const k = s.levels;
  const e = s.dressed;
  return e[k + 1] - e[k] - e[1] + e[0];
}
