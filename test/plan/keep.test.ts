/**
 * The planner option `keep` (src/plan/parking/keep.ts, applied in src/plan/parking/state.ts):
 * pinned parking stays exactly; preferred parking is kept wherever it still holds, and a
 * frequency that breaks a rule gives way, changing as few qubits as it can (Clove-17).
 */
import { describe, expect, it } from 'vitest';
import { planChip } from '../../src/plan/plan.js';
import { buildPlanContext } from '../../src/plan/context.js';
import { KEEP_DEFAULTS, KeptParking } from '../../src/plan/parking/keep.js';
import { loadLayoutFile } from '../../src/layout/load.js';

const layout = loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml');
const base = planChip(layout);
const parking: Record<string, number> = Object.fromEntries(base.ctx.ids.map((q, i) => [q, base.parking.parkingGHz[i]]));

describe('keep: parking from an earlier plan', () => {
  it('pin: every kept frequency is the plan\'s parking, bit for bit, also one that breaks a rule (reported)', () => {
    const moved: Record<string, number> = { ...parking, X3: parking.X1 + 0.005 }; // X1 and X3 share D2: 30 MHz needed (next-01-01)
    const p = planChip(layout, { keep: { parkingGHz: moved, mode: 'pin' } });
    p.ctx.ids.forEach((q, i) => expect(p.parking.parkingGHz[i], q).toBe(moved[q]));
    expect(p.violations.some((v) => v.rule === 'next-01-01' && v.qubits.includes('X1') && v.qubits.includes('X3'))).toBe(true);
  });

  it('prefer: the plan\'s own parking is kept as it is', () => {
    const p = planChip(layout, { keep: { parkingGHz: parking, mode: 'prefer' } });
    p.ctx.ids.forEach((q, i) => expect(p.parking.parkingGHz[i], q).toBe(parking[q]));
    // the same plan: the same rules hold and the same ones break (Clove-17 breaks error-budget rules, README "What the demos give")
    const key = (v: { rule: string; qubits: string[]; edge?: string }) => `${v.rule}|${v.edge ?? ''}|${v.qubits.join(',')}`;
    expect(p.violations.map(key)).toEqual(base.violations.map(key));
    expect(p.parking.idle.violations).toEqual([]);
  });

  it('prefer: a kept frequency that breaks a rule gives way; every other qubit keeps its frequency', () => {
    const moved: Record<string, number> = { ...parking, X3: parking.X1 + 0.005 };
    const p = planChip(layout, { keep: { parkingGHz: moved, mode: 'prefer' } });
    const changed = p.ctx.ids.filter((q, i) => Math.abs(p.parking.parkingGHz[i] - moved[q]) > 1e-6);
    expect(changed.length).toBe(1);
    expect(['X1', 'X3']).toContain(changed[0]);
    expect(p.parking.idle.violations).toEqual([]);
  });

  it('costOf: the penalty when parked more than 1 kHz from the kept frequency, nothing when pinned or with nothing kept; a kept frequency outside the domain is ignored', () => {
    const ctx = buildPlanContext(layout);
    const i = ctx.index.get('X1')!;
    const kept = new KeptParking(ctx, { parkingGHz: { X1: parking.X1, D1: 99 }, mode: 'prefer', changePenalty: 0.5 });
    expect(kept.costOf(i, parking.X1 + 5e-7)).toBe(0);
    expect(kept.costOf(i, parking.X1 + 2e-6)).toBe(0.5);
    expect(Number.isNaN(kept.of(ctx.index.get('D1')!))).toBe(true);
    expect(kept.costOf(ctx.index.get('Z1')!, 5)).toBe(0);
    const pinned = new KeptParking(ctx, { parkingGHz: { X1: parking.X1 }, mode: 'pin' });
    expect(pinned.pinned(i)).toBe(true);
    expect(pinned.costOf(i, 4)).toBe(0);
    expect(KEEP_DEFAULTS.changePenalty).toBe(0.5);
  });
});
