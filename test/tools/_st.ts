import { buildManifoldFrame } from '../../src/sim/manifold-frame.js';
import { simulateGate } from '../../src/sim/simulate-gate.js';
import { fixedBasisBlock } from '../../src/sim/fixed-basis.js';
import { blockDistance, crossingFlux, ejRange, pairModel, trapezoid } from '../sim/support.js';
const XC = crossingFlux();
const traj = trapezoid(XC, 6, 8);
const frame = buildManifoldFrame(pairModel(6, 4), ejRange(traj));
const ref = fixedBasisBlock(pairModel(14, 4), traj, { stepNs: 0.02 });
const fine = simulateGate(frame, traj, { maxStepNs: 0.02 });
console.log('truncation (fine steps)', blockDistance(fine.m, ref).toExponential(2));
for (const h of [0.05, 0.1, 0.15, 0.2, 0.25]) for (const ej of [0.5, 0.25]) {
  const s = simulateGate(frame, traj, { maxStepNs: h, maxEjStepGHz: ej });
  console.log(h, ej, blockDistance(s.m, ref).toExponential(2), 'vs fine', blockDistance(s.m, fine.m).toExponential(2));
}
