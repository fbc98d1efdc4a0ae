/**
 * The tuner's fast path (one ramp simulation gives the gate for every hold, with the return
 * ramp's propagator the transpose of the ramp's by time reversal) against a direct simulation
 * of the whole ramp - hold - reversed ramp trajectory.
 */
import { describe, expect, it } from 'vitest';
import { HoldScan } from '../../src/gate/hold-scan.js';
import { buildManifoldFrame } from '../../src/sim/manifold-frame.js';
import { computationalStates, simulateGate } from '../../src/sim/simulate-gate.js';
import { propagateInFrame } from '../../src/sim/propagate-frame.js';
import { edgeSimModel, moverEjRange } from '../../src/sim/pair-model.js';
import { BARE_CROSSING, G_LAYOUT, Q0, Q1 } from './support.js';

describe('hold scan', () => {
  it('psi^T D(t) psi reproduces the full symmetric trajectory to 1e-7', () => {
    const dest = 0.99 * BARE_CROSSING;
    const n = 24;
    const rampNs = 6;
    const up = { timeNs: new Float64Array(n + 1), flux: new Float64Array(n + 1) };
    for (let k = 0; k <= n; k++) {
      up.timeNs[k] = (rampNs * k) / n;
      up.flux[k] = dest * (0.5 - 0.5 * Math.cos((Math.PI * k) / n));
    }
    const model = edgeSimModel({ mover: Q1, partner: Q0, gGHz: G_LAYOUT, partnerFlux: 0 });
    const frame = buildManifoldFrame(model, moverEjRange(Q1, up));
    const { comp } = computationalStates(frame, 0);
    const res = propagateInFrame(frame, up, comp.map((s) => ({ sector: s.sector, re: s.vector, im: new Float64Array(s.vector.length) })), { maxStepNs: 0.02 });
    const scan = new HoldScan(frame, Q1.ejGHz(dest), comp, res.re, res.im, rampNs);
    for (const hold of [0, 7.3, 21.9]) {
      const t: number[] = Array.from(up.timeNs);
      const x: number[] = Array.from(up.flux);
      if (hold > 0) {
        t.push(rampNs + hold);
        x.push(dest);
      }
      for (let k = 1; k <= n; k++) {
        t.push(rampNs + hold + up.timeNs[k]);
        x.push(up.flux[n - k]);
      }
      const full = simulateGate(frame, { timeNs: Float64Array.from(t), flux: Float64Array.from(x) }, { maxStepNs: 0.02 });
      const m = scan.block(hold);
      let d = 0;
      for (let i = 0; i < 16; i++) d = Math.max(d, Math.hypot(m.re[i] - full.m.re[i], m.im[i] - full.m.im[i]));
      expect(d).toBeLessThan(1e-7);
    }
  });
});
