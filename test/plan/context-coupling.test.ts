/**
 * The plan context finds each transmon's |<0|n|1>| at Phi = 0 once and builds every edge's charge
 * coupling G from it (src/plan/context.ts), and hands G to the edge's CoupledPair: both must be
 * the numbers chargeCouplingForPair and a CoupledPair built alone give (src/pair/coupling.ts,
 * G = g / (|<0|n|1>_A| |<0|n|1>_B|)), bit for bit, on every edge of two demos. The context's pairs
 * share each qubit's last eigenbasis (src/pair/pair.ts BasisSlot): their ZZ and dressed levels
 * must be a lone pair's.
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { buildPlanContext } from '../../src/plan/context.js';
import { chargeCouplingForPair } from '../../src/pair/coupling.js';
import { CoupledPair } from '../../src/pair/pair.js';

describe('charge couplings of the plan context', () => {
  for (const name of ['clove-17', 'hitch-30']) {
    it(`${name}: every edge's G and its pair's G are chargeCouplingForPair's`, () => {
      const ctx = buildPlanContext(loadLayoutFile(`layouts/${name}.yaml`, `layouts/${name}.yaml`));
      for (const e of ctx.edges) {
        const a = ctx.transmons[e.a];
        const b = ctx.transmons[e.b];
        expect(e.gChargeGHz).toBe(chargeCouplingForPair(a, b, e.gGHz));
        expect(ctx.pair(e.index).gChargeGHz).toBe(new CoupledPair(a, b, e.gGHz).gChargeGHz);
        expect(ctx.pair(e.index).zz(0.1, 0.2)).toBe(new CoupledPair(a, b, e.gGHz).zz(0.1, 0.2));
      }
      // each qubit at one flux in all its pairs: its eigenbasis comes from the slot its pairs share
      const fluxOf = (q: number) => 0.03 + 0.011 * q;
      for (const e of ctx.edges) {
        const alone = new CoupledPair(ctx.transmons[e.a], ctx.transmons[e.b], e.gGHz);
        expect(ctx.pair(e.index).zz(fluxOf(e.a), fluxOf(e.b))).toBe(alone.zz(fluxOf(e.a), fluxOf(e.b)));
        expect(ctx.pair(e.index).spectrum(fluxOf(e.a), fluxOf(e.b)).dressed).toEqual(alone.spectrum(fluxOf(e.a), fluxOf(e.b)).dressed);
      }
    });
  }
});
