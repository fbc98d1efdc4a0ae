/**
 * Mover resonances against a static partner (README physics conventions sec. 2): the returned fluxes satisfy the
 * bare conditions f01_m = f01_p, f12_m = f01_p, f01_m = f12_p; the dressed splitting at each
 * equals twice the reported coupling (two-level Rabi formula, within 3%); the 11-20 coupling is
 * ~ sqrt2 g (harmonic ladder, Koch 2007: n12/n01 -> sqrt2, corrections O(sqrt(E_C/E_J)));
 * crossings outside the mover's range are null.
 */
import { describe, expect, it } from 'vitest';
import { Transmon } from '../../src/transmon/transmon.js';
import { CoupledPair } from '../../src/pair/pair.js';
import { pairResonances } from '../../src/pair/resonances.js';
import { expectClose } from '../support/close.js';

const qa = new Transmon('A', { ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 });
const qb = new Transmon('B', { ecGHz: 0.2, ejsGHz: 22, asymmetry: 0.3 });
const pair = new CoupledPair(qa, qb, 0.012);

describe('pairResonances(mover, partner, partnerFlux, G)', () => {
  const fb = qb.fluxForF01(5.0);
  const r = pairResonances(qa, qb, fb, pair.gChargeGHz);
  const sb = qb.spectrum(fb);

  it('solves the bare resonance conditions to 1e-10 GHz', () => {
    expectClose(qa.f01(r['01-10']!.moverFlux), sb.f01GHz, 1e-10, '01-10');
    expectClose(qa.spectrum(r['11-20']!.moverFlux).f12GHz, sb.f01GHz, 1e-10, '11-20');
    expectClose(qa.f01(r['11-02']!.moverFlux), sb.f12GHz, 1e-10, '11-02');
    // README physics conventions: 11-20 has the mover above the partner by |alpha_mover|, 11-02 below by |alpha_partner|.
    const alphaM = qa.spectrum(r['11-20']!.moverFlux).anharmonicityGHz;
    expectClose(r['11-20']!.moverF01GHz, sb.f01GHz - alphaM, 1e-10, 'f01_A = f01_B - alpha_A');
    expectClose(r['11-02']!.moverF01GHz, sb.f01GHz + sb.anharmonicityGHz, 1e-10, 'f01_A = f01_B + alpha_B');
  });

  it('reports couplings g, ~sqrt2 g, ~sqrt2 g that match the dressed splittings 2 x coupling within 3%', () => {
    const g = r['01-10']!.couplingGHz;
    expectClose(g, pair.exchangeCoupling(r['01-10']!.moverFlux, fb), 1e-14, '01-10 coupling is g');
    for (const name of ['11-20', '11-02'] as const) {
      const c = r[name]!.couplingGHz;
      expect(Math.abs(c / (Math.SQRT2 * pair.exchangeCoupling(r[name]!.moverFlux, fb)) - 1), name).toBeLessThanOrEqual(0.5 * Math.sqrt(qa.ecGHz / qa.ejsGHz));
    }
    const pairs = { '01-10': [[1, 0], [0, 1]], '11-20': [[1, 1], [2, 0]], '11-02': [[1, 1], [0, 2]] } as const;
    for (const name of ['01-10', '11-20', '11-02'] as const) {
      const s = pair.spectrum(r[name]!.moverFlux, fb);
      const [[a1, b1], [a2, b2]] = pairs[name];
      const split = Math.abs(s.energy(a1, b1) - s.energy(a2, b2));
      expect(Math.abs(split / (2 * r[name]!.couplingGHz) - 1), `${name} splitting ${split}`).toBeLessThanOrEqual(0.03);
    }
  });

  it('returns null for crossings outside the mover range', () => {
    // Partner far above the mover's f_max: no 01-10 and no 11-20 (needs the mover even higher).
    const high = new Transmon('H', { ecGHz: 0.2, ejsGHz: 30, asymmetry: 0.1 });
    const rh = pairResonances(qa, high, 0, pair.gChargeGHz);
    expect(high.fMaxGHz).toBeGreaterThan(qa.fMaxGHz + 0.3);
    expect(rh['01-10']).toBeNull();
    expect(rh['11-20']).toBeNull();
    expect(rh['11-02']).toBeNull();
    // Partner just below the mover's f_max: 01-10 and 11-02 reachable, 11-20 not.
    const rl = pairResonances(qa, qb, qb.fluxForF01(qa.fMaxGHz - 0.1), pair.gChargeGHz);
    expect(rl['01-10']).not.toBeNull();
    expect(rl['11-02']).not.toBeNull();
    expect(rl['11-20']).toBeNull();
  });
});
