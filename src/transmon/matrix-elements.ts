/**
 * Matrix elements of the charge operator n and of cos(phi) between transmon eigenstates, from
 * charge-basis wave functions c^m_n (src/transmon/levels.ts):
 *
 *     <m|n|m'>       = sum_n n c^m_n c^m'_n
 *     <m|cos phi|m'> = (1/2) sum_n ( c^m_n c^m'_{n+1} + c^m_{n+1} c^m'_n )     (cos phi = (e^{i phi} + e^{-i phi})/2,
 *                                                                              e^{i phi}|n> = |n+1>)
 *
 * Both are real symmetric K x K (row-major). n is the physical charge n (not n - n_g).
 * dH/dE_J = -cos(phi), so <m|cos phi|m'> also gives level slopes and non-adiabatic couplings.
 */
import type { TransmonLevels } from './levels.js';

/** K x K matrix <m|n|m'>. */
export function chargeMatrix(levels: TransmonLevels, out?: Float64Array): Float64Array {
  const k = levels.energies.length;
  const nCut = levels.chargeCutoff;
  const dim = 2 * nCut + 1;
  const v = levels.vectors;
  if (v.length < k * dim) throw new RangeError('chargeMatrix: levels were computed without vectors');
  const m = out ?? new Float64Array(k * k);
  for (let a = 0; a < k; a++) {
    for (let b = a; b < k; b++) {
      let s = 0;
      for (let j = 0; j < dim; j++) s += (j - nCut) * v[a * dim + j] * v[b * dim + j];
      m[a * k + b] = s;
      m[b * k + a] = s;
    }
  }
  return m;
}

/** K x K matrix <m|cos phi|m'>. */
export function cosPhiMatrix(levels: TransmonLevels, out?: Float64Array): Float64Array {
  const k = levels.energies.length;
  const dim = 2 * levels.chargeCutoff + 1;
  const v = levels.vectors;
  if (v.length < k * dim) throw new RangeError('cosPhiMatrix: levels were computed without vectors');
  const m = out ?? new Float64Array(k * k);
  for (let a = 0; a < k; a++) {
    for (let b = a; b < k; b++) {
      let s = 0;
      for (let j = 0; j < dim - 1; j++) s += v[a * dim + j] * v[b * dim + j + 1] + v[a * dim + j + 1] * v[b * dim + j];
      s *= 0.5;
      m[a * k + b] = s;
      m[b * k + a] = s;
    }
  }
  return m;
}
