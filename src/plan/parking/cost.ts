/**
 * The parking cost the search minimises once every idle rule holds: the predicted error of one
 * reference cycle that the parking choice decides, from the same error model the plan reports
 * (src/budget/), summed over qubits, coupled pairs and defects, plus two small tie-breakers.
 * With f = the qubit's f01 there and t = options.cycleNs (the search's reference idle time,
 * default 1 us; the reported cycle uses the plan's real layers):
 *
 *   idle       the one-qubit idle error over t of src/budget/idle-error.ts without its T1 part
 *              (which does not depend on f): dephasing sqrt(1 - gamma) (1 - c(t)) / 3 with the
 *              white envelope exp(-t / tphi) and the quasi-static 1/f Gaussian
 *              exp(-(2 pi df01/dPhi sigma t)^2 / 2), sigma for an operation of length t; and thermal
 *              excitation (t / T1) exp(-h f / k_B T_eff) / 3. Zero dephasing at the sweet spot:
 *              this is what pulls qubits to their maximum frequency.
 *   zz         (4/5) sin^2(pi zeta t / 2) per coupled pair, the residual-ZZ error of
 *              src/budget/idle-error.ts (zeta from the second-order estimate, calibrated to the
 *              exact value edge by edge).
 *   gate       per coupled pair, the estimated budget (T1, white dephasing, quasi-static flux noise;
 *              src/budget/gate-estimate.ts) of its usual CZ: the higher qubit to its 11-20
 *              crossing, else the lower one to its 11-02 crossing, as one speed limit 1 / (2 g_c)
 *              at the interaction point (the duration model of src/plan/rules/cz-duration.ts); 1 when neither crossing is reachable with room to tune the
 *              destination past it (src/plan/rules/tuning-room.ts) and within the flux excursion
 *              limit (rule cz-excursion). It prefers short excursions to
 *              flat points of the spectrum.
 *   spectators the spectator part of the same gates' estimates, weighed lower than the plan's
 *              (PARKING_SPECTATOR_ERROR_PER_ADMIXTURE, 0.15, below): the summed admixtures
 *              (g_c / Delta)^2 (src/plan/rules/spectator-admixture.ts, each capped at 1) of every
 *              usual CZ whose spectators this qubit's frequency decides: its own gates against the
 *              mover's other neighbours, and its neighbours' gates with their other neighbours
 *              against this qubit (the estimate src/plan/interaction/plan-edge.ts reports).
 *   tls        per listed defect, the hybridised share of the defect's loss over t,
 *              (g_TLS / (f - f_TLS))^2 t / (3 T_TLS), g_TLS = width / 2 and a defect lifetime
 *              T_TLS = 1 us (our assumption: defects seen in spectroscopy are typically short-lived).
 *   band       w_b ((f_max - f) / 1 GHz)^2, a prior, not an error (weight 0.01 per GHz^2, our
 *              choice): the model has a second sweet spot at the bottom of the range, but on
 *              hardware the readout shift falls away from the resonator, charge dispersion grows and
 *              the qubit leaves the band it was designed and characterised for (1 GHz below costs
 *              as much as a gate at the default error ceiling).
 *   margin     w_m sum over blocked intervals of exp(-d / sigma_fab), d = distance to the interval,
 *              sigma_fab the qubit's expected frequency spread (src/plan/exact-state.ts): a
 *              tie-breaker that keeps parking points off the edges of the allowed bands.
 *
 * Being inside a blocked interval of a collision rule costs violationPenalty (1 + depth / width)
 * each, so a point that breaks one is never preferred to one that does not; inside the band where
 * the qubit's own idle error breaks idleErrorLimit (a budget rule) costs IDLE_ERROR_BREAK
 * (1 + depth / width), below every collision rule and an unreachable gate.
 */
import type { PlanContext } from '../context.js';
import type { PlanOptions } from '../options.js';
import { emptyTableState, type TableState } from '../qubit-table.js';
import { secondOrderZz } from '../zz-second-order.js';
import { tuningRoomGHz } from '../rules/tuning-room.js';
import { estimateGateBudget, type GateEstimate, type GateEstimateInput } from '../../budget/gate-estimate.js';
import { H_OVER_KB_K_PER_GHZ, zzIdleError } from '../../budget/idle-error.js';
import { quasiStaticCoherence, quasiStaticFluxSigma } from '../../transmon/coherence.js';
import { shortestGateNs } from '../rules/cz-duration.js';
import { admixtureSumOf } from '../rules/spectator-admixture.js';
import type { Blocker, FrequencyView } from '../rules/idle-blockers.js';

export interface CostParts {
  violation: number;
  soft: number;
}

export class ParkingCost {
  private readonly si = emptyTableState();
  private readonly sx = emptyTableState();
  /** Per-visit cache: gate cost of each neighbour pair when i is the higher qubit (depends on f_j only). */
  private visitI = -1;
  private visitStamp = -1;
  /**
   * The per-visit caches are slots, not maps: slot q for the visited qubit's q-th neighbour j, slot
   * q * maxDegree + p for j's p-th neighbour k. A slot holds an answer while its generation equals
   * `generation`, which beginVisit advances (a new visit forgets every slot at once).
   */
  private generation = 0;
  private readonly maxDegree: number;
  /** Gate cost with neighbour slot q when the visited qubit is the higher one (depends on f_j only). */
  private readonly higherGen: Int32Array;
  private readonly higherVal: Float64Array;
  /** The spectator term's part for neighbour slot q that does not depend on the visited qubit's frequency. */
  private readonly spectatorGen: Int32Array;
  private readonly spectatorVal: Float64Array;
  /** Neighbour j's 11-20 crossing with its neighbour k (NaN: none) and j's table state there. */
  private readonly crossingGen: Int32Array;
  private readonly crossingF: Float64Array;
  private readonly crossingState: TableState[];
  private readonly se = emptyTableState();
  private readonly sc = emptyTableState();
  /** Whether the last gateCost came from the higher qubit's 11-20 crossing (which depends on the lower qubit's frequency only). */
  private lastWasHigherCrossing = false;

  /** Start a visit of qubit i with the others fixed (`stamp` changes whenever any frequency does). */
  beginVisit(i: number, stamp: number): void {
    if (this.visitI === i && this.visitStamp === stamp) return;
    this.visitI = i;
    this.visitStamp = stamp;
    this.generation++;
  }

  /** Every weight of the soft cost is >= 0 (the ceiling of `at` relies on it). */
  private readonly weightsNonNegative: boolean;

  /** Per qubit, aligned with ctx.neighbours: the edge index and the charge coupling G of each neighbour's coupling. */
  private readonly edgeOf: Int32Array[];
  private readonly gOf: Float64Array[];

  constructor(
    private readonly ctx: PlanContext,
    private readonly options: PlanOptions,
  ) {
    this.edgeOf = ctx.neighbourEdges;
    this.gOf = this.edgeOf.map((es) => Float64Array.from(es, (e) => ctx.edges[e].gChargeGHz));
    this.weightsNonNegative = Object.values(options.weights).every((x) => x >= 0) && options.search.violationPenalty >= 0;
    const d = ctx.neighbours.reduce((m, ns) => Math.max(m, ns.length), 0);
    this.maxDegree = d;
    this.higherGen = new Int32Array(d);
    this.higherVal = new Float64Array(d);
    this.spectatorGen = new Int32Array(d);
    this.spectatorVal = new Float64Array(d);
    this.crossingGen = new Int32Array(d * d);
    this.crossingF = new Float64Array(d * d);
    this.crossingState = Array.from({ length: d * d }, () => emptyTableState());
  }

  /**
   * Violation measure and soft cost of qubit i at f (pair terms with active neighbours included).
   *
   * `ceiling`: the caller only asks whether violation + soft < ceiling. Every term of the soft
   * cost is non-negative (with non-negative weights), and a floating-point sum of non-negative
   * terms never falls as terms are added (rounding is monotone), so once the violation plus the
   * terms summed so far reach the ceiling, the full sum does too: the cost then returns that
   * partial sum (a lower bound, at or above the ceiling) without the remaining terms. The answer
   * to the caller's question is the one the full sum gives. Only within a visit (the per-visit
   * caches stay as a full evaluation leaves them).
   */
  at(i: number, f: number, blockers: readonly Blocker[], view: FrequencyView, stamp = -2, ceiling = Infinity): CostParts {
    const cached = stamp === this.visitStamp && i === this.visitI;
    const bound = cached && ceiling < Infinity && this.weightsNonNegative;
    const ctx = this.ctx;
    const w = this.options.weights;
    const T = this.options.cycleNs;
    const table = ctx.tables[i];
    let violation = 0;
    let margin = 0;
    const st = table.at(f, this.si);
    const sigma = Math.max(1e-4, Math.abs(st.df01dEj * st.ejRatio * ctx.transmons[i].ejsGHz) * ctx.rules.resistanceSpread);
    let budgetBreak = 0;
    for (const b of blockers) {
      if (f > b.lo && f < b.hi) {
        const depth = 1 + Math.min(f - b.lo, b.hi - f) / Math.max(b.hi - b.lo, 1e-6);
        if (b.rule === 'idle-error') budgetBreak += depth;
        else violation += depth;
      } else margin += Math.exp(-(f <= b.lo ? b.lo - f : f - b.hi) / sigma);
    }
    let soft = w.margin * margin + IDLE_ERROR_BREAK * budgetBreak;
    const below = table.fMaxGHz - f;
    soft += w.band * below * below;
    soft += w.dephasing * this.idleError(i, f, table.fluxSlopeOf(st));
    const penalty = this.options.search.violationPenalty;
    if (bound && violation * penalty + soft >= ceiling) return { violation: violation * penalty, soft };
    const ni = ctx.neighbours[i];
    for (let q = 0; q < ni.length; q++) {
      const j = ni[q];
      if (!view.active[j]) continue;
      const e = this.edgeOf[i][q];
      const edge = ctx.edges[e];
      const z = view.zzScale[e] * secondOrderZz(st, view.states[j], edge.gChargeGHz);
      soft += w.zz * Math.min(1, zzIdleError(z, T));
      let gate: number;
      if (f >= view.freq[j] && cached) {
        if (this.higherGen[q] === this.generation) gate = this.higherVal[q];
        else {
          gate = this.gateCost(i, f, st, j, view.freq[j], view.states[j], edge.gChargeGHz);
          if (this.lastWasHigherCrossing) {
            this.higherGen[q] = this.generation;
            this.higherVal[q] = gate;
          }
        }
      } else gate = this.gateCost(i, f, st, j, view.freq[j], view.states[j], edge.gChargeGHz);
      soft += w.gate * gate;
      if (bound && violation * penalty + soft >= ceiling) return { violation: violation * penalty, soft };
    }
    // (a point that breaks a rule is ranked by its violation; the spectator term only orders the clean ones)
    if (violation === 0) soft += w.gate * PARKING_SPECTATOR_ERROR_PER_ADMIXTURE * this.spectatorAdmixture(i, f, st, view, cached);
    for (const d of ctx.qubits[i].tls) {
      const g = d.widthGHz / 2;
      const delta = Math.max(Math.abs(f - d.atGHz), d.widthGHz);
      soft += (w.tls * (g / delta) ** 2 * T) / (3 * TLS_LIFETIME_NS);
    }
    return { violation: violation * this.options.search.violationPenalty, soft };
  }

  /**
   * The f-dependent part of qubit i's idle error over the reference cycle: dephasing (white and
   * quasi-static 1/f, first order in the flux slope) and thermal excitation (src/budget/idle-error.ts).
   */
  private idleError(i: number, f: number, slope: number): number {
    const spec = this.ctx.transmons[i].coherenceSpec;
    if (!spec) return 0;
    const T = this.options.cycleNs;
    const r = this.ctx.rules;
    const gamma = -Math.expm1(-T / spec.t1Ns);
    const sigma = quasiStaticFluxSigma(spec.fluxNoisePhi0 ?? 0, T, r.noiseAveragingTimeNs);
    const white = spec.tphiNs !== undefined ? Math.exp(-T / spec.tphiNs) : 1;
    const c = white * quasiStaticCoherence(T, slope, 0, sigma);
    const thermal = r.qubitTemperatureK > 0 ? ((T / spec.t1Ns) * Math.exp(-(H_OVER_KB_K_PER_GHZ * f) / r.qubitTemperatureK)) / 3 : 0;
    return (Math.sqrt(1 - gamma) * (1 - c)) / 3 + thermal;
  }

  /** The estimated budget (T1, white dephasing, quasi-static flux noise) of the usual CZ on the pair (i at fi, j at fj). */
  private gateCost(i: number, fi: number, si: TableState, j: number, fj: number, sj: TableState, gCharge: number): number {
    const hiIsI = fi >= fj;
    const h = hiIsI ? i : j;
    const l = hiIsI ? j : i;
    const fl = hiIsI ? fj : fi;
    const sh = hiIsI ? si : sj;
    const sl = hiIsI ? sj : si;
    const th = this.ctx.tables[h];
    const tl = this.ctx.tables[l];
    this.lastWasHigherCrossing = false;
    // The higher qubit to its 11-20 crossing (its f12 = f01 of the lower one).
    const fInt = th.f01ForF12(fl);
    // A crossing counts only with room to tune the destination past it (src/plan/rules/tuning-room.ts).
    if (fInt !== null) {
      const sx = th.at(fInt, this.sx);
      const gc = gCharge * sx.n12 * sl.n01;
      if (fInt - th.fLowGHz >= tuningRoomGHz(gc) && this.withinExcursion(h, fi >= fj ? fi : fj, fInt)) {
        this.lastWasHigherCrossing = true;
        return this.gateEstimate(h, th.fluxSlopeOf(sx), l, tl.fluxSlopeOf(sl), 'mover', gc);
      }
    }
    // The lower qubit up to its 11-02 crossing (its f01 = f12 of the higher one).
    const f2 = sh.f12;
    if (tl.covers(f2)) {
      const sx = tl.at(f2, this.sx);
      const gc = gCharge * sx.n01 * sh.n12;
      if (this.ctx.ranges[l].hi - f2 >= tuningRoomGHz(gc) && this.withinExcursion(l, fl, f2)) return this.gateEstimate(l, tl.fluxSlopeOf(sx), h, th.fluxSlopeOf(sh), 'partner', gc);
    }
    return 1;
  }

  /**
   * The summed spectator admixtures (src/plan/rules/spectator-admixture.ts admixtureSum) of the
   * usual CZs whose spectators qubit i's frequency decides, with i at f: each gate of i with a
   * neighbour j (the higher of the two moving to its 11-20 crossing, whose f01 there is fixed by
   * the other's f01) against the mover's other neighbours, and each gate of a neighbour j with its
   * other neighbours k, j the higher, against i where it parks. Spectators the interaction stage
   * moves out of the way cost their move instead; this term steers the parking away from needing
   * them. 11-02 gates (the lower qubit up) are left out here.
   */
  private spectatorAdmixture(i: number, f: number, st: TableState, view: FrequencyView, cached: boolean): number {
    const ctx = this.ctx;
    let sum = 0;
    const g = this.gOf;
    // (outside a visit nothing is read from or written to the visit's slots)
    const gen = cached ? this.generation : -1;
    const D = this.maxDegree;
    const ni = ctx.neighbours[i];
    for (let q = 0; q < ni.length; q++) {
      const j = ni[q];
      if (!view.active[j]) continue;
      const fj = view.freq[j];
      if (f >= fj) {
        // i moves to its 11-20 crossing with j: the point is fixed by f_j, the spectators by the others (constant in a visit)
        let c: number;
        if (this.spectatorGen[q] === gen) c = this.spectatorVal[q];
        else {
          c = 0;
          const fInt = ctx.tables[i].f01ForF12(fj);
          if (fInt !== null) {
            const e = ctx.tables[i].at(fInt, this.se);
            for (let p = 0; p < ni.length; p++) {
              const m = ni[p];
              if (m !== j && view.active[m]) c += admixtureSumOf(e, fInt, view.states[m], view.freq[m], g[i][p], true);
            }
          }
          if (cached) {
            this.spectatorGen[q] = gen;
            this.spectatorVal[q] = c;
          }
        }
        sum += c;
      } else {
        // j moves to its 11-20 crossing with i at f; its other neighbours are the spectators
        const fInt = ctx.tables[j].f01ForF12(f);
        if (fInt !== null) {
          const e = ctx.tables[j].at(fInt, this.se);
          const nj = ctx.neighbours[j];
          for (let p = 0; p < nj.length; p++) {
            const m = nj[p];
            if (m !== i && view.active[m]) sum += admixtureSumOf(e, fInt, view.states[m], view.freq[m], g[j][p], true);
          }
        }
      }
      // the gates of j with its other neighbours k (j the higher), i a spectator where it parks
      // (j's crossing and its state there depend on f_k only: remembered for the visit)
      const nj = ctx.neighbours[j];
      for (let p = 0; p < nj.length; p++) {
        const k = nj[p];
        if (k === i || !view.active[k]) continue;
        const fk = view.freq[k];
        if (fj < fk) continue;
        const slot = q * D + p;
        const state = cached ? this.crossingState[slot] : this.sc;
        let fIntJ: number;
        if (this.crossingGen[slot] === gen) fIntJ = this.crossingF[slot];
        else {
          const x = ctx.tables[j].f01ForF12(fk);
          fIntJ = x === null ? NaN : x;
          if (x !== null) ctx.tables[j].at(x, state);
          if (cached) {
            this.crossingGen[slot] = gen;
            this.crossingF[slot] = fIntJ;
          }
        }
        if (fIntJ === fIntJ) sum += admixtureSumOf(state, fIntJ, st, f, g[i][q], true);
      }
    }
    return sum;
  }

  /** The move from f01 = from to f01 = to stays within the flux excursion limit (rule cz-excursion). */
  private withinExcursion(q: number, from: number, to: number): boolean {
    const t = this.ctx.tables[q];
    return Math.abs(t.fluxAt(to) - t.fluxAt(from)) <= this.ctx.rules.maxFluxExcursion;
  }

  private gateEstimate(mover: number, moverSlope: number, partner: number, partnerSlope: number, excited: 'mover' | 'partner', gc: number): number {
    const hold = 1 / (2 * gc);
    const r = this.ctx.rules;
    // df12/dPhi taken equal to df01/dPhi here (they differ by a few per cent in a transmon)
    // (one input and one output object per ParkingCost, filled anew for each of the search's
    // millions of calls: estimateGateBudget only reads the input)
    const x = this.estimateIn;
    x.mover.coherence = this.ctx.transmons[mover].coherenceSpec;
    x.mover.slopeGHz = moverSlope;
    x.mover.slope12GHz = moverSlope;
    x.partner.coherence = this.ctx.transmons[partner].coherenceSpec;
    x.partner.slopeGHz = partnerSlope;
    x.partner.slope12GHz = partnerSlope;
    x.excited = excited;
    x.holdNs = hold;
    x.durationNs = shortestGateNs(gc, r);
    x.averagingTimeNs = r.noiseAveragingTimeNs;
    const est = estimateGateBudget(x, this.estimateOut);
    return est.t1 + est.whiteDephasing + est.fluxNoise;
  }

  private readonly estimateIn: GateEstimateInput = {
    mover: { coherence: undefined, slopeGHz: 0, slope12GHz: 0 },
    partner: { coherence: undefined, slopeGHz: 0, slope12GHz: 0 },
    excited: 'mover', holdNs: 0, rampNs: 0, durationNs: 0, averagingTimeNs: 0,
  };
  private readonly estimateOut: GateEstimate = { t1: 0, whiteDephasing: 0, fluxNoise: 0 };
}

/**
 * Estimated error per unit of summed admixture in the parking's spectator term: 0.15, near the low
 * end of what the three-transmon simulations of the demos give (0.14-1.0 times the admixture;
 * the plan's gate estimates use 0.5, SPECTATOR_ERROR_PER_ADMIXTURE). The parking cannot tell
 * which spectators the interaction stage will move out of the way (they then cost their move, not
 * their admixture), and at 0.5 the term pushed low-group qubits off their sweet spots and into
 * sweeps that no spectator move could clear: on the generated 10 x 10 chip 56 of 180 edges had no
 * clean option before the repair (9 at 0.15), on the 16 x 16 chip 162 collision-rule breaks
 * remained (28 at 0.15), with a higher predicted cycle error on both.
 */
export const PARKING_SPECTATOR_ERROR_PER_ADMIXTURE = 0.15;

/**
 * Cost of parking inside a band where the qubit's own idle error breaks idleErrorLimit (per
 * band, times 1 + depth / width, as a collision rule's violation): a budget rule, ranked below
 * every collision rule (violationPenalty) and an unreachable gate (1), above the kept-parking
 * penalty (0.5) and the differences of the soft cost between allowed points (below 0.1).
 */
export const IDLE_ERROR_BREAK = 0.6;

/** Lifetime assumed for a listed defect in the tls term (ns; our assumption, see the banner). */
export const TLS_LIFETIME_NS = 1000;
