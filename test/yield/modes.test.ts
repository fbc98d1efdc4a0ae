/**
 * Deliverable checks on a demo (Bowline-5): the yield falls monotonically as the junction spread
 * grows (the same draws scaled: src/yield/job.ts), and re-planning each chip works at least as
 * often as keeping the nominal plan, on the same drawn chips.
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { nominalPlan } from '../../src/yield/nominal-plan.js';
import { runInThisThread } from '../../src/yield/run.js';
import type { YieldJob } from '../../src/yield/job.js';

const layout = loadLayoutFile('layouts/bowline-5.yaml', 'bowline-5.yaml');
const samples = 24;
const job = (mode: 'fixed' | 'replan', sweep: number[] | null): YieldJob => ({
  layout, mode, seed: 1, samples, spread: { rn: 0.02, ec: 0.01, g: 0.03 }, sweep,
  plan: mode === 'fixed' ? nominalPlan(layout, 1).plan : null, planSeed: 1, cycleErrorCeiling: null,
});

describe('yield on Bowline-5', () => {
  it('falls monotonically as the junction spread grows (replan mode, 1 %, 2 %, 4 %, 8 %), and is below 1 at 8 %', () => {
    const rows = runInThisThread(job('replan', [0.01, 0.02, 0.04, 0.08]), 0, samples);
    // rows: 2 % (the run's own spread), then 1 %, 4 %, 8 %
    const byRn = new Map([[0.02, rows[0]], [0.01, rows[1]], [0.04, rows[2]], [0.08, rows[3]]]);
    const yields = [0.01, 0.02, 0.04, 0.08].map((rn) => byRn.get(rn)!.filter((o) => o.ok).length);
    for (let k = 1; k < yields.length; k++) expect(yields[k], `${yields}`).toBeLessThanOrEqual(yields[k - 1]);
    expect(yields[3]).toBeLessThan(samples);
  }, 60_000);

  it('re-planning works at least as often as keeping the plan, on the same chips (2 %)', () => {
    const fixed = runInThisThread(job('fixed', null), 0, samples)[0];
    const replan = runInThisThread(job('replan', null), 0, samples)[0];
    const okFixed = fixed.filter((o) => o.ok).length;
    const okReplan = replan.filter((o) => o.ok).length;
    expect(okReplan).toBeGreaterThanOrEqual(okFixed);
    // keeping the plan fails on the drawn chips whose qubits can no longer reach their parking points
    expect(okFixed).toBeLessThan(samples);
    expect(fixed.filter((o) => !o.ok).every((o) => o.rules.some(([r]) => r === 'window'))).toBe(true);
  }, 60_000);
});
