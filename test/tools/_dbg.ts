import { loadLayoutFile } from '../../src/layout/load.js';
import { planChip } from '../../src/plan/plan.js';
import { gateRequest } from '../../src/plan/pulses.js';
import { designCzGate } from '../../src/gate/design.js';
const [lay, m, p, fam] = process.argv.slice(2);
const plan = planChip(loadLayoutFile(`layouts/${lay}.yaml`, lay), { seed: 1 });
const e = plan.edges.find((e) => plan.ctx.transmons[e.mover].id === m && plan.ctx.transmons[e.partner].id === p)!;
for (const ramp of [undefined, 12, 16, 20, 24, 32]) {
  const d = designCzGate({ ...gateRequest(plan, e, { noise: false }), family: fam, ...(ramp ? { rampNs: ramp } : {}) });
  console.log('ramp', ramp, d.rampNs, 'L', d.leakage.toExponential(3), '1-F', (1 - d.fidelity).toExponential(3), 'hold', d.holdNs.toFixed(2), 'off MHz', (d.crossingOffsetGHz * 1e3).toFixed(2), 'evals', d.evaluations, 'untunedL', d.untuned.leakage.toExponential(2));
}
