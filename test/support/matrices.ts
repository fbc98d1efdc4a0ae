/** Seeded test matrices for the eigen-solver tests (row-major Float64Array). */
import { Random } from '../../src/util/random.js';

export interface Tridiagonal {
  d: Float64Array;
  e: Float64Array;
  n: number;
}

/** Diagonal and off-diagonal uniform in [-scale, scale). */
export function randomTridiagonal(rng: Random, n: number, scale = 1): Tridiagonal {
  const d = new Float64Array(n);
  const e = new Float64Array(Math.max(n - 1, 0));
  for (let i = 0; i < n; i++) d[i] = rng.between(-scale, scale);
  for (let i = 0; i < n - 1; i++) e[i] = rng.between(-scale, scale);
  return { d, e, n };
}

/** The full (2N+1) charge-basis transmon matrix: diagonal 4 E_C (n - n_g)^2, off-diagonal -E_J/2. */
export function transmonTridiagonal(ec: number, ej: number, nCut: number, ng = 0): Tridiagonal {
  const n = 2 * nCut + 1;
  const d = new Float64Array(n);
  const e = new Float64Array(n - 1);
  for (let j = 0; j < n; j++) d[j] = 4 * ec * (j - nCut - ng) ** 2;
  e.fill(-ej / 2);
  return { d, e, n };
}

/** Wilkinson's W_n^+ (d_i = |i - (n-1)/2|, e = 1): pairs of nearly equal eigenvalues. */
export function wilkinsonPlus(n: number): Tridiagonal {
  const d = new Float64Array(n);
  const e = new Float64Array(n - 1).fill(1);
  for (let i = 0; i < n; i++) d[i] = Math.abs(i - (n - 1) / 2);
  return { d, e, n };
}

export function tridiagonalToDense(t: Tridiagonal): Float64Array {
  const a = new Float64Array(t.n * t.n);
  for (let i = 0; i < t.n; i++) {
    a[i * t.n + i] = t.d[i];
    if (i < t.n - 1) {
      a[i * t.n + i + 1] = t.e[i];
      a[(i + 1) * t.n + i] = t.e[i];
    }
  }
  return a;
}

/** Symmetric with entries uniform in [-scale, scale). */
export function randomSymmetric(rng: Random, n: number, scale = 1): Float64Array {
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = i; j < n; j++) {
      const x = rng.between(-scale, scale);
      a[i * n + j] = x;
      a[j * n + i] = x;
    }
  return a;
}

/** Hermitian: real part symmetric, imaginary part antisymmetric with zero diagonal. */
export function randomHermitian(rng: Random, n: number, scale = 1): { re: Float64Array; im: Float64Array } {
  const re = new Float64Array(n * n);
  const im = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = i; j < n; j++) {
      const x = rng.between(-scale, scale);
      re[i * n + j] = x;
      re[j * n + i] = x;
      if (j > i) {
        const y = rng.between(-scale, scale);
        im[i * n + j] = y;
        im[j * n + i] = -y;
      }
    }
  return { re, im };
}

/** Infinity norm of a dense n x n matrix. */
export function normInf(a: ArrayLike<number>, n: number): number {
  let best = 0;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += Math.abs(a[i * n + j]);
    best = Math.max(best, s);
  }
  return best;
}

/**
 * Largest entry of A V - V diag(w) (`residual`) and of V^T V - I (`orthogonality`) for an
 * eigen-decomposition with V row-major, column k the vector of w[k].
 */
export function eigenResiduals(a: ArrayLike<number>, n: number, w: ArrayLike<number>, v: ArrayLike<number>): { residual: number; orthogonality: number } {
  let residual = 0;
  let orthogonality = 0;
  for (let i = 0; i < n; i++)
    for (let k = 0; k < n; k++) {
      let av = 0;
      for (let j = 0; j < n; j++) av += a[i * n + j] * v[j * n + k];
      residual = Math.max(residual, Math.abs(av - v[i * n + k] * w[k]));
      let g = 0;
      for (let j = 0; j < n; j++) g += v[j * n + i] * v[j * n + k];
      orthogonality = Math.max(orthogonality, Math.abs(g - (i === k ? 1 : 0)));
    }
  return { residual, orthogonality };
}

/** I + u u^T with u uniform in [-1, 1): eigenvalue 1 with multiplicity n - 1 (a degenerate case). */
export function identityPlusRankOne(rng: Random, n: number): Float64Array {
  const a = new Float64Array(n * n);
  const u = Array.from({ length: n }, () => rng.between(-1, 1));
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) a[i * n + j] = (i === j ? 1 : 0) + u[i] * u[j];
  return a;
}
