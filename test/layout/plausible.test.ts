/**
 * Plausible ranges of the layout's inputs (src/layout/plausible.ts): a hard range (error) and a
 * usual range (warning) per input; the demos are all usual; the warnings carry positions.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { judgePlausible, PLAUSIBLE } from '../../src/layout/plausible.js';
import { loadLayoutFile, parseLayoutText } from '../../src/layout/load.js';
import { InputError } from '../../src/util/errors.js';

describe('plausible ranges', () => {
  it('each usual range lies inside its hard range', () => {
    for (const [key, r] of Object.entries(PLAUSIBLE)) {
      expect(r.hard[0], key).toBeLessThan(r.usual[0] + 1e-15);
      expect(r.usual[0], key).toBeLessThan(r.usual[1]);
      expect(r.usual[1], key).toBeLessThanOrEqual(r.hard[1]);
    }
  });

  it('the cases of the trial: T1 of 1e-300 s and a g of 1e300 MHz are errors; a g of 0.3 GHz and a T1 of 50 ms warnings with the likely slip', () => {
    expect(judgePlausible('t1', 1e-291, '1e-300 s')).toMatchObject({ level: 'error' });
    expect(judgePlausible('g', 1e300 * 1e-3, '1e300 MHz')).toMatchObject({ level: 'error' });
    expect(judgePlausible('g', 0.3, '0.3 GHz')).toEqual({ level: 'warning', message: '0.3 GHz is unusual for coupling g (usually 1 MHz to 100 MHz): GHz written for MHz?' });
    expect(judgePlausible('t1', 5e7, '50 ms')).toEqual({ level: 'warning', message: '50 ms is unusual for T1 (usually 5 us to 2 ms): ms written for us?' });
    expect(judgePlausible('t1', 6e4, '60 us')).toEqual({ level: 'ok' });
  });

  it('the demo layouts give no warning', () => {
    for (const f of ['bowline-5', 'clove-17', 'hitch-30', 'reef-49']) expect(loadLayoutFile(`layouts/${f}.yaml`).warnings, f).toBeUndefined();
  });

  it('a layout gets its warnings with file:line:column, and an error stops it', () => {
    const text = readFileSync('test/corpus/pair.yaml', 'utf8');
    const warned = parseLayoutText(text.replace('t1: 60 us', 't1: 50 ms').replace('12 MHz', '0.3 GHz'), 'w.yaml');
    expect(warned.warnings).toEqual([
      { file: 'w.yaml', line: 4, column: 81, path: 'qubits.A.t1', message: 'warning: 50 ms is unusual for T1 (usually 5 us to 2 ms): ms written for us?' },
      { file: 'w.yaml', line: 7, column: 12, path: 'couplings[0][2]', message: 'warning: 0.3 GHz is unusual for coupling g (usually 1 MHz to 100 MHz): GHz written for MHz?' },
    ]);
    expect(() => parseLayoutText(text.replace('t1: 60 us', 't1: 1e-300 s'), 'e.yaml')).toThrow(InputError);
  });
});
