/**
 * Cross-checks against QuTiP (Debian's python3-qutip; test/reference/qutip_*.py):
 *  - coherent: sesolve on the fixed-basis model H0 + u(t) C (array coefficients) against our
 *    fixed-basis propagator, and the frame simulator against both (larger basis);
 *  - decoherence: mesolve on the moving-basis model (time-dependent H as a sum of array-coefficient
 *    terms; collapse operators sqrt(1/T1) b and sqrt(2/T_phi(Phi(t))) b^dag b) for the 16 operator
 *    inputs, against the simulator's Lindblad channel; noisy average fidelity to 1e-5.
 */
import { describe, expect, it } from 'vitest';
import { runPython } from '../support/python.js';
import { fixedBasisBlock, fixedBasisLabBlock, fixedBasisModel, fixedBasisStateColumn } from '../../src/sim/fixed-basis.js';
import { buildManifoldFrame } from '../../src/sim/manifold-frame.js';
import { simulateGate, maximiseChannelOverlap } from '../../src/sim/simulate-gate.js';
import { MovingBasisModel } from '../../src/sim/moving-basis.js';
import { chebyshevCoefficients, chebyshevEvaluate, chebyshevPoints } from '../../src/linalg/chebyshev-series.js';
import { josephsonEnergy, josephsonEnergySlope } from '../../src/transmon/josephson.js';
import { fluxAt } from '../../src/sim/trajectory.js';
import type { TransmonNoise } from '../../src/sim/model.js';
import { MOVER, blockDistance, cosineRamps, crossingFlux, ejRange, pairModel } from './support.js';

const XC = crossingFlux();
const TWO_PI = 2 * Math.PI;

describe('QuTiP cross-check', () => {
  it('coherent propagator: QuTiP sesolve and our fixed-basis propagator agree to 1e-6 on the same model', () => {
    const model = pairModel(8, 3);
    const traj = cosineRamps(XC, 5, 6, 0.5);
    const fb = fixedBasisModel(model, 0);
    const n = fb.space.size;
    const T = traj.timeNs[traj.timeNs.length - 1];
    // QuTiP interpolates array coefficients by cubic splines; across the trajectory's kinks
    // (every 0.5 ns) that costs O(dt^2): 0.2 ps keeps it below 2e-7 (measured).
    const dtFine = 0.0002;
    const tlist: number[] = [];
    const u: number[] = [];
    for (let k = 0; k <= Math.round(T / dtFine); k++) {
      const t = Math.min(T, k * dtFine);
      tlist.push(t);
      u.push(josephsonEnergy(MOVER.ejsGHz, MOVER.asymmetry, fluxAt(traj, t)) - fb.ejPark);
    }
    const rows = (m: Float64Array): number[][] => Array.from({ length: n }, (_, r) => Array.from(m.subarray(r * n, r * n + n), (x) => TWO_PI * x));
    const labels = [[0, 0], [0, 1], [1, 0], [1, 1]];
    const psi0 = labels.map((l) => {
      const c = fixedBasisStateColumn(fb, l);
      return Array.from({ length: n }, (_, q) => fb.dressedVectors[q * n + c]);
    });
    const out = runPython<{ re: number[][]; im: number[][]; seconds: number }>('qutip_sesolve.py', { h0: rows(fb.hPark), c: rows(fb.cFull), tlist, u, psi0, atol: 1e-12, rtol: 1e-11 }, { timeoutMs: 300_000 });
    // M from QuTiP's final states (lab frame as everywhere)
    const mq = fixedBasisLabBlock(fb, labels, out.re, out.im, T);
    const ours = fixedBasisBlock(model, traj, { stepNs: 0.005 });
    expect(blockDistance(ours, mq)).toBeLessThan(1e-6);
  }, 300_000);

  it('Lindblad channel: QuTiP mesolve on the moving-basis model gives the same noisy fidelity to 1e-5', async () => {
    const dephasing = (x: number): number => 1 / 15000 + 2e-5 * Math.sin(Math.PI * x) ** 2;
    const noise: { a: TransmonNoise; b: TransmonNoise } = {
      a: { t1Ns: 10000, dephasingRate: dephasing },
      b: { t1Ns: 14000, dephasingRate: () => 1 / 20000 },
    };
    const model = pairModel(4, 3, noise);
    // a low-leakage excursion towards the crossing (so the fidelity measures the noise, not the
    // spline error of QuTiP's coefficients across kinks, see the coherent test)
    const traj = cosineRamps(0.9 * XC, 4, 4, 0.5);
    const T = traj.timeNs[traj.timeNs.length - 1];
    // Ours: frame simulator with Lindblad.
    const frame = buildManifoldFrame(model, { ...ejRange(traj), noiseOperators: true });
    const coherent = simulateGate(frame, traj);
    const sim = simulateGate(frame, traj, { lindblad: true, targetPhase: coherent.conditionalPhase });
    // QuTiP: moving product basis, H(t) = 2 pi H_b(u) - i u' T. To keep QuTiP's term count small,
    // H_b(u) and T(u) are expanded in Chebyshev polynomials of u over the trajectory's E_J range
    // (degree 14: the expansion error is checked below to be < 1e-11 GHz), so
    //   H(t) = sum_k T_k(s(t)) [2 pi H_k] + sum_k u'(t) T_k(s(t)) [-i T_k],  s = scaled u.
    const mb = new MovingBasisModel(model);
    const n = mb.space.size;
    const { ejLo, ejHi } = ejRange(traj);
    const degree = 14;
    const nodes = chebyshevPoints(ejLo, ejHi, degree);
    const samples = Array.from(nodes, (u) => mb.at(u));
    const hVals = new Float64Array((degree + 1) * n * n);
    const tVals = new Float64Array((degree + 1) * n * n);
    samples.forEach((p, j) => {
      hVals.set(p.h, j * n * n);
      tVals.set(p.t, j * n * n);
    });
    const hC = chebyshevCoefficients(hVals, degree, n * n);
    const tC = chebyshevCoefficients(tVals, degree, n * n);
    // the expansion reproduces H_b and T between the nodes
    const probe = new Float64Array(n * n);
    for (const f of [0.13, 0.5, 0.77]) {
      const u = ejLo + f * (ejHi - ejLo);
      const exact = mb.at(u);
      chebyshevEvaluate(hC, degree, n * n, ejLo, ejHi, u, probe);
      for (let q = 0; q < n * n; q++) expect(Math.abs(probe[q] - exact.h[q])).toBeLessThan(1e-11);
      chebyshevEvaluate(tC, degree, n * n, ejLo, ejHi, u, probe);
      for (let q = 0; q < n * n; q++) expect(Math.abs(probe[q] - exact.t[q])).toBeLessThan(1e-11);
    }
    const cheb = (k: number, s: number): number => Math.cos(k * Math.acos(Math.max(-1, Math.min(1, s))));
    const zeros = (): number[][] => Array.from({ length: n }, () => new Array(n).fill(0));
    const ops: [number[][], number[][]][] = [];
    for (let k = 0; k <= degree; k++) {
      const re = zeros();
      const im = zeros();
      for (let p = 0; p < n; p++)
        for (let q = 0; q < n; q++) {
          re[p][q] = TWO_PI * hC[k * n * n + p * n + q];
          im[p][q] = -tC[k * n * n + p * n + q];
        }
      ops.push([re, zeros()], [zeros(), im]);
    }
    // Per trajectory segment: its own time grid and smooth coefficients.
    const dt = 0.002;
    const segments: { tlist: number[]; coeffs: number[][]; ccoeffs: number[][] }[] = [];
    for (let seg = 0; seg + 1 < traj.timeNs.length; seg++) {
      const t0 = traj.timeNs[seg];
      const t1 = traj.timeNs[seg + 1];
      const v = (traj.flux[seg + 1] - traj.flux[seg]) / (t1 - t0);
      const m = Math.max(4, Math.ceil((t1 - t0) / dt));
      const tlist: number[] = [];
      const coeffs: number[][] = ops.map(() => []);
      const deph: number[] = [];
      for (let k = 0; k <= m; k++) {
        const t = k === m ? t1 : t0 + ((t1 - t0) * k) / m;
        tlist.push(t);
        const x = traj.flux[seg] + v * (t - t0);
        const u = josephsonEnergy(MOVER.ejsGHz, MOVER.asymmetry, x);
        const sc = (2 * u - ejLo - ejHi) / (ejHi - ejLo);
        const rate = v * josephsonEnergySlope(MOVER.ejsGHz, MOVER.asymmetry, x);
        for (let j = 0; j <= degree; j++) {
          coeffs[2 * j].push(cheb(j, sc));
          coeffs[2 * j + 1].push(rate * cheb(j, sc));
        }
        deph.push(Math.sqrt(2 * dephasing(x)));
      }
      segments.push({ tlist, coeffs, ccoeffs: [deph] });
    }
    const ladder = (i: number): number[][] => {
      const m = zeros();
      const stride = mb.space.strides[i];
      const k = mb.space.dims[i];
      for (let q = 0; q < n; q++) {
        const lv = Math.floor(q / stride) % k;
        if (lv > 0) m[q - stride][q] = Math.sqrt(lv);
      }
      return m;
    };
    const number = (i: number): number[][] => {
      const m = zeros();
      const stride = mb.space.strides[i];
      const k = mb.space.dims[i];
      for (let q = 0; q < n; q++) m[q][q] = Math.floor(q / stride) % k;
      return m;
    };
    const cops = [
      { op: [ladder(0), zeros()], scale: Math.sqrt(1 / 10000), timeDependent: false },
      { op: [number(0), zeros()], scale: 1, timeDependent: true },
      { op: [ladder(1), zeros()], scale: Math.sqrt(1 / 14000), timeDependent: false },
      { op: [number(1), zeros()], scale: Math.sqrt(2 / 20000), timeDependent: false },
    ];
    const dr = mb.dressed(josephsonEnergy(MOVER.ejsGHz, MOVER.asymmetry, 0));
    const labels = [[0, 0], [0, 1], [1, 0], [1, 1]];
    const idx = labels.map(([i, j]) => i * mb.space.dims[1] + j);
    const vec = (p: number): number[] => Array.from({ length: n }, (_, q) => dr.vectors[q * n + p]);
    const rho0: [number[][], number[][]][] = [];
    const inputOf: number[] = new Array(16);
    for (let k = 0; k < 4; k++)
      for (let l = k; l < 4; l++) {
        inputOf[k * 4 + l] = rho0.length;
        const a = vec(idx[k]);
        const b = vec(idx[l]);
        rho0.push([a.map((x) => b.map((y) => x * y)), zeros()]);
      }
    const out = runPython<{ re: number[][]; im: number[][] }>('qutip_mesolve.py', { ops, cops, segments, rho0, atol: 1e-12, rtol: 1e-10 }, { timeoutMs: 600_000 });
    // Post-processing identical to the simulator's (README physics conventions sec. 3).
    const e = idx.map((p) => dr.energies[p]);
    const eLoc = labels.map(([i, j]) => e[0] + i * (e[2] - e[0]) + j * (e[1] - e[0]));
    // E(|k><l|) for k > l is E(|l><k|)^dag
    const proj = (kl: number, a: number, b: number): [number, number] => {
      const k = Math.floor(kl / 4);
      const l = kl % 4;
      if (k > l) {
        const [xr, xi] = projRaw(inputOf[l * 4 + k], b, a);
        return [xr, -xi];
      }
      return projRaw(inputOf[kl], a, b);
    };
    const projRaw = (r: number, a: number, b: number): [number, number] => {
      const va = vec(idx[a]);
      const vb = vec(idx[b]);
      let sr = 0;
      let si = 0;
      for (let x = 0; x < n; x++)
        for (let y = 0; y < n; y++) {
          sr += va[x] * out.re[r][x * n + y] * vb[y];
          si += va[x] * out.im[r][x * n + y] * vb[y];
        }
      return [sr, si];
    };
    const cr = new Float64Array(16);
    const ci = new Float64Array(16);
    let trace = 0;
    for (let k = 0; k < 4; k++) {
      for (let l = 0; l < 4; l++) {
        const [xr, xi] = proj(k * 4 + l, k, l);
        const ph = TWO_PI * (eLoc[k] - eLoc[l]) * T;
        cr[k * 4 + l] = Math.cos(ph) * xr - Math.sin(ph) * xi;
        ci[k * 4 + l] = Math.sin(ph) * xr + Math.cos(ph) * xi;
      }
      for (let c = 0; c < 4; c++) trace += proj(k * 5, c, c)[0];
    }
    const vz = maximiseChannelOverlap(cr, ci, coherent.conditionalPhase, sim.noisy!.virtualZ);
    const fQutip = (trace + vz.value) / 20;
    expect(Math.abs(sim.noisy!.fidelity - fQutip)).toBeLessThan(1e-5);
    // and decoherence is a visible effect here (the comparison is not trivial)
    expect(sim.fidelity - sim.noisy!.fidelity).toBeGreaterThan(1e-3);
  }, 600_000);
});
