/**
 * Gauss-Hermite quadrature for the expectation over a normal variable (the "probabilists'"
 * weight exp(-x^2 / 2) / sqrt(2 pi)):
 *
 *     E[f(X)], X ~ N(0, sigma^2)  ~  sum_k w_k f(sigma x_k),   sum_k w_k = 1,
 *
 * exact for polynomials of degree <= 2n - 1. Nodes and weights by the Golub-Welsch algorithm
 * (Golub and Welsch, Math. Comp. 23, 221 (1969)): the nodes are the eigenvalues of the Jacobi
 * matrix of the monic Hermite polynomials He_k (diagonal 0, off-diagonal sqrt(k)), the weights
 * the squared first components of its normalised eigenvectors. Checked against NumPy's
 * numpy.polynomial.hermite_e.hermegauss (test/budget/gauss-hermite.test.ts).
 *
 * n = 3: nodes 0, +-sqrt(3), weights 2/3, 1/6, 1/6.
 */
import { symmetricEigen } from '../linalg/symmetric-eigen.js';

export interface QuadratureRule {
  /** Nodes in units of sigma, ascending. */
  nodes: Float64Array;
  /** Weights summing to 1. */
  weights: Float64Array;
}

const cache = new Map<number, QuadratureRule>();

/** The n-point rule (1 <= n <= 40), cached. */
export function gaussHermiteRule(n: number): QuadratureRule {
  if (!(Number.isInteger(n) && n >= 1 && n <= 40)) throw new RangeError(`gaussHermiteRule: n must be an integer in [1, 40], got ${n}`);
  const hit = cache.get(n);
  if (hit) return hit;
  const j = new Float64Array(n * n);
  for (let k = 1; k < n; k++) {
    j[(k - 1) * n + k] = Math.sqrt(k);
    j[k * n + k - 1] = Math.sqrt(k);
  }
  const eig = symmetricEigen(j, n);
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    nodes[k] = eig.values[k];
    weights[k] = eig.vectors[k] * eig.vectors[k];
  }
  // symmetry: exact zero in the middle of odd rules, mirrored nodes and weights
  for (let k = 0; k < n >> 1; k++) {
    const x = 0.5 * (nodes[n - 1 - k] - nodes[k]);
    const w = 0.5 * (weights[k] + weights[n - 1 - k]);
    nodes[k] = -x;
    nodes[n - 1 - k] = x;
    weights[k] = w;
    weights[n - 1 - k] = w;
  }
  if (n % 2 === 1) nodes[n >> 1] = 0;
  let s = 0;
  for (let k = 0; k < n; k++) s += weights[k];
  for (let k = 0; k < n; k++) weights[k] /= s;
  const rule = { nodes, weights };
  cache.set(n, rule);
  return rule;
}

/** E[f(X)] for X ~ N(0, sigma^2) by the n-point rule. */
export function normalExpectation(f: (x: number) => number, sigma: number, n: number): number {
  const { nodes, weights } = gaussHermiteRule(n);
  let s = 0;
  for (let k = 0; k < n; k++) s += weights[k] * f(sigma * nodes[k]);
  return s;
}
