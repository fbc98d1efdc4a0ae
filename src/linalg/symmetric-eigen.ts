/**
 * Eigen-decomposition of a dense real symmetric matrix by the cyclic Jacobi method with
 * threshold (Rutishauser, "The Jacobi method for real symmetric matrices", Numer. Math. 9, 1
 * (1966); Golub and Van Loan, Matrix Computations, 4th ed., sec. 8.5).
 *
 *     A = V diag(w) V^T,   V orthogonal, w ascending.
 *
 * A is n x n, row-major, only read (a copy is rotated). Cost about 6-10 sweeps of 3 n^3 flops;
 * fast for the small matrices of coupled transmons (n <= ~60), quadratically convergent, and
 * accurate to a few ulp of ||A|| in eigenvalues. The columns of V (V[i*n + k] = component i of
 * eigenvector k) are orthonormal to ~n ulp.
 *
 * @throws RangeError on bad sizes or if 100 sweeps do not converge (not observed).
 */
export interface SymmetricEigen {
  values: Float64Array;
  /** Row-major n x n; column k is the eigenvector of values[k]. */
  vectors: Float64Array;
}

export function symmetricEigen(a: ArrayLike<number>, n: number, out?: SymmetricEigen, scratch?: Float64Array): SymmetricEigen {
  if (!(n >= 1) || a.length < n * n) throw new RangeError(`symmetricEigen: bad sizes (n=${n}, a=${a.length})`);
  const m = scratch && scratch.length >= n * n ? scratch : new Float64Array(n * n);
  for (let i = 0; i < n * n; i++) m[i] = a[i];
  const v = out?.vectors ?? new Float64Array(n * n);
  const w = out?.values ?? new Float64Array(n);
  v.fill(0);
  for (let i = 0; i < n; i++) v[i * n + i] = 1;
  jacobiSweeps(m, v, n);
  for (let i = 0; i < n; i++) w[i] = m[i * n + i];
  sortEigenpairs(w, v, n);
  return { values: w, vectors: v };
}

/** Rotate the symmetric matrix m (in place) towards diagonal form, accumulating rotations in v. */
export function jacobiSweeps(m: Float64Array, v: Float64Array, n: number): void {
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    let diag = 0;
    for (let p = 0; p < n; p++) {
      diag += m[p * n + p] * m[p * n + p];
      for (let q = p + 1; q < n; q++) off += m[p * n + q] * m[p * n + q];
    }
    if (off === 0 || off <= 1e-34 * diag) return;
    let rotated = false;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        const apq = m[p * n + q];
        if (apq === 0) continue;
        const app = m[p * n + p];
        const aqq = m[q * n + q];
        // Skip negligible elements (they would not change the diagonal in floating point).
        if (Math.abs(apq) < 1e-18 * (Math.abs(app) + Math.abs(aqq))) {
          m[p * n + q] = 0;
          m[q * n + p] = 0;
          continue;
        }
        rotated = true;
        const theta = (aqq - app) / (2 * apq);
        const t = (theta >= 0 ? 1 : -1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        m[p * n + p] = app - t * apq;
        m[q * n + q] = aqq + t * apq;
        m[p * n + q] = 0;
        m[q * n + p] = 0;
        for (let k = 0; k < n; k++) {
          if (k === p || k === q) continue;
          const akp = m[k * n + p];
          const akq = m[k * n + q];
          const nkp = c * akp - s * akq;
          const nkq = s * akp + c * akq;
          m[k * n + p] = nkp;
          m[p * n + k] = nkp;
          m[k * n + q] = nkq;
          m[q * n + k] = nkq;
        }
        for (let k = 0; k < n; k++) {
          const vkp = v[k * n + p];
          const vkq = v[k * n + q];
          v[k * n + p] = c * vkp - s * vkq;
          v[k * n + q] = s * vkp + c * vkq;
        }
      }
    }
    if (!rotated) return;
  }
  throw new RangeError('symmetricEigen: Jacobi did not converge');
}

/** Sort eigenvalues ascending and permute the columns of v (row-major n x n) alike. */
export function sortEigenpairs(w: Float64Array, v: Float64Array, n: number): void {
  for (let i = 0; i < n - 1; i++) {
    let k = i;
    for (let j = i + 1; j < n; j++) if (w[j] < w[k]) k = j;
    if (k !== i) {
      const t = w[i];
      w[i] = w[k];
      w[k] = t;
      for (let r = 0; r < n; r++) {
        const x = v[r * n + i];
        v[r * n + i] = v[r * n + k];
        v[r * n + k] = x;
      }
    }
  }
}
