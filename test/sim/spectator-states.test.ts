/**
 * simulateSpectatorStates (src/sim/simulate-gate.ts): the spectator in |0> and in |1> propagated
 * together (each step prepared once for all eight columns) must give the same blocks as two
 * simulateGate calls, the second in the first's lab frame, which is how the spectator error was
 * computed before (simulateGate itself is checked against QuTiP in test/sim/qutip.test.ts, and the
 * spectator error against an independent NumPy model in test/budget/spectator-error.test.ts).
 * Also: with in-block propagation (no coupling between excitation manifolds) frames without
 * the manifolds above the computational states' give the same blocks to 1e-9.
 * And the budget's joined ramp steps (joinRamps) give the spectator's error within 1 % of one
 * step per trajectory segment.
 * The case: Clove-17's D4-Z3 CZ with D4's neighbour Z1 as the spectator, 120 MHz above the
 * mover's 2-3 transition at the hold (a strong spectator effect, so the |1> block differs).
 */
import { demoLayout } from '../support/demo-layout.js';
import { describe, expect, it } from 'vitest';
import { designCzGate } from '../../src/gate/design.js';
import { moverEjSpan, SPECTATOR_LEVELS, SPECTATOR_PROPAGATION } from '../../src/budget/spectator-error.js';
import { buildManifoldFrame } from '../../src/sim/manifold-frame.js';
import { edgeSimModel } from '../../src/sim/pair-model.js';
import { simulateGate, simulateSpectatorStates } from '../../src/sim/simulate-gate.js';
import { fidelityWithVirtualZ, gateMetrics } from '../../src/sim/gate-metrics.js';

const { layout, q, g } = demoLayout('clove-17');

describe('simulateSpectatorStates', () => {
  it('gives the blocks of two separate simulations (spectator in |0>, then |1> in its lab frame), to the bit', () => {
    const D4 = q('D4');
    const Z3 = q('Z3');
    const Z1 = q('Z1');
    const z3Flux = Z3.fluxForF01(5.0);
    const design = designCzGate({ mover: D4, partner: Z3, gGHz: g('D4', 'Z3'), moverParkFlux: 0, partnerFlux: z3Flux, crossing: '11-20', rules: layout.rules });
    const traj = design.waveform;
    const e = D4.levels(D4.fluxForF01(design.interactionFrequencyGHz), 4).energies;
    const spectator = { transmon: Z1, coupledTo: 'mover' as const, gGHz: g('D4', 'Z1'), flux: Z1.fluxForF01(e[3] - e[2] + 0.12) };
    const [ejLo, ejHi] = moverEjSpan(D4, traj);
    const model = edgeSimModel({ mover: D4, partner: Z3, gGHz: g('D4', 'Z3'), partnerFlux: z3Flux, spectators: [spectator], ...SPECTATOR_LEVELS });
    const frame = buildManifoldFrame(model, { ejLo, ejHi, keepExcitations: 4 });
    const a = simulateGate(frame, traj, { ...SPECTATOR_PROPAGATION, estimate: false, spectatorLevels: [0] });
    const lab = [a.energies['00'], a.energies['01'], a.energies['10']] as const;
    const b = simulateGate(frame, traj, { ...SPECTATOR_PROPAGATION, estimate: false, spectatorLevels: [1], labEnergies: lab });
    const [x0, x1] = simulateSpectatorStates(frame, traj, [[0], [1]], SPECTATOR_PROPAGATION);
    expect(Array.from(x0.m.re)).toEqual(Array.from(a.m.re));
    expect(Array.from(x0.m.im)).toEqual(Array.from(a.m.im));
    expect(Array.from(x1.m.re)).toEqual(Array.from(b.m.re));
    expect(Array.from(x1.m.im)).toEqual(Array.from(b.m.im));
    expect([...x0.energies]).toEqual([...lab]);
    // the case is not trivial: the spectator in |1> costs fidelity against |0>
    expect(1 - gateMetrics(b.m).fidelity).toBeGreaterThan(1 - gateMetrics(a.m).fidelity + 1e-4);
    // in-block propagation never leaves a manifold, so a frame without manifold 4 (the spectator
    // budget's since 2026-12-03) gives the same blocks (every computational state is in manifolds <= 3)
    const frame3 = buildManifoldFrame(model, { ejLo, ejHi, keepExcitations: 3 });
    expect(frame3.degree).toBeLessThanOrEqual(frame.degree);
    const [y0, y1] = simulateSpectatorStates(frame3, traj, [[0], [1]], SPECTATOR_PROPAGATION);
    for (const [p, r] of [[y0.m, x0.m], [y1.m, x1.m]]) for (let k = 0; k < 16; k++) {
      expect(Math.abs(p.re[k] - r.re[k])).toBeLessThan(1e-9);
      expect(Math.abs(p.im[k] - r.im[k])).toBeLessThan(1e-9);
    }
    // the budget's propagation joins short ramp segments (SPECTATOR_PROPAGATION.joinRamps): the
    // spectator's error (the |0>/|1> mean less the pair alone) within 1 % of one step per segment
    expect(SPECTATOR_PROPAGATION.joinRamps).toBe(true);
    const perSegment = { scheme: 'in-block' as const };
    const errorWith = (prop: typeof perSegment | typeof SPECTATOR_PROPAGATION) => {
      const [s0, s1] = simulateSpectatorStates(frame3, traj, [[0], [1]], prop);
      const m0 = gateMetrics(s0.m);
      const alone = gateMetrics(simulateGate(buildManifoldFrame(edgeSimModel({ mover: D4, partner: Z3, gGHz: g('D4', 'Z3'), partnerFlux: z3Flux, ...SPECTATOR_LEVELS }), { ejLo, ejHi, keepExcitations: 2 }), traj, { ...prop, estimate: false }).m);
      return 0.5 * (1 - m0.fidelity + 1 - fidelityWithVirtualZ(s1.m, m0.virtualZ.a, m0.virtualZ.b, Math.PI)) - (1 - alone.fidelity);
    };
    const joined = errorWith(SPECTATOR_PROPAGATION);
    const apart = errorWith(perSegment);
    expect(apart).toBeGreaterThan(1e-3);
    expect(Math.abs(joined - apart)).toBeLessThan(0.01 * apart);
    // and the pair alone with manifolds <= 2 (its computational states') against <= 4
    const pairModel = edgeSimModel({ mover: D4, partner: Z3, gGHz: g('D4', 'Z3'), partnerFlux: z3Flux, ...SPECTATOR_LEVELS });
    const alone4 = simulateGate(buildManifoldFrame(pairModel, { ejLo, ejHi, keepExcitations: 4 }), traj, { ...SPECTATOR_PROPAGATION, estimate: false });
    const alone2 = simulateGate(buildManifoldFrame(pairModel, { ejLo, ejHi, keepExcitations: 2 }), traj, { ...SPECTATOR_PROPAGATION, estimate: false });
    for (let k = 0; k < 16; k++) {
      expect(Math.abs(alone2.m.re[k] - alone4.m.re[k])).toBeLessThan(1e-9);
      expect(Math.abs(alone2.m.im[k] - alone4.m.im[k])).toBeLessThan(1e-9);
    }
  });
});
