/**
 * Start-up of the built command (dist/, as `npm ci` builds it; run `npm run build` after
 * changes): wall time of a whole process, Node's own start included, for --version, --help,
 * `spectrum` of one qubit and `check` of the 5-qubit demo. Each command loads only its own
 * stages (src/cli/main.ts, lazy commands); the goal is well under a second each.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import type { Benchmark } from './run.js';
import { BUILT_MAIN, requireBuilt } from './built-command.js';

const demo = fileURLToPath(new URL('../../layouts/bowline-5.yaml', import.meta.url));

function command(name: string, args: string[], target?: number): Benchmark {
  return {
    name: `start-up: fluxlane ${name} (node dist/cli/main.js, whole process)`,
    target,
    runs: 5,
    warmup: 1,
    setup: () => requireBuilt('startup.bench.ts'),
    run: () => {
      // (exit 0 only: these commands break no rule)
      const r = spawnSync(process.execPath, [BUILT_MAIN, ...args], { encoding: 'utf8' });
      if (r.status !== 0) throw new Error(`fluxlane ${args.join(' ')} exited ${r.status}: ${r.stderr}`);
      return r.stdout.length;
    },
  };
}

export const version = command('--version', ['--version'], 0.5e6);
export const help = command('--help', ['--help'], 0.5e6);
export const spectrum = command('spectrum LAYOUT --qubit Q1 --points 5', ['spectrum', demo, '--qubit', 'Q1', '--points', '5'], 1e6);
export const check = command('check LAYOUT (Bowline-5)', ['check', demo], 1e6);
