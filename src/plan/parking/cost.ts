/**
 * The parking cost the search minimises once every idle rule holds: an estimate of the error
 * the parking choice adds over one reference cycle t_cycle (default 1 us), summed over qubits,
 * coupled pairs and defects, plus a small robustness term. With f = the qubit's f01 there:
 *
 *   dephasing  w_d (t_cycle / 3) Gamma_1/f(f)
 *              Gamma_1/f = 2 pi A_Phi |df01/dPhi| sqrt|ln(2 pi f_ir t_m)| (src/transmon/coherence.ts);
 *              1 - F_avg = t / (3 T_phi) for pure dephasing of one qubit (F_avg = (2 F_pro + 1) / 3).
 *              Zero at the sweet spot: this is what pulls qubits to their maximum frequency.
 *   zz         w_zz 0.05 (2 pi zeta t_cycle)^2 per coupled pair (capped at 1)
 *              the infidelity of an uncorrected ZZ phase phi = 2 pi zeta t after single-qubit
 *              corrections, 1 - F_avg = 0.8 sin^2(phi / 4) ~ 0.05 phi^2 (derived; d = 4).
 *   gate       w_g (t_CZ / 3) Gamma_1/f(f_int) per coupled pair: the mover's dephasing at its
 *              interaction point during one CZ, t_CZ = 1 / (2 g_c) + 2 rampNs, for the usual
 *              choice (the higher qubit moves to its 11-20 crossing; else the lower one to its
 *              11-02 crossing); 1 when neither crossing is reachable with room to tune the
 *              destination past it (src/plan/rules/tuning-room.ts). It prefers short excursions.
 *   tls        w_tls (g_TLS / (f - f_TLS))^2 per listed defect, g_TLS = width / 2: the qubit's
 *              admixture with the defect (dispersive hybridisation), which sets the loss through it.
 *   band       w_b ((f_max - f) / 1 GHz)^2: a weak preference for the designed band at the upper sweet
 *              spot. The model has a second sweet spot at the bottom of the range (df01/dPhi = 0
 *              at Phi = 1/2) and no term that makes it worse, but on hardware the dispersive
 *              readout shift falls as a qubit moves away from its resonator, charge dispersion
 *              grows and the qubit leaves the band it was designed and characterised for; this
 *              term (0.05 per GHz^2 by default, our choice) stands for those effects, small
 *              enough that any rule or real error term outweighs it.
 *   margin     w_m sum over blocked intervals of exp(-d / sigma_fab), d = distance to the interval,
 *              sigma_fab the qubit's expected frequency spread (src/plan/exact-state.ts): keeps
 *              parking points off the edges of the allowed bands.
 *
 * Being inside a blocked interval costs violationPenalty (1 + depth / width) each, so a point
 * that breaks a rule is never preferred to one that does not.
 */
import type { PlanContext } from '../context.js';
import type { PlanOptions } from '../options.js';
import { emptyTableState, type TableState } from '../qubit-table.js';
import { secondOrderZz } from '../zz-second-order.js';
import { tuningRoomGHz } from '../rules/tuning-room.js';
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
  private readonly higher = new Map<number, number>();
  /** Whether the last gateCost came from the higher qubit's 11-20 crossing (which depends on the lower qubit's frequency only). */
  private lastWasHigherCrossing = false;

  /** Start a visit of qubit i with the others fixed (`stamp` changes whenever any frequency does). */
  beginVisit(i: number, stamp: number): void {
    if (this.visitI === i && this.visitStamp === stamp) return;
    this.visitI = i;
    this.visitStamp = stamp;
    this.higher.clear();
  }

  constructor(
    private readonly ctx: PlanContext,
    private readonly options: PlanOptions,
  ) {}

  /** Violation measure and soft cost of qubit i at f (pair terms with active neighbours included). */
  at(i: number, f: number, blockers: readonly Blocker[], view: FrequencyView, stamp = -2): CostParts {
    const cached = stamp === this.visitStamp && i === this.visitI;
    const ctx = this.ctx;
    const w = this.options.weights;
    const T = this.options.cycleNs;
    const table = ctx.tables[i];
    let violation = 0;
    let margin = 0;
    const st = table.at(f, this.si);
    const sigma = Math.max(1e-4, Math.abs(st.df01dEj * st.ejRatio * ctx.transmons[i].ejsGHz) * ctx.rules.resistanceSpread);
    for (const b of blockers) {
      if (f > b.lo && f < b.hi) violation += 1 + Math.min(f - b.lo, b.hi - f) / Math.max(b.hi - b.lo, 1e-6);
      else margin += Math.exp(-(f <= b.lo ? b.lo - f : f - b.hi) / sigma);
    }
    let soft = w.margin * margin;
    const below = table.fMaxGHz - f;
    soft += w.band * below * below;
    soft += (w.dephasing * T * table.fluxNoiseRateOf(st)) / 3;
    for (const j of ctx.neighbours[i]) {
      if (!view.active[j]) continue;
      const e = ctx.edgeBetween(i, j);
      const edge = ctx.edges[e];
      const z = view.zzScale[e] * secondOrderZz(st, view.states[j], edge.gChargeGHz);
      const phi = 2 * Math.PI * z * T;
      soft += w.zz * Math.min(1, 0.05 * phi * phi);
      let gate: number;
      if (f >= view.freq[j] && cached) {
        let c = this.higher.get(j);
        if (c === undefined) {
          c = this.gateCost(i, f, st, j, view.freq[j], view.states[j], edge.gChargeGHz);
          if (this.lastWasHigherCrossing) this.higher.set(j, c);
        }
        gate = c;
      } else gate = this.gateCost(i, f, st, j, view.freq[j], view.states[j], edge.gChargeGHz);
      soft += w.gate * gate;
    }
    for (const d of ctx.qubits[i].tls) {
      const g = d.widthGHz / 2;
      const delta = Math.max(Math.abs(f - d.atGHz), d.widthGHz);
      soft += w.tls * (g / delta) ** 2;
    }
    return { violation: violation * this.options.search.violationPenalty, soft };
  }

  /** (t_CZ / 3) Gamma_1/f(f_int) of the usual CZ on the pair (i at fi, j at fj). */
  private gateCost(i: number, fi: number, si: TableState, j: number, fj: number, sj: TableState, gCharge: number): number {
    const hiIsI = fi >= fj;
    const h = hiIsI ? i : j;
    const l = hiIsI ? j : i;
    const fl = hiIsI ? fj : fi;
    const sh = hiIsI ? si : sj;
    const sl = hiIsI ? sj : si;
    const th = this.ctx.tables[h];
    const tl = this.ctx.tables[l];
    const ramp = 2 * this.options.rampNs;
    this.lastWasHigherCrossing = false;
    // The higher qubit to its 11-20 crossing (its f12 = f01 of the lower one).
    const fInt = th.f01ForF12(fl);
    // A crossing counts only with room to tune the destination past it (src/plan/rules/tuning-room.ts).
    if (fInt !== null) {
      const sx = th.at(fInt, this.sx);
      const gc = gCharge * sx.n12 * sl.n01;
      if (fInt - th.fLowGHz >= tuningRoomGHz(gc)) {
        this.lastWasHigherCrossing = true;
        return ((1 / (2 * gc) + ramp) * th.fluxNoiseRateOf(sx)) / 3;
      }
    }
    // The lower qubit up to its 11-02 crossing (its f01 = f12 of the higher one).
    const f2 = sh.f12;
    if (tl.covers(f2)) {
      const sx = tl.at(f2, this.sx);
      const gc = gCharge * sx.n01 * sh.n12;
      if (this.ctx.ranges[l].hi - f2 >= tuningRoomGHz(gc)) return ((1 / (2 * gc) + ramp) * tl.fluxNoiseRateOf(sx)) / 3;
    }
    return 1;
  }
}
