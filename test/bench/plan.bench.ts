/**
 * Benchmarks of the planner (issue 6 targets): `plan` without pulse design of a 100-qubit square
 * chip under 2 s and of a 1,024-qubit square chip under 30 s (synthetic chips from
 * src/chip/generate.ts, seed 1, parsed by the layout stage first so only planning is timed), and
 * the same plans as the CLI runs them (layout file parsed, JSON written) for the README. The full
 * plan with pulse design of the 17-qubit demo (target 10 s) joins when the gate stage provides
 * src/gate/design.ts (it is listed as missing otherwise).
 */
import type { Benchmark } from './run.js';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { parseLayoutText } from '../../src/layout/load.js';
import type { ChipLayout } from '../../src/layout/types.js';
import { planChip } from '../../src/plan/plan.js';
import { planJson } from '../../src/report/plan-json.js';
import { loadGateDesigner } from '../../src/plan/gate-seam.js';
import { designPulses } from '../../src/plan/pulses.js';
import { loadLayoutFile } from '../../src/layout/load.js';

function square(rows: number, cols: number): { yaml: string; layout: ChipLayout } {
  const yaml = layoutToYaml(generateLayout({ kind: 'square', rows, cols, seed: 1 }));
  return { yaml, layout: parseLayoutText(yaml, `square-${rows}x${cols}.yaml`) };
}

let sq100: { yaml: string; layout: ChipLayout } | undefined;
let sq1024: { yaml: string; layout: ChipLayout } | undefined;

export const plan100: Benchmark = {
  name: 'plan --no-pulses, 100-qubit square chip (10 x 10, layout parsed)',
  target: 2e6,
  runs: 3,
  setup: () => void (sq100 ??= square(10, 10)),
  run: () => planChip(sq100!.layout),
};

export const plan100Cli: Benchmark = {
  name: 'plan --no-pulses, 100-qubit square chip, from YAML text to plan JSON (as the CLI)',
  runs: 3,
  setup: () => void (sq100 ??= square(10, 10)),
  run: () => {
    const layout = parseLayoutText(sq100!.yaml, 'sq100.yaml');
    return JSON.stringify(planJson(planChip(layout), { file: 'sq100.yaml', seed: 1, pulses: false }));
  },
};

export const plan1024: Benchmark = {
  name: 'plan --no-pulses, 1,024-qubit square chip (32 x 32, layout parsed)',
  target: 30e6,
  runs: 1,
  warmup: 0,
  setup: () => void (sq1024 ??= square(32, 32)),
  run: () => planChip(sq1024!.layout),
};

const designer = await loadGateDesigner();
const clove = loadLayoutFile(new URL('../../layouts/clove-17.yaml', import.meta.url).pathname, 'layouts/clove-17.yaml');

export const planClovePulses: Benchmark | undefined = designer
  ? {
      name: 'plan with CZ pulse design (noise on), Clove-17 demo (24 edges)',
      target: 10e6,
      runs: 1,
      warmup: 0,
      run: () => {
        const plan = planChip(clove);
        designPulses(plan, designer, { noise: true });
        return plan;
      },
    }
  : undefined;

if (!designer) process.stderr.write('plan.bench.ts: the gate stage (src/gate/design.ts) is missing; the pulse-design benchmark is not run\n');
