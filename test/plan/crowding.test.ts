/**
 * Crowding (src/plan/crowding.ts): a qubit's margin is its distance to the nearest collision
 * condition minus that condition's threshold (README physics conventions sec. 5), in MHz and in fabrication
 * spreads sigma_f = |df01/d ln E_J| * resistanceSpread (Ambegaokar-Baratoff: E_J ~ 1/R_n, common
 * practice). Checked against the exact transmon stage and a central finite difference in E_J.
 */
import { describe, expect, it } from 'vitest';
import { planChip } from '../../src/plan/plan.js';
import { exactQubitState } from '../../src/plan/exact-state.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { expectClose } from '../support/close.js';
import { handChip } from '../support/plan-chips.js';

describe('crowding margins', () => {
  it('with only the detuning rules in play, the margin is min(|f - f_c| - threshold) over the conditions', () => {
    // ZZ switched off (a huge limit) so the nearest conditions are plain detunings.
    const chip = handChip('margins', { A: { fMax: '5.8 GHz', park: '5.8 GHz' }, B: { fMax: '5.6 GHz', park: '5.45 GHz' }, C: { fMax: '5.7 GHz', park: '5.66 GHz' } }, [['A', 'B', '10 MHz'], ['A', 'C', '10 MHz']], { zzLimit: '1 GHz' });
    const plan = planChip(chip);
    const r = chip.rules;
    const s = plan.states;
    const a = plan.crowding.qubits[0];
    const conditions = [
      Math.abs(5.8 - 5.45) - r.detuning0101GHz,
      Math.abs(5.8 - 5.66) - r.detuning0101GHz,
      Math.abs(5.8 - s[1].f12GHz) - r.detuning0112GHz,
      Math.abs(5.8 - s[2].f12GHz) - r.detuning0112GHz,
      Math.abs(s[0].f12GHz - 5.45) - r.detuning0112GHz,
      Math.abs(s[0].f12GHz - 5.66) - r.detuning0112GHz,
    ];
    expectClose(a.idleMarginGHz, Math.min(...conditions), 1e-7, 'idle margin of A');
    // B and C share A: next-nearest 01-01 at |5.45 - 5.66| - 30 MHz
    const b = plan.crowding.qubits[1];
    expect(b.idleMarginGHz).toBeLessThanOrEqual(Math.abs(5.45 - 5.66) - r.detuningNext0101GHz + 1e-7);
    expectClose(a.marginSpreads, a.marginGHz / s[0].sigmaGHz, 1e-12, 'spreads');
  });

  it('sigma_f = |df01/d ln E_J| * spread matches a central finite difference of the exact f01 in E_J', () => {
    const t = new Transmon('A', { ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 });
    for (const f of [5.3, 4.8, 4.0]) {
      const st = exactQubitState(t, f, 0.02);
      const flux = t.fluxForF01(f);
      const eps = 1e-4;
      const up = new Transmon('u', { ...t.params, ejsGHz: t.ejsGHz * (1 + eps) }).f01(flux);
      const down = new Transmon('d', { ...t.params, ejsGHz: t.ejsGHz * (1 - eps) }).f01(flux);
      const slope = (up - down) / (2 * eps); // df01 / d ln E_J at fixed flux
      expectClose(st.sigmaGHz, Math.abs(slope) * 0.02, 1e-6, `sigma at ${f} GHz`);
      // About half of f01 per unit ln E_J (f01 ~ sqrt(8 E_J E_C), Koch 2007): 2 % of that.
      expect(st.sigmaGHz / (0.01 * f)).toBeGreaterThan(0.9);
      expect(st.sigmaGHz / (0.01 * f)).toBeLessThan(1.15);
    }
  });

  it('flags margins under marginFlagSpreads and reports the usable share of each window', () => {
    const chip = handChip('tight', { A: { fMax: '5.8 GHz', park: '5.8 GHz' }, B: { fMax: '5.9 GHz', window: ['5.6 GHz', '5.9 GHz'] } }, [['A', 'B', '10 MHz']], { zzLimit: '1 GHz' });
    const plan = planChip(chip);
    for (const [k, c] of plan.crowding.qubits.entries()) {
      const flagged = plan.flags.some((f) => f.rule === 'margin' && f.qubits[0] === plan.ctx.ids[k]);
      // only conditions fixed at fabrication (a qubit at its sweet spot against a defect, its
      // resonator or another sweet-spot qubit) are flagged; a qubit off its sweet spot can be
      // re-tuned after fabrication, its margin is reported but not flagged
      expect(flagged).toBe(c.fabrication !== null && c.fabrication.spreads < chip.rules.marginFlagSpreads);
      if (c.fabrication) expect(c.fabrication.marginGHz).toBeGreaterThanOrEqual(c.marginGHz - 1e-12);
      expect(c.usableFraction).toBeGreaterThan(0);
      expect(c.usableFraction).toBeLessThanOrEqual(1);
    }
    // B's window 5.6-5.9 GHz loses A's 01-01 band (5.75-5.85) and the 01-12 bands inside it.
    const b = plan.crowding.qubits[1];
    expect(b.usableFraction).toBeLessThan(1 - 0.1 / 0.3 + 1e-6);
  });
});
