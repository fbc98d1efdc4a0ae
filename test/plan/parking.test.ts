/**
 * Parking assignment (src/plan/parking/*) on chips built by hand where the answer is known:
 * a three-qubit line whose middle qubit must be parked away from its neighbours, a window that
 * two coupled qubits cannot share (explained with the conflicting qubits and rules), fixed park
 * values and windows kept, and determinism. Rules checked with the exact transmon and pair stages
 * (CoupledPair's dressed ZZ; README physics conventions sec. 2), thresholds from shared/rules.json (common practice).
 */
import { describe, expect, it } from 'vitest';
import { planChip } from '../../src/plan/plan.js';
import { buildPlanContext } from '../../src/plan/context.js';
import { assignParking } from '../../src/plan/parking/assign.js';
import { planOptions } from '../../src/plan/options.js';
import { handChip } from '../support/plan-chips.js';
import { qubitIdleError } from '../../src/budget/idle-error.js';
import { IDLE_ERROR_BREAK } from '../../src/plan/parking/cost.js';

const LINE = handChip(
  'line3',
  { Q1: { fMax: '5.6 GHz', park: '5.6 GHz' }, Q2: { fMax: '5.6 GHz' }, Q3: { fMax: '5.6 GHz', park: '5.55 GHz' } },
  [['Q1', 'Q2', '12 MHz'], ['Q2', 'Q3', '12 MHz']],
);

describe('assignParking on a three-qubit line', () => {
  const ctx = buildPlanContext(LINE);
  const r = assignParking(ctx, planOptions());
  const [f1, f2, f3] = r.parkingGHz;

  it('keeps the fixed ends and parks the middle qubit away from both (every idle rule holds)', () => {
    expect(f1).toBe(5.6);
    expect(f3).toBe(5.55);
    expect(r.idle.violations).toEqual([]);
    // Same maximum frequency as its neighbours: the exact ZZ (about 2 g^2 (|a1| + |a2|) / Delta^2)
    // forces it several hundred MHz down.
    expect(f2).toBeLessThan(5.55 - 0.5);
    expect(f2).toBeGreaterThanOrEqual(ctx.domains[1]!.lo);
  });

  it('the exact ZZ of both pairs is within the limit; above the idle-error band near its lower sweet spot the middle qubit would break a rule', () => {
    const limit = LINE.rules.zzLimitGHz;
    for (const z of r.idle.zzGHz) expect(Math.abs(z)).toBeLessThanOrEqual(limit);
    const t2 = ctx.transmons[1];
    // At its upper sweet spot (5.6 GHz, the neighbours' frequency) the exact ZZ (CoupledPair) breaks the limit.
    const zzAt = (f: number) => Math.max(...ctx.edges.map((e) => Math.abs(ctx.pair(e.index).zz(e.a === 1 ? t2.fluxForF01(f) : r.idle.states[e.a]!.flux, e.b === 1 ? t2.fluxForF01(f) : r.idle.states[e.b]!.flux))));
    expect(zzAt(5.5)).toBeGreaterThan(limit);
    // Below the ZZ edge and off its sweet spots its own idle error over 1 us (the Gaussian 1/f
    // decay exp(-(2 pi df01/dPhi sigma t)^2 / 2), Ithier et al. 2005; checked in
    // test/budget/idle-error.test.ts) exceeds idleErrorLimit, so it parks within the band the
    // ceiling leaves near its lower sweet spot (Phi = 1/2).
    const idleAt = (f: number) => {
      const flux = t2.fluxForF01(f);
      const e = qubitIdleError({ coherence: t2.coherenceSpec!, f01GHz: f, slopeGHz: t2.spectrum(flux).df01dFluxGHz, curvatureGHz: t2.fluxCurvatureGHz(flux) }, 1000, { averagingTimeNs: LINE.rules.noiseAveragingTimeNs, temperatureK: LINE.rules.qubitTemperatureK });
      return e.t1 + e.dephasing + e.thermal;
    };
    for (const f of [3.5, 4.0, 4.5, 5.0]) expect(idleAt(f)).toBeGreaterThan(LINE.rules.idleErrorLimit);
    expect(idleAt(f2)).toBeLessThanOrEqual(LINE.rules.idleErrorLimit);
    expect(t2.fluxForF01(f2)).toBeGreaterThan(0.45);
  });

  it('lands on the minimum of its documented cost over its allowed set (1 MHz scan)', () => {
    const st = r.state;
    const blockers = st.blockersOf(1).map((b) => ({ ...b }));
    const allowed = st.allowed(1, blockers);
    let best = Infinity;
    for (const a of allowed) for (let f = a.lo; f <= a.hi; f += 0.001) {
      const c = st.costAt(1, f, blockers);
      best = Math.min(best, c.violation + c.soft);
    }
    const here = st.costAt(1, f2, blockers);
    expect(here.violation).toBe(0);
    // within what the cost changes over one scan step around the answer (the scan's resolution)
    const step = Math.max(...[-0.001, 0.001].map((d) => Math.abs(st.costAt(1, f2 + d, blockers).soft - here.soft)));
    expect(here.soft).toBeLessThanOrEqual(best + step + 1e-9);
  });

  it('ranks a point where its own idle error breaks idleErrorLimit (a budget rule) below every collision rule: no violation, a cost between the soft terms and an unreachable gate', () => {
    const st = r.state;
    const blockers = st.blockersOf(1).map((b) => ({ ...b }));
    const inside = (f: number, rule: string) => blockers.some((b) => b.rule === rule && f > b.lo && f < b.hi);
    // 4.5 GHz: inside the idle-error band (its idle error there is checked against the limit in the
    // test above), clear of ZZ; 5.5 GHz: the exact ZZ breaks the limit (test above)
    expect(inside(4.5, 'idle-error')).toBe(true);
    expect(inside(4.5, 'zz')).toBe(false);
    expect(inside(5.5, 'zz')).toBe(true);
    const budgetBreak = st.costAt(1, 4.5, blockers);
    const collision = st.costAt(1, 5.5, blockers);
    const clean = st.costAt(1, f2, blockers);
    expect(budgetBreak.violation).toBe(0);
    expect(budgetBreak.soft).toBeGreaterThanOrEqual(IDLE_ERROR_BREAK + clean.soft - 0.1);
    expect(budgetBreak.soft).toBeLessThan(planOptions().search.violationPenalty);
    expect(collision.violation).toBeGreaterThanOrEqual(planOptions().search.violationPenalty);
    expect(IDLE_ERROR_BREAK).toBeLessThan(1);
  });

  it('gives the same assignment for the same seed, bit for bit', () => {
    const again = assignParking(buildPlanContext(LINE), planOptions());
    expect(Array.from(again.parkingGHz)).toEqual(Array.from(r.parkingGHz));
  });
});

describe('windows that make planning impossible', () => {
  const chip = handChip(
    'narrow',
    {
      Q1: { fMax: '5.8 GHz', window: ['5.00 GHz', '5.04 GHz'] },
      Q2: { fMax: '5.9 GHz', window: ['5.00 GHz', '5.04 GHz'] },
      Q3: { fMax: '6.5 GHz' },
    },
    [['Q1', 'Q2', '10 MHz'], ['Q2', 'Q3', '10 MHz']],
    // idleErrorLimit relaxed: off their sweet spots these windows also break the idle-error
    // ceiling on their own (next test); here the pairwise conflict is the point
    { zzLimit: '5 MHz', idleErrorLimit: 0.5 },
  );
  const plan = planChip(chip);

  it('reports the broken rule and explains it with the smallest conflicting set: Q1 and Q2, not Q3', () => {
    expect(plan.violations.some((v) => v.rule === '01-01' && v.qubits.includes('Q1') && v.qubits.includes('Q2'))).toBe(true);
    expect(plan.explanations).toHaveLength(1);
    const x = plan.explanations[0];
    expect(x.qubits).toEqual(['Q1', 'Q2']);
    expect(x.rules).toContain('01-01');
    expect(x.message).toMatch(/Q[12]: window 5\.000-5\.040 GHz is fully blocked by Q[12] 01-01/);
    expect(x.message).toMatch(/detuning0101 \(50\.0 MHz\)/);
  });

  it('a window where the idle error exceeds its ceiling everywhere is a violation that says why (rule idle-error)', () => {
    const strict = planChip(handChip('noisy', { Q1: { fMax: '5.8 GHz', window: ['5.00 GHz', '5.04 GHz'], fluxNoise: '6 uPhi0' } }, []));
    const v = strict.violations.find((x) => x.rule === 'idle-error');
    expect(v?.qubits).toEqual(['Q1']);
    expect(v?.message).toMatch(/Q1 parked at 5\.0\d\d GHz .* loses 0\.\d+ idling .* > 0\.020; largest dephasing .* \(off its sweet spot: df01\/dPhi = -\d\.\d\d GHz\/Phi0\)/);
  });

  it('a window outside the tunable range is explained as such', () => {
    const off = planChip(handChip('off', { Q1: { fMax: '5.0 GHz', window: ['5.5 GHz', '5.9 GHz'] } }, []));
    expect(off.violations.map((v) => v.rule)).toContain('window');
    expect(off.explanations[0].message).toMatch(/Q1: window 5\.500-5\.900 GHz lies outside its planning range/);
  });
});

describe('parking respects the layout', () => {
  it('every qubit parks inside its window and range; fixed values are kept exactly', () => {
    const chip = handChip(
      'windows',
      {
        A: { fMax: '6.3 GHz', window: ['5.9 GHz', '6.1 GHz'] },
        B: { fMax: '5.4 GHz', park: '5.2 GHz' },
        C: { fMax: '6.0 GHz', window: ['5.5 GHz', '6.0 GHz'], tls: [{ at: '5.95 GHz', width: '3 MHz' }] },
      },
      [['A', 'B', '12 MHz'], ['B', 'C', '12 MHz']],
    );
    const ctx = buildPlanContext(chip);
    const r = assignParking(ctx, planOptions());
    expect(r.idle.violations).toEqual([]);
    expect(r.parkingGHz[0]).toBeGreaterThanOrEqual(5.9);
    expect(r.parkingGHz[0]).toBeLessThanOrEqual(6.1);
    expect(r.parkingGHz[1]).toBe(5.2);
    expect(Math.abs(r.parkingGHz[2] - 5.95)).toBeGreaterThanOrEqual(0.003 + chip.rules.tlsClearanceGHz);
  });
});
