/**
 * csvCell (src/report/csv.ts) against Python's csv module (the outside reference: its 'excel'
 * dialect follows RFC 4180): every cell reads back as written, quotes, commas and newlines included.
 */
import { describe, expect, it } from 'vitest';
import { csvCell } from '../../src/report/csv.js';
import { runPython } from '../support/python.js';

describe('csvCell', () => {
  it('cells read back unchanged with Python csv.reader (quotes, commas, newlines, empty, numbers)', () => {
    const cells = [['plain', 'with,comma', 'say "hi"', 'two\nlines', '', '5120000000', '-3.14e-9'], ['Q1@5.1e9 Q2@4.9e9', 'true', null, undefined, 0, 1.5e-8, 'x']];
    const text = cells.map((r) => r.map(csvCell).join(',')).join('\n') + '\n';
    const { rows } = runPython<{ rows: string[][] }>('csv_read.py', { text });
    expect(rows).toEqual(cells.map((r) => r.map((v) => (v === null || v === undefined ? '' : String(v)))));
  });

  it('quotes only cells that need it', () => {
    expect(csvCell('Q0-Q1')).toBe('Q0-Q1');
    expect(csvCell('a,b')).toBe('"a,b"');
    expect(csvCell('a"b')).toBe('"a""b"');
    expect(csvCell(null)).toBe('');
  });
});
