/**
 * Benchmark of the gate designer (issue 5 target): one tuned CZ design per edge < 100 ms, on the
 * Bowline-5 demo's edges with the planner's parking and crossings (default family, no
 * decoherence; each call designs the next edge).
 */
import type { Benchmark } from './run.js';
import { loadLayoutFile } from '../../src/layout/load.js';
import { planChip } from '../../src/plan/plan.js';
import { designCzGate, type GateDesignRequest } from '../../src/gate/design.js';
import { gateRequest } from '../../src/plan/pulses.js';

const layout = loadLayoutFile('layouts/bowline-5.yaml', 'layouts/bowline-5.yaml');
const plan = planChip(layout, { seed: 1 });
const requests: GateDesignRequest[] = plan.edges.filter((e) => Number.isFinite(e.interactionGHz)).map((e) => ({ ...gateRequest(plan, e, { noise: false }), noise: false }));
let k = 0;
let lastLeak = 0;

export const tunedDesign: Benchmark = {
  name: `one tuned CZ design (default family), Bowline-5 edges with the planner's parking (${requests.length} edges in turn)`,
  target: 100_000,
  runs: 8,
  warmup: 2,
  run: () => {
    const d = designCzGate(requests[k++ % requests.length]);
    lastLeak = Math.max(lastLeak, d.leakage);
    return d;
  },
  report: () => `largest leakage over the designs ${lastLeak.toExponential(2)}`,
};
