/**
 * planDiff (src/report/plan-diff.ts) on plan documents: equal within the 12 digits plan.json
 * keeps; parking, device, rule and edge changes listed with why (a re-plan's reasons, else the
 * measured changes of the qubits involved); readPlanDocument refuses what is not a plan.
 */
import { describe, expect, it } from 'vitest';
import { planDiff, planDiffText, valueText } from '../../src/report/plan-diff.js';
import { readPlanDocument } from '../../src/plan/plan-read.js';
import { InputError } from '../../src/util/errors.js';

const doc = (over: (d: any) => void = () => {}) => {
  const d: any = {
    format: 'fluxlane-plan', version: 1, chip: 'T', rules: { maxGate: 1e-7 },
    qubits: { A: { parkingFrequency: 6e9, device: { fMax: 6.2e9, t1: 5e-5 } }, B: { parkingFrequency: 5e9, device: { fMax: 5.5e9, t1: 4e-5 } } },
    edges: [{ qubits: ['A', 'B'], mover: 'A', crossing: '11-20', interactionFrequency: 5.2e9, spectatorParking: {}, layer: 0, feasible: true, rampTime: 1.5e-8, slotDuration: 4e-8, gMax: 1.2e7, gate: { family: 'erf', fidelity: 0.9999 } }],
  };
  over(d);
  return d;
};

describe('planDiff', () => {
  it('finds nothing between a plan and itself, or a copy off in the 13th digit', () => {
    const d = planDiff(doc(), doc((x) => (x.qubits.A.parkingFrequency = 6e9 * (1 + 1e-13))));
    expect(d.parking).toEqual([]);
    expect(d.edges).toEqual([]);
    expect(d.unchanged).toEqual({ parking: 2, edges: 1 });
    expect(planDiffText(d, 'a', 'b', (l) => l)).toMatch(/no differences/);
  });

  it('lists a measured change, the parking it moved and the edge, with the measured value as why when no re-plan says more', () => {
    const d = planDiff(doc(), doc((x) => {
      x.qubits.B.device.fMax = 5.46e9;
      x.qubits.B.parkingFrequency = 4.99e9;
      x.edges[0].interactionFrequency = 5.19e9;
      x.edges[0].gate.fidelity = 0.9998;
      x.rules.maxGate = 9e-8;
    }));
    expect(d.rules!.changes).toEqual([{ field: 'maxGate', from: 1e-7, to: 9e-8 }]);
    expect(d.measured).toEqual([{ subject: 'B', changes: [{ field: 'device.fMax', from: 5.5e9, to: 5.46e9 }], why: [] }]);
    expect(d.parking).toEqual([{ subject: 'B', changes: [{ field: 'parkingFrequency', from: 5e9, to: 4.99e9 }], why: ['B fMax 5.50000 GHz -> 5.46000 GHz'] }]);
    expect(d.edges[0].changes.map((c) => c.field)).toEqual(['interactionFrequency', 'gate.fidelity']);
    expect(d.edges[0].why).toEqual(['B fMax 5.50000 GHz -> 5.46000 GHz', "B's parking changed"]);
  });

  it('takes the reasons a re-plan recorded', () => {
    const d = planDiff(doc(), doc((x) => {
      x.qubits.A.parkingFrequency = 6.1e9;
      x.edges[0].mover = 'B';
      x.replan = { from: 'old.json', changes: [{ subject: 'A', kind: 'parking', message: 'A moved: 01-01 with B' }, { subject: 'A-B', kind: 'edge', message: 'A-B planned again' }] };
    }));
    expect(d.replannedFrom).toBe('old.json');
    expect(d.parking[0].why).toEqual(['A moved: 01-01 with B']);
    expect(d.edges[0].why).toEqual(['A-B planned again']);
  });

  it('prints values with units chosen by size', () => {
    expect(valueText('parkingFrequency', 5.123456e9)).toBe('5.12346 GHz');
    expect(valueText('gate.duration', 4.04e-8)).toBe('40.40 ns');
    expect(valueText('device.t1', 5e-5)).toBe('50.00 us');
    expect(valueText('spectatorParking', { X: 4.9e9 })).toBe('X@4.9000 GHz');
    expect(valueText('gate.leakage', 1.234e-5)).toBe('1.23e-5');
  });
});

describe('readPlanDocument', () => {
  const problems = (text: string): string[] => {
    try {
      readPlanDocument(text, 'p.json');
      return [];
    } catch (err) {
      expect(err).toBeInstanceOf(InputError);
      return (err as InputError).diagnostics.map((d) => `${d.line ?? ''}:${d.column ?? ''} ${d.message}`);
    }
  };
  it('reads a plan; refuses JSON errors with line and column and documents of another kind', () => {
    expect(problems(JSON.stringify(doc()))).toEqual([]);
    expect(problems('{\n  "format": "fluxlane-plan",\n  oops\n}')[0]).toMatch(/^3:\d+ expected JSON/);
    expect(problems('{"format": "other", "version": 1}')[0]).toMatch(/expected a plan.json written by fluxlane plan .*found format "other"/);
  });
});
