import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/util/errors.js';
import { assertTrajectory, fluxAt, formatTrajectoryCsv, parseTrajectoryCsv } from '../../src/sim/trajectory.js';

function messages(f: () => unknown): string[] {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return e.diagnostics.map((d) => `${d.file}:${d.line ?? ''}:${d.column ?? ''}: ${d.message}`);
    throw e;
  }
  throw new Error('expected an InputError');
}

describe('trajectory CSV', () => {
  it('formatTrajectoryCsv and parseTrajectoryCsv round-trip the samples bit for bit', () => {
    const t = { timeNs: Float64Array.from([0, 0.4166666666666667, 1.2, 3]), flux: Float64Array.from([0.05, 0.1234567890123456, -0.2, 0.05]) };
    const back = parseTrajectoryCsv(formatTrajectoryCsv(t), 'x.csv');
    expect(Array.from(back.timeNs)).toEqual(Array.from(t.timeNs));
    expect(Array.from(back.flux)).toEqual(Array.from(t.flux));
  });

  it('fluxAt joins samples piecewise-linearly', () => {
    const t = { timeNs: Float64Array.from([0, 2, 4]), flux: Float64Array.from([0, 0.2, 0]) };
    expect(fluxAt(t, 1)).toBeCloseTo(0.1, 15);
    expect(fluxAt(t, 3)).toBeCloseTo(0.1, 15);
  });

  it('refuses a trajectory that does not end at its starting flux', () => {
    expect(messages(() => parseTrajectoryCsv('time_ns,flux\n0,0\n1,0.1\n2,0.05\n', 'a.csv'))).toEqual([
      'a.csv:4:1: expected the trajectory to end at its starting (parking) flux 0, found 0.05',
    ]);
  });

  it('refuses times that do not increase strictly, naming the line', () => {
    expect(messages(() => parseTrajectoryCsv('time_ns,flux\n0,0\n1,0.1\n1,0.1\n2,0\n', 'b.csv'))).toEqual([
      'b.csv:4:1: expected time to increase strictly, found 1 ns after 1 ns',
    ]);
  });

  it('refuses NaN, text and out-of-range flux with file:line:column', () => {
    const m = messages(() => parseTrajectoryCsv('time_ns,flux\n0,0\n1,NaN\n2,abc\n3,0.7\n4,0\n', 'c.csv'));
    expect(m).toEqual(['c.csv:3:3: expected a flux in Phi0, found `NaN`', 'c.csv:4:3: expected a flux in Phi0, found `abc`']);
    expect(messages(() => parseTrajectoryCsv('time_ns,flux\n0,0\n1,0.7\n2,0\n', 'd.csv'))).toEqual(['d.csv:3:1: expected a flux in [-0.5, 0.5] Phi0, found 0.7']);
  });

  it('refuses a wrong header and an empty file', () => {
    expect(messages(() => parseTrajectoryCsv('t,phi\n0,0\n', 'e.csv'))).toEqual(['e.csv:1:1: expected the header `time_ns,flux_phi0`, found `t,phi`']);
    expect(messages(() => parseTrajectoryCsv('', 'f.csv'))).toEqual(['f.csv:1:1: expected a header `time_ns,flux_phi0`, found an empty file']);
  });

  it('assertTrajectory needs at least two samples', () => {
    expect(() => assertTrajectory({ timeNs: Float64Array.from([0]), flux: Float64Array.from([0]) })).toThrow(InputError);
  });
});
