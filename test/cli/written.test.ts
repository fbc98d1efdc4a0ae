/** writtenLine (src/cli/written.ts): every path for a few files, folders and counts for many. */
import { describe, expect, it } from 'vitest';
import { writtenLine } from '../../src/cli/written.js';

const f = (path: string) => ({ path, contents: '' });

describe('writtenLine', () => {
  it('lists a few files in full', () => {
    expect(writtenLine([f('out/plan.json'), f('out/gates.csv')])).toBe('wrote out/plan.json, out/gates.csv');
    expect(writtenLine([])).toBe('');
  });

  it('for many files names the folder once, its own files, and counts each subfolder', () => {
    const files = [f('runs/a/plan.json'), f('runs/a/gates.csv'), f('runs/a/gates.txt'), ...Array.from({ length: 48 }, (_, k) => f(`runs/a/waveforms/Q${k}.csv`))];
    expect(writtenLine(files)).toBe('wrote 51 files to runs/a/: plan.json, gates.csv, gates.txt, 48 file(s) in waveforms/');
  });
});
