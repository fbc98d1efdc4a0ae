/**
 * Spectator moves fitted to the layers (src/plan/layer-moves.ts) and the shared-spectator rule of
 * the layers (src/plan/layers.ts).
 *
 * What is checked against something outside the planner's own choices:
 * - the layers stay a proper colouring of the conflict graph, recomputed pair by pair with the
 *   conflict test (graph colouring: no two adjacent vertices share a colour), and never use more
 *   colours than the plan before fitting: iterated greedy from a proper colouring never adds
 *   colours (Culberson and Luo, DIMACS Series 26 (1996));
 * - every gate whose spectator point changed still holds every rule: the gate is evaluated again
 *   from scratch by the same rule evaluation `verify` uses (src/plan/rules/cz-evaluate.ts);
 * - the kept plan's reference-cycle error is the smallest of the candidates (recomputed here).
 * The goal for Clove-17 (a 17-qubit surface-code patch) is at most 8 layers: published
 * schedules of such a patch run its CZs in 8 steps (common practice, from memory).
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { planChip } from '../../src/plan/plan.js';
import { conflictKind, conflictingPairs, movedQubits, planLayers, sharedSpectators } from '../../src/plan/layers.js';
import { BUDGET_MOVE_REASON, withSpectatorPoints, withoutSpectators } from '../../src/plan/interaction/plan-edge.js';
import { evaluateGate } from '../../src/plan/rules/cz-evaluate.js';
import { scenarioOf } from '../../src/plan/plan-budget.js';

const clove = planChip(loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'));

describe('layer fitting on Clove-17', () => {
  const f12 = clove.states.map((s) => s.f12GHz);
  const ec = { ctx: clove.ctx, options: clove.options, blockers: clove.parking.state.blockers, states: clove.states };

  it('runs its CZs in at most 8 layers, and the layers are a proper colouring of the recomputed conflicts', () => {
    expect(clove.layers.layers.length).toBeLessThanOrEqual(8);
    const fitting = clove.parking.stats.layerFitting!;
    expect(fitting).not.toBeNull();
    expect(clove.layers.layers.length).toBeLessThanOrEqual(fitting.planned.layers);
    const layerOf = new Map<number, number>();
    clove.layers.layers.forEach((l, i) => l.forEach((e) => layerOf.set(e, i)));
    const pairs = conflictingPairs(clove.ctx, clove.edges, f12, clove.parking.parkingGHz);
    expect(pairs.length).toBeGreaterThan(0);
    for (const [a, b] of pairs) expect(layerOf.get(clove.edges[a].edge)).not.toBe(layerOf.get(clove.edges[b].edge));
  });

  it('keeps the candidate of least cycle error, and that is the plan reported', () => {
    const f = clove.parking.stats.layerFitting!;
    const best = Math.min(f.planned.cycleError, f.aligned.cycleError, f.fitted.cycleError);
    expect(f[f.kept].cycleError).toBe(best);
    expect(clove.budget.cycle.error).toBeCloseTo(best, 12);
    expect(f[f.kept].layers).toBe(clove.layers.layers.length);
  });

  it('gates of one layer share only spectators parked at the very same point, and each such gate holds every rule there', () => {
    let shared = 0;
    for (const layer of clove.layers.layers) {
      for (let i = 0; i < layer.length; i++) {
        for (let j = i + 1; j < layer.length; j++) {
          const a = clove.edges[layer[i]];
          const b = clove.edges[layer[j]];
          for (const q of sharedSpectators(a, b)) {
            shared++;
            expect(a.parked.find((p) => p.qubit === q)!.fGHz).toBe(b.parked.find((p) => p.qubit === q)!.fGHz);
          }
        }
      }
    }
    expect(shared).toBeGreaterThan(0);
    for (const e of clove.edges) if (e.feasible) expect(evaluateGate(clove.ctx, scenarioOf(clove, e)).findings).toEqual([]);
  });

  it('a shared spectator moved to a slightly different point by one gate makes the two gates conflict again', () => {
    let checked = 0;
    for (const layer of clove.layers.layers) {
      for (let i = 0; i < layer.length && checked === 0; i++) {
        for (let j = i + 1; j < layer.length && checked === 0; j++) {
          const a = clove.edges[layer[i]];
          const b = clove.edges[layer[j]];
          const [q] = [...sharedSpectators(a, b)];
          if (q === undefined) continue;
          const moved = { ...b, parked: b.parked.map((p) => (p.qubit === q ? { ...p, fGHz: p.fGHz + 1e-6 } : p)) };
          expect(conflictKind(clove.ctx, a, movedQubits(clove.ctx, a, f12, clove.parking.parkingGHz), b, movedQubits(clove.ctx, b, f12, clove.parking.parkingGHz))).toBeNull();
          expect(conflictKind(clove.ctx, a, movedQubits(clove.ctx, a, f12, clove.parking.parkingGHz), moved, movedQubits(clove.ctx, moved, f12, clove.parking.parkingGHz))).toBe('spectator');
          checked++;
        }
      }
    }
    expect(checked).toBe(1);
  });

  it('withSpectatorPoints: the same points give the same estimated error; a point on the partner breaks a rule (null)', () => {
    const e = clove.edges.find((x) => x.feasible && x.parked.length > 0)!;
    const p = e.parked[0];
    const same = withSpectatorPoints(ec, e, new Map([[p.qubit, p]]))!;
    expect(same.score).toBeCloseTo(e.score, 12);
    expect(same.findings).toEqual([]);
    // the spectator on the mover's interaction frequency: a 01-01 resonance during the gate
    const st = clove.ctx.tables[p.qubit];
    const f = e.interactionGHz;
    expect(f).toBeGreaterThanOrEqual(clove.ctx.ranges[p.qubit].lo);
    expect(f).toBeLessThanOrEqual(clove.ctx.ranges[p.qubit].hi);
    expect(withSpectatorPoints(ec, e, new Map([[p.qubit, { fGHz: f, flux: st.fluxAt(f), f12GHz: st.at(f).f12 }]]))).toBeNull();
  });

  it('withoutSpectators: dropping nothing keeps the estimate; dropping a move a rule asked for breaks that rule (null)', () => {
    const e = clove.edges.find((x) => x.feasible && x.parked.some((p) => p.reason !== BUDGET_MOVE_REASON))!;
    expect(withoutSpectators(ec, e, new Set())!.score).toBeCloseTo(e.score, 12);
    const required = e.parked.find((p) => p.reason !== BUDGET_MOVE_REASON)!;
    expect(withoutSpectators(ec, e, new Set([required.qubit]))).toBeNull();
  });

  it('planLayers repairs a start that no longer holds (two conflicting gates in one layer) into a proper colouring', () => {
    const pairs = conflictingPairs(clove.ctx, clove.edges, f12, clove.parking.parkingGHz);
    const [a, b] = pairs[0];
    const start = [...clove.layers.layerOf];
    start[b] = start[a];
    const l = planLayers(clove.ctx, clove.edges, f12, clove.parking.parkingGHz, 1, start);
    for (const [x, y] of pairs) expect(l.layerOf[x]).not.toBe(l.layerOf[y]);
    expect(l.layers.length).toBeLessThanOrEqual(clove.layers.layers.length + 1);
  });
});
