import { readFileSync } from 'node:fs';
import { loadLayoutFile } from './src/layout/load.js';
import { Transmon } from './src/transmon/transmon.js';
import { buildManifoldFrame } from './src/sim/manifold-frame.js';
import { edgeSimModel, moverEjRange } from './src/sim/pair-model.js';
import { simulateGate } from './src/sim/simulate-gate.js';
import { parseTrajectoryCsv } from './src/sim/trajectory.js';
const [layoutPath, dir] = process.argv.slice(2);
const layout = loadLayoutFile(layoutPath);
const plan = JSON.parse(readFileSync(`${dir}/plan.json`, 'utf8'));
const tr = new Map(layout.qubits.map((q) => [q.id, Transmon.fromLayout(q)]));
for (const e of plan.edges) {
  const g = e.gate; if (!g || !g.waveform) continue;
  const mover = tr.get(e.mover)!, partner = tr.get(e.partner)!;
  const c = layout.couplings.find((c) => (c.a === e.mover && c.b === e.partner) || (c.b === e.mover && c.a === e.partner))!;
  const pf = partner.fluxForF01(plan.qubits[e.partner].parkingFrequency * 1e-9);
  const traj = parseTrajectoryCsv(readFileSync(`${dir}/${g.waveform}`, 'utf8'));
  const t0 = performance.now();
  const noise = g.fidelityNoisy != null;
  const model = edgeSimModel({ mover, partner, gGHz: c.gGHz, partnerFlux: pf, noise });
  const range = moverEjRange(mover, traj);
  const frame = buildManifoldFrame(model, { ...range, noiseOperators: noise });
  const sim = simulateGate(frame, traj, { targetPhase: Math.PI, lindblad: false, estimate: noise, scheme: 'blocks' } as any);
  const dt = performance.now() - t0;
  let far = 0; for (const x of traj.flux) if (Math.abs(x - traj.flux[0]) > Math.abs(far - traj.flux[0])) far = x;
  const fInt = mover.f01(far) * 1e9;
  console.log(e.qubits.join('-'), dt.toFixed(0) + 'ms',
    'phase', (sim.conditionalPhase - g.conditionalPhase).toExponential(2),
    'leak', (sim.leakage - g.leakage).toExponential(2),
    'fid', (sim.fidelity - g.fidelity).toExponential(2),
    'noisy', noise ? ((sim.fidelity - sim.decoherenceEstimate) - g.fidelityNoisy).toExponential(2) : '-',
    'vz', (sim.virtualZ.a - g.virtualZ.a).toExponential(2), (sim.virtualZ.b - g.virtualZ.b).toExponential(2),
    'fint', (fInt - g.interactionFrequency).toExponential(2), 'dur', ((traj.timeNs[traj.timeNs.length-1]-traj.timeNs[0])*1e-9 - g.duration).toExponential(2),
    'start', traj.flux[0], plan.qubits[e.mover].parkingFlux);
}
