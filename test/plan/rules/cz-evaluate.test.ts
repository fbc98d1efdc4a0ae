/**
 * evaluateGate's look-up of where each qubit stands during a gate (src/plan/rules/cz-evaluate.ts
 * `during`: a parked spectator at its temporary point, every other qubit at parking), kept in an
 * array that each evaluation fills from its scenario's `parked` and empties again, also when the
 * evaluation throws. Checked against distances worked out by hand from the scenario's numbers
 * (the cz-parked-01-01 rule: |f_P - f_X| below detuning0101, README physics conventions sec. 5)
 * and against the same scenarios evaluated before any other.
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../../src/layout/load.js';
import { planChip } from '../../../src/plan/plan.js';
import { scenarioOf } from '../../../src/plan/plan-budget.js';
import { crossing1120Outside, evaluateGate, type GateScenario } from '../../../src/plan/rules/cz-evaluate.js';
import { sharedReducedSpectrum } from '../../../src/transmon/reduced-spectrum.js';
import { SampledSpectrum } from '../../../src/yield/sampled-spectrum.js';
import { Random } from '../../../src/util/random.js';
import type { SpectrumTable } from '../../../src/plan/qubit-table.js';
import { estimateEdgeBudget } from '../../../src/plan/interaction/plan-edge.js';
import { sweptCrossingError } from '../../../src/plan/gate-budget.js';
import { nominalChip } from '../../../src/yield/chip-model.js';
import { chipFromDeviates, sampleDeviates } from '../../../src/yield/draw.js';
import { evaluateFixed, fixedPlan } from '../../../src/yield/fixed-evaluate.js';
import { nominalPlan, planForDrawnChip } from '../../../src/yield/nominal-plan.js';

const clove = planChip(loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'));
const { ctx } = clove;
const gates = clove.edges.filter((e) => Number.isFinite(e.interactionGHz)).map((e) => scenarioOf(clove, e));

describe('evaluateGate: where parked spectators stand', () => {
  it('a neighbour of the mover parked on the interaction frequency is 0 Hz from it (cz-spectator-01-01, admixture (g/0)^2 = Infinity), and later evaluations see no spectator left behind', () => {
    const before = gates.map((s) => evaluateGate(ctx, s, { messages: false }));
    let checks = 0;
    let first: { s: GateScenario; S: number } | undefined;
    for (const base of gates) {
      for (const S of ctx.neighbours[base.mover]) {
        if (S === base.partner || base.parked.has(S)) continue;
        const f = base.toGHz;
        if (!(f >= ctx.tables[S].fLowGHz && f <= ctx.tables[S].fMaxGHz)) continue;
        const parked = new Map(base.parked);
        parked.set(S, { f01GHz: f, f12GHz: ctx.tables[S].at(f).f12 });
        const ev = evaluateGate(ctx, { ...base, parked }, { messages: false });
        // by hand: the mover's f01 at the interaction point minus S's f01 there is 0
        const hit = ev.findings.find((x) => x.rule === 'cz-spectator-01-01' && x.qubits[0] === ctx.ids[base.mover] && x.qubits[1] === ctx.ids[S]);
        expect(hit?.value, `${ctx.ids[S]} at the interaction point of ${ctx.ids[base.mover]}`).toBe(Infinity);
        first ??= { s: base, S };
        checks++;
      }
    }
    expect(checks).toBeGreaterThan(5);
    // the same spectator there in an evaluation that throws part-way (no parking states given)
    const { s: s0, S } = first!;
    const broken: GateScenario = { ...s0, parked: new Map([...s0.parked, [S, { f01GHz: s0.toGHz, f12GHz: ctx.tables[S].at(s0.toGHz).f12 }]]), parking: [] };
    expect(() => evaluateGate(ctx, broken, { messages: false })).toThrow();
    // every scenario again (s0 among them, without that spectator): the results from before
    const after = gates.map((s) => evaluateGate(ctx, s, { messages: false }));
    expect(after).toEqual(before);
  });
});

/**
 * The 11-20 screen of a sweep (crossing1120Outside): a neighbour at f01 = x screened out must have
 * no 11-20 crossing with the sweeping qubit strictly inside the swept band, where the crossing is
 * what the sweep otherwise looks up (the table's f01ForF12(x), the qubit's f01 where its f12 = x).
 * The screen rests on f12 rising with f01 along a transmon's branch (its level spacings grow
 * with E_J; Koch et al., Phys. Rev. A 76, 042319 (2007), from memory), checked here against
 * the look-up itself on the planner's tables of Clove-17 (QubitTable) and on drawn transmons'
 * reduced-table spectra (SampledSpectrum), with band ends inside and beyond the planning range
 * and neighbours within a few margins of the band's f12 ends.
 */
describe('crossing1120Outside: the 11-20 screen of a sweep', () => {
  const drawn: SpectrumTable[] = [];
  const rng = new Random(11);
  for (let k = 0; k < 12; k++) drawn.push(new SampledSpectrum(sharedReducedSpectrum(), 0.17 + 0.08 * rng.uniform(), 12 + 25 * rng.uniform(), 0.05 + 0.6 * rng.uniform(), 2e-6));
  const cases: [string, SpectrumTable[]][] = [['Clove-17 planner tables', ctx.tables], ['drawn transmons', drawn]];
  for (const [label, tables] of cases) {
    it(`${label}: every neighbour screened out has no 11-20 crossing inside the band (the look-up agrees)`, () => {
      const r = new Random(5);
      let screened = 0;
      let kept = 0;
      for (const t of tables) {
        const span = t.fMaxGHz - t.fLowGHz;
        for (let b = 0; b < 30; b++) {
          const from = t.fLowGHz - 0.1 * span + 1.2 * span * r.uniform();
          const to = t.fLowGHz - 0.1 * span + 1.2 * span * r.uniform();
          const lo = Math.min(from, to);
          const hi = Math.max(from, to);
          // the ends' f12 as the sweep takes them (the table's, clamped to the planning range as it clamps)
          const f12a = t.at(from).f12;
          const f12b = t.at(to).f12;
          const ends = [Math.min(f12a, f12b), Math.max(f12a, f12b)];
          const xs = [...Array.from({ length: 20 }, () => ends[0] - 0.3 + (ends[1] - ends[0] + 0.6) * r.uniform())];
          for (const e of ends) for (const d of [-3e-4, -1.5e-4, -1.01e-4, -0.99e-4, -1e-6, 0, 1e-6, 0.99e-4, 1.01e-4, 1.5e-4, 3e-4]) xs.push(e + d);
          for (const x of xs) {
            if (!crossing1120Outside(x, ends[0], ends[1])) {
              kept++;
              continue;
            }
            screened++;
            const f = t.f01ForF12(x);
            expect(f === null || !(f > lo + 1e-9 && f < hi - 1e-9), `x ${x} band ${lo}-${hi}: crossing at ${f}`).toBe(true);
          }
        }
      }
      expect(screened).toBeGreaterThan(1000);
      expect(kept).toBeGreaterThan(100);
      // unknown ends (NaN) or an unknown neighbour: never screened
      expect(crossing1120Outside(5, NaN, 6)).toBe(false);
      expect(crossing1120Outside(NaN, 4, 5)).toBe(false);
    });
  }
});

/**
 * GateEvaluation.spectatorError: the spectator term of a gate's error estimate summed by the rule
 * evaluation from the table states its admixture checks look up, against estimateEdgeBudget
 * computing it anew (the same double), on every planned gate of Clove-17, the same gates with a
 * further neighbour parked, and on a drawn chip's gates (yield fixed mode).
 */
describe('evaluateGate spectatorError: the estimate\'s spectator term', () => {
  it('equals estimateEdgeBudget\'s on Clove-17\'s and Hitch-30\'s gates (11-20 and 11-02) and with spectators moved', () => {
    let compared = 0;
    const crossings = new Set<string>();
    const hitch = planChip(loadLayoutFile('layouts/hitch-30.yaml', 'layouts/hitch-30.yaml'));
    for (const p of [clove, hitch]) {
      const c = p.ctx;
      for (const e of p.edges.filter((x) => Number.isFinite(x.interactionGHz))) {
        const s = scenarioOf(p, e);
        const variants: GateScenario[] = [s];
        for (const S of c.neighbours[s.mover]) {
          if (S === s.partner || s.parked.has(S)) continue;
          const f = 0.5 * (c.tables[S].fLowGHz + c.tables[S].fMaxGHz);
          variants.push({ ...s, parked: new Map([...s.parked, [S, { f01GHz: f, f12GHz: c.tables[S].at(f).f12 }]]) });
        }
        for (const v of variants) {
          const ev = evaluateGate(c, v, { messages: false, spectatorError: true });
          const flux = c.transmons[v.mover].fluxForF01(v.toGHz);
          expect(ev.spectatorError).toBe(estimateEdgeBudget({ ctx: c, states: p.states }, v, flux, ev.durationNs).spectators);
          crossings.add(v.crossing);
          compared++;
        }
        // without the option: no term
        expect(evaluateGate(c, s, { messages: false }).spectatorError).toBeUndefined();
      }
    }
    expect(compared).toBeGreaterThan(100);
    expect(crossings.size).toBe(2);
  }, 60_000);

  it('equals estimateEdgeBudget\'s on the gates of drawn chips (the yield\'s fixed-mode budget takes it from the evaluation)', () => {
    const layout = loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml');
    const chip = nominalChip(layout, { rn: 0.02, ec: 0.01, g: 0.03 });
    const plan = fixedPlan(chip, planForDrawnChip(nominalPlan(layout, 1).plan));
    let compared = 0;
    for (let i = 0; i < 6; i++) {
      const drawn = chipFromDeviates(chip, i, sampleDeviates(2, i, chip.n, chip.ctx.edges.length));
      evaluateFixed(chip, plan, drawn, sharedReducedSpectrum(), {
        messages: false,
        onGate: (g) => {
          expect(g.evaluation.spectatorError).toBe(estimateEdgeBudget({ ctx: g.ctx, states: g.states }, g.scenario, g.moverFlux, g.evaluation.durationNs).spectators);
          compared++;
        },
      });
    }
    expect(compared).toBeGreaterThan(40);
  });
});

/**
 * GateEvaluation.sweptError: the budget's swept-crossing term summed by the rule evaluation as it
 * finds each crossing, against sweptCrossingError over the crossings the same evaluation lists
 * without the option (the same double), with the same findings, on Clove-17's and Hitch-30's
 * gates with further spectators parked on the way, and on drawn chips' gates.
 */
describe('evaluateGate sweptError: the budget\'s swept-crossing term', () => {
  it('equals sweptCrossingError of the listed crossings, with the same findings (planned gates, extra spectators, drawn chips)', () => {
    let compared = 0;
    let nonzero = 0;
    const check = (c: typeof ctx, v: GateScenario) => {
      const listed = evaluateGate(c, v, { messages: false });
      const summed = evaluateGate(c, v, { messages: false, sweptError: true });
      expect(summed.swept).toEqual([]);
      expect(summed.findings).toEqual(listed.findings);
      expect(summed.sweptError).toBe(sweptCrossingError(c, { mover: v.mover, partner: v.partner, swept: listed.swept }));
      expect(listed.sweptError).toBeUndefined();
      compared++;
      if (summed.sweptError! > 0) nonzero++;
    };
    const hitch = planChip(loadLayoutFile('layouts/hitch-30.yaml', 'layouts/hitch-30.yaml'));
    for (const p of [clove, hitch]) {
      const c = p.ctx;
      for (const e of p.edges.filter((x) => Number.isFinite(x.interactionGHz))) {
        const s = scenarioOf(p, e);
        check(c, s);
        for (const S of c.neighbours[s.partner]) {
          if (S === s.mover || s.parked.has(S)) continue;
          const f = 0.3 * c.tables[S].fLowGHz + 0.7 * c.tables[S].fMaxGHz;
          check(c, { ...s, parked: new Map([...s.parked, [S, { f01GHz: f, f12GHz: c.tables[S].at(f).f12 }]]) });
        }
      }
    }
    const layout = loadLayoutFile('layouts/hitch-30.yaml', 'layouts/hitch-30.yaml');
    const chip = nominalChip(layout, { rn: 0.03, ec: 0.01, g: 0.03 });
    const plan = fixedPlan(chip, planForDrawnChip(nominalPlan(layout, 1).plan));
    for (let i = 0; i < 4; i++) {
      const drawn = chipFromDeviates(chip, i, sampleDeviates(4, i, chip.n, chip.ctx.edges.length));
      evaluateFixed(chip, plan, drawn, sharedReducedSpectrum(), { messages: false, onGate: (g) => check(g.ctx, g.scenario) });
    }
    expect(compared).toBeGreaterThan(150);
    expect(nonzero).toBeGreaterThan(50);
  }, 120_000);
});
