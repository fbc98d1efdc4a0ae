/**
 * Drawn transmons beyond the reduced table's range (E_J/E_C far outside the accepted 20-2000, as
 * only extreme draws give) fall back to exact eigen solves instead of reading a clamped table:
 * the fixed-mode findings equal those of a table wide enough to cover them (the layout stage,
 * and so verify, refuses such a transmon in a layout).
 */
import { describe, expect, it } from 'vitest';
import { ReducedSpectrum, sharedReducedSpectrum } from '../../src/transmon/reduced-spectrum.js';
import { nominalChip } from '../../src/yield/chip-model.js';
import { evaluateFixed, fixedPlan } from '../../src/yield/fixed-evaluate.js';
import { nominalPlan, planForDrawnChip } from '../../src/yield/nominal-plan.js';
import type { DrawnChip } from '../../src/yield/draw.js';
import { reducedQubitTable } from '../../src/plan/reduced-levels.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { QubitTable } from '../../src/plan/qubit-table.js';
import { handChip } from '../support/plan-chips.js';

describe('draws beyond the reduced table', () => {
  it('a transmon with E_JS/E_C = 4,000 gets exact tables; fixed mode finds what a wider table finds', () => {
    const layout = handChip('Extreme', { A: { fMax: '6.2 GHz' }, B: { fMax: '5.1 GHz' } }, [['A', 'B', '12 MHz']]);
    const chip = nominalChip(layout, { rn: 0.02, ec: 0.01, g: 0.03 });
    const nominal = nominalPlan(layout, 1);
    const table = sharedReducedSpectrum();
    // qubit A's E_JS multiplied so that E_JS/E_C = 4,000 (> the table's 3,600)
    const drawn: DrawnChip = {
      index: 0,
      ecGHz: Float64Array.from(chip.ecGHz),
      ejsGHz: Float64Array.from([4000 * chip.ecGHz[0], chip.ej1GHz[1] + chip.ej2GHz[1]]),
      asymmetry: Float64Array.from([0.3, 0.3]),
      gChargeGHz: Float64Array.from(chip.gChargeGHz),
    };
    expect(drawn.ejsGHz[0] / drawn.ecGHz[0]).toBeGreaterThan(table.rMax);
    const plan = fixedPlan(chip, planForDrawnChip(nominal.plan));
    const fallback = evaluateFixed(chip, plan, drawn, table).violations;
    const wide = evaluateFixed(chip, plan, drawn, new ReducedSpectrum({ rMax: 6000, points: 6000 })).violations;
    const key = (f: { rule: string; qubits: string[]; value: number | null }) => `${f.rule}|${f.qubits}|${f.value?.toPrecision(6)}`;
    expect(fallback.map(key).sort()).toEqual(wide.map(key).sort());
    expect(fallback.length).toBeGreaterThan(0); // A can no longer reach its parking point
    const t = new Transmon('A', { ecGHz: drawn.ecGHz[0], ejsGHz: drawn.ejsGHz[0], asymmetry: 0.3 });
    const f = 0.5 * (new QubitTable(t).fLowGHz + t.fMaxGHz);
    expect(reducedQubitTable(t, table).at(f).f12).toBe(new QubitTable(t).at(f).f12);
  });
});
