/**
 * Ambegaokar-Baratoff E_J from R_n against an independent evaluation with mathjs's physical
 * constants (mathjs elementaryCharge, planckConstant: CODATA) through the other route,
 * I_c = pi Delta / (2 e R_n) and E_J = hbar I_c / (2 e) (Ambegaokar and Baratoff, PRL 10, 486
 * (1963)), and against the rule of thumb E_J R_n ~ 140 GHz kOhm for aluminium with
 * Delta = 180 ueV (common practice).
 */
import { describe, expect, it } from 'vitest';
import { create, all } from 'mathjs';
import { ambegaokarBaratoffConstant, josephsonEnergyFromResistance } from '../../src/transmon/ambegaokar-baratoff.js';
import { expectClose } from '../support/close.js';

const math = create(all);

describe('josephsonEnergyFromResistance(rn, gap)', () => {
  it('equals hbar I_c / (2 e) with I_c R_n = pi Delta / (2 e), using mathjs CODATA constants, to 1e-12', () => {
    const e = math.elementaryCharge.toNumber('C');
    const h = math.planckConstant.toNumber('J s');
    const hbar = h / (2 * Math.PI);
    for (const [rn, gap] of [[6.1, 180], [10, 180], [3.3, 200], [20, 170]]) {
      const delta = gap * 1e-6 * e; // J
      const ic = (Math.PI * delta) / (2 * e * rn * 1e3); // A
      const ejHz = (hbar * ic) / (2 * e) / h;
      expectClose(josephsonEnergyFromResistance(rn, gap), ejHz / 1e9, 1e-12, `R_n=${rn} kOhm, Delta=${gap} ueV`);
    }
  });

  it('E_J R_n is about 140 GHz kOhm for Delta = 180 ueV (common practice; exactly 140.43 from CODATA)', () => {
    const c = ambegaokarBaratoffConstant();
    expect(c).toBeGreaterThan(139.5);
    expect(c).toBeLessThan(141);
    expectClose(c, 180e-6 / (8 * 1.602176634e-19) / 1e12, 1e-12, 'Delta / (8 e) in GHz kOhm');
    expectClose(josephsonEnergyFromResistance(6.1), c / 6.1, 1e-14, '1/R_n scaling');
  });
});
