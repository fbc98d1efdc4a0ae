/**
 * Spectator parking: a temporary frequency for a qubit that gets in the way of a CZ (a neighbour
 * or next-nearest neighbour of the mover), inside its planning range (not its window: the window
 * bounds idle parking only), reached before the mover ramps and left after it returns.
 *
 * The qubit's f01 = x must avoid, as blocked intervals (src/plan/intervals.ts):
 *   the mover's interaction point:  the spectator admixture checks (../rules/spectator-admixture.ts)
 *                                   as bands g_c / sqrt(spectatorAdmixture) wide around the mover's
 *                                   f01, f12 (and f23 when it reaches |2>), in P's f01 or f12;
 *                                   on an 11-02 crossing also around the partner's f12 and f23
 *                                   for the partner's other neighbours;
 *                                   for a next-nearest neighbour only [to - t, to + t], t = detuningNext0101;
 *   the mover's sweep (neighbours): the swept band itself, its image under f12_A, and
 *                                   {x : f12(x) in the band} (a direct crossing is never fast enough);
 *   its own idle rules at x:        01-01, 01-12, next-01-01, tls, readout against the others
 *                                   where they are during the gate (the mover excepted);
 * and its own path from parking to x must not cross a coupled neighbour's 01-01, 11-20 or 11-02
 * point or one of its defects (the nearest such points below and above bound the reachable band).
 * Candidates: in each allowed interval the point nearest the parking frequency, placed
 * PARKING_MARGIN_GHZ inside the interval when it is wide enough (else in its middle), so the moved
 * spectator keeps a margin of its own; in a wide interval also its middle and its far side. Nearest
 * first; the caller picks among them (the nearest that clears the rules, or the least estimated error).
 * The caller re-checks the whole gate exactly (src/plan/rules/cz-evaluate.ts).
 */
import type { PlanContext } from '../context.js';
import { subtract, type Interval } from '../intervals.js';
import type { IdleBlockers } from '../rules/idle-blockers.js';
import type { DuringGate, GateScenario } from '../rules/cz-evaluate.js';
import { admixtureHalfWidth } from '../rules/spectator-admixture.js';
import { emptyTableState } from '../qubit-table.js';


/** How far inside its allowed band a moved spectator is placed when the band is wide enough (GHz; our choice). */
export const PARKING_MARGIN_GHZ = 0.02;

export interface SpectatorParkingSearch {
  /** Candidate temporary frequencies, nearest to parking first (empty when none is allowed). */
  points: number[];
  /** The band the qubit can reach from parking without crossing a direct resonance. */
  reachable: Interval;
}

/** Candidate temporary frequencies for qubit P during the gate of `s`. */
export function spectatorParkingCandidates(ctx: PlanContext, blockers: IdleBlockers, s: GateScenario, P: number): SpectatorParkingSearch {
  const r = ctx.rules;
  const A = s.mover;
  const tp = ctx.tables[P];
  const f0 = s.parking[P].f01GHz;
  const during = (q: number): DuringGate => (q === P ? s.parking[P] : s.parked.get(q) ?? s.parking[q]);
  const coupledToMover = ctx.edgeBetween(A, P) >= 0;
  const blocked: Interval[] = [];
  const push = (iv: Interval | null) => {
    if (iv && iv.hi > iv.lo) blocked.push(iv);
  };
  const to = s.toGHz;
  const limit = r.spectatorAdmixture;
  // its own object: the table's shared scratch is overwritten by the f12 preimages below
  const sp = tp.at(f0, emptyTableState());
  // The admixture checks of ../rules/spectator-admixture.ts as bands of P's f01 (P's matrix
  // elements taken at its parking point; the caller checks the chosen point exactly).
  const admixtureBands = (E: number, fE: number, withLevel2: boolean) => {
    const e = ctx.tables[E].at(fE);
    const G = ctx.edges[ctx.edgeBetween(E, P)].gChargeGHz;
    const w = (nE: number, nP: number) => admixtureHalfWidth(Math.abs(G * nE * nP), limit);
    const w00 = w(e.n01, sp.n01);
    push({ lo: fE - w00, hi: fE + w00 });
    const w10 = w(e.n12, sp.n01);
    push({ lo: e.f12 - w10, hi: e.f12 + w10 });
    const w01 = w(e.n01, sp.n12);
    push(blockers.f12Preimage(P, fE - w01, fE + w01));
    if (withLevel2) {
      const w11 = w(e.n12, sp.n12);
      push(blockers.f12Preimage(P, e.f12 - w11, e.f12 + w11));
      const w20 = w(e.n23, sp.n01);
      const f23 = e.e3 - e.e2;
      push({ lo: f23 - w20, hi: f23 + w20 });
    }
  };
  if (coupledToMover) {
    admixtureBands(A, to, s.crossing === '11-20');
    const lo = Math.min(s.fromGHz, to);
    const hi = Math.max(s.fromGHz, to);
    push({ lo, hi });
    const ta = ctx.tables[A];
    push({ lo: ta.at(lo).f12, hi: ta.at(hi).f12 });
    push(blockers.f12Preimage(P, lo, hi));
  }
  if (s.crossing === '11-02' && P !== s.partner && ctx.edgeBetween(s.partner, P) >= 0) admixtureBands(s.partner, s.parking[s.partner].f01GHz, true);
  if (!coupledToMover) {
    push({ lo: to - r.detuningNext0101GHz, hi: to + r.detuningNext0101GHz });
  }
  // Its own idle rules at the temporary point.
  const barriers: number[] = [];
  for (const X of ctx.neighbours[P]) {
    const x = X === A ? s.parking[A] : during(X);
    barriers.push(x.f01GHz, x.f12GHz);
    const pre = tp.f01ForF12(x.f01GHz);
    if (pre !== null) barriers.push(pre);
    if (X === A) continue;
    push({ lo: x.f01GHz - r.detuning0101GHz, hi: x.f01GHz + r.detuning0101GHz });
    push({ lo: x.f12GHz - r.detuning0112GHz, hi: x.f12GHz + r.detuning0112GHz });
    push(blockers.f12Preimage(P, x.f01GHz - r.detuning0112GHz, x.f01GHz + r.detuning0112GHz));
  }
  for (const p of ctx.nextNearestOf[P]) {
    const pair = ctx.nextNearest[p];
    const K = pair.a === P ? pair.b : pair.a;
    if (K === A) continue;
    const fk = during(K).f01GHz;
    push({ lo: fk - r.detuningNext0101GHz, hi: fk + r.detuningNext0101GHz });
  }
  for (const d of ctx.qubits[P].tls) {
    const w = d.widthGHz + r.tlsClearanceGHz;
    push({ lo: d.atGHz - w, hi: d.atGHz + w });
    barriers.push(d.atGHz);
  }
  const rd = ctx.qubits[P].readoutGHz;
  if (rd !== undefined) push({ lo: rd - r.readoutDetuningGHz, hi: rd + r.readoutDetuningGHz });
  // The band reachable without crossing a direct resonance, kept spectatorRangeMarginSpreads
  // expected fabrication spreads inside the tunable range (a drawn chip's range ends move with its
  // junctions; sigma_f as src/plan/parking/state.ts sigmaAt, at each end).
  const keep = r.spectatorRangeMarginSpreads;
  let below = keep > 0 ? tp.fLowGHz + keep * fabricationSpreadAt(ctx, P, tp.fLowGHz) : tp.fLowGHz;
  let above = keep > 0 ? tp.fMaxGHz - keep * fabricationSpreadAt(ctx, P, tp.fMaxGHz) : tp.fMaxGHz;
  for (const b of barriers) {
    if (b < f0 - 1e-9 && b > below) below = b;
    if (b > f0 + 1e-9 && b < above) above = b;
  }
  const allowed = below < above ? subtract({ lo: below, hi: above }, blocked) : [];
  const inside = PARKING_MARGIN_GHZ;
  const points: number[] = [];
  for (const a of allowed) {
    if (a.hi - a.lo < 1e-6) continue;
    const dn = Math.min(inside, (a.hi - a.lo) / 2);
    const x = f0 < a.lo ? a.lo + dn : f0 > a.hi ? a.hi - dn : f0;
    points.push(x);
    // deeper into a wide band too (its middle and far side): further from the gate's levels, the
    // caller may find a smaller error there (src/plan/interaction/plan-edge.ts bestSpectatorPoint)
    if (a.hi - a.lo > 4 * inside) {
      const far = x <= 0.5 * (a.lo + a.hi) ? a.hi - inside : a.lo + inside;
      points.push(0.5 * (a.lo + a.hi), far);
    }
  }
  return {
    points: points.filter((x) => Math.abs(x - f0) > 1e-9).sort((x, y) => Math.abs(x - f0) - Math.abs(y - f0) || x - y),
    reachable: { lo: below, hi: above },
  };
}

/**
 * Expected fabrication spread of qubit q's f01 at f (GHz): |df01/dE_J| E_J resistanceSpread from
 * the tabulated spectrum (the expected frequency spread of src/plan/exact-state.ts; E_J ~ 1/R_n).
 */
export function fabricationSpreadAt(ctx: PlanContext, q: number, f: number): number {
  const st = ctx.tables[q].at(f, emptyTableState());
  return Math.abs(st.df01dEj * st.ejRatio * ctx.transmons[q].ejsGHz) * ctx.rules.resistanceSpread;
}
