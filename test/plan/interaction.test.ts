/**
 * Interaction plans (src/plan/interaction/*) on hand-built chips: a spectator parked exactly on
 * the interaction frequency is detected and moved out of the way (spectator parking) or, when it
 * cannot move, reported naming it; the interaction frequency is the exact 11-20 crossing of the
 * pair stage (src/pair/resonances.ts: f12 of the mover = f01 of the partner, README physics conventions sec. 2);
 * swept crossings use the Landau-Zener formula (src/plan/landau-zener.ts, tested against SciPy).
 */
import { describe, expect, it } from 'vitest';
import { shortestGateNs, slotNs, spectatorMovesNs } from '../../src/plan/rules/cz-duration.js';
import { planChip } from '../../src/plan/plan.js';
import { buildPlanContext } from '../../src/plan/context.js';
import { pairResonances } from '../../src/pair/resonances.js';
import { landauZenerTransfer } from '../../src/plan/landau-zener.js';
import { expectClose } from '../support/close.js';
import { handChip } from '../support/plan-chips.js';
import { admixtureChecks } from '../../src/plan/rules/spectator-admixture.js';

// The interaction stage is the point here: the idle-error ceiling is relaxed (S is parked off its
// sweet spot on purpose, and its idle error would otherwise be a violation of its own), A parks at
// its sweet spot so that it is the higher qubit of A-B.
const HAND_RULES = { zzLimit: '3 MHz', idleErrorLimit: 0.5 };
const couplings: [string, string, string][] = [['A', 'B', '12 MHz'], ['A', 'S', '10 MHz']];
const probe = handChip('probe', { A: { fMax: '6.3 GHz', alpha: '-220 MHz', park: '6.3 GHz' }, B: { fMax: '5.5 GHz', park: '5.5 GHz' }, S: { fMax: '6.0 GHz' } }, couplings, HAND_RULES);
const pctx = buildPlanContext(probe);
// The 11-20 crossing of A against B at 5.5 GHz, from the pair stage.
const crossing = pairResonances(pctx.transmons[0], pctx.transmons[1], pctx.transmons[1].fluxForF01(5.5), pctx.edges[0].gChargeGHz)['11-20']!;
const fInt = crossing.moverF01GHz.toFixed(6);

describe('a spectator exactly on the interaction frequency', () => {
  it('is detected and moved out of the way for the gate (spectator parking), within its range', () => {
    const chip = handChip('spectator', { A: { fMax: '6.3 GHz', alpha: '-220 MHz', park: '6.3 GHz' }, B: { fMax: '5.5 GHz', park: '5.5 GHz' }, S: { fMax: '6.0 GHz', park: `${fInt} GHz` } }, couplings, HAND_RULES);
    const plan = planChip(chip);
    expect(plan.violations).toEqual([]);
    const ab = plan.edges[0];
    expect(plan.ctx.ids[ab.mover]).toBe('A');
    expect(ab.crossing).toBe('11-20');
    expectClose(ab.interactionGHz, Number(fInt), 1e-6, 'interaction frequency = the 11-20 crossing');
    expect(ab.parked.map((p) => plan.ctx.ids[p.qubit])).toEqual(['S']);
    const s = ab.parked[0];
    // The broken rules where it stood, and the temporary point clear of all three spectator conditions.
    expect(s.reason).toContain('cz-spectator-01-01');
    // every admixture (g_c / Delta)^2 of A at the interaction point with S at its temporary point
    // is within the limit (src/plan/rules/spectator-admixture.ts)
    const G = plan.ctx.edges[plan.ctx.edgeBetween(ab.mover, 2)].gChargeGHz;
    const checks = admixtureChecks(plan.ctx, ab.mover, ab.interactionGHz, 2, s.fGHz, G, true);
    expect(checks).toHaveLength(5);
    for (const c of checks) expect(c.admixture, c.rule).toBeLessThanOrEqual(chip.rules.spectatorAdmixture);
    expect(s.fGHz).toBeGreaterThanOrEqual(plan.ctx.ranges[2].lo);
    expect(s.fGHz).toBeLessThanOrEqual(plan.ctx.ranges[2].hi);
    // It must also be off the mover's sweep 5.72 -> 6.30 GHz (a direct crossing is never fast enough).
    expect(s.fGHz < ab.interactionGHz || s.fGHz > 6.3).toBe(true);
    expect(ab.reason).toMatch(/S parked at \d\.\d{3} GHz \(where it stood it broke cz-spectator-01-01/);
  });

  it('is reported, naming the spectator and the rule, when it cannot move', () => {
    const lo = (Number(fInt) - 0.004).toFixed(6);
    const hi = (Number(fInt) + 0.004).toFixed(6);
    const chip = handChip('stuck', { A: { fMax: '6.3 GHz', alpha: '-220 MHz', park: '6.3 GHz' }, B: { fMax: '5.5 GHz', park: '5.5 GHz' }, S: { fMax: `${hi} GHz`, fMin: `${lo} GHz`, park: `${fInt} GHz` } }, couplings, HAND_RULES);
    const plan = planChip(chip);
    const broken = plan.violations.filter((v) => v.edge === 'A-B');
    expect(broken.map((v) => v.rule)).toContain('cz-spectator-01-01');
    const v = broken.find((x) => x.rule === 'cz-spectator-01-01')!;
    expect(v.qubits).toEqual(['A', 'S']);
    expect(v.value).toBeGreaterThan(1e6);
    expect(v.message).toMatch(/A f01 5\.722 GHz at the interaction point is 0\.0 MHz from spectator S f01 5\.722 GHz \(g_c = [\d.]+ MHz\): admixture .* > 0\.020 during the CZ on A-B/);
    expect(plan.edges[0].reason).toMatch(/S cannot be moved out of the way/);
  });
});

describe('the choice of mover and crossing', () => {
  it('picks the higher qubit at its 11-20 crossing when the lower one cannot reach a crossing, and says why', () => {
    const plan = planChip(probe);
    const ab = plan.edges[0];
    expect(plan.ctx.ids[ab.mover]).toBe('A');
    expect(ab.reason).toMatch(/B 11-20: 11-20 crossing outside its tunable range/);
    expect(ab.options).toHaveLength(4);
    expect(ab.speedLimitNs).toBeCloseTo(1 / (2 * ab.crossingCouplingGHz), 12);
  });

  it('every crossing a mover passes is listed with its Landau-Zener transfer at the planning sweep rate', () => {
    // A weak defect of A at 6.0 GHz lies on its way down to the 5.72 GHz crossing (g = width / 2).
    const chip = handChip('sweep', { A: { fMax: '6.3 GHz', alpha: '-220 MHz', park: '6.3 GHz', tls: [{ at: '6.0 GHz', width: '0.4 MHz' }] }, B: { fMax: '5.5 GHz', park: '5.5 GHz' }, S: { fMax: '6.0 GHz', park: '5.35 GHz' } }, couplings, HAND_RULES);
    const plan = planChip(chip);
    const ab = plan.edges[0];
    expect(ab.swept.map((c) => c.rule)).toContain('cz-swept-tls');
    expect(ab.swept.find((c) => c.rule === 'cz-swept-tls')!.couplingGHz).toBeCloseTo(0.0002, 15);
    const rate = (plan.states[ab.mover].f01GHz - ab.interactionGHz) / ab.rampNs;
    for (const c of ab.swept) {
      expect(c.atGHz).toBeGreaterThan(ab.interactionGHz);
      expect(c.atGHz).toBeLessThan(plan.states[ab.mover].f01GHz);
      expectClose(c.rateGHzPerNs, rate, 1e-12, 'linear sweep rate');
      expectClose(c.transfer, landauZenerTransfer(c.couplingGHz, rate), 1e-12, 'transfer');
    }
  });
});

describe('room to tune past the crossing (src/plan/rules/tuning-room.ts, our choice)', () => {
  // A's 11-20 crossing with B at 5.5 GHz lies at fInt (pair stage); A's range ends just below it
  // (5 MHz, less than one bare splitting 2 g_c ~ 34 MHz) or well below it (150 MHz).
  const chipWithBottom = (fMinGHz: number) =>
    handChip('room', { A: { fMax: '6.3 GHz', alpha: '-220 MHz', park: '6.3 GHz', fMin: `${fMinGHz.toFixed(6)} GHz` }, B: { fMax: '5.5 GHz', park: '5.5 GHz' } }, [['A', 'B', '12 MHz']], HAND_RULES);

  it('tuningRoomShortfall: the missing room on the far side of the excursion, 0 with enough', async () => {
    const { tuningRoomShortfall } = await import('../../src/plan/rules/tuning-room.js');
    const range = { lo: 4, hi: 6 };
    // moving down to 4.010 GHz with g_c = 10 MHz: 20 MHz needed past it, 10 MHz there
    expect(tuningRoomShortfall(range, 5.5, 4.01, 0.01)).toBeCloseTo(0.01, 12);
    expect(tuningRoomShortfall(range, 5.5, 4.03, 0.01)).toBe(0);
    // moving up to 5.995 GHz: 5 MHz below the top, 15 MHz short
    expect(tuningRoomShortfall(range, 5.0, 5.995, 0.01)).toBeCloseTo(0.015, 12);
    expect(tuningRoomShortfall(range, 5.0, 5.9, 0.01)).toBe(0);
  });

  it('a crossing less than one splitting above the bottom of the mover range is not offered; with room it is', () => {
    const tight = planChip(chipWithBottom(Number(fInt) - 0.005));
    const e = tight.edges[0];
    const opt = e.options.find((o) => tight.ctx.ids[o.mover] === 'A' && o.crossing === '11-20')!;
    expect(opt.feasible).toBe(false);
    expect(opt.problems.map((p) => p.rule)).toEqual(['cz-range']);
    expect(opt.problems[0].message).toMatch(/no room to tune the destination past it/);
    expect(tight.violations.map((v) => v.rule)).toContain('cz-range');
    const roomy = planChip(chipWithBottom(Number(fInt) - 0.15));
    expect(roomy.violations).toEqual([]);
    expect(roomy.ctx.ids[roomy.edges[0].mover]).toBe('A');
    expect(roomy.edges[0].crossing).toBe('11-20');
  });
});

describe('cz-duration', () => {
  it('counts the full 11-20 cycle 1/(2 g_c) (the speed limit: the ramps add phase, so they are not added), the flux line settling at both ends and two sample intervals (src/gate/pulse.ts), plus the spectator moves', async () => {
    const { lineDelayNs } = await import('../../src/gate/pulse.js');
    const plan = planChip(probe);
    const ab = plan.edges[0];
    const r = probe.rules;
    const settle = 2 * lineDelayNs(r.sampleRateGHz, r.fluxBandwidthGHz) + 2 / r.sampleRateGHz;
    expect(settle).toBeGreaterThan(0);
    const moves = ab.parked.length > 0 ? 2 * Math.ceil(ab.rampNs * r.sampleRateGHz - 1e-9) / r.sampleRateGHz : 0;
    expectClose(ab.durationNs, 1 / (2 * ab.crossingCouplingGHz) + settle + moves, 1e-12, 'duration');
    expectClose(shortestGateNs(ab.crossingCouplingGHz, r), 1 / (2 * ab.crossingCouplingGHz) + settle, 1e-12, 'shortestGateNs');
    // a limit that the cycle alone would meet, but not with the settling: a violation (whatever
    // ramp and spectator moves the planner tries, the shortest gate itself does not fit)
    const limit = shortestGateNs(ab.crossingCouplingGHz, r) - settle / 2;
    const tight = planChip(handChip('probe', { A: { fMax: '6.3 GHz', alpha: '-220 MHz', park: '6.3 GHz' }, B: { fMax: '5.5 GHz', park: '5.5 GHz' }, S: { fMax: '6.0 GHz' } }, couplings, { ...HAND_RULES, maxGate: `${limit.toFixed(4)} ns` }));
    expect(tight.violations.map((v) => v.rule)).toContain('cz-duration');
  });

  it('spectator moves take the plan ramp rounded up to the AWG grid, twice, and only when a spectator moves', () => {
    const rules = { sampleRateGHz: 2.4 };
    expectClose(spectatorMovesNs(true, 15, rules), 30, 1e-12, '15 ns is 36 samples');
    expectClose(spectatorMovesNs(true, 10.1, rules), (2 * 25) / 2.4, 1e-12, '10.1 ns rounds up to 25 samples');
    expect(spectatorMovesNs(false, 15, rules)).toBe(0);
    expectClose(slotNs(40, true, 15, rules), 70, 1e-12, 'slot');
  });
});
