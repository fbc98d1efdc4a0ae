/**
 * One time step in the dressed-manifold frame (src/sim/manifold-frame.ts), splitting the
 * generator H(t) = 2 pi E(t) - i B(t) into its manifold blocks H_in (E is block diagonal; the
 * in-block part of B) and the weak inter-manifold coupling H_x = -i B_x:
 *
 *     U(h) = U_in(h) U_I(h).
 *
 * U_in: fourth-order Magnus with two Gauss-Legendre nodes, restricted to each block (Blanes,
 * Casas, Oteo and Ros, Phys. Rep. 470, 151 (2009), Eq. 253), exponentiated exactly through the
 * eigen-decomposition of each small Hermitian block.
 *
 * U_I: the interaction picture of H_x relative to the in-block motion, taken about the middle
 * of the step with the block Hamiltonian H_m = Q Lambda Q^dag, taken as M / h from the in-block
 * Magnus exponent (equal to (H(t1) + H(t2))/2 up to O(h^2)), so that in
 * Q's basis H_x(t) = X_m + tau X_d + (tau^2/2) X_c (a parabola through the two nodes and the
 * midpoint) oscillates as e^{i (w_pq tau + w'_pq tau^2 / 2)} (w_pq = lambda_p - lambda_q, GHz-scale
 * for states of different manifolds, w' its rate from dE/dt; the chirp enters to first order).
 * Its Magnus series to second order is integrated exactly in the oscillation (Filon-type
 * quadrature; Iserles, BIT 42, 561 (2002)):
 *
 *     Omega1_pq = -i [ Xm_pq S0 + Xd_pq S1 + (Xc_pq / 2 + i w'_pq Xm_pq / 2) S2 ](w_pq),
 *     S2(w) = int tau^2 e^{i w tau},
 *     Omega2_pq = -(1/2) sum_r Xm_pr Xm_rq [ I(w_pr, w_rq) - I(w_rq, w_pr) ]   (p, q in one block),
 *     S0(w) = int e^{i w tau} = 2 sin(w h/2)/w,   S1(w) = int tau e^{i w tau} = i [2 sin(w h/2)/w^2 - h cos(w h/2)/w],
 *     I(a, b) = int_{tau1 > tau2} e^{i a tau1 + i b tau2} = [S0(a + b) - e^{-i b h/2} S0(a)] / (i b),
 * over tau in [-h/2, h/2], and U_I = Q exp(Omega~) Q^dag with Omega~_pq = e^{i (w_pq h/2 - w'_pq h^2/8)} Omega_pq
 * (exp by a third-order Taylor series: |Omega| ~ 1e-3). This keeps the GHz-fast counter-rotating
 * (squeezing and dressing) transitions between manifolds accurate at steps much longer than
 * their period; the neglected terms are third order in B_x and the chirp of the in-block phases
 * over the step.
 */
import { applyEigenExponential } from '../linalg/complex.js';
import { hermitianEigen, type HermitianEigen } from '../linalg/hermitian-eigen.js';
import type { FrameBlock } from './manifold-frame.js';

const TWO_PI = 2 * Math.PI;

class BlockScratch {
  readonly mr: Float64Array;
  readonly mi: Float64Array;
  readonly u: HermitianEigen;
  readonly q: HermitianEigen;
  readonly work: Float64Array;
  hasStart = false;
  constructor(readonly start: number, readonly size: number) {
    const m = size;
    this.mr = new Float64Array(m * m);
    this.mi = new Float64Array(m * m);
    this.u = { values: new Float64Array(m), vectorsRe: new Float64Array(m * m), vectorsIm: new Float64Array(m * m) };
    this.q = { values: new Float64Array(m), vectorsRe: new Float64Array(m * m), vectorsIm: new Float64Array(m * m) };
    this.work = new Float64Array(4 * m * m);
  }
}

/** Blocks up to this size are diagonalised from scratch (a warm start costs more than it saves). */
const WARM_START_MIN = 5;

export class BlockStepper {
  readonly d: number;
  private readonly blocks: BlockScratch[];
  private readonly blockOf: Int32Array;
  /** Full-space Q (block diagonal) and eigenvalues lambda of H_m, and their rates d lambda/dt. */
  private readonly lam: Float64Array;
  private readonly lamDot: Float64Array;
  /** Omega~ (D x D complex). */
  private readonly or: Float64Array;
  private readonly oi: Float64Array;
  /** Xm, Xd in Q's basis (D x D complex). */
  private readonly xmr: Float64Array;
  private readonly xmi: Float64Array;
  private readonly xdr: Float64Array;
  private readonly xdi: Float64Array;
  /** second time derivative of X (from the midpoint value), half of it enters as tau^2 / 2 */
  private readonly xcr: Float64Array;
  private readonly xci: Float64Array;
  private readonly qFullRe: Float64Array;
  private readonly qFullIm: Float64Array;
  private readonly tFull: Float64Array;
  /** Tables per pair: S0(w_pq), cos/sin(w_pq h/2). */
  private readonly s0: Float64Array;
  private readonly ch: Float64Array;
  private readonly sh: Float64Array;
  private readonly w: Float64Array;
  private readonly tr: Float64Array;
  private readonly ti: Float64Array;
  private readonly ur: Float64Array;
  private readonly ui: Float64Array;
  private readonly cr: Float64Array;
  private readonly ci: Float64Array;
  private readonly nr: Float64Array;
  private readonly ni: Float64Array;
  /** Whether the current step has an inter-manifold part. */
  private coupled = false;
  /**
   * In-block only: the blocks that carry amplitude (setActiveBlocks); the others are skipped.
   * Without coupling between blocks a block that starts at exactly zero stays exactly zero, so
   * skipping its exponential changes no number.
   */
  private active: Uint8Array | undefined;

  /**
   * `inBlockOnly`: skip the inter-manifold part (an approximation for fast scans; its effect on
   * the computational block is second order in B_x, ~1e-6 for typical ramps).
   */
  constructor(blocks: readonly FrameBlock[], d: number, private readonly inBlockOnly = false) {
    this.d = d;
    this.blocks = blocks.map((b) => new BlockScratch(b.start, b.size));
    this.blockOf = new Int32Array(d);
    blocks.forEach((b, i) => {
      for (let q = 0; q < b.size; q++) this.blockOf[b.start + q] = i;
    });
    const dd = d * d;
    this.lam = new Float64Array(d);
    this.lamDot = new Float64Array(d);
    this.or = new Float64Array(dd);
    this.oi = new Float64Array(dd);
    this.xmr = new Float64Array(dd);
    this.xmi = new Float64Array(dd);
    this.xdr = new Float64Array(dd);
    this.xdi = new Float64Array(dd);
    this.xcr = new Float64Array(dd);
    this.xci = new Float64Array(dd);
    this.qFullRe = new Float64Array(dd);
    this.qFullIm = new Float64Array(dd);
    this.tFull = new Float64Array(2 * dd);
    this.s0 = new Float64Array(dd);
    this.ch = new Float64Array(dd);
    this.sh = new Float64Array(dd);
    this.w = new Float64Array(dd);
    this.tr = new Float64Array(d);
    this.ti = new Float64Array(d);
    this.ur = new Float64Array(d);
    this.ui = new Float64Array(d);
    this.cr = new Float64Array(d);
    this.ci = new Float64Array(d);
    this.nr = new Float64Array(d);
    this.ni = new Float64Array(d);
  }

  /**
   * In-block only (ignored otherwise): propagate just the blocks flagged in `active` (one flag per
   * block); the caller guarantees the columns it applies are exactly zero on the others.
   */
  setActiveBlocks(active: Uint8Array | undefined): void {
    this.active = this.inBlockOnly ? active : undefined;
  }

  private skipped(bi: number): boolean {
    return this.active !== undefined && this.active[bi] === 0;
  }

  /** A hold of length dt with E (D x D, block diagonal): U = exp(-i 2 pi E dt), no coupling. */
  setHold(e: Float64Array, dt: number): void {
    const d = this.d;
    for (let bi = 0; bi < this.blocks.length; bi++) {
      const b = this.blocks[bi];
      if (this.skipped(bi)) continue;
      const m = b.size;
      for (let i = 0; i < m; i++)
        for (let j = 0; j < m; j++) {
          b.mr[i * m + j] = TWO_PI * dt * e[(b.start + i) * d + b.start + j];
          b.mi[i * m + j] = 0;
        }
      hermitianEigen(b.mr, b.mi, m, { out: b.u, sort: false, work: b.work });
      b.hasStart = false;
    }
    this.coupled = false;
  }

  /**
   * A Magnus step of length h from E and B (= (du/dt) A) at the two Gauss-Legendre nodes.
   * Arrays are D x D row-major; E block diagonal, B antisymmetric.
   */
  setStep(e1: Float64Array, e2: Float64Array, b1: Float64Array, b2: Float64Array, h: number, bMid?: Float64Array): void {
    const d = this.d;
    const c = (Math.sqrt(3) * h * h) / 12;
    const bo = this.blockOf;
    for (let bi = 0; bi < this.blocks.length; bi++) {
      const b = this.blocks[bi];
      if (this.skipped(bi)) continue;
      const m = b.size;
      const o = b.start;
      for (let i = 0; i < m; i++) {
        const n = o + i;
        for (let j = i; j < m; j++) {
          const k = o + j;
          let s1 = 0;
          let s2 = 0;
          let s3 = 0;
          for (let l = 0; l < m; l++) {
            const q = o + l;
            const e2nq = e2[n * d + q];
            const e1nq = e1[n * d + q];
            const b1nq = b1[n * d + q];
            const b2nq = b2[n * d + q];
            const e2qk = e2[q * d + k];
            const e1qk = e1[q * d + k];
            const b1qk = b1[q * d + k];
            const b2qk = b2[q * d + k];
            s1 += e2nq * b1qk - b1nq * e2qk + b2nq * e1qk - e1nq * b2qk;
            s2 += e2nq * e1qk - e1nq * e2qk;
            s3 += b2nq * b1qk - b1nq * b2qk;
          }
          const re = Math.PI * h * (e1[n * d + k] + e2[n * d + k]) - TWO_PI * c * s1;
          const im = -0.5 * h * (b1[n * d + k] + b2[n * d + k]) - 4 * Math.PI * Math.PI * c * s2 + c * s3;
          b.mr[i * m + j] = re;
          b.mr[j * m + i] = re;
          b.mi[i * m + j] = i === j ? 0 : im;
          b.mi[j * m + i] = i === j ? 0 : -im;
        }
      }
      const warm = b.hasStart && m >= WARM_START_MIN;
      hermitianEigen(b.mr, b.mi, m, { out: b.u, start: warm ? { re: b.u.vectorsRe, im: b.u.vectorsIm } : undefined, sort: false, work: b.work });
      b.hasStart = true;
      if (this.inBlockOnly) continue;
      // The interaction frame of the inter-manifold step uses H_m = M / h + O(h^2): the
      // eigenvectors of M serve (their O(h^2) difference enters only the small coupling terms).
      b.q.vectorsRe.set(b.u.vectorsRe);
      b.q.vectorsIm.set(b.u.vectorsIm);
      for (let i = 0; i < m; i++) this.lam[o + i] = b.u.values[i] / h;
      // d lambda_i/dt ~ 2 pi (Q^dag dE/dt Q)_ii, dE/dt = (E2 - E1) sqrt3 / h
      const kd = Math.sqrt(3) / h;
      for (let i = 0; i < m; i++) {
        let acc = 0;
        for (let r = 0; r < m; r++)
          for (let c2 = 0; c2 < m; c2++) {
            const de = (e2[(o + r) * d + o + c2] - e1[(o + r) * d + o + c2]) * kd;
            if (de === 0) continue;
            const qr1 = b.q.vectorsRe[r * m + i];
            const qi1 = b.q.vectorsIm[r * m + i];
            const qr2 = b.q.vectorsRe[c2 * m + i];
            const qi2 = b.q.vectorsIm[c2 * m + i];
            acc += de * (qr1 * qr2 + qi1 * qi2);
          }
        this.lamDot[o + i] = TWO_PI * acc;
      }
    }
    // Inter-manifold coupling in Q's basis: X = Q^dag (-i B_x) Q for off-block pairs.
    if (this.inBlockOnly) {
      this.coupled = false;
      return;
    }
    let any = false;
    for (let p = 0; p < d && !any; p++) for (let q = 0; q < d; q++) if (bo[p] !== bo[q] && (b1[p * d + q] !== 0 || b2[p * d + q] !== 0)) any = true;
    this.coupled = any;
    if (!this.coupled) return;
    const kd = Math.sqrt(3) / h; // 1 / (h (c2 - c1)) = 1 / (2 delta)
    const kc = 12 / (h * h); // 1 / delta^2, delta = h sqrt3 / 6 (second difference, halved below)
    const { xmr, xmi, xdr, xdi } = this;
    // X = Q^dag (-i B_x) Q for the mean, slope and curvature of B over the step (off-block
    // entries only), as T = B Q (sum over the block of the column) then Q^dag T (sum over the
    // block of the row): O(D^2 m) each.
    const bo2 = this.blockOf;
    const qr = this.qFullRe;
    const qi = this.qFullIm;
    qr.fill(0);
    qi.fill(0);
    for (const b of this.blocks) {
      const m = b.size;
      for (let r = 0; r < m; r++)
        for (let c = 0; c < m; c++) {
          qr[(b.start + r) * d + b.start + c] = b.q.vectorsRe[r * m + c];
          qi[(b.start + r) * d + b.start + c] = b.q.vectorsIm[r * m + c];
        }
    }
    const tr = this.tFull;
    for (let variant = 0; variant < 3; variant++) {
      // T[r][j] (complex, stored re then im) = sum_{s in block(j)} Bv[r][s] Q[s][j] for r outside block(j)
      for (let r = 0; r < d; r++) {
        for (let j = 0; j < d; j++) {
          if (bo2[r] === bo2[j]) continue;
          const blk = this.blocks[bo2[j]];
          let sr = 0;
          let si = 0;
          for (let s2 = blk.start; s2 < blk.start + blk.size; s2++) {
            const idx = r * d + s2;
            let bv: number;
            if (variant === 0) bv = bMid ? bMid[idx] : 0.5 * (b1[idx] + b2[idx]);
            else if (variant === 1) bv = (b2[idx] - b1[idx]) * kd;
            else bv = bMid ? (b1[idx] - 2 * bMid[idx] + b2[idx]) * kc : 0;
            sr += bv * qr[s2 * d + j];
            si += bv * qi[s2 * d + j];
          }
          tr[2 * (r * d + j)] = sr;
          tr[2 * (r * d + j) + 1] = si;
        }
      }
      const outR = variant === 0 ? xmr : variant === 1 ? xdr : this.xcr;
      const outI = variant === 0 ? xmi : variant === 1 ? xdi : this.xci;
      for (let i = 0; i < d; i++) {
        const blk = this.blocks[bo2[i]];
        for (let j = 0; j < d; j++) {
          if (bo2[i] === bo2[j]) continue;
          // sum_{r in block(i)} conj(Q[r][i]) (-i) T[r][j]
          let sr = 0;
          let si = 0;
          for (let r = blk.start; r < blk.start + blk.size; r++) {
            const ar = qr[r * d + i];
            const ai = -qi[r * d + i];
            const t1 = tr[2 * (r * d + j)];
            const t2 = tr[2 * (r * d + j) + 1];
            // (-i)(t1 + i t2) = t2 - i t1
            sr += ar * t2 + ai * t1;
            si += ai * t2 - ar * t1;
          }
          outR[i * d + j] = sr;
          outI[i * d + j] = si;
        }
      }
    }
    // Phase tables from one cos/sin per state (angle addition): w_pq = lambda_p - lambda_q.
    const lam = this.lam;
    const cl = this.cr;
    const sl = this.ci;
    for (let p = 0; p < d; p++) {
      cl[p] = Math.cos(0.5 * lam[p] * h);
      sl[p] = Math.sin(0.5 * lam[p] * h);
    }
    for (let p = 0; p < d; p++)
      for (let q = 0; q < d; q++) {
        const idx = p * d + q;
        const w = lam[p] - lam[q];
        const x = 0.5 * w * h;
        const cx = cl[p] * cl[q] + sl[p] * sl[q];
        const sx = sl[p] * cl[q] - cl[p] * sl[q];
        this.w[idx] = w;
        this.ch[idx] = cx;
        this.sh[idx] = sx;
        this.s0[idx] = Math.abs(x) < 1e-4 ? h * (1 - (x * x) / 6) : (2 * sx) / w;
      }
    const { or, oi } = this;
    for (let p = 0; p < d; p++) {
      for (let q = 0; q < d; q++) {
        const pq = p * d + q;
        let wr = 0;
        let wi = 0;
        if (bo[p] !== bo[q]) {
          // Omega1 = -i (Xm S0 + Xd S1), S1 = i s1 (s1 real)
          const w = this.w[pq];
          const x = 0.5 * w * h;
          const s1 = Math.abs(x) < 1e-3 ? ((w * h * h * h) / 12) * (1 - (w * h) ** 2 / 40) : (2 * this.sh[pq]) / (w * w) - (h * this.ch[pq]) / w;
          const s0 = this.s0[pq];
          // chirp of the phase over the step to first order: e^{i w' tau^2 / 2} ~ 1 + i w' tau^2 / 2
          const wd = this.lamDot[p] - this.lamDot[q];
          const s2 = Math.abs(x) < 1e-2 ? ((h * h * h) / 12) * (1 - (3 * x * x) / 10) : (2 * ((x * x - 2) * this.sh[pq] + 2 * x * this.ch[pq])) / (w * w * w);
          const c2 = 0.5 * wd * s2;
          // + (1/2) X'' S2 (curvature of the coupling over the step)
          const tr = xmr[pq] * s0 - xdi[pq] * s1 - xmi[pq] * c2 + 0.5 * this.xcr[pq] * s2;
          const ti = xmi[pq] * s0 + xdr[pq] * s1 + xmr[pq] * c2 + 0.5 * this.xci[pq] * s2;
          wr = ti;
          wi = -tr;
        }
        if (bo[p] === bo[q]) {
          // Omega2 (same block: the secular second-order part; across blocks it is third order in effect).
          let sr = 0;
          let si = 0;
          for (let r = 0; r < d; r++) {
            if (bo[r] === bo[p] || bo[r] === bo[q]) continue;
            const pr = p * d + r;
            const rq = r * d + q;
            const ar = xmr[pr] * xmr[rq] - xmi[pr] * xmi[rq];
            const ai = xmr[pr] * xmi[rq] + xmi[pr] * xmr[rq];
            if (ar === 0 && ai === 0) continue;
            this.ordered(pq, pr, rq, h);
            const i1r = this.ir;
            const i1i = this.ii;
            this.ordered(pq, rq, pr, h);
            const dr = i1r - this.ir;
            const di = i1i - this.ii;
            sr += ar * dr - ai * di;
            si += ar * di + ai * dr;
          }
          wr += -0.5 * sr;
          wi += -0.5 * si;
        }
        // Omega~ = e^{i theta_pq} Omega with theta_pq = (phase of W = U_in(h/2))_pq:
        // w_pq h/2 - w'_pq h^2/8 (the in-block phases advance with their chirp over the first half).
        const chirp = ((this.lamDot[p] - this.lamDot[q]) * h * h) / 8;
        const cc0 = this.ch[pq];
        const ss0 = this.sh[pq];
        const cch = Math.cos(chirp);
        const sch = Math.sin(chirp);
        const cc = cc0 * cch + ss0 * sch;
        const ss = ss0 * cch - cc0 * sch;
        or[pq] = cc * wr - ss * wi;
        oi[pq] = ss * wr + cc * wi;
      }
    }
  }

  private ir = 0;
  private ii = 0;

  /**
   * I(a, b) = int_{-h/2}^{h/2} dt1 int_{-h/2}^{t1} dt2 e^{i a t1 + i b t2} with a = w[ia], b = w[ib]
   * and a + b = w[isum]: [S0(a+b) - e^{-i b h/2} S0(a)] / (i b); result in (ir, ii).
   */
  private ordered(isum: number, ia: number, ib: number, h: number): void {
    const b = this.w[ib];
    const s0sum = this.s0[isum];
    const s0a = this.s0[ia];
    if (Math.abs(b * h) < 1e-4) {
      // b -> 0: int e^{i a t1} (t1 + h/2) dt1 = S1(a) + (h/2) S0(a)
      const a = this.w[ia];
      const x = 0.5 * a * h;
      this.ir = 0.5 * h * s0a;
      this.ii = Math.abs(x) < 1e-3 ? (a * h * h * h) / 12 : (2 * this.sh[ia]) / (a * a) - (h * this.ch[ia]) / a;
      return;
    }
    // e^{-i b h/2} = cos - i sin;  (nr + i ni) / (i b) = (ni - i nr) / b
    const nr = s0sum - this.ch[ib] * s0a;
    const ni = this.sh[ib] * s0a;
    this.ir = ni / b;
    this.ii = -nr / b;
  }

  /** x <- U(h) x for one column (re, im of length D). */
  apply(re: Float64Array, im: Float64Array): void {
    const d = this.d;
    const { tr, ti, ur, ui } = this;
    if (this.coupled) {
      // y = Q^dag x
      for (const b of this.blocks) {
        const m = b.size;
        for (let i = 0; i < m; i++) {
          let sr = 0;
          let si = 0;
          for (let r = 0; r < m; r++) {
            const qr = b.q.vectorsRe[r * m + i];
            const qi = -b.q.vectorsIm[r * m + i];
            const xr = re[b.start + r];
            const xi = im[b.start + r];
            sr += qr * xr - qi * xi;
            si += qr * xi + qi * xr;
          }
          tr[b.start + i] = sr;
          ti[b.start + i] = si;
        }
      }
      // y <- exp(Omega~) y  (Taylor: y + O y + O^2 y / 2 + O^3 y / 6)
      const or = this.or;
      const oi = this.oi;
      let cr = this.cr;
      let ci = this.ci;
      let nr = this.nr;
      let ni = this.ni;
      cr.set(tr);
      ci.set(ti);
      for (let k = 1; k <= 3; k++) {
        for (let p = 0; p < d; p++) {
          let sr = 0;
          let si = 0;
          for (let q = 0; q < d; q++) {
            const a = or[p * d + q];
            const bq = oi[p * d + q];
            sr += a * cr[q] - bq * ci[q];
            si += a * ci[q] + bq * cr[q];
          }
          nr[p] = sr / k;
          ni[p] = si / k;
        }
        for (let p = 0; p < d; p++) {
          tr[p] += nr[p];
          ti[p] += ni[p];
        }
        const xr = cr;
        const xi = ci;
        cr = nr;
        ci = ni;
        nr = xr;
        ni = xi;
      }
      // x = Q y
      for (const b of this.blocks) {
        const m = b.size;
        for (let r = 0; r < m; r++) {
          let sr = 0;
          let si = 0;
          for (let i = 0; i < m; i++) {
            const qr = b.q.vectorsRe[r * m + i];
            const qi = b.q.vectorsIm[r * m + i];
            const yr = tr[b.start + i];
            const yi = ti[b.start + i];
            sr += qr * yr - qi * yi;
            si += qr * yi + qi * yr;
          }
          re[b.start + r] = sr;
          im[b.start + r] = si;
        }
      }
    }
    // x <- U_in x per block: V e^{-i w} V^dag x
    for (let bi = 0; bi < this.blocks.length; bi++) {
      if (this.skipped(bi)) continue;
      const b = this.blocks[bi];
      applyEigenExponential(b.u.vectorsRe, b.u.vectorsIm, b.u.values, b.size, re, im, ur, ui, b.start);
    }
  }
}
