/**
 * freq (src/plan/format.ts): a frequency printed with its unit chosen by size; each output read
 * back with mathjs units (the outside reference) gives the input to the printed precision.
 */
import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { freq } from '../../src/plan/format.js';

describe('freq', () => {
  it('chooses GHz, MHz, kHz or Hz by size, with the significant digits asked for', () => {
    expect(freq(-0.087274)).toBe('-87.3 MHz');
    expect(freq(0.036651)).toBe('36.7 MHz');
    expect(freq(5.1204, 5)).toBe('5.1204 GHz');
    expect(freq(3.2e-5)).toBe('32.0 kHz');
    expect(freq(-5.03283e-5)).toBe('-50.3 kHz');
    expect(freq(3e-10)).toBe('0.300 Hz');
    expect(freq(0)).toBe('0.00 GHz');
  });

  it('a value that rounds up to 1000 of a unit is printed one unit up', () => {
    expect(freq(0.00099996)).toBe('1.00 MHz');
    expect(freq(0.9999996)).toBe('1.00 GHz');
  });

  it('reads back with mathjs to within half of its last digit, and the number stays below 1000 of its unit', () => {
    for (const x of [6.62, -0.2121, 0.0123456, 4.4e-4, -7.77e-6, 1.23e-8, 0.999, 0.0009995]) {
      for (const sig of [3, 5]) {
        const text = freq(x, sig);
        const [num, u] = text.split(' ');
        const decimals = num.split('.')[1]?.length ?? 0;
        const step = unit(10 ** -decimals, u).toNumber('GHz');
        expect(Math.abs(unit(Number(num), u).toNumber('GHz') - x), text).toBeLessThanOrEqual(step / 2 + 1e-15);
        expect(Math.abs(Number(num)), text).toBeLessThan(1000);
      }
    }
  });
});
