/**
 * Exchange coupling g(Phi_A, Phi_B) = G |n01_A| |n01_B| (README physics conventions sec. 2), checked against
 * (1) the dressed splitting at the 01-10 resonance, which the two-level Rabi formula puts at 2 g
 *     (corrections of relative order g/(f01_A + f01_B) and g/alpha from other states: < 2% here);
 * (2) Koch et al. 2007 Eq. 3.4, |n01| ~ (E_J / 8 E_C)^(1/4) / sqrt2, so g(Phi_A, 0) / g(0, 0)
 *     ~ (E_J(Phi_A) / E_JS)^(1/4), with relative corrections O(sqrt(E_C/E_J)) (from memory).
 */
import { describe, expect, it } from 'vitest';
import { Transmon } from '../../src/transmon/transmon.js';
import { CoupledPair } from '../../src/pair/pair.js';
import { chargeCouplingFromExchange, exchangeFromChargeCoupling } from '../../src/pair/coupling.js';
import { expectClose } from '../support/close.js';

const qa = new Transmon('A', { ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 });
const qb = new Transmon('B', { ecGHz: 0.2, ejsGHz: 22, asymmetry: 0.3 });

describe('exchange coupling g', () => {
  it('equals the layout g with both qubits at Phi = 0, and G inverts it', () => {
    const pair = new CoupledPair(qa, qb, 0.0142);
    expectClose(pair.exchangeCoupling(0, 0), 0.0142, 1e-14, 'g(0, 0)');
    expectClose(chargeCouplingFromExchange(0.0142, qa.chargeElement01(0), qb.chargeElement01(0)), pair.gChargeGHz, 1e-15, 'G');
    expectClose(exchangeFromChargeCoupling(pair.gChargeGHz, qa.chargeElement01(0), qb.chargeElement01(0)), 0.0142, 1e-15, 'round trip');
  });

  it('gives the dressed 01-10 splitting 2 g at resonance (two-level Rabi formula) within 2%', () => {
    for (const g of [0.006, 0.012, 0.02]) {
      const pair = new CoupledPair(qa, qb, g);
      for (const fb of [0.1, 0.3]) {
        const fbF01 = qb.f01(fb);
        const fa = qa.fluxForF01OrNull(fbF01);
        if (fa === null) continue;
        const s = pair.spectrum(fa, fb);
        const split = Math.abs(s.energy(1, 0) - s.energy(0, 1));
        const gHere = pair.exchangeCoupling(fa, fb);
        expect(Math.abs(split / (2 * gHere) - 1), `g=${g} Phi_B=${fb}`).toBeLessThanOrEqual(0.02);
      }
    }
  });

  it('shrinks as a qubit tunes down like (E_J / E_JS)^(1/4) within 0.5 sqrt(E_C/E_J)', () => {
    const pair = new CoupledPair(qa, qb, 0.0142);
    let prev = Infinity;
    for (const flux of [0, 0.1, 0.2, 0.3, 0.4, 0.5]) {
      const ratio = pair.exchangeCoupling(flux, 0) / pair.exchangeCoupling(0, 0);
      expect(ratio).toBeLessThanOrEqual(prev);
      prev = ratio;
      const ej = qa.ejGHz(flux);
      const koch = (ej / qa.ejsGHz) ** 0.25;
      expect(Math.abs(ratio / koch - 1), `Phi=${flux}`).toBeLessThanOrEqual(0.5 * Math.sqrt(qa.ecGHz / ej));
    }
  });
});
