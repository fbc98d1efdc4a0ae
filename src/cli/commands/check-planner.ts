/**
 * The planner's stage of `fluxlane check` (src/plan/check.ts): every idle collision rule at the
 * best parking assignment, the interaction feasibility of every edge (mover, crossing, spectators,
 * swept crossings; no pulse design), the parallel layers and the crowding margins. Stage names in
 * `--profile`: spectra, parking, interaction, layers, crowding.
 */
import { checkChip } from '../../plan/check.js';
import type { CheckStage } from './check.js';
import { FigureGuard, guardPlan } from '../figure-guard.js';

export const PLANNER_CHECK_STAGE: CheckStage = {
  name: 'collisions',
  run(input) {
    let bar: ReturnType<NonNullable<typeof input.progress>> | undefined;
    let current = '';
    const result = checkChip(input.layout, input.graph, {}, {
      profiler: input.profiler,
      progress: (stage, done, total) => {
        if (!input.progress) return;
        if (stage !== current) {
          bar?.done();
          current = stage;
          bar = input.progress(stage, total);
        }
        bar?.tick();
        if (done >= total) {
          bar?.done();
          bar = undefined;
        }
      },
    });
    bar?.done();
    const guard = new FigureGuard(input.layout);
    guardPlan(guard, result.plan);
    guard.throwIfAny();
    return { violations: result.violations, flags: result.flags, data: result.data, lines: result.lines };
  },
};
