/**
 * The demo layouts are meant for planning: plausible parameters (E_C 0.18-0.26 GHz, f_max
 * 4.5-7 GHz, common practice for tunable transmons) and room for a planner, i.e. coupled
 * neighbours' maximum frequencies a few hundred MHz apart, and each pair's CZ point (the higher
 * qubit moved down to about f_low + |alpha_high|, README physics conventions sec. 2: the 11-20 crossing) inside
 * the higher qubit's tunable range. Checked on the exact spectrum (src/transmon).
 */
import { describe, expect, it } from 'vitest';
import { readdirSync } from 'node:fs';
import { loadLayoutFile } from '../../src/layout/load.js';
import { resolveTransmon } from '../../src/transmon/resolve.js';
import { tunableRange } from '../../src/transmon/tunable-range.js';

const DEMOS = readdirSync('layouts').filter((f) => f.endsWith('.yaml'));

describe.each(DEMOS)('demo layouts/%s', (name) => {
  const layout = loadLayoutFile(`layouts/${name}`);
  const ranges = new Map(
    layout.qubits.map((q) => {
      const params = resolveTransmon(q.transmon, q.id, q.source);
      return [q.id, { params, range: tunableRange(params) }] as const;
    }),
  );

  it('every qubit resolves to E_C in 0.18-0.26 GHz and f_max in 4.5-7 GHz, with f_min well below f_max', () => {
    for (const [id, { params, range }] of ranges) {
      expect(params.ecGHz, id).toBeGreaterThanOrEqual(0.17);
      expect(params.ecGHz, id).toBeLessThanOrEqual(0.27);
      expect(range.fMaxGHz, id).toBeGreaterThanOrEqual(4.5);
      expect(range.fMaxGHz, id).toBeLessThanOrEqual(7);
      expect(range.fMaxGHz - range.fMinGHz, id).toBeGreaterThan(1);
    }
  });

  it('coupled neighbours differ by at least 200 MHz at f_max, and each CZ point lies in the higher qubit\'s range', () => {
    for (const c of layout.couplings) {
      const [a, b] = [ranges.get(c.a)!, ranges.get(c.b)!];
      const [hi, lo] = a.range.fMaxGHz >= b.range.fMaxGHz ? [a, b] : [b, a];
      expect(hi.range.fMaxGHz - lo.range.fMaxGHz, `${c.a}-${c.b}`).toBeGreaterThan(0.2);
      const czPoint = lo.range.fMaxGHz + Math.abs(hi.range.top.anharmonicityGHz);
      expect(czPoint, `${c.a}-${c.b}`).toBeGreaterThan(hi.range.fMinGHz);
      expect(czPoint, `${c.a}-${c.b}`).toBeLessThan(hi.range.fMaxGHz);
    }
  });

  it('windows and fixed parking points lie inside the qubit\'s tunable range', () => {
    for (const q of layout.qubits) {
      const { range } = ranges.get(q.id)!;
      if (q.parkGHz !== undefined) {
        expect(q.parkGHz, q.id).toBeGreaterThanOrEqual(range.fMinGHz);
        expect(q.parkGHz, q.id).toBeLessThanOrEqual(range.fMaxGHz + 1e-9);
      }
      if (q.windowGHz) expect(q.windowGHz[0], q.id).toBeLessThan(range.fMaxGHz);
    }
  });
});
