/**
 * Eigen-decomposition of a dense complex Hermitian matrix by the cyclic complex Jacobi method
 * (each step removes the phase of A_pq and applies a real Jacobi rotation; Golub and Van Loan,
 * Matrix Computations, 4th ed., sec. 8.5, extended to Hermitian matrices as in Forsythe and
 * Henrici, Trans. AMS 94, 1 (1960)).
 *
 *     A = V diag(w) V^H,   V unitary, w real ascending.
 *
 * A is given as separate real and imaginary parts, row-major n x n (re[i*n+j] + i im[i*n+j]);
 * only read. V is returned the same way (column k is the eigenvector of w[k]).
 * Optional `start`: a unitary guess for V (e.g. the eigenvectors of a nearby matrix); the method
 * then rotates V^H A V, which converges in one or two sweeps when the guess is good.
 *
 * Accuracy: eigenvalues to a few ulp of ||A||; V unitary to ~n ulp.
 * @throws RangeError on bad sizes or if 100 sweeps do not converge (not observed).
 */
export interface HermitianEigen {
  values: Float64Array;
  vectorsRe: Float64Array;
  vectorsIm: Float64Array;
}

export function hermitianEigen(
  re: ArrayLike<number>,
  im: ArrayLike<number>,
  n: number,
  options: {
    out?: HermitianEigen;
    start?: { re: ArrayLike<number>; im: ArrayLike<number> };
    sort?: boolean;
    /** Scratch of at least 4 n^2 numbers (avoids allocation in hot loops). */
    work?: Float64Array;
  } = {},
): HermitianEigen {
  if (!(n >= 1) || re.length < n * n || im.length < n * n) throw new RangeError(`hermitianEigen: bad sizes (n=${n})`);
  const out = options.out ?? { values: new Float64Array(n), vectorsRe: new Float64Array(n * n), vectorsIm: new Float64Array(n * n) };
  if (n === 1) {
    out.values[0] = re[0];
    out.vectorsRe[0] = 1;
    out.vectorsIm[0] = 0;
    return out;
  }
  const nn = n * n;
  const work = options.work && options.work.length >= 4 * nn ? options.work : new Float64Array(4 * nn);
  const ar = work.subarray(0, nn);
  const ai = work.subarray(nn, 2 * nn);
  const vr = out.vectorsRe;
  const vi = out.vectorsIm;
  if (options.start) {
    // ar + i ai = S^H A S
    const sr = options.start.re;
    const si = options.start.im;
    const tr = work.subarray(2 * nn, 3 * nn);
    const ti = work.subarray(3 * nn, 4 * nn);
    // T = A S
    for (let i = 0; i < n; i++)
      for (let k = 0; k < n; k++) {
        let xr = 0;
        let xi = 0;
        for (let j = 0; j < n; j++) {
          const a1 = re[i * n + j];
          const a2 = im[i * n + j];
          const b1 = sr[j * n + k];
          const b2 = si[j * n + k];
          xr += a1 * b1 - a2 * b2;
          xi += a1 * b2 + a2 * b1;
        }
        tr[i * n + k] = xr;
        ti[i * n + k] = xi;
      }
    // S^H T
    for (let i = 0; i < n; i++)
      for (let k = 0; k < n; k++) {
        let xr = 0;
        let xi = 0;
        for (let j = 0; j < n; j++) {
          const a1 = sr[j * n + i];
          const a2 = -si[j * n + i];
          const b1 = tr[j * n + k];
          const b2 = ti[j * n + k];
          xr += a1 * b1 - a2 * b2;
          xi += a1 * b2 + a2 * b1;
        }
        ar[i * n + k] = xr;
        ai[i * n + k] = xi;
      }
    // Restore exact Hermiticity.
    for (let i = 0; i < n; i++) {
      ai[i * n + i] = 0;
      for (let k = i + 1; k < n; k++) {
        const xr = 0.5 * (ar[i * n + k] + ar[k * n + i]);
        const xi = 0.5 * (ai[i * n + k] - ai[k * n + i]);
        ar[i * n + k] = xr;
        ar[k * n + i] = xr;
        ai[i * n + k] = xi;
        ai[k * n + i] = -xi;
      }
    }
    for (let i = 0; i < n * n; i++) {
      vr[i] = sr[i];
      vi[i] = si[i];
    }
  } else {
    for (let i = 0; i < n * n; i++) {
      ar[i] = re[i];
      ai[i] = im[i];
    }
    for (let i = 0; i < n; i++) ai[i * n + i] = 0;
    vr.fill(0);
    vi.fill(0);
    for (let i = 0; i < n; i++) vr[i * n + i] = 1;
  }
  complexJacobiSweeps(ar, ai, vr, vi, n);
  const w = out.values;
  for (let i = 0; i < n; i++) w[i] = ar[i * n + i];
  if (options.sort !== false) sortHermitianEigenpairs(w, vr, vi, n);
  return out;
}

/** In-place complex Jacobi sweeps on Hermitian (ar + i ai), accumulating V = (vr + i vi). */
export function complexJacobiSweeps(ar: Float64Array, ai: Float64Array, vr: Float64Array, vi: Float64Array, n: number): void {
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    let diag = 0;
    for (let p = 0; p < n; p++) {
      diag += ar[p * n + p] * ar[p * n + p];
      for (let q = p + 1; q < n; q++) off += ar[p * n + q] * ar[p * n + q] + ai[p * n + q] * ai[p * n + q];
    }
    if (off === 0 || off <= 1e-34 * diag) return;
    let rotated = false;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        const zr = ar[p * n + q];
        const zi = ai[p * n + q];
        const r = Math.sqrt(zr * zr + zi * zi);
        if (r === 0) continue;
        const app = ar[p * n + p];
        const aqq = ar[q * n + q];
        if (r < 1e-18 * (Math.abs(app) + Math.abs(aqq))) {
          ar[p * n + q] = 0;
          ai[p * n + q] = 0;
          ar[q * n + p] = 0;
          ai[q * n + p] = 0;
          continue;
        }
        rotated = true;
        const er = zr / r; // e^{i theta}
        const ei = zi / r;
        const theta = (aqq - app) / (2 * r);
        const t = (theta >= 0 ? 1 : -1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        // V = [[c, s e^{i th}], [-s e^{-i th}, c]] on (p, q).
        const spr = s * er; // s e^{i th}
        const spi = s * ei;
        ar[p * n + p] = app - t * r;
        ar[q * n + q] = aqq + t * r;
        ar[p * n + q] = 0;
        ai[p * n + q] = 0;
        ar[q * n + p] = 0;
        ai[q * n + p] = 0;
        for (let k = 0; k < n; k++) {
          if (k === p || k === q) continue;
          const kpr = ar[k * n + p];
          const kpi = ai[k * n + p];
          const kqr = ar[k * n + q];
          const kqi = ai[k * n + q];
          // A_kp' = c A_kp - s e^{-i th} A_kq ; A_kq' = s e^{i th} A_kp + c A_kq
          const npr = c * kpr - (spr * kqr + spi * kqi);
          const npi = c * kpi - (spr * kqi - spi * kqr);
          const nqr = spr * kpr - spi * kpi + c * kqr;
          const nqi = spr * kpi + spi * kpr + c * kqi;
          ar[k * n + p] = npr;
          ai[k * n + p] = npi;
          ar[p * n + k] = npr;
          ai[p * n + k] = -npi;
          ar[k * n + q] = nqr;
          ai[k * n + q] = nqi;
          ar[q * n + k] = nqr;
          ai[q * n + k] = -nqi;
        }
        for (let k = 0; k < n; k++) {
          const kpr = vr[k * n + p];
          const kpi = vi[k * n + p];
          const kqr = vr[k * n + q];
          const kqi = vi[k * n + q];
          vr[k * n + p] = c * kpr - (spr * kqr + spi * kqi);
          vi[k * n + p] = c * kpi - (spr * kqi - spi * kqr);
          vr[k * n + q] = spr * kpr - spi * kpi + c * kqr;
          vi[k * n + q] = spr * kpi + spi * kpr + c * kqi;
        }
      }
    }
    if (!rotated) return;
  }
  throw new RangeError('hermitianEigen: Jacobi did not converge');
}

function sortHermitianEigenpairs(w: Float64Array, vr: Float64Array, vi: Float64Array, n: number): void {
  for (let i = 0; i < n - 1; i++) {
    let k = i;
    for (let j = i + 1; j < n; j++) if (w[j] < w[k]) k = j;
    if (k !== i) {
      const t = w[i];
      w[i] = w[k];
      w[k] = t;
      for (let r = 0; r < n; r++) {
        let x = vr[r * n + i];
        vr[r * n + i] = vr[r * n + k];
        vr[r * n + k] = x;
        x = vi[r * n + i];
        vi[r * n + i] = vi[r * n + k];
        vi[r * n + k] = x;
      }
    }
  }
}
