/**
 * The parking search's last calibration hands its exact fluxes and ZZ values to the final idle
 * evaluation (src/plan/parking/assign.ts, recalibrate; src/plan/rules/idle-evaluate.ts). The
 * evaluation must be the one computed from the parking frequencies alone, bit for bit: the states
 * built on the known fluxes, the ZZ values reused, every finding the same. Checked on Clove-17 and
 * a generated chip, and with a qubit parked just outside its tunable range (no known flux there).
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile, parseLayoutText } from '../../../src/layout/load.js';
import { generateLayout } from '../../../src/chip/generate.js';
import { layoutToYaml } from '../../../src/layout/write.js';
import { buildPlanContext } from '../../../src/plan/context.js';
import { planOptions } from '../../../src/plan/options.js';
import { assignParking, recalibrate, type ExactPoint } from '../../../src/plan/parking/assign.js';
import { evaluateIdle, exactStates, exactZz } from '../../../src/plan/rules/idle-evaluate.js';

const layouts = {
  'Clove-17': () => loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'),
  'generated 5 x 5': () => parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 5, cols: 5, seed: 2 })), 'square-5x5.yaml'),
};

describe('the final idle evaluation on the last calibration', () => {
  for (const [name, layout] of Object.entries(layouts)) {
    it(`${name}: assignParking's evaluation equals evaluateIdle of its parking`, () => {
      const ctx = buildPlanContext(layout());
      const result = assignParking(ctx, planOptions({}));
      expect(result.idle).toStrictEqual(evaluateIdle(ctx, result.parkingGHz));
    });
  }

  it('known fluxes and ZZ give the same states and ZZ, also with a qubit outside its range', () => {
    const ctx = buildPlanContext(layouts['generated 5 x 5']());
    const result = assignParking(ctx, planOptions({}));
    const freq = Float64Array.from(result.parkingGHz);
    // qubit 0 half a hertz above its top (inside the evaluation's 1 Hz slack, outside the range)
    freq[0] = ctx.transmons[0].fMaxGHz + 5e-10;
    result.state.freq.set(freq);
    const found: ExactPoint = { flux: new Float64Array(ctx.n), zzGHz: new Float64Array(ctx.edges.length), has: new Uint8Array(ctx.edges.length) };
    recalibrate(ctx, result.state, found);
    expect(Number.isNaN(found.flux[0])).toBe(true);
    expect(found.has.some((h) => h === 0)).toBe(true);
    const fresh = exactStates(ctx, freq);
    const reused = exactStates(ctx, freq, found.flux);
    expect(reused).toStrictEqual(fresh);
    expect(exactZz(ctx, reused, found)).toStrictEqual(exactZz(ctx, fresh));
  });
});
