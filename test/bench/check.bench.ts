/**
 * `fluxlane check` of a 1,024-qubit chip (issue 13 target: under 5 s): the generated 32 x 32
 * square chip (seed 1). The target is for the built command as users run it
 * (`node dist/cli/main.js check FILE --json`, whole process: start-up, reading the YAML file, the
 * layout stage, chip graph, the planner's evaluation without pulse design, the JSON written; run
 * `npm run build` after changes), as for the yield's fixed mode (./yield.bench.ts). The same steps
 * from the TypeScript sources in this process are listed too, without a target: the planner's
 * code runs 15-25 % slower from tsx's transform than built (DEVELOPERS.md, Performance log, ninth
 * round).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Benchmark } from './run.js';
import { generateLayout } from '../../src/chip/generate.js';
import { buildChipGraph } from '../../src/chip/graph.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { parseLayoutText } from '../../src/layout/load.js';
import { checkChip } from '../../src/plan/check.js';

let yaml: string | undefined;
const text = () => (yaml ??= layoutToYaml(generateLayout({ kind: 'square', rows: 32, cols: 32, seed: 1 })));

const builtMain = fileURLToPath(new URL('../../dist/cli/main.js', import.meta.url));
let chipFile: string | undefined;

export const check1024Built: Benchmark = {
  name: 'check, 1,024-qubit square chip (32 x 32), YAML file to JSON (built command, whole process)',
  target: 5e6,
  runs: 1,
  warmup: 0,
  setup: () => {
    if (!existsSync(builtMain)) throw new Error('check.bench.ts: dist/cli/main.js is missing; run npm run build first');
    if (!chipFile) {
      chipFile = path.join(mkdtempSync(path.join(tmpdir(), 'fluxlane-bench-')), 'square-32x32.yaml');
      writeFileSync(chipFile, text());
    }
  },
  run: () => {
    const r = spawnSync(process.execPath, [builtMain, 'check', chipFile!, '--json'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
    // (exit 1: the check found violations; the generated chip has none, but the time is the same)
    if (r.status !== 0 && r.status !== 1) throw new Error(`fluxlane check exited ${r.status}: ${r.stderr}`);
    return r.stdout.length;
  },
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
