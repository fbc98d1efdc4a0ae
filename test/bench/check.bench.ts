/**
 * `fluxlane check` of a 1,024-qubit chip (issue 13 target: under 5 s): the generated 32 x 32
 * square chip (seed 1). The target is for the built command as users run it
 * (`node dist/cli/main.js check FILE --json`, whole process: start-up, reading the YAML file, the
 * layout stage, chip graph, the planner's evaluation without pulse design, the JSON written; run
 * `npm run build` after changes), as for the yield's fixed mode (./yield.bench.ts). Three
 * processes, one after the other; the target is on their median (each is a cold start: no run
 * warms another up), and the slowest is printed too (this machine's speed changes by up to 1.5x
 * between minutes: DEVELOPERS.md, Performance log, twelfth round). The same steps
 * from the TypeScript sources in this process are listed too, without a target: from tsx's
 * transform the planner's code ran 0-21 % slower than built in the runs measured (DEVELOPERS.md,
 * Performance log, ninth round), and the whole process adds ~0.4 s of start-up, output and exit
 * (0.36-0.39 s beside the in-process total of `--profile`, 2026-12-04 evening, a slow phase).
 */
import type { Benchmark } from './run.js';
import { chipFile, requireBuilt, runBuilt } from './built-command.js';
import { generateLayout } from '../../src/chip/generate.js';
import { buildChipGraph } from '../../src/chip/graph.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { parseLayoutText } from '../../src/layout/load.js';
import { checkChip } from '../../src/plan/check.js';

let yaml: string | undefined;
const text = () => (yaml ??= layoutToYaml(generateLayout({ kind: 'square', rows: 32, cols: 32, seed: 1 })));

const file = chipFile('square-32x32.yaml', text);

export const check1024Built: Benchmark = {
  name: 'check, 1,024-qubit square chip (32 x 32), YAML file to JSON (built command, whole process)',
  target: 5e6,
  runs: 3,
  warmup: 0,
  setup: () => {
    requireBuilt('check.bench.ts');
    file();
  },
  run: () => runBuilt(['check', file(), '--json']).length,
};

export const check1024: Benchmark = {
  name: 'check, 1,024-qubit square chip (32 x 32), YAML text to JSON (from the sources, under tsx, this process)',
  runs: 1,
  warmup: 0,
  setup: () => void text(),
  run: () => {
    const layout = parseLayoutText(text(), 'square-32x32.yaml');
    const r = checkChip(layout, buildChipGraph(layout));
    return JSON.stringify({ ...r.data, violations: r.violations, flags: r.flags });
  },
};
