/**
 * The inverse flux map on 0 <= Phi <= 1/2: round trips f01(fluxForFrequency(f)) = f to 1e-11
 * GHz across the tunable range (reference: the forward map, itself checked against Mathieu
 * values in spectrum.test.ts), the asymptotic inverse as a sanity bound (Koch 2007), f12 targets,
 * and InputErrors that name the qubit outside the range.
 */
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/util/errors.js';
import { fluxForFrequency, fluxForFrequencyOrNull } from '../../src/transmon/flux-for-frequency.js';
import { josephsonEnergy } from '../../src/transmon/josephson.js';
import { spectrumAt, type TransmonParams } from '../../src/transmon/spectrum.js';
import { tunableRange } from '../../src/transmon/tunable-range.js';
import { expectClose } from '../support/close.js';

const devices: TransmonParams[] = [
  { ecGHz: 0.21, ejsGHz: 18.4, asymmetry: 0.35 },
  { ecGHz: 0.25, ejsGHz: 12.5, asymmetry: 0 },
  { ecGHz: 0.18, ejsGHz: 30, asymmetry: 0.6 },
];

describe('fluxForFrequency(params, f01)', () => {
  it('round-trips f01 to 1e-11 GHz on 100 targets across each tunable range, ends included', () => {
    for (const p of devices) {
      const { fMaxGHz, fMinGHz } = tunableRange(p);
      for (let i = 0; i <= 100; i++) {
        const target = fMinGHz + ((fMaxGHz - fMinGHz) * i) / 100;
        const flux = fluxForFrequency(p, target, 'Q');
        expect(flux).toBeGreaterThanOrEqual(0);
        expect(flux).toBeLessThanOrEqual(0.5);
        expectClose(spectrumAt(p, flux).f01GHz, target, 1e-11, `d=${p.asymmetry} target ${target}`);
      }
    }
  });

  it('recovers the flux it was given (away from Phi = 0, where the map is square-root conditioned)', () => {
    const p = devices[0];
    for (const flux of [0.05, 0.123, 0.3, 0.45]) {
      expectClose(fluxForFrequency(p, spectrumAt(p, flux).f01GHz, 'Q'), flux, 1e-9, `Phi=${flux}`);
    }
  });

  it('agrees with the asymptotic inverse sqrt(8 E_J E_C) - E_C = f to within its O(E_C sqrt(E_C/E_J)) accuracy', () => {
    const p = devices[0];
    const target = 4.8;
    const flux = fluxForFrequency(p, target, 'Q');
    const ej = josephsonEnergy(p.ejsGHz, p.asymmetry, flux);
    const asymptoticEj = (target + p.ecGHz) ** 2 / (8 * p.ecGHz);
    // E_J error from an f01 error df: dE_J = df * 2 sqrt(E_J/(8 E_C)); df <= 0.6 E_C sqrt(E_C/E_J).
    const bound = 0.6 * p.ecGHz * Math.sqrt(p.ecGHz / ej) * 2 * Math.sqrt(ej / (8 * p.ecGHz));
    expect(Math.abs(ej - asymptoticEj)).toBeLessThanOrEqual(bound);
  });

  it('finds f12 targets too (transition: f12)', () => {
    const p = devices[2];
    for (const flux of [0.1, 0.25, 0.4]) {
      const f12 = spectrumAt(p, flux).f12GHz;
      const back = fluxForFrequencyOrNull(p, f12, { transition: 'f12' })!;
      expectClose(spectrumAt(p, back).f12GHz, f12, 1e-11, `f12 at Phi=${flux}`);
    }
  });

  it('returns null outside the range and throws an InputError naming the qubit and the range', () => {
    const p = devices[0];
    const { fMaxGHz, fMinGHz } = tunableRange(p);
    expect(fluxForFrequencyOrNull(p, fMaxGHz + 0.01)).toBeNull();
    expect(fluxForFrequencyOrNull(p, fMinGHz - 0.01)).toBeNull();
    expect(() => fluxForFrequency(p, 7.5, 'Q7')).toThrow(InputError);
    expect(() => fluxForFrequency(p, 7.5, 'Q7')).toThrow(/qubit Q7: f01 = 7\.5 GHz is outside its tunable range \d\.\d+ GHz to \d\.\d+ GHz/);
    let caught: unknown;
    try {
      fluxForFrequency(p, 1, 'Q7', { where: { path: 'options.park' } });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(InputError);
    expect((caught as InputError).diagnostics[0].path).toBe('options.park');
  });
});
