/**
 * The fixed-mode fast path (src/yield/fixed-evaluate.ts: reduced-spectrum tables, calibrated ZZ
 * estimate with the exact ZZ near the limit, layer-conflict candidates) against the exact
 * evaluation `fluxlane verify` makes (verifyPlan, src/plan/verify.ts: exact transmon states,
 * exact crossings, exact dressed ZZ of every pair, QubitTables) of the same drawn chip written
 * as a layout, with the plan's interaction frequencies left to be found again and its gates
 * dropped (planForDrawnChip). Every finding must agree: rule, qubits, edge, and value (to 1e-6;
 * an idle-error value to 1e-3 relative: its ZZ part comes from the calibrated ZZ estimate, exact
 * only where it could decide the verdict, src/yield/fixed-evaluate.ts IDLE_EXACT_BAND).
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { parseLayoutText } from '../../src/layout/load.js';
import type { ChipLayout } from '../../src/layout/types.js';
import type { Finding } from '../../src/plan/rules/findings.js';
import { verifyPlan } from '../../src/plan/verify.js';
import { sharedReducedSpectrum } from '../../src/transmon/reduced-spectrum.js';
import { nominalChip } from '../../src/yield/chip-model.js';
import { drawChip } from '../../src/yield/draw.js';
import { candidatesConflict, evaluateFixed, fixedPlan } from '../../src/yield/fixed-evaluate.js';
import { planChip } from '../../src/plan/plan.js';
import { gatesConflict, movedQubits } from '../../src/plan/layers.js';
import type { EdgePlan } from '../../src/plan/interaction/plan-edge.js';
import { outcomeOf } from '../../src/yield/outcome.js';
import { nominalPlan, planForDrawnChip } from '../../src/yield/nominal-plan.js';
import { sampledContext, sampledLayout } from '../../src/yield/sampled-context.js';
import { crossingCouplingsForTest } from '../../src/plan/rules/cz-evaluate.js';
import type { FabricationSpread } from '../../src/yield/spread.js';
import type { SampledSpectrum } from '../../src/yield/sampled-spectrum.js';

const key = (f: Finding) => `${f.rule}|${f.qubits.join(',')}|${f.edge ?? ''}`;

function compare(layout: ChipLayout, spread: FabricationSpread, seed: number, samples: number, zzExactAbove?: number) {
  const nominal = nominalPlan(layout, 1);
  const chip = nominalChip(layout, spread);
  const plan = fixedPlan(chip, planForDrawnChip(nominal.plan));
  const table = sharedReducedSpectrum();
  const rules = new Map<string, number>();
  let failing = 0;
  let exactZz = 0;
  const reuse: (SampledSpectrum | undefined)[] = []; // spectrum objects reused from sample to sample, as a run does
  for (let i = 0; i < samples; i++) {
    const drawn = drawChip(chip, seed, i);
    const fast = evaluateFixed(chip, plan, drawn, table, zzExactAbove === undefined ? {} : { zzExactAbove }, reuse);
    const exact = verifyPlan(sampledLayout(chip, drawn), planForDrawnChip(nominal.plan), { dir: '.' }).violations;
    exactZz += fast.exactZzEdges;
    const a = [...fast.violations].sort((x, y) => (key(x) < key(y) ? -1 : key(x) > key(y) ? 1 : (x.value ?? 0) - (y.value ?? 0)));
    const b = [...exact].sort((x, y) => (key(x) < key(y) ? -1 : key(x) > key(y) ? 1 : (x.value ?? 0) - (y.value ?? 0)));
    expect(a.map(key), `sample ${i}`).toEqual(b.map(key));
    a.forEach((f, k) => {
      const v = b[k].value;
      if (f.value === null || v === null) expect(f.value, `sample ${i} ${key(f)}`).toBe(v);
      else if (f.rule === 'idle-error') expect(Math.abs(f.value - v), `sample ${i} ${key(f)}: ${f.value} vs ${v}`).toBeLessThanOrEqual(1e-3 * Math.abs(v));
      else expect(Math.abs(f.value - v), `sample ${i} ${key(f)}: ${f.value} vs ${v}`).toBeLessThanOrEqual(1e-6 * Math.max(1, Math.abs(v)));
    });
    if (fast.violations.length > 0) failing++;
    for (const f of fast.violations) rules.set(f.rule, (rules.get(f.rule) ?? 0) + 1);
  }
  return { failing, rules, exactZz };
}

describe('evaluateFixed (the fast path) agrees with verifyPlan on drawn chips', () => {
  it('Clove-17 (windows, a fixed park, defects, readout, 22 spectator moves) at 2 % / 1 % / 3 %, 12 chips', () => {
    const layout = loadLayoutFile('layouts/clove-17.yaml', 'clove-17.yaml');
    const r = compare(layout, { rn: 0.02, ec: 0.01, g: 0.03 }, 5, 12);
    // the comparison saw failing chips with several kinds of broken rules
    expect(r.failing).toBeGreaterThan(0);
    expect(r.rules.size).toBeGreaterThanOrEqual(3);
  });

  it('a generated 3 x 3 chip at large spreads (6 % / 5 % / 10 %): idle, CZ, swept and layer rules, 20 chips', () => {
    const layout = parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 3, cols: 3, seed: 2 })), 'g.yaml');
    const r = compare(layout, { rn: 0.06, ec: 0.05, g: 0.1 }, 9, 20);
    expect(r.failing).toBeGreaterThan(5);
    expect([...r.rules.keys()]).toEqual(expect.arrayContaining(['window', 'cz-swept-11-20']));
  });

  it('with the exact ZZ for every edge (zzExactAbove 0) the findings are the same', () => {
    const layout = loadLayoutFile('layouts/bowline-5.yaml', 'bowline-5.yaml');
    const r = compare(layout, { rn: 0.03, ec: 0.02, g: 0.05 }, 3, 8, 0);
    expect(r.exactZz).toBeGreaterThan(0);
  });
});

describe('evaluateFixed without messages (the yield run\'s hot path)', () => {
  it('gives the same findings; messageOf writes each CZ, cz-range and budget finding\'s message exactly as the evaluation with messages, and the outcome is the same', () => {
    const layout = parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 3, cols: 3, seed: 2 })), 'g.yaml');
    const spread = { rn: 0.06, ec: 0.05, g: 0.1 };
    const chip = nominalChip(layout, spread);
    const plan = fixedPlan(chip, planForDrawnChip(nominalPlan(layout, 1).plan));
    const table = sharedReducedSpectrum();
    const reuse: (SampledSpectrum | undefined)[] = [];
    let rewritten = 0;
    const rewrittenRules = new Set<string>();
    for (let i = 0; i < 20; i++) {
      const drawn = drawChip(chip, 9, i);
      const off = evaluateFixed(chip, plan, drawn, table, { messages: false }, reuse);
      const filled = off.violations.map((f) => {
        if (f.message === '') {
          rewritten++;
          rewrittenRules.add(f.rule);
        }
        return { ...f, message: off.messageOf(f) };
      });
      const outcomeOff = outcomeOf(chip.ctx, i, off.violations, null, null, off.messageOf);
      const on = evaluateFixed(chip, plan, drawn, table, {}, reuse);
      expect(filled, `sample ${i}`).toEqual(on.violations);
      expect(outcomeOff, `sample ${i}`).toEqual(outcomeOf(chip.ctx, i, on.violations, null));
    }
    expect(rewritten).toBeGreaterThan(10);
    // so are the cz-range findings' and the budget's (src/plan/plan-budget.ts budgetFindings)
    expect(rewrittenRules.has('cz-range'), [...rewrittenRules].join(', ')).toBe(true);
    expect([...rewrittenRules].filter((r) => r === 'gate-error' || r === 'idle-error').length, [...rewrittenRules].join(', ')).toBeGreaterThan(0);
  });
});

describe('the sweep\'s crossing memo shared by drawn chips of one structure', () => {
  it('answers each drawn chip with its own couplings when chips take turns (never another chip\'s answer)', () => {
    const layout = parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 3, cols: 3, seed: 2 })), 'g.yaml');
    const chip = nominalChip(layout, { rn: 0.06, ec: 0.05, g: 0.1 });
    const table = sharedReducedSpectrum();
    // two drawn chips with spectra of their own (no reuse), sharing the nominal neighbour lists
    const a = sampledContext(chip, drawChip(chip, 4, 0), table);
    const b = sampledContext(chip, drawChip(chip, 4, 1), table);
    expect(a.neighbours).toBe(b.neighbours);
    let differ = 0;
    for (let Q = 0; Q < a.n; Q++) {
      for (let k = 0; k < a.neighbours[Q].length; k++) {
        const X = a.neighbours[Q][k];
        // the same key (f01, f12) for both chips: only the memo's owner tells their answers apart
        const f = 0.5 * (a.tables[X].fLowGHz + a.tables[X].fMaxGHz);
        const f12 = a.tables[X].at(f).f12;
        for (const ctx of [a, b, a, a, b]) {
          const { remembered, computed } = crossingCouplingsForTest(ctx, Q, k, f, f12);
          expect(remembered).toEqual(computed);
        }
        if (crossingCouplingsForTest(a, Q, k, f, f12).computed.g0101 !== crossingCouplingsForTest(b, Q, k, f, f12).computed.g0101) differ++;
      }
    }
    // the chips' couplings differ (a memo answering with the other chip's would fail above)
    expect(differ).toBeGreaterThan(10);
  });
});

describe('candidatesConflict (the yield run\'s layer-conflict test without sets)', () => {
  it('answers as gatesConflict (src/plan/layers.ts, the reference) for every pair of planned gates, with spectators shared at the same or another point, and unreachable gates', () => {
    // the reference is the planner's own conflict test (rules a-c of src/plan/layers.ts); the
    // gates are the planner's gates of a generated 4 x 4 chip, plus variants of each pair
    const layout = parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 4, cols: 4, seed: 3 })), 'g.yaml');
    const plan = planChip(layout);
    const ctx = plan.ctx;
    const parking = plan.states.map((s) => s.f01GHz);
    const f12 = plan.states.map((s) => s.f12GHz);
    const stub = (e: EdgePlan): EdgePlan => ({ ...e, interactionGHz: NaN, parked: [] });
    let cases = 0;
    let conflicts = 0;
    let sharedCases = 0;
    const check = (g1: EdgePlan, g2: EdgePlan) => {
      const m1 = movedQubits(ctx, g1, f12, parking);
      const m2 = movedQubits(ctx, g2, f12, parking);
      const want = gatesConflict(ctx, g1, m1, g2, m2);
      expect(candidatesConflict(ctx, g1, m1, g2, m2), `${g1.edge} ${g2.edge}`).toBe(want);
      cases++;
      if (want) conflicts++;
    };
    const edges = plan.edges;
    expect(edges.some((e) => e.parked.length > 0)).toBe(true);
    for (let i = 0; i < edges.length; i++) {
      for (let j = 0; j < edges.length; j++) {
        if (i === j) continue;
        const g1 = edges[i];
        const g2 = edges[j];
        check(g1, g2);
        check(stub(g1), g2);
        if (g1.parked.length > 0) {
          // g2 parks g1's spectators at the very same points (shared: no conflict by them) or 1 MHz off
          check(g1, { ...g2, parked: [...g2.parked, ...g1.parked] });
          check(g1, { ...g2, parked: [...g2.parked, ...g1.parked.map((p) => ({ ...p, fGHz: p.fGHz + 1e-3 }))] });
          sharedCases++;
        }
      }
    }
    // both answers occur, and the shared-spectator variants were exercised
    expect(conflicts).toBeGreaterThan(50);
    expect(cases - conflicts).toBeGreaterThan(50);
    expect(sharedCases).toBeGreaterThan(10);
  });
});
