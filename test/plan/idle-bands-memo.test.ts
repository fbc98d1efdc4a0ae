/**
 * The idle-error bands shared by every IdleBlockers of one plan context
 * (src/plan/rules/idle-blockers.ts idleErrorIntervals): the remembered bands against the bands
 * computed anew (idleErrorBands), shared between instances of one context, and kept apart between
 * contexts with other rules (a memo keyed by qubit alone would hand the second context the first
 * one's bands and fail here).
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { buildPlanContext } from '../../src/plan/context.js';
import { IdleBlockers, idleErrorBands } from '../../src/plan/rules/idle-blockers.js';

const layout = loadLayoutFile('layouts/bowline-5.yaml', 'layouts/bowline-5.yaml');

describe('IdleBlockers.idleErrorIntervals (remembered per context)', () => {
  it('equals the bands computed anew, and one context shares them between instances', () => {
    const ctx = buildPlanContext(layout);
    const a = new IdleBlockers(ctx);
    const b = new IdleBlockers(ctx);
    let nonEmpty = 0;
    for (let i = 0; i < ctx.n; i++) {
      const fresh = idleErrorBands(ctx, i);
      expect(a.idleErrorIntervals(i)).toEqual(fresh);
      expect(b.idleErrorIntervals(i)).toBe(a.idleErrorIntervals(i));
      if (fresh.length > 0) nonEmpty++;
    }
    // the demo has bands to remember (an empty scan everywhere would test nothing)
    expect(nonEmpty).toBeGreaterThan(0);
  });

  it('a context with another idle-error limit gets its own bands', () => {
    const first = buildPlanContext(layout);
    const second = buildPlanContext({ ...layout, rules: { ...layout.rules, idleErrorLimit: layout.rules.idleErrorLimit / 4 } });
    const one = new IdleBlockers(first);
    const two = new IdleBlockers(second);
    let differ = 0;
    for (let i = 0; i < first.n; i++) {
      const r1 = one.idleErrorIntervals(i);
      const r2 = two.idleErrorIntervals(i);
      expect(r1).toEqual(idleErrorBands(first, i));
      expect(r2).toEqual(idleErrorBands(second, i));
      if (JSON.stringify(r1) !== JSON.stringify(r2)) differ++;
    }
    expect(differ).toBeGreaterThan(0);
  });
});
