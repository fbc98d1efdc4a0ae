import { describe, expect, it } from 'vitest';
import { complex, expm, matrix, multiply, type Matrix } from 'mathjs';
import { applyEigenExponential, complexMatVec } from '../../src/linalg/complex.js';
import { hermitianEigen } from '../../src/linalg/hermitian-eigen.js';
import { Random } from '../../src/util/random.js';

describe('complex helpers', () => {
  it('applyEigenExponential(eig(M), x) = expm(-i M) x (mathjs expm as the reference, 1e-12)', () => {
    const rng = new Random(5);
    for (const n of [1, 3, 6]) {
      const re = new Float64Array(n * n);
      const im = new Float64Array(n * n);
      for (let i = 0; i < n; i++)
        for (let j = i; j < n; j++) {
          const a = rng.normal();
          const b = i === j ? 0 : rng.normal();
          re[i * n + j] = a;
          re[j * n + i] = a;
          im[i * n + j] = b;
          im[j * n + i] = -b;
        }
      const eig = hermitianEigen(re, im, n);
      const xr = Float64Array.from({ length: n }, () => rng.normal());
      const xi = Float64Array.from({ length: n }, () => rng.normal());
      const yr = Float64Array.from(xr);
      const yi = Float64Array.from(xi);
      applyEigenExponential(eig.vectorsRe, eig.vectorsIm, eig.values, n, yr, yi, new Float64Array(n), new Float64Array(n));
      // mathjs: expm(-i M) x
      const M = matrix(Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => complex(im[i * n + j], -re[i * n + j]))));
      const E = expm(M) as Matrix;
      const x = matrix(Array.from({ length: n }, (_, i) => [complex(xr[i], xi[i])]));
      const y = (multiply(E, x) as Matrix).toArray() as unknown as { re: number; im: number }[][];
      for (let i = 0; i < n; i++) {
        expect(Math.abs(y[i][0].re - yr[i])).toBeLessThan(1e-12);
        expect(Math.abs(y[i][0].im - yi[i])).toBeLessThan(1e-12);
      }
    }
  });

  it('complexMatVec multiplies like mathjs', () => {
    const ar = Float64Array.from([1, 2, 3, 4, 5, 6]);
    const ai = Float64Array.from([0.5, -1, 0, 2, 1, -0.5]);
    const yr = new Float64Array(2);
    const yi = new Float64Array(2);
    complexMatVec(ar, ai, 2, 3, [1, 0, -1], [0, 1, 2], yr, yi);
    const A = matrix([[complex(1, 0.5), complex(2, -1), complex(3, 0)], [complex(4, 2), complex(5, 1), complex(6, -0.5)]]);
    const y = (multiply(A, matrix([[complex(1, 0)], [complex(0, 1)], [complex(-1, 2)]])) as Matrix).toArray() as unknown as { re: number; im: number }[][];
    for (let i = 0; i < 2; i++) {
      expect(yr[i]).toBeCloseTo(y[i][0].re, 14);
      expect(yi[i]).toBeCloseTo(y[i][0].im, 14);
    }
  });
});
