/**
 * The quasi-static flux-noise average of a designed gate (src/budget/gate-flux-noise.ts) on the
 * Bowline-5 edge Q1-Q0 (mover Q1 at its sweet spot, partner Q0 tuned down to flux 0.29, where both
 * offsets matter), against:
 *  - an independent NumPy model (test/reference/quasi_static_gate.py: charge-basis transmons, fixed
 *    basis, fourth-order Magnus, its own dressed states, virtual-Z phases and Gauss-Hermite nodes)
 *    within 10 % (the acceptance; measured 0.04 % on the plan's Q0-Q1 gate);
 *  - a 9-node rule and a joint two-dimensional rule over both offsets (the per-transmon sum is
 *    exact for an error quadratic in the offsets; the cross term averages out) within 1 %;
 *  - the full propagation scheme (the average uses the in-block one) within 1 %, and the budget's
 *    in-block propagation with short ramp segments joined (FLUX_NOISE_PROPAGATION) within 1 %;
 *  - the second-order law: the excess grows as sigma^2 (within 2 % for sigma doubled).
 */
import { describe, expect, it } from 'vitest';
import { designCzGate } from '../../src/gate/design.js';
import { gateFluxNoise, shiftTrajectory } from '../../src/budget/gate-flux-noise.js';
import { gaussHermiteRule } from '../../src/budget/gauss-hermite.js';
import { FLUX_NOISE_PROPAGATION } from '../../src/budget/waveform-budget.js';
import { buildManifoldFrame } from '../../src/sim/manifold-frame.js';
import { edgeSimModel } from '../../src/sim/pair-model.js';
import { simulateGate } from '../../src/sim/simulate-gate.js';
import { fidelityWithVirtualZ } from '../../src/sim/gate-metrics.js';
import { quasiStaticFluxSigma } from '../../src/transmon/coherence.js';
import { G_LAYOUT, Q0, Q1, layout } from '../gate/support.js';
import { runPython } from '../support/python.js';

const PARTNER_FLUX = 0.29;
const design = designCzGate({ mover: Q1, partner: Q0, gGHz: G_LAYOUT, moverParkFlux: 0, partnerFlux: PARTNER_FLUX, crossing: '11-20', rules: layout.rules, noise: true, decoherence: 'estimate' });
const traj = design.waveform;
const T = traj.timeNs[traj.timeNs.length - 1];
const frameOf = (delta: number) => {
  let lo = Infinity;
  let hi = -Infinity;
  for (const x of traj.flux) {
    lo = Math.min(lo, Q1.ejGHz(x));
    hi = Math.max(hi, Q1.ejGHz(x));
  }
  return buildManifoldFrame(edgeSimModel({ mover: Q1, partner: Q0, gGHz: G_LAYOUT, partnerFlux: PARTNER_FLUX + delta }), { ejLo: lo, ejHi: hi });
};
const frame = frameOf(0);
const nominal = simulateGate(frame, traj, { estimate: false });
const sigmaA = quasiStaticFluxSigma(Q1.coherenceSpec!.fluxNoisePhi0!, T);
const sigmaB = quasiStaticFluxSigma(Q0.coherenceSpec!.fluxNoisePhi0!, T);
const input = {
  frame, traj, targetPhase: Math.PI, virtualZ: nominal.virtualZ,
  labEnergies: [nominal.energies['00'], nominal.energies['01'], nominal.energies['10']] as const,
  moverSigma: sigmaA, partnerSigma: sigmaB, partnerFrame: frameOf, propagation: { scheme: 'in-block' as const },
};
const three = gateFluxNoise(input);

describe('gateFluxNoise on a designed Bowline-5 gate', () => {
  it('the design carries it in its budget, and both transmons contribute (the partner sits on its flux slope)', () => {
    expect(design.feasible).toBe(true);
    expect(design.budget).toBeDefined();
    expect(three.mover).toBeGreaterThan(1e-5);
    expect(three.partner).toBeGreaterThan(1e-5);
    expect(Math.abs(design.budget!.fluxNoise - three.total) / three.total).toBeLessThan(0.02);
  });

  it('an independent NumPy model averaged over the offsets gives the same excess within 10 % per transmon', () => {
    const ref = runPython<{ mover: number; partner: number; nominalError: number }>('quasi_static_gate.py', {
      mover: { ec: Q1.ecGHz, ejs: Q1.ejsGHz, d: Q1.asymmetry }, partner: { ec: Q0.ecGHz, ejs: Q0.ejsGHz, d: Q0.asymmetry },
      g: G_LAYOUT, partnerFlux: PARTNER_FLUX, time: Array.from(traj.timeNs), flux: Array.from(traj.flux), theta: Math.PI,
      sigmaMover: sigmaA, sigmaPartner: sigmaB, nodes: 3, dt: 0.03,
    }, { timeoutMs: 300_000 });
    expect(Math.abs(three.mover - ref.mover) / ref.mover, `mover: ours ${three.mover}, NumPy ${ref.mover}`).toBeLessThan(0.1);
    expect(Math.abs(three.partner - ref.partner) / ref.partner, `partner: ours ${three.partner}, NumPy ${ref.partner}`).toBeLessThan(0.1);
  }, 300_000);

  it('three nodes per transmon agree with nine, and with a joint 3 x 3 rule over both offsets, within 1 %', () => {
    const nine = gateFluxNoise({ ...input, nodes: 9 });
    expect(Math.abs(nine.total - three.total) / nine.total).toBeLessThan(0.01);
    const rule = gaussHermiteRule(3);
    let joint = 0;
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++) {
        const f = frameOf(sigmaB * rule.nodes[j]);
        const m = simulateGate(f, shiftTrajectory(traj, sigmaA * rule.nodes[i]), { scheme: 'in-block', estimate: false, labEnergies: input.labEnergies }).m;
        joint += rule.weights[i] * rule.weights[j] * (1 - fidelityWithVirtualZ(m, input.virtualZ.a, input.virtualZ.b));
      }
    }
    joint -= three.nominalError;
    expect(Math.abs(joint - three.total) / joint).toBeLessThan(0.01);
  });

  it('the in-block propagation gives the full scheme\'s excess within 1 %', () => {
    const full = gateFluxNoise({ ...input, propagation: { scheme: 'blocks' } });
    expect(Math.abs(full.total - three.total) / full.total).toBeLessThan(0.01);
  });

  it('the budget\'s propagation (FLUX_NOISE_PROPAGATION: in-block, short ramp segments joined) gives the per-segment excess within 1 %', () => {
    expect(FLUX_NOISE_PROPAGATION.joinRamps).toBe(true);
    const joined = gateFluxNoise({ ...input, propagation: FLUX_NOISE_PROPAGATION });
    expect(Math.abs(joined.mover - three.mover) / three.mover).toBeLessThan(0.01);
    expect(Math.abs(joined.partner - three.partner) / three.partner).toBeLessThan(0.01);
  });

  it('grows as sigma^2 (second order in the offsets) within 2 %', () => {
    const twice = gateFluxNoise({ ...input, moverSigma: 2 * sigmaA, partnerSigma: 2 * sigmaB });
    expect(Math.abs(twice.total / three.total - 4) / 4).toBeLessThan(0.02);
  });
});
