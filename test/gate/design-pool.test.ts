/**
 * Per-edge CZ designs on worker threads (src/gate/design-pool.ts): the same designs bit for bit
 * as in this thread, in request order, and a designer error comes back as that edge's error.
 */
import { describe, expect, it } from 'vitest';
import { designCzGate, type GateDesignRequest } from '../../src/gate/design.js';
import { designInWorkers } from '../../src/gate/design-pool.js';
import { requestFromWire, requestToWire } from '../../src/gate/design-wire.js';
import { G_LAYOUT, Q0, Q1, layout, qubit } from './support.js';

const base: GateDesignRequest = { mover: Q1, partner: Q0, gGHz: G_LAYOUT, moverParkFlux: 0, partnerFlux: 0, crossing: '11-20', rules: layout.rules };
const requests: GateDesignRequest[] = [
  { ...base, family: 'erf' },
  { ...base, family: 'linear', rampNs: 6 },
  { ...base, family: 'faquad', noise: true, decoherence: 'estimate' },
  { ...base, family: 'no-such-family' },
  { ...base, family: 'erf', spectators: [{ transmon: qubit('Q2'), coupledTo: 'mover', gGHz: 0.01, flux: 0.1 }] },
];

describe('designInWorkers', () => {
  it('gives the designs of this thread bit for bit, in request order, on 2 threads; an error stays with its request', async () => {
    const done: number[] = [];
    const pooled = await designInWorkers(requests, 2, (d) => done.push(d));
    expect(done).toEqual([1, 2, 3, 4, 5]);
    requests.forEach((req, k) => {
      if (req.family === 'no-such-family') {
        expect(pooled[k]).toEqual({ error: expect.stringMatching(/unknown ramp family no-such-family/) });
        return;
      }
      const here = designCzGate(req);
      expect(pooled[k]).toEqual(here);
    });
  }, 120_000);

  it('the wire form of a request rebuilds identical transmons (same spectra to the last bit)', () => {
    const back = requestFromWire(structuredClone(requestToWire(requests[4])));
    for (const [a, b] of [[back.mover, Q1], [back.partner, Q0], [back.spectators![0].transmon, qubit('Q2')]] as const) {
      expect(a.descriptor()).toEqual(b.descriptor());
      for (const x of [0, 0.13, 0.31, 0.5]) expect(a.spectrum(x)).toEqual(b.spectrum(x));
      expect(a.coherence(0.2)).toEqual(b.coherence(0.2));
    }
  });
});
