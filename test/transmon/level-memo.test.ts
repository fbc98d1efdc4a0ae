/**
 * lowestLevels (src/transmon/level-memo.ts) against direct solves: every answer, whatever was
 * asked before at the same point (two or three levels, with or without cos(phi) elements), is the
 * one parityEigenbasis and cosPhiElement give for the question itself, to the last bit; points that
 * differ only in E_C, in E_J or in the charge cutoff never share an entry; answers stay exact after
 * the table has forgotten entries. (parityEigenbasis itself is checked against NumPy in
 * ./parity-eigenbasis.test.ts.) And the spectrum functions built on it give what they gave
 * without it (the same formulas on direct solves).
 */
import { beforeEach, describe, expect, it } from 'vitest';
import { clearLowestLevels, lowestLevels } from '../../src/transmon/level-memo.js';
import { cosPhiElement, parityEigenbasis } from '../../src/transmon/parity-eigenbasis.js';
import { f01FluxSlopeAt, f01ForJosephsonEnergy, f12At, f12ForJosephsonEnergy, spectrumAt } from '../../src/transmon/spectrum.js';
import { josephsonEnergy, josephsonEnergySlope } from '../../src/transmon/josephson.js';
import { Random } from '../../src/util/random.js';

type Question = { k: 2 | 3; cos: boolean };
const QUESTIONS: Question[] = [
  { k: 2, cos: false },
  { k: 2, cos: true },
  { k: 3, cos: false },
  { k: 3, cos: true },
];

function direct(ec: number, ej: number, nCut: number, q: Question) {
  const b = parityEigenbasis(ec, ej, q.k, nCut, q.cos);
  return {
    e0: b.energies[0],
    e1: b.energies[1],
    e2: q.k === 3 ? b.energies[2] : NaN,
    c0: q.cos ? cosPhiElement(b, 0, 0) : NaN,
    c1: q.cos ? cosPhiElement(b, 1, 1) : NaN,
    c2: q.cos && q.k === 3 ? cosPhiElement(b, 2, 2) : NaN,
  };
}

function expectSame(ec: number, ej: number, nCut: number, q: Question): void {
  const got = { ...lowestLevels(ec, ej, nCut, q.k, q.cos) };
  const want = direct(ec, ej, nCut, q);
  for (const key of Object.keys(want) as (keyof typeof want)[]) {
    expect(Object.is(got[key], want[key]), `${key} at E_C=${ec} E_J=${ej} N=${nCut} k=${q.k} cos=${q.cos}: ${got[key]} vs ${want[key]}`).toBe(true);
  }
}

describe('lowestLevels', () => {
  beforeEach(() => clearLowestLevels());

  it('answers every question the way a direct solve does, after any earlier question at the same point', () => {
    const rng = new Random(7);
    for (let n = 0; n < 12; n++) {
      const ec = 0.15 + 0.15 * rng.uniform();
      const ej = ec * (20 + 80 * rng.uniform());
      // every sequence of three questions at one point, each asked after the earlier ones filled the entry
      for (const first of QUESTIONS) {
        for (const second of QUESTIONS) {
          for (const third of QUESTIONS) {
            clearLowestLevels();
            expectSame(ec, ej, 20, first);
            expectSame(ec, ej, 20, second);
            expectSame(ec, ej, 20, third);
          }
        }
      }
    }
  });

  it('keeps points apart that differ only in E_C, E_J or the charge cutoff', () => {
    const ec = 0.2;
    const ej = 14;
    const q: Question = { k: 3, cos: true };
    expectSame(ec, ej, 20, q);
    expectSame(ec, ej, 4, q);
    expectSame(ec, ej * (1 + 2 ** -40), 20, q);
    expectSame(ec * (1 + 2 ** -40), ej, 20, q);
    expectSame(ec, ej, 20, q);
    // cutoffs one apart land in neighbouring home slots (the hash mixes the cutoff in last), so a
    // look-up that ignored the cutoff would find the other entry; at E_J / E_C = 5 the cutoff
    // changes the levels
    for (let n = 2; n <= 7; n++) {
      clearLowestLevels();
      expectSame(0.3, 1.5, n, q);
      expectSame(0.3, 1.5, n + 1, q);
      expectSame(0.3, 1.5, n, q);
    }
  });

  it('stays exact once the table forgets entries (more points than it holds, asked again)', () => {
    const rng = new Random(3);
    const points = Array.from({ length: 40_000 }, () => ({ ec: 0.2, ej: 4 + 30 * rng.uniform() }));
    for (const p of points) lowestLevels(p.ec, p.ej, 12, 2, false);
    for (let i = 0; i < points.length; i += 997) {
      expectSame(points[i].ec, points[i].ej, 12, { k: 2, cos: false });
      expectSame(points[i].ec, points[i].ej, 12, { k: 3, cos: true });
    }
  });

  it('the spectrum functions give the formulas of a direct solve (f01, f12, alpha, slopes)', () => {
    const params = { ecGHz: 0.22, ejsGHz: 19.5, asymmetry: 0.3 };
    for (const flux of [0, 0.07, 0.19, 0.31, 0.5]) {
      const ej = josephsonEnergy(params.ejsGHz, params.asymmetry, flux);
      const dEj = josephsonEnergySlope(params.ejsGHz, params.asymmetry, flux);
      // twice each: once solved, once remembered
      for (let round = 0; round < 2; round++) {
        const b = parityEigenbasis(params.ecGHz, ej, 3, 20, true);
        const e = b.energies;
        const [c0, c1, c2] = [0, 1, 2].map((m) => cosPhiElement(b, m, m));
        const s = spectrumAt(params, flux);
        expect(s.f01GHz).toBe(e[1] - e[0]);
        expect(s.f12GHz).toBe(e[2] - e[1]);
        expect(s.anharmonicityGHz).toBe(e[2] - 2 * e[1] + e[0]);
        expect(s.df01dFluxGHz).toBe(-(c1 - c0) * dEj);
        expect(s.df12dFluxGHz).toBe(-(c2 - c1) * dEj);
        expect(f01FluxSlopeAt(params, flux)).toBe(s.df01dFluxGHz);
        expect(f12At(params, flux)).toBe(s.f12GHz);
        const slope = { value: NaN };
        expect(f01ForJosephsonEnergy(params.ecGHz, ej, 20, slope)).toBe(e[1] - e[0]);
        expect(slope.value).toBe(c0 - c1);
        expect(f12ForJosephsonEnergy(params.ecGHz, ej, 20, slope)).toBe(e[2] - e[1]);
        expect(slope.value).toBe(c1 - c2);
      }
    }
  });
});
