/**
 * Asymmetric-SQUID Josephson energy against its definition as the phasor sum of two junctions,
 * E_J(Phi) = |E_J1 e^{i pi Phi} + E_J2 e^{-i pi Phi}| (Koch et al. 2007, Eq. 2.17 follows from
 * it), its slope against a central finite difference, and the closed-form inverse.
 */
import { describe, expect, it } from 'vitest';
import { fluxForJosephsonEnergy, josephsonEnergy, josephsonEnergySlope } from '../../src/transmon/josephson.js';
import { expectClose } from '../support/close.js';

describe('josephsonEnergy(ejs, d, flux)', () => {
  it('equals |E_J1 e^{i pi Phi} + E_J2 e^{-i pi Phi}| for any flux to 1e-14', () => {
    for (const [ej1, ej2] of [[10, 10], [12, 8], [3, 17], [20, 0.5]]) {
      const ejs = ej1 + ej2;
      const d = Math.abs(ej1 - ej2) / ejs;
      for (const flux of [-1.3, -0.5, -0.2, 0, 0.1, 0.25, 0.4, 0.5, 0.77, 2.1]) {
        const re = (ej1 + ej2) * Math.cos(Math.PI * flux);
        const im = (ej1 - ej2) * Math.sin(Math.PI * flux);
        expectClose(josephsonEnergy(ejs, d, flux), Math.sqrt(re * re + im * im), 1e-14, `E_J1=${ej1} E_J2=${ej2} Phi=${flux}`);
      }
    }
  });

  it('slope matches a central finite difference to 1e-8 relative', () => {
    for (const d of [0, 0.2, 0.6]) {
      for (const flux of [0.05, 0.2, 0.33, 0.45, -0.3]) {
        const h = 1e-6;
        const fd = (josephsonEnergy(20, d, flux + h) - josephsonEnergy(20, d, flux - h)) / (2 * h);
        expectClose(josephsonEnergySlope(20, d, flux), fd, 1e-8, `d=${d} Phi=${flux}`);
      }
    }
    expect(josephsonEnergySlope(20, 0.3, 0)).toBe(-0);
  });

  it('is exact at the sweet spots: E_J(1/2) = d E_JS and the slope there is exactly 0', () => {
    for (const flux of [0.5, -0.5, 1.5]) {
      expect(josephsonEnergy(20, 0.3, flux)).toBe(20 * 0.3);
      expect(Math.abs(josephsonEnergySlope(20, 0.3, flux))).toBe(0);
    }
    expect(josephsonEnergy(20, 0.3, 1)).toBe(20);
  });

  it('fluxForJosephsonEnergy inverts E_J on 0 <= Phi <= 1/2 and returns NaN outside [d E_JS, E_JS]', () => {
    for (const d of [0, 0.25, 0.7]) {
      for (const flux of [0, 0.01, 0.2, 0.37, 0.5]) {
        const ej = josephsonEnergy(18, d, flux);
        // Near Phi = 0 the inverse is square-root conditioned: Phi error ~ sqrt(eps).
        const back = fluxForJosephsonEnergy(18, d, ej);
        expectClose(josephsonEnergy(18, d, back), ej, 1e-14, `d=${d} Phi=${flux} (E_J round trip)`);
        expect(Math.abs(back - flux)).toBeLessThanOrEqual(flux < 0.02 ? 1e-7 : 1e-12);
      }
      expect(fluxForJosephsonEnergy(18, d, 18.1)).toBeNaN();
    }
    expect(fluxForJosephsonEnergy(18, 0.5, 8)).toBeNaN();
  });
});
