/**
 * The gate as a function of the hold time, from one simulated ramp (the tuner's fast path).
 *
 * With psi_c = U_up P_c the ramp's final frame columns (four computational states), a hold of
 * length t at the destination is exact phases D(t) = exp(-i 2 pi E_dest t) in the frame, and the
 * return ramp is the time reverse of the ramp up: its generator is the complex conjugate of the
 * ramp's at the mirrored time (E and A are real, du/dt changes sign), so U_down = U_up^T. Hence
 *
 *     <c'|U(t)|c> = psi_c'^T D(t) psi_c            (a plain transpose, no conjugation),
 *
 * and the lab-frame block M(t) follows for every hold time at the cost of a few products.
 */
import { symmetricEigen } from '../linalg/symmetric-eigen.js';
import { evaluateFrame, type ManifoldFrame } from '../sim/manifold-frame.js';
import type { DressedState } from '../sim/dressed-states.js';
import type { Block4 } from '../sim/gate-metrics.js';

export class HoldScan {
  /** per computational column: sector and V^T psi (complex) */
  private readonly y: { sector: number; re: Float64Array; im: Float64Array }[];
  /** per sector: eigenvalues lambda (GHz) of E at the destination */
  private readonly lam: Float64Array[];
  private readonly eLoc: number[];

  constructor(frame: ManifoldFrame, uDest: number, comp: DressedState[], finalRe: Float64Array[], finalIm: Float64Array[], private readonly rampNs: number) {
    // rampNs: duration of the simulated ramp up (through a line filter, up to where it settles)
    const vecs: Float64Array[] = [];
    this.lam = frame.sectors.map((sector) => {
      const d = sector.size;
      const e = new Float64Array(d * d);
      const a = new Float64Array(d * d);
      evaluateFrame(frame, sector, uDest, e, a);
      const v = new Float64Array(d * d);
      const w = new Float64Array(d);
      for (const blk of sector.blocks) {
        const m = blk.size;
        const sub = new Float64Array(m * m);
        for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) sub[i * m + j] = e[(blk.start + i) * d + blk.start + j];
        const ev = symmetricEigen(sub, m);
        for (let i = 0; i < m; i++) {
          w[blk.start + i] = ev.values[i];
          for (let j = 0; j < m; j++) v[(blk.start + j) * d + blk.start + i] = ev.vectors[j * m + i];
        }
      }
      vecs.push(v);
      return w;
    });
    this.y = comp.map((st, c) => {
      const d = frame.sectors[st.sector].size;
      const v = vecs[st.sector];
      const re = new Float64Array(d);
      const im = new Float64Array(d);
      for (let k = 0; k < d; k++) {
        let sr = 0;
        let si = 0;
        for (let r = 0; r < d; r++) {
          sr += v[r * d + k] * finalRe[c][r];
          si += v[r * d + k] * finalIm[c][r];
        }
        re[k] = sr;
        im[k] = si;
      }
      return { sector: st.sector, re, im };
    });
    const e00 = comp[0].energy;
    this.eLoc = [0, 1, 2, 3].map((r) => e00 + (r >> 1) * (comp[2].energy - e00) + (r & 1) * (comp[1].energy - e00));
  }

  /**
   * phi_c on a uniform hold grid t_k = k step, k = 0..n, from the four diagonal elements only,
   * advancing each phase factor by a fixed rotation (re-anchored exactly every 64 steps).
   */
  phaseScan(step: number, n: number): Float64Array {
    const out = new Float64Array(n + 1);
    const diag = [0, 1, 2, 3].map((r) => {
      const y = this.y[r];
      const lam = this.lam[y.sector];
      const d = lam.length;
      const pr = new Float64Array(d);
      const pi = new Float64Array(d);
      for (let k = 0; k < d; k++) {
        pr[k] = y.re[k] * y.re[k] - y.im[k] * y.im[k];
        pi[k] = 2 * y.re[k] * y.im[k];
      }
      return { lam, pr, pi, cr: new Float64Array(d), ci: new Float64Array(d), sr: new Float64Array(d), si: new Float64Array(d) };
    });
    const args = new Float64Array(4);
    for (let k = 0; k <= n; k++) {
      for (let r = 0; r < 4; r++) {
        const g = diag[r];
        const d = g.lam.length;
        if (k % 64 === 0) {
          for (let q = 0; q < d; q++) {
            const a = -2 * Math.PI * g.lam[q] * k * step;
            g.cr[q] = Math.cos(a);
            g.ci[q] = Math.sin(a);
            const b = -2 * Math.PI * g.lam[q] * step;
            g.sr[q] = Math.cos(b);
            g.si[q] = Math.sin(b);
          }
        } else {
          for (let q = 0; q < d; q++) {
            const xr = g.cr[q] * g.sr[q] - g.ci[q] * g.si[q];
            const xi = g.cr[q] * g.si[q] + g.ci[q] * g.sr[q];
            g.cr[q] = xr;
            g.ci[q] = xi;
          }
        }
        let sr = 0;
        let si = 0;
        for (let q = 0; q < d; q++) {
          sr += g.pr[q] * g.cr[q] - g.pi[q] * g.ci[q];
          si += g.pr[q] * g.ci[q] + g.pi[q] * g.cr[q];
        }
        // lab phase e^{i 2 pi eLoc T} enters phi_c only through the combination below
        args[r] = Math.atan2(si, sr);
      }
      const T = 2 * this.rampNs + k * step;
      const lab = 2 * Math.PI * (this.eLoc[3] - this.eLoc[2] - this.eLoc[1] + this.eLoc[0]) * T;
      out[k] = args[3] - args[2] - args[1] + args[0] + lab;
    }
    return out;
  }

  /** Lab-frame block after a hold of holdNs (total time 2 ramp + hold). */
  block(holdNs: number, out: Block4 = { re: new Float64Array(16), im: new Float64Array(16) }): Block4 {
    const T = 2 * this.rampNs + holdNs;
    out.re.fill(0);
    out.im.fill(0);
    // e^{-i 2 pi lam_k t} once per sector
    const rot = this.lam.map((lam) => {
      const c = new Float64Array(lam.length);
      const sn = new Float64Array(lam.length);
      for (let k = 0; k < lam.length; k++) {
        const a = -2 * Math.PI * lam[k] * holdNs;
        c[k] = Math.cos(a);
        sn[k] = Math.sin(a);
      }
      return { c, sn };
    });
    for (let r = 0; r < 4; r++) {
      const yr = this.y[r];
      const ph = 2 * Math.PI * this.eLoc[r] * T;
      const cr = Math.cos(ph);
      const ci = Math.sin(ph);
      const { c: ca, sn: sa } = rot[yr.sector];
      for (let c = 0; c < 4; c++) {
        const yc = this.y[c];
        if (yr.sector !== yc.sector) continue;
        let sr = 0;
        let si = 0;
        for (let k = 0; k < ca.length; k++) {
          // yr_k yc_k e^{-i 2 pi lam_k t}
          const pr = yr.re[k] * yc.re[k] - yr.im[k] * yc.im[k];
          const pi = yr.re[k] * yc.im[k] + yr.im[k] * yc.re[k];
          sr += pr * ca[k] - pi * sa[k];
          si += pr * sa[k] + pi * ca[k];
        }
        out.re[r * 4 + c] = cr * sr - ci * si;
        out.im[r * 4 + c] = ci * sr + cr * si;
      }
    }
    return out;
  }
}
