/**
 * The collision rules as data (src/plan/rules/catalogue.ts) and their exact evaluation on a
 * parking assignment (src/plan/rules/idle-evaluate.ts), on hand-made chips that break a rule by
 * a known amount and ones that clear it. Values come from the exact transmon stage (f01, f12) and
 * CoupledPair's dressed ZZ; thresholds from shared/rules.json (common practice).
 */
import { describe, expect, it } from 'vitest';
import { COLLISION_RULES, thresholdOf } from '../../src/plan/rules/catalogue.js';
import { evaluateIdle } from '../../src/plan/rules/idle-evaluate.js';
import { buildPlanContext } from '../../src/plan/context.js';
import { IdleBlockers } from '../../src/plan/rules/idle-blockers.js';
import { emptyTableState } from '../../src/plan/qubit-table.js';
import { toFindingJson } from '../../src/plan/rules/findings.js';
import { RULE_SPECS } from '../../src/layout/rules.js';
import { expectClose } from '../support/close.js';
import { handChip } from '../support/plan-chips.js';

const pairChip = handChip('pair', { Q1: { fMax: '5.8 GHz', tls: [{ at: '5.2 GHz', width: '2 MHz' }], readout: '6.0 GHz' }, Q2: { fMax: '6.2 GHz' }, Q3: { fMax: '6.0 GHz' } }, [['Q1', 'Q2', '12 MHz'], ['Q1', 'Q3', '10 MHz']]);
const ctx = buildPlanContext(pairChip);

describe('COLLISION_RULES', () => {
  it('names every rule once, after the transitions it compares, with a threshold field from shared/rules.json', () => {
    const names = COLLISION_RULES.map((r) => r.name);
    expect(new Set(names).size).toBe(names.length);
    for (const name of ['01-01', '01-12', 'zz', 'next-01-01', 'tls', 'readout', 'cz-spectator-01-01', 'cz-spectator-11-20', 'cz-spectator-11-02', 'cz-swept-01-01', 'cz-swept-11-20', 'cz-swept-11-02', 'cz-swept-next-01-01', 'cz-swept-tls']) {
      expect(names).toContain(name);
    }
    const fields = RULE_SPECS.map((s) => s.field);
    for (const r of COLLISION_RULES) {
      expect(r.doc.length).toBeGreaterThan(20);
      expect(r.source.length).toBeGreaterThan(3);
      if (r.threshold !== null) expect(fields).toContain(r.threshold);
    }
    expect(thresholdOf('01-01', pairChip.rules)).toBe(0.05);
    expect(thresholdOf('cz-swept-tls', pairChip.rules)).toBe(0.001);
  });
});

describe('evaluateIdle', () => {
  it('finds 01-01 broken by a known amount: neighbours 30 MHz apart with a 50 MHz threshold', () => {
    const r = evaluateIdle(ctx, [5.5, 5.53, 4.7]);
    const v = r.violations.find((x) => x.rule === '01-01')!;
    expect(v.qubits).toEqual(['Q1', 'Q2']);
    expectClose(v.value!, 0.03, 1e-9, '|f1 - f2|');
    expect(v.threshold).toBe(0.05);
    expect(v.message).toMatch(/Q1 \(5\.500 GHz\) and Q2 \(5\.530 GHz\) are 30\.0 MHz apart; coupled neighbours need 50\.0 MHz/);
    // SI in JSON: Hz
    expect(toFindingJson(v)).toMatchObject({ rule: '01-01', value: 3e7, threshold: 5e7, unit: 'Hz' });
  });

  it('finds 01-12 when f01 of one qubit sits 10 MHz from f12 of its neighbour (exact f12)', () => {
    const f12 = ctx.transmons[0].spectrum(ctx.transmons[0].fluxForF01(5.6)).f12GHz;
    const r = evaluateIdle(ctx, [5.6, f12 + 0.01, 4.7]);
    const v = r.violations.find((x) => x.rule === '01-12')!;
    expect(v.qubits).toEqual(['Q1', 'Q2']);
    expectClose(v.value!, 0.01, 1e-9, '|f12_1 - f01_2|');
  });

  it('reports the exact dressed ZZ of CoupledPair, and clears pairs that are far apart', () => {
    const r = evaluateIdle(ctx, [5.5, 6.2, 4.6]);
    const exact = ctx.pair(0).zz(ctx.transmons[0].fluxForF01(5.5), ctx.transmons[1].fluxForF01(6.2));
    expect(r.zzGHz[0]).toBe(exact);
    const zz = r.violations.filter((x) => x.rule === 'zz');
    expect(zz.map((x) => x.qubits)).toEqual(Math.abs(exact) > pairChip.rules.zzLimitGHz ? [['Q1', 'Q2']] : []);
    const clear = evaluateIdle(ctx, [4.6, 6.2, 6.0]);
    expect(clear.violations.filter((x) => x.rule !== 'next-01-01' && x.rule !== 'zz')).toEqual([]);
  });

  it('finds next-01-01, tls (beyond the width) and readout by their distances', () => {
    const r = evaluateIdle(ctx, [5.204, 6.0, 5.99]);
    const next = r.violations.find((x) => x.rule === 'next-01-01')!;
    expect(next.qubits).toEqual(['Q2', 'Q3']);
    expectClose(next.value!, 0.01, 1e-9, 'next-nearest distance');
    const tls = r.violations.find((x) => x.rule === 'tls')!;
    expectClose(tls.value!, 0.004 - 0.002, 1e-9, '|f - f_TLS| - width');
    const near = evaluateIdle(ctx, [5.8, 6.2, 4.7]).violations.find((x) => x.rule === 'readout')!;
    expect(near.qubits).toEqual(['Q1']);
    expectClose(near.value!, 0.2, 1e-9, '|f - f_r|');
    expect(evaluateIdle(ctx, [5.5, 6.2, 4.7]).violations.find((x) => x.rule === 'readout')).toBeUndefined();
  });
});

describe('IdleBlockers', () => {
  it('a point inside a blocked interval breaks the exact rule, a point outside does not (01-01, 01-12, tls)', () => {
    const freq = Float64Array.from([5.5, 6.1, 4.7]);
    const view = {
      freq,
      states: ctx.tables.map((t, i) => t.at(freq[i], emptyTableState())),
      active: new Uint8Array(3).fill(1),
      zzScale: new Float64Array(2).fill(1),
      zzLimitGHz: 1, // switch ZZ off for this test
    };
    const blockers = new IdleBlockers(ctx).of(1, view, []);
    expect(blockers.filter((x) => x.rule === '01-01' || x.rule === '01-12').length).toBeGreaterThanOrEqual(3);
    for (const b of blockers.filter((x) => x.rule === '01-01' || x.rule === '01-12')) {
      const inside = 0.5 * (b.lo + b.hi);
      const parking = [5.5, inside, 4.7];
      expect(evaluateIdle(ctx, parking).violations.some((v) => v.rule === b.rule && v.qubits.includes('Q2')), `${b.rule} inside`).toBe(true);
      for (const out of [b.lo - 1e-4, b.hi + 1e-4]) {
        const other = blockers.filter((x) => x.rule === b.rule && out > x.lo && out < x.hi);
        if (other.length > 0) continue;
        expect(evaluateIdle(ctx, [5.5, out, 4.7]).violations.some((v) => v.rule === b.rule && v.qubits.includes('Q2')), `${b.rule} outside at ${out}`).toBe(false);
      }
    }
  });
});
