/**
 * The planner's speed-ups of issue 13 remember or skip work; each must give exactly what the
 * work it replaces gives. The reference here is that work done again from scratch (the recomputed
 * result), compared for exact equality:
 * - the exact-result memos (src/plan/exact-memo.ts) against the transmon's own calls;
 * - the sweep's remembered crossing couplings (src/plan/rules/cz-evaluate.ts CrossingMemo)
 *   against computing them again, also after their slots were overwritten;
 * - a rule evaluation without messages against the full one with its messages blanked, on gate
 *   scenarios that break rules (spectators put on the mover's interaction point);
 * - the admixture checks beyond the limit against filtering all of them;
 * - the layer fitting's conflict cache against conflictKinds without it, on the planned edges and
 *   on a list where some plans were replaced;
 * - the shared parking list of the rule evaluations against building it anew;
 * - a spectator's screening with the parts of the evaluation that do not read its point
 *   replayed (SpectatorScreen) against evaluating each point from scratch;
 * - the lazy screening of spectator points by their score's floor against screening every point
 *   (spectator parking with and without the floor), and the floor against the score itself;
 * - the remembered last gate estimate (estimateEdgeBudget) and pair move error
 *   (spectatorMovePairError) against the answers computed after another question;
 * - the parking state's remembered blocked intervals (and IdleBlockers' remembered parts of them)
 *   against IdleBlockers.of of a fresh instance, and its
 *   remembered allowed sets against the domain minus those intervals, through moves, changes of
 *   the active set and of the ZZ calibration;
 * - the plan budget with remembered gate estimates against computing them anew;
 * - the remembered ZZ blocked sets (IdleBlockers.zzIntervals, the last per edge and direction)
 *   against a fresh IdleBlockers, through trial moves, their undos and calibration changes;
 * - the parking cost's per-visit slots (src/plan/parking/cost.ts) against the cost computed
 *   outside a visit, through moves and changes of the active set.
 * The physics of each routine is tested against its outside references in its own test file
 * (rules.test.ts, layers.test.ts, qubit-table.test.ts).
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { planChip } from '../../src/plan/plan.js';
import { fluxCurvatureMemo, fluxForF01Memo, fluxSlopeMemo, spectrumMemo } from '../../src/plan/exact-memo.js';
import { crossingCouplingsForTest, evaluateGate, nextNearestCouplingForTest, SpectatorScreen, type GateScenario } from '../../src/plan/rules/cz-evaluate.js';
import { admixtureChecks, admixtureChecksBeyond } from '../../src/plan/rules/spectator-admixture.js';
import { ConflictCache, conflictKinds } from '../../src/plan/layers.js';
import { bestSpectatorPointForTest, edgePlanOf, estimateEdgeBudget, optionReportOf, exchangeAtInteraction, optionScore, parkingOf, parkSpectators, withoutSpectators, withSpectatorPoints, withSpectatorPointsDraft, type ParkedSpectator } from '../../src/plan/interaction/plan-edge.js';
import { exactQubitState } from '../../src/plan/exact-state.js';
import { planBudget, scenarioOf, type EstimateMemo } from '../../src/plan/plan-budget.js';
import { idleTotalForTest, spectatorMovePairError } from '../../src/plan/gate-budget.js';
import { ParkingState } from '../../src/plan/parking/state.js';
import { IdleBlockers } from '../../src/plan/rules/idle-blockers.js';
import { subtract } from '../../src/plan/intervals.js';
import { Random } from '../../src/util/random.js';
import { fluxForJosephsonEnergy } from '../../src/transmon/josephson.js';

const clove = planChip(loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'));
const { ctx } = clove;

describe('exact-result memos', () => {
  it('give the transmon calls\' own results, for repeated and new arguments (0 and -0 one key)', () => {
    const rng = new Random(3);
    for (let k = 0; k < 40; k++) {
      const q = rng.int(ctx.n);
      const t = ctx.transmons[q];
      const flux = 0.45 * rng.uniform();
      const f = t.fMinGHz + (t.fMaxGHz - t.fMinGHz) * rng.uniform();
      for (let again = 0; again < 2; again++) {
        expect(spectrumMemo(ctx, q, flux)).toEqual(t.spectrum(flux));
        expect(fluxForF01Memo(ctx, q, f)).toBe(t.fluxForF01OrNull(f));
        expect(fluxCurvatureMemo(ctx, q, flux)).toBe(t.fluxCurvatureGHz(flux));
        expect(fluxSlopeMemo(ctx, q, flux)).toBe(t.spectrum(flux).df01dFluxGHz);
      }
    }
    expect(spectrumMemo(ctx, 0, -0)).toEqual(ctx.transmons[0].spectrum(0));
    expect(fluxForF01Memo(ctx, 1, 1e9)).toBeNull();
  });
});

describe('the table\'s remembered flux', () => {
  it('fluxAt gives the flux of a fresh lookup, for alternating and repeated points', () => {
    const rng = new Random(11);
    for (let q = 0; q < ctx.n; q++) {
      const t = ctx.tables[q];
      const fixed = t.fLowGHz + 0.7 * (t.fMaxGHz - t.fLowGHz);
      for (let k = 0; k < 6; k++) {
        const f = t.fLowGHz + (t.fMaxGHz - t.fLowGHz) * rng.uniform();
        for (const x of [f, fixed, f, fixed]) {
          const s = t.at(x).ejRatio;
          const d = ctx.transmons[q].asymmetry;
          // the flux of E_J / E_J,max = s on the asymmetric-SQUID law (the table's own conversion, done here anew)
          expect(t.fluxAt(x)).toBe(fluxForJosephsonEnergy(1, d, Math.min(1, Math.max(d, s))));
        }
      }
    }
  });
});

describe('the sweep\'s remembered crossing couplings', () => {
  it('equal the couplings computed anew, also after more positions than a slot keeps', () => {
    const rng = new Random(5);
    for (let Q = 0; Q < ctx.n; Q++) {
      for (let k = 0; k < ctx.neighbours[Q].length; k++) {
        const X = ctx.neighbours[Q][k];
        const t = ctx.tables[X];
        // eleven positions (a slot keeps eight), each asked twice, then the first ones again
        const points = Array.from({ length: 11 }, () => t.fLowGHz + (t.fMaxGHz - t.fLowGHz) * rng.uniform());
        for (const f of [...points, ...points, points[0], points[1]]) {
          const f12 = t.at(f).f12;
          const { remembered, computed } = crossingCouplingsForTest(ctx, Q, k, f, f12);
          expect(remembered).toEqual(computed);
        }
      }
    }
  });

  it('next-nearest: the remembered mediated coupling equals the one computed anew, through more mediator positions than a slot keeps', () => {
    const rng = new Random(9);
    let compared = 0;
    for (let Q = 0; Q < ctx.n; Q++) {
      for (let j = 0; j < ctx.nextNearestOf[Q].length; j++) {
        const pair = ctx.nextNearest[ctx.nextNearestOf[Q][j]];
        const K = pair.a === Q ? pair.b : pair.a;
        const tk = ctx.tables[K];
        const fk = tk.fLowGHz + (tk.fMaxGHz - tk.fLowGHz) * rng.uniform();
        // eleven mediator positions (a slot keeps eight), each asked twice, then the first ones again
        const positions = Array.from({ length: 11 }, () => new Map(pair.via.map((S) => [S, ctx.tables[S].fLowGHz + (ctx.tables[S].fMaxGHz - ctx.tables[S].fLowGHz) * rng.uniform()])));
        for (const at of [...positions, ...positions, positions[0], positions[1]]) {
          const { remembered, computed } = nextNearestCouplingForTest(ctx, Q, j, fk, at);
          expect(remembered).toBe(computed);
          compared++;
        }
      }
    }
    expect(compared).toBeGreaterThan(100);
  });

  it('give the same couplings whichever is asked for first (each is found on first use)', () => {
    const rng = new Random(8);
    const orders = [['g1102', 'g0101', 'g1120'], ['g1120', 'g1102', 'g0101'], ['g1102'], ['g1120']] as const;
    let compared = 0;
    for (let Q = 0; Q < ctx.n; Q++) {
      for (let k = 0; k < ctx.neighbours[Q].length; k++) {
        const t = ctx.tables[ctx.neighbours[Q][k]];
        for (const order of orders) {
          // a position no slot holds yet: its first reads are in `order`
          const f = t.fLowGHz + (t.fMaxGHz - t.fLowGHz) * rng.uniform();
          const { remembered, computed } = crossingCouplingsForTest(ctx, Q, k, f, t.at(f).f12, order);
          for (const g of order) expect(remembered[g]).toBe(computed[g]);
          expect(remembered.f1120).toBe(computed.f1120);
          compared++;
        }
      }
    }
    expect(compared).toBeGreaterThan(100);
  });
});

/** Gate scenarios of the planned edges, and the same with a neighbour of the mover moved onto the interaction point (rules break). */
function scenarios(): GateScenario[] {
  const out: GateScenario[] = [];
  for (const e of clove.edges) {
    if (!Number.isFinite(e.interactionGHz)) continue;
    const base = scenarioOf(clove, e);
    out.push(base);
    for (const S of ctx.neighbours[e.mover]) {
      if (S === e.partner) continue;
      for (const dx of [0.003, -0.04]) {
        const f = Math.min(ctx.tables[S].fMaxGHz, Math.max(ctx.tables[S].fLowGHz, e.interactionGHz + dx));
        const parked = new Map(base.parked);
        parked.set(S, { f01GHz: f, f12GHz: ctx.tables[S].at(f).f12 });
        out.push({ ...base, parked });
      }
    }
  }
  return out;
}

describe('rule evaluation without messages', () => {
  it('gives the same findings (messages aside), swept crossings and duration as the full evaluation', () => {
    let findings = 0;
    for (const s of scenarios()) {
      const full = evaluateGate(ctx, s);
      const quiet = evaluateGate(ctx, s, { messages: false });
      findings += full.findings.length;
      expect(full.findings.every((f) => f.message.length > 0)).toBe(true);
      expect(quiet.findings.every((f) => f.message === '')).toBe(true);
      expect(quiet.findings).toEqual(full.findings.map((f) => ({ ...f, message: '' })));
      expect(quiet.swept).toEqual(full.swept);
      expect(quiet.durationNs).toBe(full.durationNs);
      // the keys of each finding in the order a spread copy gave them (the JSON output's order)
      for (const f of full.findings) expect(Object.keys(f).at(-1)).toBe('edge');
    }
    expect(findings).toBeGreaterThan(50);
  });

  it('does not depend on the order the parked spectators were put in the map (they are taken in qubit order)', () => {
    let reordered = 0;
    for (const s of scenarios()) {
      if (s.parked.size < 2) continue;
      const backwards = new Map([...s.parked].sort((x, y) => y[0] - x[0]));
      const ascending = new Map([...s.parked].sort((x, y) => x[0] - y[0]));
      const want = evaluateGate(ctx, { ...s, parked: ascending });
      expect(evaluateGate(ctx, { ...s, parked: backwards })).toEqual(want);
      expect(evaluateGate(ctx, s)).toEqual(want);
      reordered++;
    }
    expect(reordered).toBeGreaterThan(10);
  });

  it('evaluating the same scenarios again (remembered couplings) gives the same results', () => {
    const list = scenarios();
    const first = list.map((s) => evaluateGate(ctx, s));
    const again = list.map((s) => evaluateGate(ctx, s));
    expect(again).toEqual(first);
  });
});

describe('a spectator\'s screening with the unchanged parts replayed', () => {
  it('gives, point after point, the findings, swept crossings and duration of evaluating each point from scratch', () => {
    let compared = 0;
    let findings = 0;
    let swept = 0;
    for (const base of scenarios()) {
      // every neighbour of the mover and partner and every next-nearest neighbour of the mover can be the screened one
      const candidates = new Set<number>([...ctx.neighbours[base.mover], ...ctx.neighbours[base.partner]]);
      for (const p of ctx.nextNearestOf[base.mover]) candidates.add(ctx.nextNearest[p].a === base.mover ? ctx.nextNearest[p].b : ctx.nextNearest[p].a);
      candidates.delete(base.mover);
      candidates.delete(base.partner);
      for (const P of [...candidates].sort((a, b) => a - b)) {
        const t = ctx.tables[P];
        const screen = new SpectatorScreen(P);
        const parked = new Map(base.parked);
        const s: GateScenario = { ...base, parked };
        // points across P's range and next to the interaction point (some break rules), one repeated
        const points = [0.1, 0.35, 0.6, 0.85, 0.99].map((u) => t.fLowGHz + u * (t.fMaxGHz - t.fLowGHz));
        points.push(Math.min(t.fMaxGHz, Math.max(t.fLowGHz, base.toGHz + 0.002)), points[1]);
        for (const f of points) {
          parked.set(P, { f01GHz: f, f12GHz: t.at(f).f12 });
          const replayed = evaluateGate(ctx, s, { messages: false, screen });
          const fresh = evaluateGate(ctx, s, { messages: false });
          expect(replayed.findings).toEqual(fresh.findings);
          expect(replayed.swept).toEqual(fresh.swept);
          expect(replayed.durationNs).toBe(fresh.durationNs);
          compared++;
          findings += fresh.findings.length;
          swept += fresh.swept.length;
        }
      }
    }
    expect(compared).toBeGreaterThan(500);
    expect(findings).toBeGreaterThan(200);
    expect(swept).toBeGreaterThan(200);
  });

  it('is not used for a scenario without the screened spectator parked (the full evaluation instead)', () => {
    const base = scenarios().find((s) => s.parked.size === 0)!;
    const P = ctx.neighbours[base.mover].find((q) => q !== base.partner)!;
    const screen = new SpectatorScreen(P);
    expect(evaluateGate(ctx, base, { messages: false, screen })).toEqual(evaluateGate(ctx, base, { messages: false }));
  });
});

describe('the lazy screening of spectator points by their score\'s floor', () => {
  const ec = { ctx, options: clove.options, blockers: clove.parking.state.blockers, states: clove.states };

  it('parks the same spectators at the same points with the same evaluation as screening every point', () => {
    let parkedSome = 0;
    let runs = 0;
    for (const base of scenarios()) {
      const e = clove.edges.find((x) => x.edge === base.edge)!;
      const run = (withFloor: boolean) => {
        const s = { ...base, parked: new Map(base.parked) };
        const info: ParkedSpectator[] = [];
        const full = optionScore(ec, s, e.moverInteractionFlux);
        // without a floor bestSpectatorPoint screens every point (the code before the floor)
        const score = withFloor ? full : (t: Parameters<typeof full>[0], i: Parameters<typeof full>[1]) => full(t, i);
        const r = parkSpectators(ec, s, info, score);
        return { evaluation: r.evaluation, unmovable: r.unmovable, info, parked: [...s.parked.entries()] };
      };
      const lazy = run(true);
      const every = run(false);
      expect(lazy).toEqual(every);
      runs++;
      if (every.info.length > 0) parkedSome++;
    }
    expect(runs).toBeGreaterThan(100);
    expect(parkedSome).toBeGreaterThan(20);
  });

  it('picks the same point as screening every point, for each spectator of each gate and points across its range', () => {
    let picked = 0;
    let calls = 0;
    for (const base of scenarios()) {
      const e = clove.edges.find((x) => x.edge === base.edge)!;
      for (const P of [...ctx.neighbours[base.mover], ...ctx.neighbours[base.partner]]) {
        if (P === base.partner || P === base.mover || base.parked.has(P)) continue;
        const t = ctx.tables[P];
        // eight points across the range, nearest to the interaction point first (as the candidates come)
        const points = [0.03, 0.17, 0.3, 0.45, 0.6, 0.72, 0.86, 0.98].map((u) => t.fLowGHz + u * (t.fMaxGHz - t.fLowGHz)).sort((a, b) => Math.abs(a - base.toGHz) - Math.abs(b - base.toGHz));
        for (const clears of [(ev: ReturnType<typeof evaluateGate>) => ev.findings.length === 0, (ev: ReturnType<typeof evaluateGate>) => !ev.findings.some((f) => f.blame === P)]) {
          const pick = (withFloor: boolean) => {
            const s = { ...base, parked: new Map(base.parked) };
            const full = optionScore(ec, s, e.moverInteractionFlux);
            const score = withFloor ? full : (x: Parameters<typeof full>[0], i: Parameters<typeof full>[1]) => full(x, i);
            const r = bestSpectatorPointForTest(ec, s, [], P, points, clears, 'test', score);
            expect(s.parked.has(P)).toBe(false);
            return r;
          };
          const every = pick(false);
          expect(pick(true)).toEqual(every);
          calls++;
          if (every) picked++;
        }
      }
    }
    expect(calls).toBeGreaterThan(300);
    expect(picked).toBeGreaterThan(100);
  });

  it('the floor is at most the score, for points across each spectator\'s range', () => {
    let compared = 0;
    for (const base of scenarios()) {
      const e = clove.edges.find((x) => x.edge === base.edge)!;
      const s = { ...base, parked: new Map(base.parked) };
      const score = optionScore(ec, s, e.moverInteractionFlux);
      for (const P of ctx.neighbours[base.mover]) {
        if (P === base.partner || s.parked.has(P)) continue;
        const t = ctx.tables[P];
        for (const u of [0.05, 0.5, 0.95]) {
          const f = t.fLowGHz + u * (t.fMaxGHz - t.fLowGHz);
          s.parked.set(P, { f01GHz: f, f12GHz: t.at(f).f12 });
          const ev = evaluateGate(ctx, s, { messages: false });
          const info: ParkedSpectator[] = [{ qubit: P, fGHz: f, flux: t.fluxAt(f), f12GHz: t.at(f).f12, reason: 'test' }];
          expect(score.floor!()).toBeLessThanOrEqual(score(ev, info));
          expect(score.floor!()).toBeGreaterThan(0);
          compared++;
        }
        s.parked.delete(P);
      }
    }
    expect(compared).toBeGreaterThan(100);
  });
});

describe('the remembered last gate estimate and pair move error', () => {
  it('give, asked twice in a row, what they give when asked after another question', () => {
    const ec = { ctx, states: clove.states };
    const list = clove.edges.filter((e) => Number.isFinite(e.interactionGHz));
    expect(list.length).toBeGreaterThan(10);
    list.forEach((e, k) => {
      const other = list[(k + 1) % list.length];
      const s = scenarioOf(clove, e);
      const o = scenarioOf(clove, other);
      for (const d of [e.durationNs, e.durationNs + 12.5]) {
        estimateEdgeBudget(ec, o, other.moverInteractionFlux, other.durationNs);
        const fresh = estimateEdgeBudget(ec, s, e.moverInteractionFlux, d);
        expect(estimateEdgeBudget(ec, s, e.moverInteractionFlux, d)).toEqual(fresh);
        // another duration or flux is not the remembered answer
        expect(estimateEdgeBudget(ec, s, e.moverInteractionFlux, d + 40).t1).toBeGreaterThan(fresh.t1);
        spectatorMovePairError(ctx, { mover: other.mover, partner: other.partner, rampNs: other.rampNs }, clove.states);
        const pair = spectatorMovePairError(ctx, { mover: e.mover, partner: e.partner, rampNs: e.rampNs }, clove.states);
        expect(spectatorMovePairError(ctx, { mover: e.mover, partner: e.partner, rampNs: e.rampNs }, clove.states)).toBe(pair);
        expect(spectatorMovePairError(ctx, { mover: e.mover, partner: e.partner, rampNs: 2 * e.rampNs }, clove.states)).toBeGreaterThan(pair);
      }
    });
  });
});

describe('the remembered idle error of a qubit (the pair part of the spectator-move term)', () => {
  it('equals the idle error computed anew, for repeated, alternating and changed flux, frequency and time', () => {
    const rng = new Random(12);
    let changed = 0;
    for (let k = 0; k < 60; k++) {
      const q = rng.int(ctx.n);
      const s = clove.states[q];
      const t = [20, 20, 45][k % 3];
      // the parking point, then a point nearby (another key for the same qubit), then parking again
      const flux2 = Math.min(0.45, s.flux + 0.02 * rng.uniform());
      const f2 = ctx.transmons[q].f01(flux2);
      for (const [x, f] of [[s.flux, s.f01GHz], [s.flux, s.f01GHz], [flux2, f2], [s.flux, s.f01GHz]]) {
        const { remembered, computed } = idleTotalForTest(ctx, q, x, f, t);
        expect(remembered).toBe(computed);
        expect(computed).toBeGreaterThan(0);
      }
      const { computed: other } = idleTotalForTest(ctx, q, s.flux, s.f01GHz, 2 * t);
      if (other !== idleTotalForTest(ctx, q, s.flux, s.f01GHz, t).computed) changed++;
    }
    // a longer time is another answer (the memo does not hand out the old one: checked above)
    expect(changed).toBeGreaterThan(30);
  });
});

describe('the parking state\'s remembered blocked intervals', () => {
  it('equal the intervals computed anew through moves, active-set and calibration changes', () => {
    const state = new ParkingState(ctx, clove.options);
    const rng = new Random(13);
    for (let i = 0; i < ctx.n; i++) state.active[i] = 1;
    state.touch();
    let checked = 0;
    for (let step = 0; step < 600; step++) {
      const q = rng.int(ctx.n);
      const u = rng.uniform();
      if (u < 0.5) {
        const t = ctx.tables[q];
        state.set(q, t.fLowGHz + (t.fMaxGHz - t.fLowGHz) * rng.uniform());
      } else if (u < 0.55) {
        state.active[q] = state.active[q] ? 0 : 1;
        state.touch();
      } else if (u < 0.58) {
        state.zzScale[rng.int(ctx.edges.length)] = 0.5 + rng.uniform();
        state.blockers.clearZzCache();
        state.touch();
      }
      // ask for a few qubits (some twice: remembered), compare with a fresh computation
      for (let k = 0; k < 3; k++) {
        const i = rng.int(ctx.n);
        const got = state.blockersOf(i).map((b) => ({ ...b }));
        expect(state.blockersOf(i)).toEqual(got);
        expect(got).toEqual(state.blockers.of(i, state, []));
        // and what a fresh IdleBlockers builds (no remembered parts: every neighbour's, next-nearest
        // neighbour's and the qubit's own intervals made anew)
        expect(got).toEqual(new IdleBlockers(ctx).of(i, state, []));
        // and the remembered allowed set equals the domain minus them, computed anew
        const d = ctx.domains[i];
        expect(state.allowed(i, state.blockersOf(i))).toEqual(d ? subtract(d, got) : []);
        checked++;
      }
    }
    expect(checked).toBe(1800);
  });
});

describe('the remembered ZZ blocked sets', () => {
  it('equal the sets a fresh IdleBlockers computes, through moves, undos back to earlier points and calibration changes', () => {
    const state = new ParkingState(ctx, clove.options);
    const rng = new Random(31);
    for (let i = 0; i < ctx.n; i++) state.active[i] = 1;
    state.touch();
    let checked = 0;
    for (let step = 0; step < 300; step++) {
      const e = ctx.edges[rng.int(ctx.edges.length)];
      const [i, j] = rng.uniform() < 0.5 ? [e.a, e.b] : [e.b, e.a];
      const t = ctx.tables[j];
      const saved = state.freq[j];
      // a trial move of j, then (mostly) its undo: the set for the earlier point is asked again
      state.set(j, t.fLowGHz + (t.fMaxGHz - t.fLowGHz) * rng.uniform());
      expect(state.blockers.zzIntervals(i, j, state)).toEqual(new IdleBlockers(ctx).zzIntervals(i, j, state));
      if (rng.uniform() < 0.7) state.set(j, saved);
      if (rng.uniform() < 0.05) {
        state.zzScale[e.index] = 0.5 + rng.uniform();
        state.touch();
      }
      expect(state.blockers.zzIntervals(i, j, state)).toEqual(new IdleBlockers(ctx).zzIntervals(i, j, state));
      checked += 2;
    }
    expect(checked).toBe(600);
  });
});

describe('the parking cost\'s per-visit slots', () => {
  it('give, point after point of a visit, the cost computed without them (no visit), through moves and active-set changes', () => {
    // ParkingCost.at within a visit (state.costAt after blockersOf) reads the gate costs, spectator
    // parts and neighbours' crossings it remembered in its slots; outside a visit (no stamp) it
    // computes everything anew
    const state = new ParkingState(ctx, clove.options);
    const rng = new Random(29);
    for (let i = 0; i < ctx.n; i++) state.active[i] = 1;
    state.touch();
    let checked = 0;
    for (let step = 0; step < 200; step++) {
      const q = rng.int(ctx.n);
      const u = rng.uniform();
      const t = ctx.tables[q];
      if (u < 0.6) state.set(q, t.fLowGHz + (t.fMaxGHz - t.fLowGHz) * rng.uniform());
      else if (u < 0.65) {
        state.active[q] = state.active[q] ? 0 : 1;
        state.touch();
      }
      const i = rng.int(ctx.n);
      if (!state.active[i]) continue;
      const blockers = state.blockersOf(i);
      const ti = ctx.tables[i];
      for (let k = 0; k < 6; k++) {
        // points across the range and the neighbours' own frequencies (i the higher, the lower, level)
        const j = ctx.neighbours[i][k % Math.max(1, ctx.neighbours[i].length)];
        const f = k < 3 || j === undefined ? ti.fLowGHz + (ti.fMaxGHz - ti.fLowGHz) * rng.uniform() : Math.min(ti.fMaxGHz, Math.max(ti.fLowGHz, state.freq[j] + (k - 4) * 0.01));
        const inVisit = { ...state.costAt(i, f, blockers) };
        expect(inVisit).toEqual({ ...state.cost.at(i, f, blockers, state) });
        // and asked again in the visit (answered from the slots)
        state.blockersOf(i);
        expect({ ...state.costAt(i, f, blockers) }).toEqual(inVisit);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(600);
  });
});

describe('the plan budget with remembered gate estimates', () => {
  it('equals the budget computed anew, for the plan and for a list with some plans replaced', () => {
    const memo: EstimateMemo = new WeakMap();
    const ec = { ctx, options: clove.options, blockers: clove.parking.state.blockers, states: clove.states };
    const fresh = planBudget(clove);
    expect(planBudget(clove, memo)).toEqual(fresh);
    expect(planBudget(clove, memo)).toEqual(fresh);
    const replaced = clove.edges.map((e) => (e.parked.length > 0 ? (withoutSpectators(ec, e, new Set(e.parked.map((p) => p.qubit))) ?? e) : e));
    expect(replaced.some((e, k) => e !== clove.edges[k])).toBe(true);
    const other = { ...clove, edges: replaced };
    expect(planBudget(other, memo)).toEqual(planBudget(other));
    expect(planBudget(other).cycle.error).not.toBe(fresh.cycle.error);
  });
});

describe('admixture checks beyond the limit', () => {
  it('are the checks of admixtureChecks not within the limit, in order', () => {
    const rng = new Random(7);
    let kept = 0;
    for (let k = 0; k < 400; k++) {
      const e = ctx.edges[rng.int(ctx.edges.length)];
      const [E, S] = rng.uniform() < 0.5 ? [e.a, e.b] : [e.b, e.a];
      const tE = ctx.tables[E];
      const fE = tE.fLowGHz + (tE.fMaxGHz - tE.fLowGHz) * rng.uniform();
      // spectators near the excited qubit's transitions, so that some checks break the limit
      const fS = Math.min(ctx.tables[S].fMaxGHz, Math.max(ctx.tables[S].fLowGHz, fE + 0.4 * (rng.uniform() - 0.5)));
      const level2 = rng.uniform() < 0.5;
      const limit = ctx.rules.spectatorAdmixture;
      const all = admixtureChecks(ctx, E, fE, S, fS, e.gChargeGHz, level2).filter((c) => !(c.admixture <= limit));
      const beyond = admixtureChecksBeyond(ctx, E, fE, S, fS, e.gChargeGHz, level2, limit);
      expect(beyond).toEqual(all);
      kept += beyond.length;
    }
    expect(kept).toBeGreaterThan(5);
  });
});

describe('the layer fitting\'s conflict cache', () => {
  const f12 = clove.states.map((s) => s.f12GHz);
  const ghz = clove.parking.parkingGHz;
  const ec = { ctx, options: clove.options, blockers: clove.parking.state.blockers, states: clove.states };

  it('gives the conflict kinds computed without it, on the plans and on a list with some plans replaced', () => {
    const cache = new ConflictCache(f12, ghz);
    const plain = conflictKinds(ctx, clove.edges, f12, ghz);
    expect(conflictKinds(ctx, clove.edges, f12, ghz, cache)).toEqual(plain);
    expect(plain.size).toBeGreaterThan(0);
    // the same again from the cache
    expect(conflictKinds(ctx, clove.edges, f12, ghz, cache)).toEqual(plain);
    // some plans without their moved spectators (new plan objects), the rest the same objects
    const replaced = clove.edges.map((e) => (e.parked.length > 0 ? (withoutSpectators(ec, e, new Set(e.parked.map((p) => p.qubit))) ?? e) : e));
    expect(replaced.some((e, k) => e !== clove.edges[k])).toBe(true);
    expect(conflictKinds(ctx, replaced, f12, ghz, cache)).toEqual(conflictKinds(ctx, replaced, f12, ghz));
  });

  it('gives, for a list of the same plan objects asked for again (its kinds remembered per list), the kinds computed without it, in the same order (the very map: read-only to its callers)', () => {
    const cache = new ConflictCache(f12, ghz);
    const plain = [...conflictKinds(ctx, clove.edges, f12, ghz)];
    const first = conflictKinds(ctx, [...clove.edges], f12, ghz, cache);
    expect([...first]).toEqual(plain);
    expect(conflictKinds(ctx, [...clove.edges], f12, ghz, cache)).toBe(first);
    expect([...conflictKinds(ctx, [...clove.edges], f12, ghz, cache)]).toEqual(plain);
    // lists that differ in one plan each, more of them than the cache keeps, then the first again
    const variants = clove.edges
      .map((e, k) => (e.parked.length > 0 ? k : -1))
      .filter((k) => k >= 0)
      .map((k) => clove.edges.map((e, j) => (j === k ? (withoutSpectators(ec, e, new Set(e.parked.map((p) => p.qubit))) ?? e) : e)));
    expect(variants.length).toBeGreaterThan(4);
    for (const v of variants) {
      expect([...conflictKinds(ctx, v, f12, ghz, cache)]).toEqual([...conflictKinds(ctx, v, f12, ghz)]);
      expect([...conflictKinds(ctx, [...v], f12, ghz, cache)]).toEqual([...conflictKinds(ctx, v, f12, ghz)]);
    }
    expect([...conflictKinds(ctx, clove.edges, f12, ghz, cache)]).toEqual(plain);
    // the same plans in another order are another list
    const reversed = [...clove.edges].reverse();
    expect([...conflictKinds(ctx, reversed, f12, ghz, cache)]).toEqual([...conflictKinds(ctx, reversed, f12, ghz)]);
  });

  it('refuses parking frequencies other than its own', () => {
    const cache = new ConflictCache(f12, ghz);
    expect(() => conflictKinds(ctx, clove.edges, [...f12], ghz, cache)).toThrow();
  });
});

describe('the shared parking list', () => {
  it('is the list built anew; a replaced state gives a new list and leaves the old one as it was', () => {
    const states = [...clove.states];
    const a = parkingOf(states);
    expect(a).toEqual(states.map((s) => ({ f01GHz: s.f01GHz, f12GHz: s.f12GHz })));
    expect(parkingOf(states)).toBe(a);
    const before = a.map((d) => ({ ...d }));
    const q = 3;
    const f = states[q].f01GHz - 0.05;
    states[q] = exactQubitState(ctx.transmons[q], f, ctx.rules.resistanceSpread);
    const b = parkingOf(states);
    expect(b).not.toBe(a);
    expect(b).toEqual(states.map((s) => ({ f01GHz: s.f01GHz, f12GHz: s.f12GHz })));
    expect(a).toEqual(before);
  });
});

describe('the exchange coupling at the interaction point from two levels per transmon', () => {
  it('equals the pair\'s six-level exchangeCoupling bit for bit, at every planned interaction point and across fluxes', () => {
    const rng = new Random(5);
    for (const e of clove.edges) {
      const edge = ctx.edges[e.edge];
      const pair = ctx.pair(e.edge);
      if (Number.isFinite(e.moverInteractionFlux)) {
        const fa = e.mover === edge.a ? e.moverInteractionFlux : clove.states[edge.a].flux;
        const fb = e.mover === edge.b ? e.moverInteractionFlux : clove.states[edge.b].flux;
        expect(exchangeAtInteraction(ctx, e.edge, fa, fb)).toBe(pair.exchangeCoupling(fa, fb));
        expect(e.gAtInteractionGHz).toBe(pair.exchangeCoupling(fa, fb));
      }
      for (let k = 0; k < 3; k++) {
        const fa = 0.45 * rng.uniform();
        const fb = 0.45 * rng.uniform();
        expect(exchangeAtInteraction(ctx, e.edge, fa, fb)).toBe(pair.exchangeCoupling(fa, fb));
      }
    }
  });
});

describe('an edge re-evaluated with other spectator points, its plan built on demand', () => {
  it('the draft\'s score and plan are withSpectatorPoints\' plan (the same object on every call)', () => {
    const ec = { ctx, options: clove.options, blockers: clove.parking.state.blockers, states: clove.states };
    let tried = 0;
    let movedSweeps = 0;
    for (const e of clove.edges) {
      for (const p of e.parked) {
        const t = ctx.tables[p.qubit];
        for (const f of [p.fGHz - 0.03, p.fGHz + 0.02, t.fLowGHz + 0.5 * (t.fMaxGHz - t.fLowGHz)]) {
          if (!(f > t.fLowGHz && f < t.fMaxGHz)) continue;
          const st = exactQubitState(ctx.transmons[p.qubit], f, ctx.rules.resistanceSpread);
          const points = new Map([[p.qubit, { fGHz: f, flux: st.flux, f12GHz: st.f12GHz }]]);
          const full = withSpectatorPoints(ec, e, points);
          const draft = withSpectatorPointsDraft(ec, e, points);
          tried++;
          if (full === null) {
            expect(draft).toBeNull();
            continue;
          }
          expect(draft).not.toBeNull();
          expect(draft!.score).toBe(full.score);
          const built = draft!.plan();
          expect(built).toEqual(full);
          expect(draft!.plan()).toBe(built);
          // the plan's swept crossings, findings and slot are those of the gate evaluated here on
          // its own scenario (the draft keeps neither its scenario nor its evaluation)
          const scenario: GateScenario = {
            edge: e.edge, mover: e.mover, partner: e.partner, crossing: e.crossing,
            fromGHz: clove.states[e.mover].f01GHz, toGHz: e.crossingGHz, moverF12AtToGHz: e.moverF12AtInteractionGHz,
            crossingCouplingGHz: e.crossingCouplingGHz, rampNs: e.rampNs, parking: parkingOf(clove.states),
            parked: new Map(built.parked.map((q) => [q.qubit, { f01GHz: q.fGHz, f12GHz: q.f12GHz }])),
          };
          const ev = evaluateGate(ctx, scenario, { messages: false });
          expect(ev.findings).toEqual([]);
          expect(built.findings).toEqual([]);
          expect(built.swept).toEqual(ev.swept);
          expect(built.durationNs).toBe(ev.durationNs);
          if (ev.swept.some((x) => x.moving === p.qubit)) movedSweeps++;
        }
      }
    }
    expect(tried).toBeGreaterThan(5);
    // (some of them pass crossings on the spectator's own sweep: a plan built without its moves would differ)
    expect(movedSweeps).toBeGreaterThan(0);
  });

  it('derived plans and option reports have the planned ones\' fields in the same order (one object shape), with the same values', () => {
    const ec = { ctx, options: clove.options, blockers: clove.parking.state.blockers, states: clove.states };
    const planKeys = Object.keys(clove.edges[0]);
    const optionKeys = Object.keys(clove.edges[0].options[0]);
    let built = 0;
    for (const e of clove.edges) {
      expect(Object.keys(e)).toEqual(planKeys);
      const copy = edgePlanOf(e);
      expect(Object.keys(copy)).toEqual(planKeys);
      expect(copy).toEqual(e);
      for (const o of e.options) {
        expect(Object.keys(optionReportOf(o))).toEqual(optionKeys);
        expect(optionReportOf(o)).toEqual(o);
      }
      for (const p of e.parked) {
        const t = ctx.tables[p.qubit];
        for (const f of [p.fGHz - 0.03, p.fGHz + 0.02]) {
          if (!(f > t.fLowGHz && f < t.fMaxGHz)) continue;
          const st = exactQubitState(ctx.transmons[p.qubit], f, ctx.rules.resistanceSpread);
          const draft = withSpectatorPointsDraft(ec, e, new Map([[p.qubit, { fGHz: f, flux: st.flux, f12GHz: st.f12GHz }]]));
          if (!draft) continue;
          const plan = draft.plan();
          built++;
          expect(Object.keys(plan)).toEqual(planKeys);
          for (const o of plan.options) expect(Object.keys(o)).toEqual(optionKeys);
        }
      }
    }
    expect(built).toBeGreaterThan(2);
  });
});
