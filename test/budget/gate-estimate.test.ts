/**
 * The fast gate-budget estimate (src/budget/gate-estimate.ts), used before pulses are designed,
 * against the simulated budget of designed gates (the first-order Lindblad estimate for T1 and white
 * dephasing, the quasi-static flux-noise average; both checked against outside references in
 * their own tests): Bowline-5 edges with the partner Q0 tuned down to flux 0.29.
 * Tolerances: T1 10 %, white dephasing 25 %, flux noise 20 % (the estimate's square-pulse picture).
 */
import { describe, expect, it } from 'vitest';
import { designCzGate } from '../../src/gate/design.js';
import { estimateGateBudget } from '../../src/budget/gate-estimate.js';
import { Q0, layout, qubit } from '../gate/support.js';

const PARTNER_FLUX = 0.29;
const cases = ['Q1', 'Q2', 'Q3'].map((m) => {
  const mover = qubit(m);
  const g = layout.couplings.find((c) => [c.a, c.b].sort().join() === ['Q0', m].sort().join())!.gGHz;
  const d = designCzGate({ mover, partner: Q0, gGHz: g, moverParkFlux: 0, partnerFlux: PARTNER_FLUX, crossing: '11-20', rules: layout.rules, noise: true, decoherence: 'estimate' });
  const xi = mover.fluxForF01(d.interactionFrequencyGHz);
  const sm = mover.spectrum(xi);
  const sb = Q0.spectrum(PARTNER_FLUX);
  const est = estimateGateBudget({
    mover: { coherence: mover.coherenceSpec, slopeGHz: sm.df01dFluxGHz, slope12GHz: sm.df12dFluxGHz },
    partner: { coherence: Q0.coherenceSpec, slopeGHz: sb.df01dFluxGHz, slope12GHz: sb.df12dFluxGHz },
    excited: 'mover', holdNs: d.holdNs, rampNs: d.rampNs, durationNs: d.durationNs, averagingTimeNs: 1e9,
  });
  return { m, d, est };
});

describe('estimateGateBudget against designed gates', () => {
  for (const term of [['t1', 'T1', 0.1], ['whiteDephasing', 'white dephasing', 0.25], ['fluxNoise', 'flux noise', 0.2]] as const) {
    it(`${term[1]} within ${term[2] * 100} % of the simulated term (Bowline-5 Q1, Q2, Q3 to Q0)`, () => {
      for (const c of cases) {
        expect(c.d.feasible, c.m).toBe(true);
        const sim = c.d.budget![term[0]];
        const est = c.est[term[0]];
        expect(Math.abs(est - sim) / sim, `${c.m}-Q0: estimate ${est}, simulated ${sim}`).toBeLessThan(term[2]);
      }
    });
  }
});
