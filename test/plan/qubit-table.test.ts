/**
 * The planner's tabulated transmon spectrum (src/plan/qubit-table.ts) against a dense NumPy
 * diagonalisation of the charge-basis Hamiltonian (test/reference/transmon_matrix_elements.py)
 * at the E_J the table reports, and against the exact Transmon (inverse maps, flux slope).
 */
import { describe, expect, it } from 'vitest';
import { Transmon } from '../../src/transmon/transmon.js';
import { QubitTable } from '../../src/plan/qubit-table.js';
import { expectClose } from '../support/close.js';
import { runPython } from '../support/python.js';

const t = new Transmon('A', { ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 }, { coherenceSpec: { t1Ns: 60000, fluxNoisePhi0: 3e-6 } });
const table = new QubitTable(t);
const freqs = [0.02, 0.13, 0.37, 0.5, 0.71, 0.93, 0.999].map((x) => table.fLowGHz + x * (table.fMaxGHz - table.fLowGHz));

describe('QubitTable', () => {
  it('levels and charge matrix elements at f01 = f match a dense NumPy diagonalisation to 1e-7 GHz / 1e-7', () => {
    const states = freqs.map((f) => ({ ...table.at(f) }));
    const ref = runPython<{ results: { energies: number[]; charge: number[] }[] }>('transmon_matrix_elements.py', {
      cases: states.map((s) => ({ ec: t.ecGHz, ej: s.ejRatio * t.ejsGHz, levels: 6, cutoff: 30 })),
    }).results;
    states.forEach((s, k) => {
      const e = ref[k].energies.map((x) => x - ref[k].energies[0]);
      const n = (i: number, j: number) => Math.abs(ref[k].charge[i * 6 + j]);
      expectClose(s.f01, freqs[k], 1e-9, 'f01 at the requested frequency');
      for (const [got, want, what] of [
        [s.f01, e[1], 'E1'], [s.e2, e[2], 'E2'], [s.e3, e[3], 'E3'], [s.e4, e[4], 'E4'], [s.e5, e[5], 'E5'],
        [s.n01, n(0, 1), 'n01'], [s.n03, n(0, 3), 'n03'], [s.n12, n(1, 2), 'n12'], [s.n23, n(2, 3), 'n23'], [s.n05, n(0, 5), 'n05'], [s.n14, n(1, 4), 'n14'],
      ] as const) {
        expectClose(got, want, 1e-7, `${what} at ${freqs[k].toFixed(3)} GHz`);
      }
    });
  });

  it('fluxSlopeAtF01 is fluxSlopeOf(at(f)) to the last bit (the idle-error scan asks for the slope alone)', () => {
    // 401 points as the scan takes them, the range ends and points outside it (clamped by both);
    // each asked fresh and again after at() has remembered the point
    const lo = table.fLowGHz;
    const hi = table.fMaxGHz;
    const points = [lo - 0.1, hi + 0.1, ...Array.from({ length: 401 }, (_, k) => lo + ((hi - lo) * k) / 400)];
    for (const round of [0, 1]) {
      const fresh = new QubitTable(t);
      for (const f of points) {
        const slope = fresh.fluxSlopeAtF01(f);
        expect(Object.is(slope, fresh.fluxSlopeOf(fresh.at(f))), `round ${round} f ${f}`).toBe(true);
        if (round === 1) expect(Object.is(fresh.fluxSlopeAtF01(f), slope)).toBe(true);
      }
    }
  });

  it('flux, f12 and df01/dPhi agree with the exact Transmon (inverse map and Hellmann-Feynman slope)', () => {
    for (const f of freqs) {
      const flux = t.fluxForF01(f);
      const sp = t.spectrum(flux);
      expectClose(table.fluxAt(f), flux, 1e-7, `flux at ${f}`);
      expectClose(table.f12At(f), sp.f12GHz, 1e-7, `f12 at ${f}`);
      expectClose(table.slopeAt(f), sp.df01dFluxGHz, 1e-5, `slope at ${f}`);
      expectClose(table.fluxSlopeOf(table.at(f)), sp.df01dFluxGHz, 1e-5, `fluxSlopeOf at ${f}`);
    }
  });

  it('f01ForF12 and f01ForLevel invert the tabulated levels, and return null outside the range', () => {
    for (const f of freqs.slice(1, -1)) {
      const s = { ...table.at(f) };
      expectClose(table.f01ForF12(s.f12)!, f, 1e-9, 'f12 inverse');
      expectClose(table.f01ForLevel(3, s.e3)!, f, 1e-9, 'E3 inverse');
      expectClose(table.f01ForLevel(4, s.e4 - s.f01, true)!, f, 1e-9, 'E4 - E1 inverse');
    }
    expect(table.f01ForF12(table.fMaxGHz + 1)).toBeNull();
    expect(table.f01ForF12(0.1)).toBeNull();
  });

  it('remembered answers of at and f01ForF12 equal a fresh table\'s to the last bit, whatever came before', () => {
    // a long seeded stream of queries with many repeats (more distinct frequencies than memo
    // slots, so slots are replaced); each answer against a new table asked only that question
    let x = 12345;
    const next = () => ((x = (Math.imul(x, 1103515245) + 12345) >>> 0) / 2 ** 32);
    const pool = Array.from({ length: 400 }, () => table.fLowGHz - 0.05 + next() * (table.fMaxGHz - table.fLowGHz + 0.1));
    const f12s = pool.map((f) => f - 0.2);
    const out = { ...table.at(pool[0]) };
    for (let q = 0; q < 500; q++) {
      const k = Math.floor(next() * next() * pool.length);
      const f = pool[k];
      const got = { ...table.at(f, q % 2 ? out : undefined) };
      expect(got).toEqual({ ...new QubitTable(t).at(f) });
      expect(Object.is(table.f01ForF12(f12s[k]), new QubitTable(t).f01ForF12(f12s[k]))).toBe(true);
    }
  });

  it('stops at E_J / E_C = 30 when the SQUID would tune below it (planning range)', () => {
    const weak = new Transmon('B', { ecGHz: 0.25, ejsGHz: 15, asymmetry: 0.1 });
    const wt = new QubitTable(weak);
    expect(wt.fLowGHz).toBeGreaterThan(weak.fMinGHz);
    expectClose(wt.at(wt.fLowGHz).ejRatio * weak.ejsGHz / weak.ecGHz, 30, 1e-9, 'E_J/E_C at the floor');
    expectClose(wt.fMaxGHz, weak.fMaxGHz, 1e-12, 'top');
  });
});
