/**
 * Benchmarks of the error budget (issue 10 targets):
 *  - what the budget adds to one designed gate, under 100 ms: the quasi-static flux-noise average
 *    (two offsets per transmon, the partner's frames built anew) on Bowline-5 designs, and one
 *    spectator's three-transmon simulation (in |0> and |1>, its frame built anew) on a Clove-17 gate;
 *  - the fast estimate the planner's search uses (per call).
 */
import type { Benchmark } from './run.js';
import { loadLayoutFile } from '../../src/layout/load.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { designCzGate } from '../../src/gate/design.js';
import { gateFluxNoise } from '../../src/budget/gate-flux-noise.js';
import { spectatorError } from '../../src/budget/spectator-error.js';
import { estimateGateBudget } from '../../src/budget/gate-estimate.js';
import { buildManifoldFrame } from '../../src/sim/manifold-frame.js';
import { edgeSimModel } from '../../src/sim/pair-model.js';
import { simulateGate } from '../../src/sim/simulate-gate.js';
import { quasiStaticFluxSigma } from '../../src/transmon/coherence.js';

const bowline = loadLayoutFile('layouts/bowline-5.yaml', 'layouts/bowline-5.yaml');
const clove = loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml');
const q = (l: typeof bowline, id: string) => Transmon.fromLayout(l.qubits.find((x) => x.id === id)!);
const g = (l: typeof bowline, a: string, b: string) => l.couplings.find((c) => [c.a, c.b].sort().join() === [a, b].sort().join())!.gGHz;

const Q0 = q(bowline, 'Q0');
const PF = 0.29;
const gates = ['Q1', 'Q2', 'Q3'].map((m) => {
  const mover = q(bowline, m);
  const gGHz = g(bowline, m, 'Q0');
  const d = designCzGate({ mover, partner: Q0, gGHz, moverParkFlux: 0, partnerFlux: PF, crossing: '11-20', rules: bowline.rules });
  let lo = Infinity;
  let hi = -Infinity;
  for (const x of d.waveform.flux) {
    lo = Math.min(lo, mover.ejGHz(x));
    hi = Math.max(hi, mover.ejGHz(x));
  }
  const frame = buildManifoldFrame(edgeSimModel({ mover, partner: Q0, gGHz, partnerFlux: PF }), { ejLo: lo, ejHi: hi });
  const nominal = simulateGate(frame, d.waveform, { estimate: false });
  const T = d.durationNs;
  return {
    frame, traj: d.waveform, targetPhase: Math.PI, virtualZ: nominal.virtualZ,
    labEnergies: [nominal.energies['00'], nominal.energies['01'], nominal.energies['10']] as const,
    moverSigma: quasiStaticFluxSigma(mover.coherenceSpec!.fluxNoisePhi0!, T), partnerSigma: quasiStaticFluxSigma(Q0.coherenceSpec!.fluxNoisePhi0!, T),
    partnerFrame: (delta: number) => buildManifoldFrame(edgeSimModel({ mover, partner: Q0, gGHz, partnerFlux: PF + delta }), { ejLo: lo, ejHi: hi }),
    propagation: { scheme: 'in-block' as const },
  };
});
let k = 0;
let last = 0;

export const fluxNoiseAverage: Benchmark = {
  name: 'quasi-static flux-noise average of one designed gate (3 nodes per transmon, partner frames anew; Bowline-5 Q1/Q2/Q3-Q0 in turn)',
  target: 100_000,
  runs: 12,
  warmup: 3,
  run: () => {
    last = gateFluxNoise(gates[k++ % gates.length]).total;
  },
  report: () => `last excess ${last.toExponential(3)}`,
};

const D4 = q(clove, 'D4');
const Z3 = q(clove, 'Z3');
const Z1 = q(clove, 'Z1');
const z3f = Z3.fluxForF01(5.0);
const cz = designCzGate({ mover: D4, partner: Z3, gGHz: g(clove, 'D4', 'Z3'), moverParkFlux: 0, partnerFlux: z3f, crossing: '11-20', rules: clove.rules });
let lastSpectator = 0;

export const oneSpectator: Benchmark = {
  name: 'one spectator of a designed gate, three transmons in |0> and |1> (frame anew; Clove-17 D4-Z3 with Z1)',
  target: 100_000,
  runs: 8,
  warmup: 2,
  run: () => {
    lastSpectator = spectatorError({
      mover: D4, partner: Z3, gGHz: g(clove, 'D4', 'Z3'), partnerFlux: z3f,
      spectator: { transmon: Z1, coupledTo: 'mover', gGHz: g(clove, 'D4', 'Z1'), flux: 0 },
      traj: cz.waveform, targetPhase: Math.PI, pairError: 0, pairLeakage: 0,
    }).error;
  },
  report: () => `spectator error ${lastSpectator.toExponential(3)}`,
};

export const fastEstimate: Benchmark = {
  name: 'fast gate-budget estimate (the planner search\'s gate term)',
  run: () =>
    estimateGateBudget({
      mover: { coherence: { t1Ns: 60_000, tphiNs: 90_000, fluxNoisePhi0: 3e-6 }, slopeGHz: -6, slope12GHz: -6.2 },
      partner: { coherence: { t1Ns: 50_000, fluxNoisePhi0: 2.5e-6 }, slopeGHz: -2, slope12GHz: -2.1 },
      excited: 'mover', holdNs: 25, rampNs: 8, durationNs: 45, averagingTimeNs: 1e9,
    }),
};
