/**
 * Energy levels and eigenvectors of one transmon in the charge basis (Koch et al., Phys. Rev. A
 * 76, 042319 (2007), Eq. 2.1):
 *
 *     H = 4 E_C (n - n_g)^2 - (E_J / 2) sum_n ( |n><n+1| + |n+1><n| ),    |n| <= N.
 *
 * H is tridiagonal. At n_g = 0 it commutes with charge parity n -> -n and splits into an even
 * block (basis |0>, (|k> + |-k>)/sqrt2) and an odd block ((|k> - |-k>)/sqrt2), k = 1..N; their
 * eigenvalues interleave (even, odd, even, ... as the Mathieu values a_0 < b_2 < a_2 < b_4 ...),
 * so level m is eigenvalue floor(m/2) of the even block for even m and of the odd block for odd m.
 * Each block's lowest eigenvalues are found by Newton's method from the asymptotic levels with a
 * Sturm-count check (src/linalg/tridiagonal-lowest-eigenvalues.ts), eigenvectors by inverse
 * iteration. For n_g != 0 the full (2N+1) tridiagonal matrix is solved by implicit QL.
 *
 * Energies are absolute (GHz), ascending. Eigenvectors are real, in the full charge basis
 * (component j belongs to n = j - N), normalised, with a fixed sign: for n_g = 0 even levels
 * have c_0 > 0 and odd levels c_1 > 0; for n_g != 0 the component of largest magnitude is > 0.
 *
 * N = 20 (the default) converges to better than 1e-10 GHz for E_J/E_C up to ~150
 * (test/transmon/levels.test.ts shows the convergence).
 */
import { tridiagonalEigenvalues } from '../linalg/tridiagonal-eigenvalues.js';
import { tridiagonalEigenvector } from '../linalg/tridiagonal-eigenvector.js';
import { tridiagonalLowestEigenvalues } from '../linalg/tridiagonal-lowest-eigenvalues.js';

export interface TransmonLevelOptions {
  /** Number of lowest levels wanted (K). */
  levels: number;
  /** Charge cutoff N (basis |n| <= N). */
  chargeCutoff?: number;
  /** Offset charge n_g. */
  offsetCharge?: number;
  /** Also compute eigenvectors. */
  vectors?: boolean;
}

export interface TransmonLevels {
  /** E_0 ... E_{K-1}, absolute, GHz. */
  energies: Float64Array;
  /** K x (2N+1), row m is level m's charge-basis wave function; empty unless requested. */
  vectors: Float64Array;
  /** Charge cutoff N. */
  chargeCutoff: number;
}

export const TRANSMON_LEVEL_DEFAULTS = Object.freeze({ chargeCutoff: 20, offsetCharge: 0 });

/** Lowest levels of H for charging energy `ecGHz` and Josephson energy `ejGHz`. */
export function transmonLevels(ecGHz: number, ejGHz: number, options: TransmonLevelOptions): TransmonLevels {
  const nCut = options.chargeCutoff ?? TRANSMON_LEVEL_DEFAULTS.chargeCutoff;
  const ng = options.offsetCharge ?? TRANSMON_LEVEL_DEFAULTS.offsetCharge;
  const k = options.levels;
  const dim = 2 * nCut + 1;
  if (!(k >= 1) || k > dim) throw new RangeError(`transmonLevels: levels must be in [1, ${dim}], got ${k}`);
  if (!(ecGHz > 0) || !(ejGHz >= 0)) throw new RangeError(`transmonLevels: need E_C > 0 and E_J >= 0 (got ${ecGHz}, ${ejGHz})`);
  const energies = new Float64Array(k);
  const vectors = new Float64Array(options.vectors ? k * dim : 0);
  if (ng === 0) solveByParity(ecGHz, ejGHz, nCut, k, energies, options.vectors ? vectors : undefined);
  else solveFull(ecGHz, ejGHz, nCut, ng, k, energies, options.vectors ? vectors : undefined);
  return { energies, vectors, chargeCutoff: nCut };
}

interface ParityScratch {
  nCut: number;
  dEven: Float64Array;
  eEven: Float64Array;
  dOdd: Float64Array;
  eOdd: Float64Array;
  wEven: Float64Array;
  wOdd: Float64Array;
  guessEven: Float64Array;
  guessOdd: Float64Array;
  vec: Float64Array;
  work: Float64Array;
}
let scratch: ParityScratch | undefined;

function parityScratch(nCut: number): ParityScratch {
  if (scratch && scratch.nCut === nCut) return scratch;
  const nEven = nCut + 1;
  const m = Math.max(nCut, 1);
  scratch = {
    nCut,
    dEven: new Float64Array(nEven),
    eEven: new Float64Array(nEven),
    dOdd: new Float64Array(m),
    eOdd: new Float64Array(m),
    wEven: new Float64Array(nEven),
    wOdd: new Float64Array(m),
    guessEven: new Float64Array(nEven),
    guessOdd: new Float64Array(m),
    vec: new Float64Array(nEven),
    work: new Float64Array(5 * nEven),
  };
  return scratch;
}

/**
 * Asymptotic level (Koch 2007, Eq. 2.11): E_m ~ -E_J + sqrt(8 E_J E_C)(m + 1/2) - (E_C/12)(6m^2 + 6m + 3).
 * Used only as the starting guess of the exact solver.
 */
function asymptoticLevel(ec: number, ej: number, m: number): number {
  return -ej + Math.sqrt(8 * ej * ec) * (m + 0.5) - (ec / 12) * (6 * m * m + 6 * m + 3);
}

function solveByParity(ec: number, ej: number, nCut: number, k: number, energies: Float64Array, vectors: Float64Array | undefined): void {
  const dim = 2 * nCut + 1;
  const nEven = nCut + 1;
  const nOdd = nCut;
  const kEven = (k + 1) >> 1;
  const kOdd = k >> 1;
  if (kEven > nEven || kOdd > nOdd) throw new RangeError(`transmonLevels: ${k} levels need a larger charge cutoff than ${nCut}`);
  const s = parityScratch(nCut);
  const { dEven, eEven, dOdd, eOdd, wEven, wOdd, guessEven, guessOdd, vec, work } = s;
  for (let i = 0; i < nEven; i++) dEven[i] = 4 * ec * i * i;
  eEven[0] = -ej / Math.SQRT2;
  for (let i = 1; i < nEven - 1; i++) eEven[i] = -ej / 2;
  for (let i = 0; i < kEven; i++) guessEven[i] = asymptoticLevel(ec, ej, 2 * i);
  tridiagonalLowestEigenvalues(dEven, eEven, nEven, kEven, wEven, guessEven);
  if (kOdd > 0) {
    for (let i = 0; i < nOdd; i++) dOdd[i] = 4 * ec * (i + 1) * (i + 1);
    for (let i = 0; i < nOdd - 1; i++) eOdd[i] = -ej / 2;
    for (let i = 0; i < kOdd; i++) guessOdd[i] = asymptoticLevel(ec, ej, 2 * i + 1);
    tridiagonalLowestEigenvalues(dOdd, eOdd, nOdd, kOdd, wOdd, guessOdd);
  }
  for (let m = 0; m < k; m++) {
    const even = m % 2 === 0;
    const idx = m >> 1;
    energies[m] = even ? wEven[idx] : wOdd[idx];
    if (!vectors) continue;
    const row = m * dim;
    if (even) {
      tridiagonalEigenvector(dEven, eEven, nEven, energies[m], vec, work);
      const sign = vec[0] >= 0 ? 1 : -1;
      vectors[row + nCut] = sign * vec[0];
      for (let i = 1; i < nEven; i++) {
        const c = (sign * vec[i]) / Math.SQRT2;
        vectors[row + nCut + i] = c;
        vectors[row + nCut - i] = c;
      }
    } else {
      tridiagonalEigenvector(dOdd, eOdd, nOdd, energies[m], vec, work);
      const sign = vec[0] >= 0 ? 1 : -1;
      vectors[row + nCut] = 0;
      for (let i = 0; i < nOdd; i++) {
        const c = (sign * vec[i]) / Math.SQRT2;
        vectors[row + nCut + i + 1] = c;
        vectors[row + nCut - i - 1] = -c;
      }
    }
  }
}

function solveFull(ec: number, ej: number, nCut: number, ng: number, k: number, energies: Float64Array, vectors: Float64Array | undefined): void {
  const dim = 2 * nCut + 1;
  const d = new Float64Array(dim);
  const e = new Float64Array(dim);
  for (let j = 0; j < dim; j++) {
    const n = j - nCut - ng;
    d[j] = 4 * ec * n * n;
  }
  for (let j = 0; j < dim - 1; j++) e[j] = -ej / 2;
  const w = tridiagonalEigenvalues(d, e, dim);
  const vec = new Float64Array(dim);
  const work = new Float64Array(5 * dim);
  for (let m = 0; m < k; m++) {
    energies[m] = w[m];
    if (!vectors) continue;
    tridiagonalEigenvector(d, e, dim, w[m], vec, work);
    let big = 0;
    for (let j = 1; j < dim; j++) if (Math.abs(vec[j]) > Math.abs(vec[big])) big = j;
    const sign = vec[big] >= 0 ? 1 : -1;
    for (let j = 0; j < dim; j++) vectors[m * dim + j] = sign * vec[j];
  }
}
