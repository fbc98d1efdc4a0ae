/**
 * What a plan was made for: each qubit's device parameters as the layout gave them, resolved
 * (SI: Hz, s; flux noise in Phi0), so a later plan of a re-measured chip can say what changed
 * (`fluxlane plan --from`, `fluxlane diff`).
 */
import type { PlanContext } from '../plan/context.js';
import { plain, toHz, toSeconds } from '../plan/format.js';

export function deviceJson(ctx: PlanContext, i: number): Record<string, unknown> {
  const t = ctx.transmons[i];
  const q = ctx.qubits[i];
  return {
    fMax: toHz(t.fMaxGHz),
    fMin: toHz(t.fMinGHz),
    anharmonicity: toHz(t.anharmonicityMaxGHz),
    ec: toHz(t.ecGHz),
    ejMax: toHz(t.ejsGHz),
    asymmetry: plain(t.asymmetry),
    t1: toSeconds(q.t1Ns),
    tphi: q.tphiNs === undefined ? null : toSeconds(q.tphiNs),
    fluxNoise: q.fluxNoisePhi0 === undefined ? null : plain(q.fluxNoisePhi0),
    tls: q.tls.map((d) => ({ at: toHz(d.atGHz), width: toHz(d.widthGHz) })),
    readout: q.readoutGHz === undefined ? null : toHz(q.readoutGHz),
  };
}
