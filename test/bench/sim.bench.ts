/**
 * Benchmarks of the gate simulator (issue 4 targets), on a designed CZ of the Bowline-5 demo
 * edge Q1-Q0 (FAQUAD, 8 ns ramps, about 65 ns in all, sampled at 2.4 GS/s):
 *  - coherent gate at default settings, frame built anew each call (the cost per edge) < 30 ms,
 *    with its accuracy against a 16-level fixed-basis, 5 ps-step run printed (must be < 1e-6);
 *  - the same with the frame reused (the cost per simulation while tuning);
 *  - the noisy fidelity (Lindblad on all kept states, 16 operator inputs) < 1 s;
 *  - QuTiP sesolve on the fixed-basis model (14 mover levels, the accuracy the fixed basis needs)
 *    with array coefficients, its fastest form, at the loosest tolerances that still give 1e-6,
 *    timed in the same run; the ratio is printed.
 */
import type { Benchmark } from './run.js';
import { buildManifoldFrame, type ManifoldFrame } from '../../src/sim/manifold-frame.js';
import { simulateGate, type GateSimulation } from '../../src/sim/simulate-gate.js';
import { fixedBasisBlock, fixedBasisLabBlock, fixedBasisModel, fixedBasisStateColumn } from '../../src/sim/fixed-basis.js';
import { fluxAt } from '../../src/sim/trajectory.js';
import { runPython } from '../support/python.js';
import { blockDistance } from '../sim/support.js';
import { designCzGate } from '../../src/gate/design.js';
import { edgeSimModel, moverEjRange } from '../../src/sim/pair-model.js';
import { G_LAYOUT, Q0, Q1, layout } from '../gate/support.js';

const design = designCzGate({ mover: Q1, partner: Q0, gGHz: G_LAYOUT, moverParkFlux: 0, partnerFlux: 0, crossing: '11-20', family: 'faquad', rampNs: 8, rules: layout.rules });
const traj = design.waveform;
const model = edgeSimModel({ mover: Q1, partner: Q0, gGHz: G_LAYOUT, partnerFlux: 0 });
const noisyModel = edgeSimModel({ mover: Q1, partner: Q0, gGHz: G_LAYOUT, partnerFlux: 0, noise: true });
const bigModel = (levels: number) => edgeSimModel({ mover: Q1, partner: Q0, gGHz: G_LAYOUT, partnerFlux: 0, moverLevels: levels, partnerLevels: 4 });
const range = moverEjRange(Q1, traj);
const MOVER = Q1;
let last: GateSimulation | undefined;
let reference: { re: Float64Array; im: Float64Array } | undefined;
let frame: ManifoldFrame | undefined;

function referenceBlock(): { re: Float64Array; im: Float64Array } {
  reference ??= fixedBasisBlock(bigModel(16), traj, { stepNs: 0.005 });
  return reference;
}

export const coherentGateCold: Benchmark = {
  name: 'coherent 65 ns CZ, default settings, frame built anew (per edge)',
  target: 30_000,
  run: () => {
    last = simulateGate(buildManifoldFrame(model, range), traj);
    return last;
  },
  report: () => `accuracy vs 16-level fixed basis at 5 ps steps: max |dM| = ${blockDistance(last!.m, referenceBlock()).toExponential(2)} (required < 1e-6); ${last!.steps} steps`,
};

export const coherentGateWarm: Benchmark = {
  name: 'coherent 65 ns CZ, default settings, frame reused (per simulation)',
  setup: () => {
    frame = buildManifoldFrame(model, range);
  },
  run: () => simulateGate(frame!, traj),
};

let noisyFrame: ManifoldFrame | undefined;
let noisy: GateSimulation | undefined;
export const noisyGate: Benchmark = {
  name: 'noisy fidelity of the 65 ns CZ (Lindblad, all inputs; frame built anew)',
  target: 1_000_000,
  runs: 5,
  run: () => {
    noisyFrame = buildManifoldFrame(noisyModel, { ...range, noiseOperators: true });
    noisy = simulateGate(noisyFrame, traj, { lindblad: true });
    return noisy;
  },
  report: () => `fidelity ${noisy!.fidelity.toFixed(6)} coherent, ${noisy!.noisy!.fidelity.toFixed(6)} noisy; first-order estimate of the decoherence error ${noisy!.decoherenceEstimate.toExponential(3)} vs Lindblad ${(noisy!.fidelity - noisy!.noisy!.fidelity).toExponential(3)}`,
};

let qutipNote = '';
export const qutipRatio: Benchmark = {
  name: 'QuTiP sesolve, same model and accuracy (fixed basis, array coefficients), timed by Python',
  runs: 1,
  warmup: 0,
  run: () => {
    const big = bigModel(14);
    const fb = fixedBasisModel(big, 0);
    const n = fb.space.size;
    const T = traj.timeNs[traj.timeNs.length - 1];
    const dt = 0.0002;
    const tlist: number[] = [];
    const u: number[] = [];
    for (let k = 0; k <= Math.round(T / dt); k++) {
      const t = Math.min(T, k * dt);
      tlist.push(t);
      u.push(MOVER.ejGHz(fluxAt(traj, t)) - fb.ejPark);
    }
    const rows = (m: Float64Array): number[][] => Array.from({ length: n }, (_, r) => Array.from(m.subarray(r * n, r * n + n), (x) => 2 * Math.PI * x));
    const labels = [[0, 0], [0, 1], [1, 0], [1, 1]];
    const psi0 = labels.map((l) => {
      const c = fixedBasisStateColumn(fb, l);
      return Array.from({ length: n }, (_, q) => fb.dressedVectors[q * n + c]);
    });
    const ref = referenceBlock();
    const ours = (() => {
      const t0 = performance.now();
      const r = simulateGate(buildManifoldFrame(model, range), traj);
      return { ms: performance.now() - t0, err: blockDistance(r.m, ref) };
    })();
    const tried: string[] = [];
    let best: { seconds: number; tol: number; err: number } | undefined;
    for (const tol of [1e-10, 1e-11, 1e-12]) {
      const out = runPython<{ re: number[][]; im: number[][]; seconds: number }>('qutip_sesolve.py', { h0: rows(fb.hPark), c: rows(fb.cFull), tlist, u, psi0, atol: tol, rtol: tol }, { timeoutMs: 900_000 });
      const m = fixedBasisLabBlock(fb, labels, out.re, out.im, T);
      const err = blockDistance(m, ref);
      tried.push(`tol ${tol}: ${out.seconds.toFixed(2)} s, error ${err.toExponential(1)}`);
      if (err < 1e-6) {
        best = { seconds: out.seconds, tol, err };
        break;
      }
    }
    qutipNote = best
      ? `QuTiP reaches 1e-6 at tolerance ${best.tol}: ${best.seconds.toFixed(2)} s (4 states); fluxlane ${ours.ms.toFixed(1)} ms (error ${ours.err.toExponential(1)}): ratio ${(best.seconds * 1000 / ours.ms).toFixed(0)}x [${tried.join('; ')}]`
      : `QuTiP did not reach 1e-6: ${tried.join('; ')}`;
    return best;
  },
  report: () => qutipNote,
};
