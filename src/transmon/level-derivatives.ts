/**
 * Derivatives of transmon levels and wave functions with respect to E_J
 * (H = 4 E_C (n - n_g)^2 - E_J cos phi, so dH/dE_J = -cos phi):
 *
 *     dE_m/dE_J = -<m|cos phi|m>                                   (Hellmann-Feynman)
 *     (H - E_m) d|m>/dE_J = (cos phi + dE_m/dE_J ... ) |m>  i.e.  (H - E_m) y = (cos phi - <m|cos phi|m>) |m>,
 *     <m|y> = 0,
 *
 * solved by Nelson's method (R. B. Nelson, AIAA J. 14, 1201 (1976)): fix the component k where
 * |c^m_k| is largest to zero, drop row and column k (the tridiagonal system splits into two
 * tridiagonal systems, both non-singular), then remove the component along |m>. O(N) per level,
 * exact to rounding (no sum over the other levels is needed).
 */
import { tridiagonalSolve } from '../linalg/tridiagonal-solve.js';
import type { TransmonLevels } from './levels.js';

export interface TransmonLevelDerivatives {
  /** dE_m / dE_J (dimensionless). */
  energies: Float64Array;
  /** K x (2N+1): d c^m_n / dE_J (per GHz). */
  vectors: Float64Array;
}

export function transmonLevelDerivatives(ecGHz: number, ejGHz: number, levels: TransmonLevels, offsetCharge = 0): TransmonLevelDerivatives {
  const k = levels.energies.length;
  const nCut = levels.chargeCutoff;
  const dim = 2 * nCut + 1;
  const v = levels.vectors;
  if (v.length < k * dim) throw new RangeError('transmonLevelDerivatives: levels were computed without vectors');
  const d = new Float64Array(dim);
  const e = new Float64Array(dim);
  for (let j = 0; j < dim; j++) {
    const n = j - nCut - offsetCharge;
    d[j] = 4 * ecGHz * n * n;
  }
  for (let j = 0; j < dim - 1; j++) e[j] = -ejGHz / 2;
  const dE = new Float64Array(k);
  const dV = new Float64Array(k * dim);
  const rhs = new Float64Array(dim);
  const y = new Float64Array(dim);
  const work = new Float64Array(5 * dim);
  for (let m = 0; m < k; m++) {
    const row = m * dim;
    // cos phi |m>: (cos c)_j = (c_{j-1} + c_{j+1}) / 2
    let expect = 0;
    for (let j = 0; j < dim; j++) {
      const c = 0.5 * ((j > 0 ? v[row + j - 1] : 0) + (j < dim - 1 ? v[row + j + 1] : 0));
      rhs[j] = c;
      expect += c * v[row + j];
    }
    dE[m] = -expect;
    for (let j = 0; j < dim; j++) rhs[j] -= expect * v[row + j];
    // Nelson: pivot component.
    let kk = 0;
    for (let j = 1; j < dim; j++) if (Math.abs(v[row + j]) > Math.abs(v[row + kk])) kk = j;
    y.fill(0);
    if (kk > 0) tridiagonalSolve(d, e, levels.energies[m], rhs, y, 0, kk, work);
    if (kk < dim - 1) tridiagonalSolve(d, e, levels.energies[m], rhs, y, kk + 1, dim, work);
    y[kk] = 0;
    let proj = 0;
    for (let j = 0; j < dim; j++) proj += y[j] * v[row + j];
    for (let j = 0; j < dim; j++) dV[row + j] = y[j] - proj * v[row + j];
  }
  return { energies: dE, vectors: dV };
}
