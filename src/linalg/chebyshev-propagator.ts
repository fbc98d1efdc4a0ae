/**
 * Action of exp(-i tau H) on a complex vector for a real symmetric H given as a mat-vec, by the
 * Chebyshev expansion (Tal-Ezer and Kosloff, J. Chem. Phys. 81, 3967 (1984)):
 *
 *     exp(-i tau H) = e^{-i tau c} sum_k (2 - delta_k0) (-i)^k J_k(tau r) T_k((H - c) / r),
 *
 * where [c - r, c + r] contains the spectrum of H. Terms are added until |J_k(tau r)| falls
 * below `tol` (k ~ tau r + O((tau r)^{1/3})). Unitary to the truncation error.
 * Cost: about tau r + 20 mat-vecs; the vector pair (re, im) is overwritten with the result.
 */
import { besselJSeries } from './bessel.js';

/** y = H x for real symmetric H (x and y do not alias). */
export type RealMatVec = (x: Float64Array, y: Float64Array) => void;

export class ChebyshevPropagator {
  private readonly n: number;
  private readonly buf: Float64Array[];
  private bessel = new Float64Array(64);

  constructor(n: number) {
    this.n = n;
    this.buf = Array.from({ length: 8 }, () => new Float64Array(n));
  }

  /** (re, im) <- exp(-i tau H) (re, im); spectrum of H within [lo, hi]. */
  apply(matvec: RealMatVec, lo: number, hi: number, tau: number, re: Float64Array, im: Float64Array, tol = 1e-16): void {
    const n = this.n;
    const c = 0.5 * (hi + lo);
    const r = 0.5 * (hi - lo);
    const z = Math.abs(tau) * r;
    const kMax = Math.ceil(z + 10 * Math.cbrt(z) + 20);
    if (this.bessel.length < kMax + 1) this.bessel = new Float64Array(2 * kMax + 2);
    const J = besselJSeries(z, kMax, this.bessel);
    const sgn = tau >= 0 ? 1 : -1;
    const [t0r, t0i, t1r, t1i, t2r, t2i, accR, accI] = this.buf;
    // T0 = x, T1 = (H - c) x / r
    t0r.set(re);
    t0i.set(im);
    matvec(t0r, t1r);
    matvec(t0i, t1i);
    for (let q = 0; q < n; q++) {
      t1r[q] = (t1r[q] - c * t0r[q]) / r;
      t1i[q] = (t1i[q] - c * t0i[q]) / r;
    }
    // acc = J0 T0 + 2 (-i) J1 T1
    for (let q = 0; q < n; q++) {
      accR[q] = J[0] * t0r[q] + 2 * sgn * J[1] * t1i[q];
      accI[q] = J[0] * t0i[q] - 2 * sgn * J[1] * t1r[q];
    }
    let pr = t0r;
    let pi = t0i;
    let cr = t1r;
    let ci = t1i;
    let nr = t2r;
    let ni = t2i;
    for (let k = 2; k <= kMax; k++) {
      matvec(cr, nr);
      matvec(ci, ni);
      for (let q = 0; q < n; q++) {
        nr[q] = (2 * (nr[q] - c * cr[q])) / r - pr[q];
        ni[q] = (2 * (ni[q] - c * ci[q])) / r - pi[q];
      }
      // (-i)^k with sign of tau: (-i sgn)^k
      const m = k % 4;
      const coef = 2 * J[k] * (sgn < 0 && k % 2 === 1 ? -1 : 1);
      // (-i)^k: 1, -i, -1, i
      for (let q = 0; q < n; q++) {
        const xr = nr[q];
        const xi = ni[q];
        if (m === 0) {
          accR[q] += coef * xr;
          accI[q] += coef * xi;
        } else if (m === 1) {
          accR[q] += coef * xi;
          accI[q] -= coef * xr;
        } else if (m === 2) {
          accR[q] -= coef * xr;
          accI[q] -= coef * xi;
        } else {
          accR[q] -= coef * xi;
          accI[q] += coef * xr;
        }
      }
      const tr = pr;
      const ti = pi;
      pr = cr;
      pi = ci;
      cr = nr;
      ci = ni;
      nr = tr;
      ni = ti;
      if (Math.abs(J[k]) < tol && k > z) break;
    }
    // multiply by e^{-i tau c}
    const ph = -tau * c;
    const cs = Math.cos(ph);
    const sn = Math.sin(ph);
    for (let q = 0; q < n; q++) {
      re[q] = cs * accR[q] - sn * accI[q];
      im[q] = sn * accR[q] + cs * accI[q];
    }
  }
}
