/**
 * The gate table's one column list (src/report/gate-columns.ts): names that carry their SI unit,
 * no name twice, every column documented, and the README's column list generated from it
 * (`npm run generated`).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { GATE_COLUMNS, csvValue, textValue } from '../../src/report/gate-columns.js';
import { readmeWithGateColumns, README_FILE } from '../tools/write-generated.js';

describe('GATE_COLUMNS', () => {
  it('each CSV name says its SI unit, no name or title twice, every column says what it is', () => {
    const unit: Record<string, RegExp> = { frequency: /_hz$/, 'frequency-map': /_hz$/, time: /_s$/, phase: /_rad$/ };
    for (const c of GATE_COLUMNS) {
      if (unit[c.kind]) expect(c.csv, c.csv).toMatch(unit[c.kind]);
      expect(c.doc.length, c.csv).toBeGreaterThan(10);
    }
    expect(new Set(GATE_COLUMNS.map((c) => c.csv)).size).toBe(GATE_COLUMNS.length);
    const titles = GATE_COLUMNS.filter((c) => c.title !== null).map((c) => c.title);
    expect(new Set(titles).size).toBe(titles.length);
    // the three durations and both ramps are named apart
    expect(GATE_COLUMNS.map((c) => c.csv)).toEqual(expect.arrayContaining(['gate_duration_s', 'slot_duration_s', 'plan_ramp_s', 'design_ramp_s']));
  });

  it('cells: the JSON value in the CSV, units chosen by size in the text, blanks for what a plan without a design lacks', () => {
    const col = (csv: string) => GATE_COLUMNS.find((c) => c.csv === csv)!;
    expect(csvValue(col('zz_idle_hz'), -87274e3)).toBe('-87274000');
    expect(textValue(col('zz_idle_hz'), -87274e3)).toBe('-87.3 MHz');
    expect(textValue(col('zz_idle_hz'), -50328.3)).toBe('-50.3 kHz');
    expect(textValue(col('gate_duration_s'), 4.04166666667e-8)).toBe('40.4 ns');
    expect(csvValue(col('spectator_parking_hz'), { X3: 4.99e9, Z4: 5e9 })).toBe('X3@4990000000 Z4@5000000000');
    expect(textValue(col('spectator_parking_hz'), {})).toBe('-');
    expect(csvValue(col('family'), undefined)).toBe('');
    expect(textValue(col('fidelity'), undefined)).toBe('-');
    expect(textValue(col('feasible'), false)).toBe('NO');
  });

  it('the README lists the columns as generated', () => {
    const readme = readFileSync(README_FILE, 'utf8');
    expect(readmeWithGateColumns(readme)).toBe(readme);
  });
});
