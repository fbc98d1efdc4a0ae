import { describe, expect, it } from 'vitest';
import { conditionalPhase, gateMetrics, leakage, optimalVirtualZ, wrapAngle, type Block4 } from '../../src/sim/gate-metrics.js';
import { Random } from '../../src/util/random.js';
import { expectClose } from '../support/close.js';

function diag(phases: number[], scale = 1): Block4 {
  const re = new Float64Array(16);
  const im = new Float64Array(16);
  phases.forEach((p, k) => {
    re[k * 5] = scale * Math.cos(p);
    im[k * 5] = scale * Math.sin(p);
  });
  return { re, im };
}

/** A random 4 x 4 unitary (QR of a Gaussian matrix, modified Gram-Schmidt). */
function randomUnitary(rng: Random): Block4 {
  const re = new Float64Array(16);
  const im = new Float64Array(16);
  for (let i = 0; i < 16; i++) {
    re[i] = rng.normal();
    im[i] = rng.normal();
  }
  for (let c = 0; c < 4; c++) {
    for (let p = 0; p < c; p++) {
      let dr = 0;
      let di = 0;
      for (let r = 0; r < 4; r++) {
        dr += re[r * 4 + p] * re[r * 4 + c] + im[r * 4 + p] * im[r * 4 + c];
        di += re[r * 4 + p] * im[r * 4 + c] - im[r * 4 + p] * re[r * 4 + c];
      }
      for (let r = 0; r < 4; r++) {
        re[r * 4 + c] -= dr * re[r * 4 + p] - di * im[r * 4 + p];
        im[r * 4 + c] -= dr * im[r * 4 + p] + di * re[r * 4 + p];
      }
    }
    let n = 0;
    for (let r = 0; r < 4; r++) n += re[r * 4 + c] ** 2 + im[r * 4 + c] ** 2;
    n = Math.sqrt(n);
    for (let r = 0; r < 4; r++) {
      re[r * 4 + c] /= n;
      im[r * 4 + c] /= n;
    }
  }
  return { re, im };
}

/**
 * The 20 states of the five mutually unbiased bases of C^4 (computational basis and the four
 * built from Z4 Galois-field phases) form a complex projective 2-design (Klappenecker and
 * Roetteler, "Mutually unbiased bases are complex projective 2-designs", ISIT 2005), so the
 * average of |<psi|V^dag M|psi>|^2 over them equals the Haar average: an outside check of the
 * fidelity formula of Pedersen, Moller and Molmer (PLA 367, 47 (2007)).
 * MUBs for d = 4 = 2 x 2 from the tensor products of single-qubit MUBs are not complete; we use
 * the standard construction for two qubits: the eigenbases of the five commuting classes
 * {ZI, IZ, ZZ}, {XI, IX, XX}, {YI, IY, YY}, {XZ, ZY, YX}, {YZ, ZX, XY}.
 */
function mubStates(): { re: number[]; im: number[] }[] {
  type C = [number, number];
  const I: C[][] = [[[1, 0], [0, 0]], [[0, 0], [1, 0]]];
  const X: C[][] = [[[0, 0], [1, 0]], [[1, 0], [0, 0]]];
  const Y: C[][] = [[[0, 0], [0, -1]], [[0, 1], [0, 0]]];
  const Z: C[][] = [[[1, 0], [0, 0]], [[0, 0], [-1, 0]]];
  const kron = (a: C[][], b: C[][]): C[][] => {
    const out: C[][] = Array.from({ length: 4 }, () => Array.from({ length: 4 }, () => [0, 0] as C));
    for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) for (let k = 0; k < 2; k++) for (let l = 0; l < 2; l++) {
      const [ar, ai] = a[i][j];
      const [br, bi] = b[k][l];
      out[2 * i + k][2 * j + l] = [ar * br - ai * bi, ar * bi + ai * br];
    }
    return out;
  };
  const classes = [
    [kron(Z, I), kron(I, Z)],
    [kron(X, I), kron(I, X)],
    [kron(Y, I), kron(I, Y)],
    [kron(X, Z), kron(Z, Y)],
    [kron(Y, Z), kron(Z, X)],
  ];
  const states: { re: number[]; im: number[] }[] = [];
  for (const [p, q] of classes) {
    // Common eigenvectors: project random vectors onto each joint eigenspace (s1, s2) = (+-1, +-1).
    for (const s1 of [1, -1]) for (const s2 of [1, -1]) {
      // P = (1 + s1 p)(1 + s2 q) / 4 applied to the basis vector that gives the largest norm.
      let best: { re: number[]; im: number[]; n: number } | undefined;
      for (let e = 0; e < 4; e++) {
        const v: C[] = Array.from({ length: 4 }, (_, i) => [i === e ? 1 : 0, 0] as C);
        const apply = (m: C[][], x: C[], s: number): C[] =>
          x.map((_, i) => {
            let r = x[i][0];
            let im = x[i][1];
            for (let j = 0; j < 4; j++) {
              r += s * (m[i][j][0] * x[j][0] - m[i][j][1] * x[j][1]);
              im += s * (m[i][j][0] * x[j][1] + m[i][j][1] * x[j][0]);
            }
            return [r / 2, im / 2] as C;
          });
        const w = apply(q, apply(p, v, s1), s2);
        const n = Math.sqrt(w.reduce((acc, [a, b]) => acc + a * a + b * b, 0));
        if (!best || n > best.n) best = { re: w.map((z) => z[0] / n), im: w.map((z) => z[1] / n), n };
      }
      states.push({ re: best!.re, im: best!.im });
    }
  }
  return states;
}

describe('gate metrics (README physics conventions sec. 3)', () => {
  it('CZ itself has phi_c = pi, no leakage, fidelity 1', () => {
    const m = diag([0, 0, 0, Math.PI]);
    const g = gateMetrics(m);
    expectClose(Math.abs(g.conditionalPhase), Math.PI, 1e-15, 'phi_c');
    expectClose(g.leakage, 0, 1e-15, 'leakage');
    expectClose(g.fidelity, 1, 1e-15, 'fidelity');
  });

  it('optimalVirtualZ recovers single-qubit phases: CZ followed by phases a on A and b on B', () => {
    const rng = new Random(7);
    for (let t = 0; t < 20; t++) {
      const a = rng.between(-3, 3);
      const b = rng.between(-3, 3);
      const g = rng.between(-3, 3);
      const m = diag([g, g + b, g + a, g + a + b + Math.PI]);
      const vz = optimalVirtualZ(m);
      expectClose(wrapAngle(vz.a - a), 0, 1e-12, 'a');
      expectClose(wrapAngle(vz.b - b), 0, 1e-12, 'b');
      expectClose(gateMetrics(m).fidelity, 1, 1e-14, 'fidelity');
    }
  });

  it('conditionalPhase is invariant to single-qubit phases and wraps to (-pi, pi]', () => {
    const m = diag([0.3, 0.3 + 1.1, 0.3 - 2.0, 0.3 + 1.1 - 2.0 + 3.0]);
    expectClose(conditionalPhase(m), 3.0, 1e-14, 'phi');
    expect(wrapAngle(-Math.PI)).toBeCloseTo(Math.PI, 15);
    expect(wrapAngle(3 * Math.PI)).toBeCloseTo(Math.PI, 14);
  });

  it('leakage = 1 - Tr(M^dag M)/4 (Wood and Gambetta 2018) for a block that lost population', () => {
    const m = diag([0, 0, 0, Math.PI]);
    m.re[15] = -Math.sqrt(0.9); // |11> keeps 90 %
    expectClose(leakage(m), 0.1 / 4, 1e-15, 'L');
  });

  it('fidelity equals the average over a 2-design of |<psi|V^dag M|psi>|^2 (Pedersen et al. 2007)', () => {
    const states = mubStates();
    expect(states).toHaveLength(20);
    const rng = new Random(11);
    for (let t = 0; t < 5; t++) {
      const u = randomUnitary(rng);
      // shrink to a non-unitary block (leakage) to test the general formula
      const m = { re: u.re.map((x) => 0.97 * x), im: u.im.map((x) => 0.97 * x) };
      const g = gateMetrics(m);
      const ph = [0, g.virtualZ.b, g.virtualZ.a, Math.PI + g.virtualZ.a + g.virtualZ.b];
      let avg = 0;
      for (const s of states) {
        // <psi| V^dag M |psi>
        let zr = 0;
        let zi = 0;
        for (let r = 0; r < 4; r++) {
          let yr = 0;
          let yi = 0;
          for (let c = 0; c < 4; c++) {
            yr += m.re[r * 4 + c] * s.re[c] - m.im[r * 4 + c] * s.im[c];
            yi += m.re[r * 4 + c] * s.im[c] + m.im[r * 4 + c] * s.re[c];
          }
          // multiply by conj(v_r) = e^{-i ph_r}, then by conj(psi_r)
          const cr = Math.cos(ph[r]);
          const ci = -Math.sin(ph[r]);
          const wr = cr * yr - ci * yi;
          const wi = cr * yi + ci * yr;
          zr += s.re[r] * wr + s.im[r] * wi;
          zi += s.re[r] * wi - s.im[r] * wr;
        }
        avg += (zr * zr + zi * zi) / states.length;
      }
      expectClose(g.fidelity, avg, 1e-13, `unitary ${t}`);
    }
  });

  it('optimalVirtualZ finds the global maximum of |Tr(V^dag M)| (checked on a 400 x 400 grid)', () => {
    const rng = new Random(3);
    for (let t = 0; t < 4; t++) {
      const m = randomUnitary(rng);
      const vz = optimalVirtualZ(m);
      let best = 0;
      for (let i = 0; i < 400; i++)
        for (let j = 0; j < 400; j++) {
          const a = (2 * Math.PI * i) / 400;
          const b = (2 * Math.PI * j) / 400;
          const ph = [0, b, a, Math.PI + a + b];
          let sr = 0;
          let si = 0;
          for (let k = 0; k < 4; k++) {
            sr += Math.cos(ph[k]) * m.re[k * 5] + Math.sin(ph[k]) * m.im[k * 5];
            si += Math.cos(ph[k]) * m.im[k * 5] - Math.sin(ph[k]) * m.re[k * 5];
          }
          best = Math.max(best, Math.hypot(sr, si));
        }
      expect(vz.overlap).toBeGreaterThanOrEqual(best - 1e-12);
      expect(vz.overlap - best).toBeLessThan(1e-3); // the grid is 1/64 rad fine
    }
  });
});
