/**
 * Fast eigenbasis of one transmon at n_g = 0 in its charge-parity blocks, with the charge and
 * cos(phi) matrices computed in the blocks (the hot path of spectra, inverse maps and pair ZZ).
 * Same physics, basis and sign convention as src/transmon/levels.ts (Koch et al., Phys. Rev. A
 * 76, 042319 (2007)); test/transmon/parity-eigenbasis.test.ts checks they agree.
 *
 * Blocks (N = charge cutoff): even basis |0>, (|k> + |-k>)/sqrt2 (k = 1..N), block
 * tridiag(d_k = 4 E_C k^2; e_0 = -E_J/sqrt2, e_k = -E_J/2); odd basis (|k> - |-k>)/sqrt2
 * (k = 1..N), block tridiag(4 E_C k^2; -E_J/2). Level m is eigenvalue floor(m/2) of the even
 * block (m even) or the odd block (m odd). Eigenvalues: Newton from the asymptotic levels with a
 * Sturm check (src/linalg/tridiagonal-lowest-eigenvalues.ts); vectors: twisted factorisation
 * (src/linalg/tridiagonal-twisted-eigenvector.ts). Sign: even levels x_0 > 0, odd levels y_0 > 0
 * (the components on |0> and on (|1> - |-1>)/sqrt2), i.e. c_0 > 0 and c_1 > 0 as in levels.ts.
 *
 * Matrix elements in block components (x even, y odd; derived from the full charge basis):
 *     <even x|n|odd y> = sum_{k=1..N} k x_k y_{k-1}                       (n is odd under parity)
 *     <x|cos phi|x'>  = sum_i c_i (x_i x'_{i+1} + x_{i+1} x'_i),   c_0 = 1/sqrt2 (even block), else 1/2.
 */
import { tridiagonalLowestEigenvalues } from '../linalg/tridiagonal-lowest-eigenvalues.js';
import { tridiagonalTwistedEigenvector } from '../linalg/tridiagonal-twisted-eigenvector.js';

export interface ParityEigenbasis {
  /** Levels K. */
  levels: number;
  chargeCutoff: number;
  /** E_0 .. E_{K-1} (GHz, absolute). */
  energies: Float64Array;
  /**
   * Row m (stride N + 1): level m's components in its parity block (even: N + 1 entries,
   * odd: N entries and a trailing 0).
   */
  blockVectors: Float64Array;
}

interface Scratch {
  nCut: number;
  dEven: Float64Array;
  eEven: Float64Array;
  dOdd: Float64Array;
  eOdd: Float64Array;
  wEven: Float64Array;
  wOdd: Float64Array;
  gEven: Float64Array;
  gOdd: Float64Array;
  dPlus: Float64Array;
  dMinus: Float64Array;
  /** One level's vector as the twisted factorisation finds it (nCut + 1). */
  row: Float64Array;
}
/**
 * Work buffers by charge cutoff, kept for every cutoff asked for (a planner's run alternates
 * between a few: its transmons', the reduced spectrum's and the layout solve's; one kept buffer
 * set was made anew at every switch). Each solve writes what it reads.
 */
const scratchByCutoff: (Scratch | undefined)[] = [];

function scratchFor(nCut: number): Scratch {
  const kept = scratchByCutoff[nCut];
  if (kept) return kept;
  const m = nCut + 1;
  const scratch: Scratch = {
    nCut,
    dEven: new Float64Array(m),
    eEven: new Float64Array(m),
    dOdd: new Float64Array(m),
    eOdd: new Float64Array(m),
    wEven: new Float64Array(m),
    wOdd: new Float64Array(m),
    gEven: new Float64Array(m),
    gOdd: new Float64Array(m),
    dPlus: new Float64Array(m),
    dMinus: new Float64Array(m),
    row: new Float64Array(m),
  };
  scratchByCutoff[nCut] = scratch;
  return scratch;
}

/** Koch 2007 Eq. 2.11 (start values only). */
function asymptoticLevel(ec: number, ej: number, m: number): number {
  return -ej + Math.sqrt(8 * ej * ec) * (m + 0.5) - (ec / 12) * (6 * m * m + 6 * m + 3);
}

/**
 * Lowest `k` levels (and, if `vectors`, block wave functions) for E_C, E_J at n_g = 0.
 * `into`, when given, is filled and returned (its arrays at least k and k (N + 1) long; entries
 * beyond those, and without `vectors` every vector entry, are left as they were): for callers that
 * read the result at once, many times over.
 * @throws RangeError for E_C <= 0, E_J < 0, or k > 2N + 1.
 */
export function parityEigenbasis(ecGHz: number, ejGHz: number, k: number, nCut: number, vectors = true, into?: ParityEigenbasis): ParityEigenbasis {
  if (!(ecGHz > 0) || !(ejGHz >= 0)) throw new RangeError(`parityEigenbasis: need E_C > 0 and E_J >= 0 (got ${ecGHz}, ${ejGHz})`);
  const nEven = nCut + 1;
  const nOdd = nCut;
  const kEven = (k + 1) >> 1;
  const kOdd = k >> 1;
  if (!(k >= 1) || kEven > nEven || kOdd > nOdd) throw new RangeError(`parityEigenbasis: ${k} levels need a larger charge cutoff than ${nCut}`);
  const s = scratchFor(nCut);
  const { dEven, eEven, dOdd, eOdd, wEven, wOdd, gEven, gOdd, dPlus, dMinus } = s;
  const half = -ejGHz / 2;
  for (let i = 0; i < nEven; i++) {
    dEven[i] = 4 * ecGHz * i * i;
    eEven[i] = half;
  }
  eEven[0] = -ejGHz / Math.SQRT2;
  for (let i = 0; i < kEven; i++) gEven[i] = asymptoticLevel(ecGHz, ejGHz, 2 * i);
  tridiagonalLowestEigenvalues(dEven, eEven, nEven, kEven, wEven, gEven);
  if (kOdd > 0) {
    for (let i = 0; i < nOdd; i++) {
      dOdd[i] = 4 * ecGHz * (i + 1) * (i + 1);
      eOdd[i] = half;
    }
    for (let i = 0; i < kOdd; i++) gOdd[i] = asymptoticLevel(ecGHz, ejGHz, 2 * i + 1);
    tridiagonalLowestEigenvalues(dOdd, eOdd, nOdd, kOdd, wOdd, gOdd);
  }
  const stride = nCut + 1;
  if (into && (into.energies.length < k || (vectors && into.blockVectors.length < k * stride))) throw new RangeError('parityEigenbasis: the result to fill is too small');
  const energies = into ? into.energies : new Float64Array(k);
  for (let m = 0; m < k; m++) energies[m] = m % 2 === 0 ? wEven[m >> 1] : wOdd[m >> 1];
  const blockVectors = into ? into.blockVectors : new Float64Array(vectors ? k * stride : 0);
  if (vectors) {
    // (each level's vector is found in the scratch row and copied to its place: no view per row)
    const row = s.row;
    for (let m = 0; m < k; m++) {
      const even = m % 2 === 0;
      if (even) tridiagonalTwistedEigenvector(dEven, eEven, nEven, energies[m], row, dPlus, dMinus);
      else tridiagonalTwistedEigenvector(dOdd, eOdd, nOdd, energies[m], row, dPlus, dMinus);
      const n = even ? nEven : nOdd;
      // Sign convention: first component positive (first non-negligible one if it vanishes).
      let lead = 0;
      while (lead < n - 1 && Math.abs(row[lead]) < 1e-300) lead++;
      const o = m * stride;
      if (row[lead] < 0) for (let i = 0; i < n; i++) blockVectors[o + i] = -row[i];
      else for (let i = 0; i < n; i++) blockVectors[o + i] = row[i];
      if (!even) blockVectors[o + stride - 1] = 0;
    }
  }
  if (!into) return { levels: k, chargeCutoff: nCut, energies, blockVectors };
  into.levels = k;
  into.chargeCutoff = nCut;
  return into;
}

/** K x K <m|n|m'> from a parity eigenbasis (zero unless m + m' is odd). */
export function chargeMatrixFromParity(b: ParityEigenbasis, out: Float64Array = new Float64Array(b.levels * b.levels)): Float64Array {
  const k = b.levels;
  const nCut = b.chargeCutoff;
  const stride = nCut + 1;
  const v = b.blockVectors;
  if (v.length < k * stride) throw new RangeError('chargeMatrixFromParity: basis has no vectors');
  out.fill(0);
  for (let m = 0; m < k; m += 2) {
    const xr = m * stride;
    for (let p = 1; p < k; p += 2) {
      const yr = p * stride;
      let s = 0;
      for (let j = 1; j <= nCut; j++) s += j * v[xr + j] * v[yr + j - 1];
      out[m * k + p] = s;
      out[p * k + m] = s;
    }
  }
  return out;
}

/** K x K <m|cos phi|m'> from a parity eigenbasis (zero unless m + m' is even). */
export function cosPhiMatrixFromParity(b: ParityEigenbasis, out: Float64Array = new Float64Array(b.levels * b.levels)): Float64Array {
  const k = b.levels;
  out.fill(0);
  for (let m = 0; m < k; m++) for (let p = m; p < k; p += 2) {
    const c = cosPhiElement(b, m, p);
    out[m * k + p] = c;
    out[p * k + m] = c;
  }
  return out;
}

/** <m|cos phi|p> for levels of equal parity (0 otherwise). */
export function cosPhiElement(b: ParityEigenbasis, m: number, p: number): number {
  if ((m + p) % 2 !== 0) return 0;
  const nCut = b.chargeCutoff;
  const stride = nCut + 1;
  const v = b.blockVectors;
  const xr = m * stride;
  const yr = p * stride;
  const even = m % 2 === 0;
  const n = even ? nCut + 1 : nCut;
  let s = 0;
  for (let i = 0; i < n - 1; i++) s += v[xr + i] * v[yr + i + 1] + v[xr + i + 1] * v[yr + i];
  s *= 0.5;
  if (even) s += (Math.SQRT1_2 - 0.5) * (v[xr] * v[yr + 1] + v[xr + 1] * v[yr]);
  return s;
}
