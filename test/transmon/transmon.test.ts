/**
 * The Transmon object: built from layout qubits (parsed by the layout stage from an inline YAML
 * layout of our own), consistent with the stage functions it wraps, with the charge matrix
 * element |<0|n|1>| against Koch 2007 Eq. 3.4 ((E_J / 8 E_C)^(1/4) / sqrt 2, harmonic limit,
 * corrections O(sqrt(E_C/E_J)), from memory), and with errors that name the qubit.
 */
import { describe, expect, it } from 'vitest';
import { parseLayoutText } from '../../src/layout/load.js';
import { InputError } from '../../src/util/errors.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { spectrumAt } from '../../src/transmon/spectrum.js';
import { coherenceFor } from '../../src/transmon/coherence.js';
import { transmonLevels } from '../../src/transmon/levels.js';
import { chargeMatrix } from '../../src/transmon/matrix-elements.js';
import { expectClose } from '../support/close.js';

const YAML = `
chip: Tarnwick-3
qubits:
  A:
    pos: [0, 0]
    ec: 205 MHz
    ejMax: 19.5 GHz
    asymmetry: 0.3
    t1: 70 us
    tphi: 100 us
    fluxNoise: 3 uPhi0/sqrt(Hz)
  B:
    pos: [1, 0]
    fMax: 5.9 GHz
    anharmonicity: -220 MHz
    fMin: 4.1 GHz
    t1: 55 us
    fluxNoise: 2 uPhi0/sqrt(Hz)
  C:
    pos: [2, 0]
    ec: 190 MHz
    rn: 6.4 kOhm
    t1: 90 us
    tphi: 60 us
couplings:
  - [A, B, 12 MHz]
  - [B, C, 10 MHz]
`;
const layout = parseLayoutText(YAML, 'tarnwick.yaml');
const [qa, qb, qc] = layout.qubits.map((q) => Transmon.fromLayout(q));

describe('Transmon.fromLayout(qubit)', () => {
  it('resolves every form: B reproduces its fMax, anharmonicity and fMin to 1 kHz', () => {
    expect(Math.abs(qb.fMaxGHz - 5.9)).toBeLessThanOrEqual(1e-6);
    expect(Math.abs(qb.anharmonicityMaxGHz + 0.22)).toBeLessThanOrEqual(1e-6);
    expect(Math.abs(qb.fMinGHz - 4.1)).toBeLessThanOrEqual(1e-6);
    expect(qa.ejsGHz).toBe(19.5);
    expect(qc.asymmetry).toBe(0);
    expect(qc.fMinGHz).toBeCloseTo(4 * 0.19, 10); // symmetric SQUID tunes to E_J = 0
    expect(qa.id).toBe('A');
    expect(qa.source?.file).toBe('tarnwick.yaml');
  });

  it('answers the same as the stage functions it wraps (spectrumAt, coherenceFor)', () => {
    for (const flux of [0, 0.17, 0.33, 0.5]) {
      expect(qa.spectrum(flux)).toEqual(spectrumAt(qa.params, flux, { chargeCutoff: qa.chargeCutoff }));
      expectClose(qa.f01(flux), qa.spectrum(flux).f01GHz, 1e-13, `f01 at ${flux}`);
      const s = qa.spectrum(flux);
      expect(qa.coherence(flux)).toEqual(coherenceFor({ t1Ns: 70_000, tphiNs: 100_000, fluxNoisePhi0: 3e-6 }, s.df01dFluxGHz, qa.fluxCurvatureGHz(flux)));
    }
  });

  it('fluxForF01 inverts f01 on the branch 0..1/2 and names the qubit when the target is out of range', () => {
    for (const f of [4.2, 5.0, 5.8]) expectClose(qb.f01(qb.fluxForF01(f)), f, 1e-11, `f=${f}`);
    expect(qb.fluxForF01OrNull(6.5)).toBeNull();
    expect(() => qb.fluxForF01(6.5)).toThrow(InputError);
    expect(() => qb.fluxForF01(6.5)).toThrow(/qubit B: f01 = 6\.5 GHz is outside its tunable range 4\.1 GHz to 5\.9 GHz/);
    expect(qb.reaches(5)).toBe(true);
    expect(qb.reaches(3)).toBe(false);
    const f12 = qb.spectrum(0.2).f12GHz;
    expectClose(qb.spectrum(qb.fluxForF12OrNull(f12)!).f12GHz, f12, 1e-11, 'f12 inverse');
  });

  it('accepts any real flux (E_J even and 1-periodic)', () => {
    expectClose(qa.f01(-0.2), qa.f01(0.2), 1e-13, 'even');
    expectClose(qa.f01(1.2), qa.f01(0.2), 1e-12, 'periodic');
  });

  it('chargeElement01 equals |<0|n|1>| of the charge matrix and Koch Eq. 3.4 within 0.5 sqrt(E_C/E_J) relative', () => {
    for (const flux of [0, 0.25, 0.4]) {
      const ej = qa.ejGHz(flux);
      const n = chargeMatrix(transmonLevels(qa.ecGHz, ej, { levels: 2, vectors: true }));
      expectClose(qa.chargeElement01(flux), Math.abs(n[1]), 1e-14, `n01 at ${flux}`);
      const koch = (ej / (8 * qa.ecGHz)) ** 0.25 / Math.SQRT2;
      expect(Math.abs(qa.chargeElement01(flux) / koch - 1)).toBeLessThanOrEqual(0.5 * Math.sqrt(qa.ecGHz / ej));
    }
  });

  it('eigenbasis(flux, K) gives energies, a charge matrix with the parity selection rule, and cos phi', () => {
    const b = qa.eigenbasis(0.2, 6);
    expect(b.energies.length).toBe(6);
    for (let m = 0; m < 6; m++)
      for (let k = 0; k < 6; k++) {
        if ((m + k) % 2 === 0) expect(Math.abs(b.charge[m * 6 + k])).toBeLessThanOrEqual(1e-14);
        else expect(Math.abs(b.cosPhi[m * 6 + k])).toBeLessThanOrEqual(1e-14);
      }
    // Hellmann-Feynman: <0|cos phi|0> = -dE_0/dE_J (central difference).
    const h = 1e-5;
    const e = (ej: number) => transmonLevels(qa.ecGHz, ej, { levels: 1 }).energies[0];
    expectClose(b.cosPhi[0], -(e(b.ejGHz + h) - e(b.ejGHz - h)) / (2 * h), 1e-8, '<0|cos phi|0>');
  });

  it('f01FluxSlope and f12 are spectrum()\'s df01dFluxGHz and f12GHz bit for bit, and fluxCurvatureGHz the central difference of spectrum()\'s slopes', () => {
    const h = 1e-4;
    for (const t of [qa, qb, qc]) {
      for (let i = 0; i <= 40; i++) {
        const flux = -0.05 + (0.6 * i) / 40;
        const s = t.spectrum(flux);
        expect(t.f01FluxSlope(flux)).toBe(s.df01dFluxGHz);
        expect(t.f12(flux)).toBe(s.f12GHz);
        expect(t.fluxCurvatureGHz(flux)).toBe((t.spectrum(flux + h).df01dFluxGHz - t.spectrum(flux - h).df01dFluxGHz) / (2 * h));
      }
    }
  });

  it('without coherence data, coherence() says so', () => {
    const bare = new Transmon('X', { ecGHz: 0.2, ejsGHz: 15, asymmetry: 0.1 });
    expect(() => bare.coherence(0.1)).toThrow(/no coherence data/);
    expect(() => new Transmon('Y', { ecGHz: 0.2, ejsGHz: 15, asymmetry: 1 })).toThrow(RangeError);
  });
});
