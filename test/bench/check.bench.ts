/**
 * `fluxlane check` of a 1,024-qubit chip (issue 13 target: under 5 s): the generated 32 x 32
 * square chip (seed 1) from its YAML text to the check's JSON, as the command runs it (layout
 * stage, chip graph, the planner's evaluation without pulse design), and the planner part alone.
 */
import type { Benchmark } from './run.js';
import { generateLayout } from '../../src/chip/generate.js';
import { buildChipGraph } from '../../src/chip/graph.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { parseLayoutText } from '../../src/layout/load.js';
import { checkChip } from '../../src/plan/check.js';

let yaml: string | undefined;
const text = () => (yaml ??= layoutToYaml(generateLayout({ kind: 'square', rows: 32, cols: 32, seed: 1 })));

export const check1024: Benchmark = {
  name: 'check, 1,024-qubit square chip (32 x 32), YAML text to JSON as the command',
  target: 5e6,
  runs: 1,
  warmup: 0,
  setup: () => void text(),
  run: () => {
    const layout = parseLayoutText(text(), 'square-32x32.yaml');
    const r = checkChip(layout, buildChipGraph(layout));
    return JSON.stringify({ ...r.data, violations: r.violations, flags: r.flags });
  },
};
