/**
 * ZZ sweep across the mover's range: uniform in f01 from f_min to f_max, each point equal to the
 * pair's exact ZZ at the mapped flux, and sign changes only at the 11-20 / 11-02 crossings found
 * independently by pairResonances (README physics conventions sec. 2).
 */
import { describe, expect, it } from 'vitest';
import { Transmon } from '../../src/transmon/transmon.js';
import { CoupledPair } from '../../src/pair/pair.js';
import { pairResonances } from '../../src/pair/resonances.js';
import { zzSweep } from '../../src/pair/zz-sweep.js';
import { expectClose } from '../support/close.js';

const qa = new Transmon('A', { ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 });
const qb = new Transmon('B', { ecGHz: 0.2, ejsGHz: 22, asymmetry: 0.3 });

describe('zzSweep(pair, mover, partnerFlux)', () => {
  it('covers the mover range uniformly in frequency and matches pair.zz point by point', () => {
    const pair = new CoupledPair(qa, qb, 0.012);
    const fb = qb.fluxForF01(5.0);
    const pts = zzSweep(pair, 'a', fb, { points: 101 });
    expect(pts.length).toBe(101);
    expectClose(pts[0].moverF01GHz, qa.fMinGHz, 1e-12, 'first');
    expectClose(pts[100].moverF01GHz, qa.fMaxGHz, 1e-12, 'last');
    for (const p of pts.filter((_, i) => i % 10 === 0)) {
      expectClose(qa.f01(p.moverFlux), p.moverF01GHz, 1e-11, 'flux map');
      expectClose(p.zzGHz, new CoupledPair(qa, qb, 0.012).zz(p.moverFlux, fb), 1e-12, 'zz');
      expectClose(p.gGHz, pair.exchangeCoupling(p.moverFlux, fb), 1e-14, 'g');
    }
  });

  it('changes sign exactly at the 11-20 and 11-02 crossings (mover = b works the same way)', () => {
    const pair = new CoupledPair(qb, qa, 0.012); // mover qa is pair.b
    const fPartner = qb.fluxForF01(5.0);
    const pts = zzSweep(pair, 'b', fPartner, { points: 400 });
    const r = pairResonances(qa, qb, fPartner, pair.gChargeGHz);
    const crossings = [r['11-02']!.moverF01GHz, r['11-20']!.moverF01GHz].sort((x, y) => x - y);
    const changes: number[] = [];
    for (let i = 1; i < pts.length; i++) if (Math.sign(pts[i].zzGHz) !== Math.sign(pts[i - 1].zzGHz)) changes.push(i);
    expect(changes.length).toBe(2);
    changes.forEach((i, c) => {
      expect(pts[i - 1].moverF01GHz).toBeLessThanOrEqual(crossings[c]);
      expect(pts[i].moverF01GHz).toBeGreaterThanOrEqual(crossings[c]);
    });
  });

  it('rejects fewer than two points', () => {
    expect(() => zzSweep(new CoupledPair(qa, qb, 0.01), 'a', 0, { points: 1 })).toThrow(RangeError);
  });
});
