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
import { evaluateGate, type GateScenario } from '../../../src/plan/rules/cz-evaluate.js';

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
