/**
 * The reduced three-transmon model a spectator's error falls back to when no dressed-manifold
 * frame of the full model converges (src/budget/spectator-error.ts spectatorFrame): Reef-49's
 * Q4-Q5 CZ on an 11-02 crossing (Q4 from its lower sweet spot, 3.12 GHz, up to the crossing with
 * Q5 at its sweet spot), with Q4's neighbour Q6 at its sweet spot (6.67 GHz) as the spectator.
 * Against an independent NumPy model (test/reference/spectator_gate.py: charge-basis transmons,
 * the mover in 6 eigenstates at parking plus 6 at the waveform's flux extreme, partner 5 levels,
 * spectator 3, fourth-order Magnus, its own dressed states and virtual-Z phases) within 15 % of
 * the error (measured 2026-12-03: NumPy 1.038e-4; the planned waveform's share 1.037e-4 and the
 * direct check's 1.038e-4; with the reduced models' partner kept to 3 levels this test fails,
 * 3.28e-4 against 1.04e-4). The fallback is reached from the five-level mover model (the
 * spectator models' default before SPECTATOR_LEVELS kept 4 mover levels), whose frame does not
 * converge here. The budget's own call (spectatorBudget: the default 4 mover levels, and on an
 * 11-02 gate the partner kept to 5 levels in every model) is held to the same value (its frame
 * converges: 1.037e-4, measured 2026-12-03 with the 0.4 ns budget steps).
 */
import { demoLayout } from '../support/demo-layout.js';
import { describe, expect, it } from 'vitest';
import { designCzGate } from '../../src/gate/design.js';
import { REDUCED_MODEL_PARTNER_LEVELS, spectatorError, SPECTATOR_LEVELS } from '../../src/budget/spectator-error.js';
import { spectatorBudget, spectatorModelLevels } from '../../src/budget/waveform-budget.js';
import { numpySpectatorShare, pairAloneBaseline } from './support.js';

const { layout, q, g } = demoLayout('reef-49');
const Q4 = q('Q4');
const Q5 = q('Q5');
const Q6 = q('Q6');
const MOVER_PARK = 0.5;
const PARTNER_FLUX = 0;
const SPECTATOR_FLUX = 0;

describe('spectatorError where the full frame does not converge (reduced model)', () => {
  it('Reef-49 Q4-Q5 (11-02) with Q6: the reduced model agrees with a NumPy three-transmon simulation within 15 %', () => {
    const design = designCzGate({ mover: Q4, partner: Q5, gGHz: g('Q4', 'Q5'), moverParkFlux: MOVER_PARK, partnerFlux: PARTNER_FLUX, crossing: '11-02', rules: layout.rules });
    expect(design.feasible).toBe(true);
    const traj = design.waveform;
    const pairIn = { mover: Q4, partner: Q5, gGHz: g('Q4', 'Q5'), partnerFlux: PARTNER_FLUX };
    const spectator = { transmon: Q6, coupledTo: 'partner' as const, gGHz: g('Q5', 'Q6'), flux: SPECTATOR_FLUX };
    const fiveLevelMover = { ...SPECTATOR_LEVELS, moverLevels: 5 };
    const ours = spectatorError({ ...pairIn, traj, targetPhase: Math.PI, ...pairAloneBaseline(pairIn, traj, fiveLevelMover), levels: fiveLevelMover, spectator });
    // the case this test is about: the full model's frame does not converge
    expect(ours.reduced).toBe('mover-levels');
    const ref = numpySpectatorShare(pairIn, spectator, traj, { KA: 6, KAfar: 6, KB: 5, KS: 3, dt: 0.03 });
    expect(ref.error).toBeGreaterThan(1e-5);
    expect(Math.abs(ours.error - ref.error) / ref.error, `ours ${ours.error}, NumPy ${ref.error}`).toBeLessThan(0.15);
    // the budget as the commands compute it (spectatorBudget): on this 11-02 gate its models keep
    // the partner to 5 levels (spectatorModelLevels), and the share agrees with the same NumPy value
    const pair = { ...pairIn, traj, targetPhase: Math.PI };
    expect(spectatorModelLevels(pair).partnerLevels).toBe(REDUCED_MODEL_PARTNER_LEVELS);
    const share = spectatorBudget(pair, [spectator]).spectatorShares[0];
    expect(Math.abs(share.error - ref.error) / ref.error, `budget ${share.error} (${share.reduced}), NumPy ${ref.error}`).toBeLessThan(0.15);
  }, 600_000);

  it('spectatorModelLevels: 5 partner levels on an 11-02 gate, the usual 3 on an 11-20 gate (Reef-49 Q4-Q5 both ways)', () => {
    for (const crossing of ['11-02', '11-20'] as const) {
      const d = designCzGate({ mover: Q4, partner: Q5, gGHz: g('Q4', 'Q5'), moverParkFlux: MOVER_PARK, partnerFlux: PARTNER_FLUX, crossing, rules: layout.rules });
      expect(d.feasible, crossing).toBe(true);
      const levels = spectatorModelLevels({ mover: Q4, partner: Q5, gGHz: g('Q4', 'Q5'), partnerFlux: PARTNER_FLUX, traj: d.waveform, targetPhase: Math.PI });
      expect(levels.partnerLevels, crossing).toBe(crossing === '11-02' ? REDUCED_MODEL_PARTNER_LEVELS : SPECTATOR_LEVELS.partnerLevels);
    }
  }, 600_000);
});
