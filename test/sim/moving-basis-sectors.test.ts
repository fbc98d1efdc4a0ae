/**
 * The sector-wise moving-basis propagation's step plan (src/sim/moving-basis-sectors.ts pathSteps):
 * a worked example by hand. Its propagation is checked against the plain moving-basis propagator
 * in test/budget/spectator-moving-basis.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { pathSteps } from '../../src/sim/moving-basis-sectors.js';

describe('pathSteps', () => {
  it('holds are single steps, ramps are joined up to the step and cover the waveform exactly', () => {
    const traj = { timeNs: Float64Array.from([0, 0.06, 0.12, 0.18, 0.24, 1.24, 2.24, 2.3, 2.36]), flux: Float64Array.from([0, 0.1, 0.2, 0.3, 0.4, 0.4, 0.4, 0.2, 0]) };
    const steps = pathSteps(traj, 0.13);
    expect(steps.map((s) => [+s.t0.toFixed(6), +s.t1.toFixed(6), s.hold])).toEqual([
      [0, 0.12, false],
      [0.12, 0.24, false],
      [0.24, 2.24, true],
      [2.24, 2.36, false],
    ]);
  });
});
