/**
 * stepSchedule (src/sim/propagate-frame.ts) joins a run of constant-flux segments into one exact
 * hold step when holds have no length limit (coherent simulations): exp(-i H h1) exp(-i H h2) =
 * exp(-i H (h1 + h2)) for the same H (an identity of the matrix exponential). Checked on a
 * designed Bowline-5 CZ sampled finely on its plateau (as a plan's qubit file): fewer steps,
 * and the gate block agrees with one hold step per segment (a finite but huge hold limit keeps
 * them apart) to 1e-12, in both propagation schemes the budget and the designer use.
 * And the option joinRamps (the error budget's runs): Magnus steps over several short ramp
 * segments, against one step per segment (itself checked against QuTiP and a large fixed basis in
 * test/sim/qutip.test.ts and propagate-frame.test.ts): amplitudes within 1e-3 (the nodes miss the
 * path's kinks; the budget's terms, differences of such runs, move far less:
 * test/sim/spectator-states.test.ts).
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { designCzGate } from '../../src/gate/design.js';
import { moverEjSpan } from '../../src/budget/spectator-error.js';
import { buildManifoldFrame } from '../../src/sim/manifold-frame.js';
import { edgeSimModel } from '../../src/sim/pair-model.js';
import { propagateInFrame, stepSchedule } from '../../src/sim/propagate-frame.js';
import { computationalStates } from '../../src/sim/simulate-gate.js';

const layout = loadLayoutFile('layouts/bowline-5.yaml', 'layouts/bowline-5.yaml');
const q = (id: string) => Transmon.fromLayout(layout.qubits.find((x) => x.id === id)!);

describe('stepSchedule joins equal-flux segments', () => {
  it('one step per plateau, the same propagator to 1e-12', () => {
    const Q1 = q('Q1');
    const Q0 = q('Q0');
    const gGHz = layout.couplings.find((c) => [c.a, c.b].sort().join() === 'Q0,Q1')!.gGHz;
    const d = designCzGate({ mover: Q1, partner: Q0, gGHz, moverParkFlux: 0, partnerFlux: 0.29, crossing: '11-20', rules: layout.rules });
    // the designer's waveform with each constant-flux segment cut into 40 equal samples, as the
    // plan's uniformly sampled qubit files have it (src/report/uniform-grid.ts)
    const t: number[] = [];
    const x: number[] = [];
    const w = d.waveform;
    for (let k = 0; k + 1 < w.flux.length; k++) {
      const n = w.flux[k + 1] === w.flux[k] ? 40 : 1;
      for (let j = 0; j < n; j++) {
        t.push(w.timeNs[k] + ((w.timeNs[k + 1] - w.timeNs[k]) * j) / n);
        x.push(w.flux[k]);
      }
      if (n === 1) x[x.length - 1] = w.flux[k];
    }
    t.push(w.timeNs[w.timeNs.length - 1]);
    x.push(w.flux[w.flux.length - 1]);
    const traj = { timeNs: Float64Array.from(t), flux: Float64Array.from(x) };
    const [ejLo, ejHi] = moverEjSpan(Q1, traj);
    const frame = buildManifoldFrame(edgeSimModel({ mover: Q1, partner: Q0, gGHz, partnerFlux: 0.29 }), { ejLo, ejHi });
    let flat = 0;
    for (let k = 0; k + 1 < traj.flux.length; k++) if (traj.flux[k + 1] === traj.flux[k]) flat++;
    expect(flat).toBeGreaterThan(20);
    const joined = stepSchedule(frame, traj);
    const apart = stepSchedule(frame, traj, { maxHoldStepNs: 1e9 });
    expect(apart.length - joined.length).toBeGreaterThan(flat / 2);
    let sum = 0;
    for (const s of joined) sum += s.h;
    expect(sum).toBeCloseTo(traj.timeNs[traj.timeNs.length - 1] - traj.timeNs[0], 12);
    const { comp } = computationalStates(frame, traj.flux[0]);
    const initial = comp.map((st) => ({ sector: st.sector, re: st.vector, im: new Float64Array(st.vector.length) }));
    for (const scheme of ['blocks', 'in-block'] as const) {
      const a = propagateInFrame(frame, traj, initial, { scheme });
      const b = propagateInFrame(frame, traj, initial, { scheme, maxHoldStepNs: 1e9 });
      expect(a.steps).toBe(joined.length);
      let worst = 0;
      for (let c = 0; c < 4; c++) for (let k = 0; k < a.re[c].length; k++) worst = Math.max(worst, Math.abs(a.re[c][k] - b.re[c][k]), Math.abs(a.im[c][k] - b.im[c][k]));
      expect(worst).toBeLessThan(1e-12);
    }
  });

  it('joinRamps: ramp segments joined into steps of up to 0.2 ns and 0.05 GHz of E_J, 1.6x fewer steps, amplitudes within 1e-3 of one step per segment (measured 3.6e-4)', () => {
    const Q2 = q('Q2');
    const Q0 = q('Q0');
    const gGHz = layout.couplings.find((c) => [c.a, c.b].sort().join() === 'Q0,Q2')!.gGHz;
    const d = designCzGate({ mover: Q2, partner: Q0, gGHz, moverParkFlux: 0, partnerFlux: 0.29, crossing: '11-20', rules: layout.rules });
    const traj = d.waveform;
    const [ejLo, ejHi] = moverEjSpan(Q2, traj);
    const frame = buildManifoldFrame(edgeSimModel({ mover: Q2, partner: Q0, gGHz, partnerFlux: 0.29 }), { ejLo, ejHi });
    const { comp } = computationalStates(frame, traj.flux[0]);
    const initial = comp.map((st) => ({ sector: st.sector, re: st.vector, im: new Float64Array(st.vector.length) }));
    for (const scheme of ['blocks', 'in-block'] as const) {
      const a = propagateInFrame(frame, traj, initial, { scheme, joinRamps: true });
      const b = propagateInFrame(frame, traj, initial, { scheme });
      expect(a.steps).toBeLessThan(b.steps / 1.4);
      let worst = 0;
      for (let c = 0; c < 4; c++) for (let k = 0; k < a.re[c].length; k++) worst = Math.max(worst, Math.abs(a.re[c][k] - b.re[c][k]), Math.abs(a.im[c][k] - b.im[c][k]));
      console.log(`joinRamps ${scheme}: ${a.steps} steps against ${b.steps}, max |d amplitude| ${worst.toExponential(2)}`);
      expect(worst).toBeLessThan(1e-3);
      expect(worst).toBeGreaterThan(0);
    }
    // with holds limited (the first-order estimate's schedule) nothing is joined
    expect(stepSchedule(frame, traj, { joinRamps: true, maxHoldStepNs: 0.25 }).length).toBe(stepSchedule(frame, traj, { maxHoldStepNs: 0.25 }).length);
  });
});
