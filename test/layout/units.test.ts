import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createRequire } from 'node:module';
import { unit } from 'mathjs';
import { formatQuantity, normaliseUnitText, parseQuantity, roundSignificant } from '../../src/layout/units.js';
import { expectClose } from '../support/close.js';

const value = (input: unknown, kind: Parameters<typeof parseQuantity>[1]) => {
  const r = parseQuantity(input, kind);
  if (!r.ok) throw new Error(r.message);
  return r.value;
};

describe('parseQuantity', () => {
  it.each([
    ['5.8 GHz', 'frequency', 5.8],
    ['-210 MHz', 'frequency', -0.21],
    ['200 kHz', 'frequency', 2e-4],
    ['5e9 Hz', 'frequency', 5],
    ['.5 GHz', 'frequency', 0.5],
    ['45 us', 'time', 45_000],
    ['45us', 'time', 45_000],
    ['45 µs', 'time', 45_000],
    ['45 μs', 'time', 45_000],
    ['20 us', 'time', 20_000],
    ['0.1 ms', 'time', 100_000],
    ['80 ns', 'time', 80],
    ['8.2 kOhm', 'resistance', 8.2],
    ['8200 Ohm', 'resistance', 8.2],
    ['8200 ohm', 'resistance', 8.2],
    ['8.2 kΩ', 'resistance', 8.2],
    ['1 MOhm', 'resistance', 1000],
    ['3 uPhi0', 'fluxNoise', 3e-6],
    ['3 µPhi0', 'fluxNoise', 3e-6],
    ['3 uPhi0/sqrt(Hz)', 'fluxNoise', 3e-6],
    ['3 uPhi0 / Hz^0.5', 'fluxNoise', 3e-6],
    ['3 uPhi0/Hz^(1/2)', 'fluxNoise', 3e-6],
    ['0.002 mPhi0', 'fluxNoise', 2e-6],
  ] as const)('%s as %s -> %d (internal units GHz, ns, kOhm, Phi0)', (text, kind, expected) => {
    expect(value(text, kind)).toBe(expected);
  });

  it('agrees with the mathjs global instance on conversions (reference), to 1e-12', () => {
    const cases: [string, 'frequency' | 'time', string][] = [
      ['4.713 GHz', 'frequency', 'GHz'], ['12.5 MHz', 'frequency', 'GHz'], ['37 us', 'time', 'ns'], ['0.25 ms', 'time', 'ns'],
    ];
    for (const [text, kind, to] of cases) expectClose(value(text, kind), unit(text).toNumber(to), 1e-12, text);
  });

  it('rounds binary artefacts away: 20 us is exactly 20000 ns (mathjs alone gives 19999.999999999996)', () => {
    expect(unit('20 us').toNumber('ns')).not.toBe(20000); // the artefact this guards against
    expect(value('20 us', 'time')).toBe(20000);
    expect(roundSignificant(0.1 + 0.2)).toBe(0.3);
  });

  it.each([
    [5.8, 'frequency', 'expected a frequency with a unit, found the bare number 5.8 (write e.g. "5.8 GHz")'],
    ['5.8', 'frequency', 'expected a frequency with a unit, found the bare number 5.8 (write e.g. "5.8 GHz")'],
    ['20 us', 'frequency', 'expected a frequency, found 20 us'],
    ['5 GHz', 'time', 'expected a time, found 5 GHz'],
    ['5 GHz GHz', 'frequency', 'expected a frequency, found 5 GHz GHz'],
    ['3 uPhi0/Hz', 'fluxNoise', 'expected a flux-noise amplitude, found 3 uPhi0/Hz'],
    ['', 'frequency', 'expected a frequency such as "5.8 GHz", found "" (a unit without a number)'],
    ['GHz', 'frequency', 'expected a frequency such as "5.8 GHz", found GHz (a unit without a number)'],
    ['5 Ghz', 'frequency', 'expected a frequency such as "5.8 GHz", found 5 Ghz: unknown unit "Ghz" (did you mean GHz?)'],
    ['5 GHz + 1 MHz', 'frequency', 'expected a frequency such as "5.8 GHz", found 5 GHz + 1 MHz'],
    ['1e400 GHz', 'frequency', 'expected a finite frequency, found 1e400 GHz'],
    [true, 'time', 'expected a time such as "45 us", found the value true'],
    [null, 'time', 'expected a time such as "45 us", found an empty value'],
    ['x'.repeat(200), 'time', 'expected a time such as "45 us", found a text of 200 characters'],
  ] as const)('%j as %s is refused: %s', (input, kind, message) => {
    expect(parseQuantity(input, kind)).toEqual({ ok: false, message });
  });

  it('normaliseUnitText maps µ, μ, Ohm, Ω and sqrt(Hz) to mathjs spellings', () => {
    expect(normaliseUnitText(' 3 µPhi0/sqrt(Hz) ')).toBe('3 uPhi0/Hz^0.5');
    expect(normaliseUnitText('4 kΩ')).toBe('4 kohm');
    expect(normaliseUnitText('4 kOhm')).toBe('4 kohm');
  });

  it('defining Phi0 does not touch the default mathjs instances (ESM build, and the bundle units.ts loads)', () => {
    expect(value('3 uPhi0', 'fluxNoise')).toBe(3e-6);
    expect(() => unit('3 uPhi0')).toThrow();
    const bundle = createRequire(import.meta.url)('mathjs/lib/browser/math.js') as typeof import('mathjs');
    expect(() => bundle.unit('3 uPhi0')).toThrow();
  });
});

describe('formatQuantity', () => {
  it.each([
    [0.012, 'frequency', '12 MHz'],
    [5.8, 'frequency', '5.8 GHz'],
    [2e-4, 'frequency', '200 kHz'],
    [-0.21, 'frequency', '-210 MHz'],
    [20000, 'time', '20 us'],
    [80, 'time', '80 ns'],
    [3e-6, 'fluxNoise', '3 uPhi0'],
    [8.2, 'resistance', '8.2 kOhm'],
    [0, 'frequency', '0 GHz'],
  ] as const)('formatQuantity(%d, %s) = %s', (v, kind, text) => {
    expect(formatQuantity(v, kind)).toBe(text);
  });
});

describe('parseQuantity without mathjs for plain texts', () => {
  it('gives exactly what mathjs gives, on 3,000 random plain texts of every kind (fixed seed) and on edge cases', () => {
    const units: Record<Parameters<typeof parseQuantity>[1], string[]> = {
      frequency: ['Hz', 'kHz', 'MHz', 'GHz', 'THz', 'Ghz', 'mHz'],
      time: ['s', 'ms', 'us', 'µs', 'μs', 'ns', 'ps', 'min'],
      resistance: ['Ohm', 'ohm', 'kOhm', 'kΩ', 'MOhm', 'Ω'],
      fluxNoise: ['Phi0', 'mPhi0', 'uPhi0', 'nPhi0', 'uPhi0/sqrt(Hz)', 'uPhi0 / sqrt(Hz)', 'mPhi0/Hz^0.5'],
      temperature: ['K', 'mK', 'uK', 'µK'],
    };
    const text = fc.record({
      kind: fc.constantFrom('frequency', 'time', 'resistance', 'fluxNoise') as fc.Arbitrary<Parameters<typeof parseQuantity>[1]>,
      sign: fc.constantFrom('', '-', '+'),
      int: fc.stringMatching(/^\d{1,7}$/),
      frac: fc.option(fc.stringMatching(/^\d{0,9}$/), { nil: undefined }),
      exp: fc.option(fc.integer({ min: -12, max: 12 }), { nil: undefined }),
      space: fc.constantFrom(' ', '', '  '),
      pick: fc.nat(),
    });
    fc.assert(
      fc.property(text, (t) => {
        const list = units[t.kind];
        const s = `${t.sign}${t.int}${t.frac !== undefined ? `.${t.frac}` : ''}${t.exp !== undefined ? `e${t.exp}` : ''}${t.space}${list[t.pick % list.length]}`;
        expect(parseQuantity(s, t.kind), s).toEqual(parseQuantity(s, t.kind, { plain: false }));
      }),
      { seed: 20261202, numRuns: 3000 },
    );
    for (const s of ['5.123456789012 GHz', '5.1234567890125 GHz', '0.000000000001 GHz', '999999999999 Hz', '0 GHz', '-0 MHz', '007 GHz', '1e308 GHz', '3 uPhi0 / Hz^0.5']) {
      expect(parseQuantity(s, 'frequency'), s).toEqual(parseQuantity(s, 'frequency', { plain: false }));
    }
  });
});
