/**
 * Dressed spectrum and static ZZ of a coupled pair (src/pair/dressed-spectrum.ts, pair.ts)
 * against outside references:
 * - a dense NumPy diagonalisation of the two-transmon Hamiltonian in the full product CHARGE
 *   basis (N = 15 per transmon, no level truncation; labels by largest overlap with bare product
 *   states), test/reference/pair_reference.py "exact";
 * - full second-order perturbation theory in G over all product states of 12 levels each,
 *   with exact charge matrix elements and counter-rotating terms (same script, "pt2", written
 *   independently of the code under test): within 1%;
 * - the simple dispersive formula of README physics conventions sec. 2 (derived, common practice),
 *   zeta ~ 2 g^2 [1/(Delta - alpha_B) - 1/(Delta + alpha_A)]: within 6%;
 * - convergence in the level cutoff K; label continuity through the 11-20 and 11-02 crossings.
 */
import { describe, expect, it } from 'vitest';
import { Transmon } from '../../src/transmon/transmon.js';
import { CoupledPair } from '../../src/pair/pair.js';
import { dressedSpectrum, staticZz } from '../../src/pair/dressed-spectrum.js';
import { symmetricEigenvalues } from '../../src/linalg/symmetric-eigenvalues.js';
import { productHamiltonian, productSpace } from '../../src/pair/product-basis.js';
import { expectAllClose, expectClose } from '../support/close.js';
import { runPython } from '../support/python.js';

const qa = new Transmon('A', { ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 });
const qb = new Transmon('B', { ecGHz: 0.2, ejsGHz: 22, asymmetry: 0.3 });

/** Dispersive working points: mover f01, partner f01 (GHz), layout g (GHz). */
const dispersive: [number, number, number][] = [
  [5.0, 4.2, 0.01],
  [4.4, 5.3, 0.012],
  [5.2, 4.6, 0.015],
  [4.0, 5.0, 0.008],
];
const points = dispersive.map(([f1, f2, g]) => {
  const pair = new CoupledPair(qa, qb, g);
  return { pair, fa: qa.fluxForF01(f1), fb: qb.fluxForF01(f2) };
});
const LABELS: [number, number][] = [[0, 0], [0, 1], [1, 0], [1, 1], [2, 0], [0, 2]];
const ref = runPython<{ results: { exact: { energies: number[]; overlaps: number[] } | null; pt2: { zz: number } }[] }>(
  'pair_reference.py',
  {
    cases: points.map(({ pair, fa, fb }, i) => ({
      ecA: qa.ecGHz,
      ejA: qa.ejGHz(fa),
      ecB: qb.ecGHz,
      ejB: qb.ejGHz(fb),
      G: pair.gChargeGHz,
      cutoff: i === 0 ? 15 : 12,
      labels: LABELS,
      ptLevels: 12,
      exact: i < 2,
    })),
  },
  { timeoutMs: 120_000 },
).results;

describe('CoupledPair.spectrum against a full charge-basis diagonalisation (NumPy)', () => {
  it('dressed 00, 01, 10, 11, 20, 02 with K = 10 match to 1e-9 GHz, with K = 6 to 1e-8 GHz', () => {
    points.slice(0, 2).forEach(({ fa, fb }, i) => {
      const exact = ref[i].exact!.energies;
      for (const [k, tol] of [[10, 1e-9], [6, 1e-8]] as const) {
        const s = new CoupledPair(qa, qb, dispersive[i][2], { levels: k }).spectrum(fa, fb);
        LABELS.forEach(([a, b], li) => expect(Math.abs(s.energy(a, b) - exact[li]), `K=${k} |${a}${b}> point ${i}`).toBeLessThanOrEqual(tol));
      }
    });
  });

  it('static ZZ with K = 6 matches the exact charge-basis ZZ to 1e-5 relative and converges in K', () => {
    points.slice(0, 2).forEach(({ fa, fb }, i) => {
      const e = ref[i].exact!.energies;
      const exactZz = e[3] - e[2] - e[1] + e[0];
      const zz = (k: number) => new CoupledPair(qa, qb, dispersive[i][2], { levels: k }).zz(fa, fb);
      expect(Math.abs(zz(6) / exactZz - 1), `K=6 point ${i}`).toBeLessThanOrEqual(1e-5);
      // Convergence: the error shrinks from K = 4 to K = 10 (K = 4 is ~1e-3 off, K = 10 ~1e-8).
      const errors = [4, 6, 8, 10].map((k) => Math.abs(zz(k) - exactZz));
      expect(errors[1]).toBeLessThan(errors[0]);
      expect(errors[3]).toBeLessThan(errors[1]);
      expect(errors[3] / Math.abs(exactZz)).toBeLessThanOrEqual(1e-7);
    });
  });
});

describe('static ZZ in the dispersive regime', () => {
  it('agrees with full second-order perturbation theory (all states, counter-rotating terms) within 1%', () => {
    points.forEach(({ pair, fa, fb }, i) => {
      const zz = pair.zz(fa, fb);
      expect(Math.abs(ref[i].pt2.zz / zz - 1), `point ${i}: exact ${zz}, PT2 ${ref[i].pt2.zz}`).toBeLessThanOrEqual(0.01);
    });
  });

  it('agrees with the simple formula 2 g^2 [1/(Delta - alpha_B) - 1/(Delta + alpha_A)] within 6%', () => {
    for (const { pair, fa, fb } of points) {
      const sa = qa.spectrum(fa);
      const sb = qb.spectrum(fb);
      const g = pair.exchangeCoupling(fa, fb);
      const delta = sa.f01GHz - sb.f01GHz;
      const simple = 2 * g * g * (1 / (delta - sb.anharmonicityGHz) - 1 / (delta + sa.anharmonicityGHz));
      const zz = pair.zz(fa, fb);
      expect(Math.abs(simple / zz - 1), `Delta=${delta}: exact ${zz}, simple ${simple}`).toBeLessThanOrEqual(0.06);
    }
  });

  it('the fast ZZ path equals the full dressed spectrum and a diagonalisation of the whole product Hamiltonian', () => {
    const { pair, fa, fb } = points[2];
    const s = pair.spectrum(fa, fb);
    expectClose(pair.zz(fa, fb), s.zzGHz, 1e-12, 'fast vs full');
    // All K^2 dressed energies equal the eigenvalues of the unsplit 36 x 36 product Hamiltonian.
    const k = pair.levels;
    const space = productSpace([k, k]);
    const h = productHamiltonian(space, [pair.basisA(fa), pair.basisB(fb)], [{ a: 0, b: 1, gCharge: pair.gChargeGHz }]);
    const all = symmetricEigenvalues(h, k * k);
    expectAllClose([...s.dressed].sort((x, y) => x - y), all, 1e-12, 'sector split');
  });
});

describe('labels of dressed states', () => {
  it('agree with the largest bare overlap wherever that overlap exceeds 0.75, over a sweep of the mover', () => {
    const pair = new CoupledPair(qa, qb, 0.012);
    const fb = qb.fluxForF01(5.0);
    let checked = 0;
    for (let f = qa.fMinGHz + 0.01; f < qa.fMaxGHz; f += 0.013) {
      const fa = qa.fluxForF01(f);
      const s = pair.spectrum(fa, fb, { vectors: true });
      const size = s.levels * s.levels;
      for (let label = 0; label < size; label++) {
        let best = 0;
        for (let r = 1; r < size; r++) if (Math.abs(s.vectors![r * size + label]) > Math.abs(s.vectors![best * size + label])) best = r;
        const w = s.vectors![best * size + label] ** 2;
        if (w < 0.75) continue;
        expect(best, `f_A=${f.toFixed(3)} label ${label}`).toBe(label);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(1000);
  });

  it('through the 11-20 and 11-02 crossings: ZZ changes sign and peaks at each, dressed |11> jumps only there and by at most the gap', () => {
    const pair = new CoupledPair(qa, qb, 0.012);
    const fb = qb.fluxForF01(5.0);
    const f12B = qb.spectrum(fb).f12GHz;
    const f01B = qb.spectrum(fb).f01GHz;
    const step = 2e-4; // GHz
    const rows: { f: number; zz: number; shift11: number; f12A: number }[] = [];
    for (let f = 4.7; f <= 5.33; f += step) {
      const fa = qa.fluxForF01(f);
      const s = pair.spectrum(fa, fb);
      rows.push({ f, zz: s.zzGHz, shift11: s.energy(1, 1) - s.bare[s.levels + 1], f12A: qa.spectrum(fa).f12GHz });
    }
    const g = pair.exchangeCoupling(qa.fluxForF01(5.0), fb);
    const gap = 2 * Math.SQRT2 * g * 1.1; // 11-20 / 11-02 splitting 2 sqrt2 g (two-level Rabi), 10% slack
    const jumps: number[] = [];
    for (let i = 1; i < rows.length; i++) {
      const d = Math.abs(rows[i].shift11 - rows[i - 1].shift11);
      if (d > 0.002) jumps.push(i);
      expect(d, `dressed 11 step at f_A=${rows[i].f.toFixed(4)}`).toBeLessThanOrEqual(gap);
    }
    // Exactly two jumps: at the bare 11-02 crossing (f01_A = f12_B) and 11-20 (f12_A = f01_B).
    expect(jumps.length).toBe(2);
    expect(rows[jumps[0] - 1].f <= f12B && rows[jumps[0]].f >= f12B).toBe(true);
    expect(rows[jumps[1] - 1].f12A <= f01B && rows[jumps[1]].f12A >= f01B).toBe(true);
    // ZZ changes sign exactly at those two places (and nowhere else in this window).
    const signChanges: number[] = [];
    for (let i = 1; i < rows.length; i++) if (Math.sign(rows[i].zz) !== Math.sign(rows[i - 1].zz)) signChanges.push(i);
    expect(signChanges).toEqual(jumps);
    // |ZZ| peaks at each crossing (the 2nd-order divergence, cut off at ~ sqrt2 g by the avoided
    // crossing): within +-20 MHz the largest |ZZ| sits on one of the two points bracketing the
    // crossing; 20 MHz away it has fallen by more than a third, 100 MHz away by more than 3x.
    for (const j of jumps) {
      let best = j;
      for (let i = Math.max(0, j - 100); i < Math.min(rows.length, j + 100); i++) if (Math.abs(rows[i].zz) > Math.abs(rows[best].zz)) best = i;
      expect(best === j || best === j - 1, `peak of |ZZ| at ${rows[best].f} vs crossing at ${rows[j].f}`).toBe(true);
      expect(Math.abs(rows[best].zz)).toBeGreaterThan(1.5 * Math.abs(rows[Math.max(0, j - 100)].zz));
      expect(Math.abs(rows[best].zz)).toBeGreaterThan(3 * Math.abs(rows[j < rows.length / 2 ? j + 500 : j - 500].zz));
    }
    // Away from the crossings ZZ is smooth: second differences small against the values.
    for (let i = 2; i < rows.length; i++) {
      if (jumps.some((j) => Math.abs(i - j) <= 40)) continue;
      const d2 = Math.abs(rows[i].zz - 2 * rows[i - 1].zz + rows[i - 2].zz);
      expect(d2, `ZZ curvature at ${rows[i].f.toFixed(4)}`).toBeLessThanOrEqual(1e-3 * Math.abs(rows[i].zz) + 1e-9);
    }
  });

  it('dressedSpectrum rejects inconsistent inputs', () => {
    expect(() => dressedSpectrum({ energies: [0, 1], charge: [0, 1, 1, 0] }, { energies: [0, 1], charge: [0, 1, 1] }, 0.01, 2)).toThrow(RangeError);
    const s = dressedSpectrum({ energies: [0, 5], charge: [0, 1, 1, 0] }, { energies: [0, 4], charge: [0, 1, 1, 0] }, 0, 2);
    expect(staticZz(s)).toBe(0);
  });
});
