/**
 * One qubit's idle error (src/budget/idle-error.ts) against outside references:
 *  - the average gate fidelity of the amplitude-damping and dephasing channels computed from
 *    their Kraus operators with mathjs, through Nielsen's formula
 *    F_avg = [sum_k |Tr K_k|^2 + d] / (d (d + 1)) (Nielsen, Phys. Lett. A 303, 249 (2002));
 *  - the quasi-static dephasing part against a direct Gaussian average of the phase with 40
 *    Gauss-Hermite nodes (NumPy's rule, checked in gauss-hermite.test.ts);
 *  - the residual-ZZ error against the best single-qubit correction of diag(1, 1, 1, e^{i phi})
 *    found by a grid search with mathjs complex numbers, F_avg = (|Tr V^dag U|^2 / 4 + 1) / 5;
 *  - h / k_B from the CODATA 2018 exact constants (0.04799 K per GHz).
 */
import { describe, expect, it } from 'vitest';
import { complex, abs, add, exp } from 'mathjs';
import { H_OVER_KB_K_PER_GHZ, qubitIdleError, relaxationError, zzIdleError } from '../../src/budget/idle-error.js';
import { quasiStaticFluxSigma } from '../../src/transmon/coherence.js';
import { gaussHermiteRule } from '../../src/budget/gauss-hermite.js';
import { expectClose } from '../support/close.js';

/** F_avg of a one-qubit channel with real Kraus operators [[a, b], [c, d]] (Nielsen 2002). */
function nielsen(kraus: number[][][]): number {
  let s = 0;
  for (const k of kraus) s += (k[0][0] + k[1][1]) ** 2;
  return (s + 2) / 6;
}

describe('qubitIdleError', () => {
  it('fills a given parts object with the numbers it returns otherwise', () => {
    const out = { t1: NaN, dephasing: NaN, thermal: NaN };
    for (const [t, slope, temp] of [[0, 0, 0], [1000, 0, 0.05], [800, -2.1, 0.04], [2000, -0.3, 0]] as const) {
      const p = { coherence: { t1Ns: 40_000, tphiNs: 90_000, fluxNoisePhi0: 2e-6 }, f01GHz: 4.7, slopeGHz: slope, curvatureGHz: 0 };
      const want = qubitIdleError(p, t, { averagingTimeNs: 1e9, temperatureK: temp });
      expect(qubitIdleError(p, t, { averagingTimeNs: 1e9, temperatureK: temp }, out)).toBe(out);
      expect(out).toEqual(want);
    }
  });

  it('its T1 part is the amplitude-damping channel\'s average infidelity (Kraus operators, Nielsen 2002)', () => {
    for (const [t, t1] of [[1000, 50_000], [10_000, 20_000], [100, 100_000]]) {
      const g = 1 - Math.exp(-t / t1);
      const ref = 1 - nielsen([[[1, 0], [0, Math.sqrt(1 - g)]], [[0, Math.sqrt(g)], [0, 0]]]);
      const e = qubitIdleError({ coherence: { t1Ns: t1 }, f01GHz: 5, slopeGHz: 0, curvatureGHz: 0 }, t);
      expectClose(e.t1, ref, 1e-12, `t=${t} T1=${t1}`);
      expect(e.dephasing).toBe(0);
    }
  });

  it('T1 and white dephasing together: the combined channel\'s infidelity, split as documented', () => {
    const t = 1000;
    const spec = { t1Ns: 60_000, tphiNs: 90_000 };
    const g = 1 - Math.exp(-t / spec.t1Ns);
    const l = Math.exp(-t / spec.tphiNs);
    // amplitude damping followed by dephasing with coherence factor l: Kraus sqrt((1+l)/2) A_k and sqrt((1-l)/2) Z A_k
    const a0 = [[1, 0], [0, Math.sqrt(1 - g)]];
    const a1 = [[0, Math.sqrt(g)], [0, 0]];
    const z = (m: number[][]) => [[m[0][0], m[0][1]], [-m[1][0], -m[1][1]]];
    const sc = (m: number[][], s: number) => m.map((r) => r.map((x) => x * s));
    const p = Math.sqrt((1 + l) / 2);
    const q = Math.sqrt((1 - l) / 2);
    const ref = 1 - nielsen([sc(a0, p), sc(a1, p), sc(z(a0), q), sc(z(a1), q)]);
    const e = qubitIdleError({ coherence: spec, f01GHz: 5, slopeGHz: 0, curvatureGHz: 0 }, t);
    expectClose(e.t1 + e.dephasing, ref, 1e-12, 'total');
  });

  it('its quasi-static dephasing part is the Gaussian average of the idle phase (40-node Gauss-Hermite)', () => {
    const spec = { t1Ns: Infinity, fluxNoisePhi0: 3e-6 };
    const t = 800;
    const slope = -5.5;
    const sigma = quasiStaticFluxSigma(3e-6, t);
    const rule = gaussHermiteRule(40);
    let c = 0;
    for (let k = 0; k < 40; k++) c += rule.weights[k] * Math.cos(2 * Math.PI * slope * sigma * rule.nodes[k] * t);
    const e = qubitIdleError({ coherence: spec, f01GHz: 5, slopeGHz: slope, curvatureGHz: 0 }, t);
    expectClose(e.dephasing, (1 - c) / 3, 1e-12, 'dephasing');
  });

  it('thermal excitation follows detailed balance, (t / T1) exp(-h f / k_B T) / 3 to first order; h/k_B = 0.04799 K/GHz (CODATA)', () => {
    expectClose(H_OVER_KB_K_PER_GHZ, 0.0479924307, 1e-9, 'h/k_B');
    const e = qubitIdleError({ coherence: { t1Ns: 50_000 }, f01GHz: 5, slopeGHz: 0, curvatureGHz: 0 }, 1000, { temperatureK: 0.05 });
    const p = (1000 / 50_000) * Math.exp(-(0.0479924307 * 5) / 0.05);
    expectClose(e.thermal, p / 3, 0.01, 'thermal');
    expect(qubitIdleError({ coherence: { t1Ns: 50_000 }, f01GHz: 6, slopeGHz: 0, curvatureGHz: 0 }, 1000, { temperatureK: 0.05 }).thermal).toBeLessThan(e.thermal);
  });

  it('two qubits idling: (6/5) x the sum of one-qubit errors is the weak-dissipation law (2/5) t sum (1/T1 + 1/T_phi) (README physics conventions sec. 4)', () => {
    const t = 100;
    const qs = [{ t1Ns: 60_000, tphiNs: 90_000 }, { t1Ns: 35_000, tphiNs: 40_000 }];
    let sum = 0;
    let law = 0;
    for (const c of qs) {
      const e = qubitIdleError({ coherence: c, f01GHz: 5, slopeGHz: 0, curvatureGHz: 0 }, t);
      sum += e.t1 + e.dephasing;
      law += 0.4 * t * (1 / c.t1Ns + 1 / c.tphiNs);
    }
    expectClose(1.2 * sum, law, 0.01, 'weak dissipation');
  });

  it('relaxationError keeps its digits for tiny probabilities (p/3 to first order)', () => {
    expectClose(relaxationError(1e-12), 1e-12 / 3, 1e-9, 'tiny');
    expect(relaxationError(0)).toBe(0);
  });
});

describe('zzIdleError(zeta, t)', () => {
  it('equals 1 - F_avg of diag(1, 1, 1, e^{i 2 pi zeta t}) after the best single-qubit phases (mathjs grid search)', () => {
    for (const [zeta, t] of [[1e-4, 1000], [5e-5, 1250], [3e-4, 2000], [-2e-4, 1500]]) {
      const phi = 2 * Math.PI * zeta * t;
      let best = 0;
      const n = 360;
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j += 1) {
          const a = (2 * Math.PI * i) / n;
          const b = (2 * Math.PI * j) / n;
          // Tr(V^dag U), V = diag(1, e^{ib}, e^{ia}, e^{i(a+b)})
          const tr = add(add(add(complex(1, 0), exp(complex(0, -b))), exp(complex(0, -a))), exp(complex(0, phi - a - b)));
          const m = abs(tr) as unknown as number;
          if (m > best) best = m;
        }
      }
      const ref = 1 - (best * best / 4 + 1) / 5;
      expect(Math.abs(zzIdleError(zeta, t) - ref), `zeta=${zeta} t=${t}`).toBeLessThan(2e-4);
    }
  });
});
