/**
 * resolveTransmon for every layout form. References: the forward spectrum (checked against SciPy
 * Mathieu values in spectrum.test.ts) for the round trip (E_C, E_JS) -> (f_max, alpha) -> back
 * to 1 kHz; Ambegaokar-Baratoff (ambegaokar-baratoff.test.ts) for resistances; Koch 2007
 * asymptotics to show the exact solve is not the asymptotic formula; and the physical limits
 * (Koch 2007: transmon regime E_J/E_C >= 20; asymmetry in [0, 1)).
 */
import { describe, expect, it } from 'vitest';
import type { SourceRef, TransmonSpec } from '../../src/layout/types.js';
import { InputError } from '../../src/util/errors.js';
import { josephsonEnergyFromResistance } from '../../src/transmon/ambegaokar-baratoff.js';
import { resolveTransmon } from '../../src/transmon/resolve.js';
import { spectrumAt } from '../../src/transmon/spectrum.js';
import { tunableRange } from '../../src/transmon/tunable-range.js';
import { expectClose } from '../support/close.js';

const KHZ = 1e-6; // GHz
const where: SourceRef = { file: 'chip.yaml', line: 12, column: 5, path: 'qubits.Q3' };

function thrown(fn: () => unknown): InputError {
  try {
    fn();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an InputError, none was thrown');
}

describe('resolveTransmon({kind: "frequencies"})', () => {
  it('round-trips (E_C, E_JS) -> (f_max, alpha) -> (E_C, E_JS) to 1 kHz over a grid of designs', () => {
    for (const ec of [0.15, 0.2, 0.25, 0.33]) {
      for (const r of [20.5, 35, 60, 110, 250, 900]) {
        const ejs = r * ec;
        const top = spectrumAt({ ecGHz: ec, ejsGHz: ejs, asymmetry: 0 }, 0);
        const back = resolveTransmon({ kind: 'frequencies', fMaxGHz: top.f01GHz, anharmonicityGHz: top.anharmonicityGHz, asymmetry: 0.3 }, 'Q');
        expect(Math.abs(back.ecGHz - ec), `E_C at E_J/E_C=${r}`).toBeLessThanOrEqual(KHZ);
        expect(Math.abs(back.ejsGHz - ejs), `E_JS at E_J/E_C=${r}`).toBeLessThanOrEqual(KHZ);
        expect(back.asymmetry).toBe(0.3);
        // And the solved parameters reproduce the inputs (in fact to ~1e-12 GHz).
        const again = spectrumAt({ ...back }, 0);
        expectClose(again.f01GHz, top.f01GHz, 1e-11, 'f_max');
        expectClose(again.anharmonicityGHz, top.anharmonicityGHz, 1e-11, 'alpha');
      }
    }
  });

  it('differs from the asymptotic inversion (alpha = -E_C) by the expected O(E_C sqrt(E_C/E_J)) amount', () => {
    const p = resolveTransmon({ kind: 'frequencies', fMaxGHz: 6.32, anharmonicityGHz: -0.228, asymmetry: 0.3 }, 'Q1');
    const offset = p.ecGHz - 0.228; // asymptotic E_C would be |alpha|
    expect(offset).toBeLessThan(0);
    expect(Math.abs(offset)).toBeGreaterThan(0.3 * p.ecGHz * Math.sqrt(p.ecGHz / p.ejsGHz));
    expect(Math.abs(offset)).toBeLessThan(1.5 * p.ecGHz * Math.sqrt(p.ecGHz / p.ejsGHz));
  });

  it('fMin fixes the asymmetry: the resolved device tunes down to f_min within 1 kHz', () => {
    for (const fMin of [3.9, 4.5, 5.8]) {
      const p = resolveTransmon({ kind: 'frequencies', fMaxGHz: 6.05, anharmonicityGHz: -0.214, fMinGHz: fMin }, 'Q2');
      const r = tunableRange(p);
      expect(Math.abs(r.fMinGHz - fMin)).toBeLessThanOrEqual(KHZ);
      expect(Math.abs(r.fMaxGHz - 6.05)).toBeLessThanOrEqual(KHZ);
      expect(p.asymmetry).toBeGreaterThan(0);
      expect(p.asymmetry).toBeLessThan(1);
    }
  });

  it('rejects unreachable or unphysical inputs with messages naming the qubit and its place in the file', () => {
    const cases: [TransmonSpec, RegExp][] = [
      [{ kind: 'frequencies', fMaxGHz: 5, anharmonicityGHz: -0.9 }, /qubit Q3: .*E_JS\/E_C = .*below the transmon limit 20/],
      [{ kind: 'frequencies', fMaxGHz: 5, anharmonicityGHz: -6 }, /qubit Q3: anharmonicity -6 GHz is too large for fMax = 5 GHz/],
      [{ kind: 'frequencies', fMaxGHz: 5, anharmonicityGHz: -0.01 }, /qubit Q3: anharmonicity -0\.01 GHz is too small .*above the supported 2000/],
      [{ kind: 'frequencies', fMaxGHz: 5, anharmonicityGHz: 0.2 }, /qubit Q3: expected a negative anharmonicity/],
      [{ kind: 'frequencies', fMaxGHz: 5, anharmonicityGHz: -0.2, fMinGHz: 5.2 }, /qubit Q3: expected 0 < fMin < fMax/],
      [{ kind: 'frequencies', fMaxGHz: 5, anharmonicityGHz: -0.2, fMinGHz: 0.5 }, /qubit Q3: fMin = 0\.5 GHz is unreachable.*4 E_C/],
      [{ kind: 'frequencies', fMaxGHz: 5, anharmonicityGHz: -0.2, asymmetry: 1 }, /qubit Q3: expected a SQUID asymmetry d in \[0, 1\), found 1/],
      [{ kind: 'frequencies', fMaxGHz: 5, anharmonicityGHz: -0.2, asymmetry: 0.1, fMinGHz: 4 }, /qubit Q3: expected asymmetry or fMin, found both/],
    ];
    for (const [spec, pattern] of cases) {
      const err = thrown(() => resolveTransmon(spec, 'Q3', where));
      expect(err.message).toMatch(pattern);
      expect(err.message.startsWith('chip.yaml:12:5: qubits.Q3: ')).toBe(true);
    }
  });
});

describe('resolveTransmon({kind: "energies"})', () => {
  it('passes (E_C, ejMax, d) through and enforces 20 <= E_JS/E_C <= 2000 and 0 <= d < 1', () => {
    expect(resolveTransmon({ kind: 'energies', ecGHz: 0.21, ejMaxGHz: 18.4, asymmetry: 0.35 }, 'Q0')).toEqual({ ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 });
    expect(thrown(() => resolveTransmon({ kind: 'energies', ecGHz: 0.5, ejMaxGHz: 5, asymmetry: 0 }, 'Q0', where)).message).toMatch(
      /qubit Q0: ec and ejMax gives E_JS\/E_C = 10, below the transmon limit 20/,
    );
    expect(thrown(() => resolveTransmon({ kind: 'energies', ecGHz: 0.2, ejMaxGHz: 15, asymmetry: -0.1 }, 'Q0')).message).toMatch(/asymmetry d in \[0, 1\), found -0\.1/);
    expect(thrown(() => resolveTransmon({ kind: 'energies', ecGHz: 0.01, ejMaxGHz: 30, asymmetry: 0 }, 'Q0')).message).toMatch(/above the supported 2000/);
    expect(thrown(() => resolveTransmon({ kind: 'energies', ecGHz: 0, ejMaxGHz: 30, asymmetry: 0 }, 'Q0')).message).toMatch(/positive charging energy/);
  });
});

describe('resolveTransmon({kind: "resistance"})', () => {
  it('a single R_n is the whole SQUID: E_JS = E_J(R_n) by Ambegaokar-Baratoff, with the given asymmetry', () => {
    const p = resolveTransmon({ kind: 'resistance', ecGHz: 0.195, rnKOhm: 6.1, asymmetry: 0.4 }, 'Q3');
    expectClose(p.ejsGHz, josephsonEnergyFromResistance(6.1), 1e-15, 'E_JS');
    expect(p.asymmetry).toBe(0.4);
    // Common practice: about 140 GHz kOhm / 6.1 kOhm = 23 GHz.
    expect(p.ejsGHz).toBeGreaterThan(22.9);
    expect(p.ejsGHz).toBeLessThan(23.1);
  });

  it('a pair [R1, R2] gives E_JS = E_J1 + E_J2 and d = |E_J1 - E_J2| / E_JS (parallel junctions)', () => {
    const p = resolveTransmon({ kind: 'resistance', ecGHz: 0.2, rnKOhm: [9, 15] }, 'Q5');
    const ej1 = josephsonEnergyFromResistance(9);
    const ej2 = josephsonEnergyFromResistance(15);
    expectClose(p.ejsGHz, ej1 + ej2, 1e-15, 'E_JS');
    expectClose(p.asymmetry, (ej1 - ej2) / (ej1 + ej2), 1e-15, 'd');
    // Two junctions in parallel equal one junction of the parallel resistance.
    expectClose(p.ejsGHz, josephsonEnergyFromResistance((9 * 15) / (9 + 15)), 1e-14, 'parallel resistance');
    expect(resolveTransmon({ kind: 'resistance', ecGHz: 0.2, rnKOhm: [10, 10] }, 'Q5').asymmetry).toBe(0);
  });

  it('rejects non-positive resistances and a too-large R_n (E_J/E_C < 20) naming the qubit', () => {
    expect(thrown(() => resolveTransmon({ kind: 'resistance', ecGHz: 0.2, rnKOhm: 0 }, 'Q3', where)).message).toMatch(/qubit Q3: expected a positive normal-state resistance/);
    expect(thrown(() => resolveTransmon({ kind: 'resistance', ecGHz: 0.2, rnKOhm: [5, -1] }, 'Q3')).message).toMatch(/positive junction resistances/);
    expect(thrown(() => resolveTransmon({ kind: 'resistance', ecGHz: 0.3, rnKOhm: 40 }, 'Q3')).message).toMatch(/ec and rn \(Ambegaokar-Baratoff\) gives E_JS\/E_C = 11\.7.*below the transmon limit 20/);
  });

  it('uses a configurable gap (options.gapUeV)', () => {
    const p = resolveTransmon({ kind: 'resistance', ecGHz: 0.2, rnKOhm: 6 }, 'Q3', undefined, { gapUeV: 200 });
    expectClose(p.ejsGHz, josephsonEnergyFromResistance(6, 200), 1e-15, 'gap 200 ueV');
  });
});
