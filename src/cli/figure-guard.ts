/**
 * The output guard: no figure a command prints or writes may leave its range (a fidelity outside
 * [0, 1], a negative error or leakage, NaN, Infinity where a number is due). Commands pass their
 * figures through a FigureGuard before building the output; the guard stops the command with a
 * message naming the qubit or edge:
 *
 *   - a finite figure outside its range: the layout's values drive the model past where it
 *     holds (e.g. coherence times so short that the first-order decoherence estimate of a gate
 *     exceeds 1): bad input, exit 2, at the qubit's or coupling's place in the layout;
 *   - NaN or Infinity: the computation broke down, which in-range inputs must never cause: an
 *     internal error, exit 70 (please report).
 *
 * A small tolerance (1e-9) absorbs rounding (a leakage of -1e-16 is 0).
 */
import type { ChipLayout } from '../layout/types.js';
import type { ChipPlan } from '../plan/plan.js';
import { InputError, type Diagnostic } from '../util/errors.js';

export const FIGURE_TOLERANCE = 1e-9;

/** What a figure is about: a qubit or an edge (A-B) of the layout. */
export interface FigureSubject {
  qubit?: string;
  edge?: [string, string];
}

export class FigureGuard {
  private readonly outOfRange: Diagnostic[] = [];
  private readonly broken: string[] = [];

  constructor(private readonly layout: ChipLayout) {}

  /** A figure that must be finite and inside [lo, hi]; `cause` says which inputs drive it. */
  range(value: number, lo: number, hi: number, what: string, subject: FigureSubject, cause: string): void {
    if (!Number.isFinite(value)) {
      this.broken.push(`${this.name(subject)}: ${what} is ${value}`);
      return;
    }
    if (value < lo - FIGURE_TOLERANCE || value > hi + FIGURE_TOLERANCE) {
      this.outOfRange.push({
        ...this.where(subject),
        message: `${this.name(subject)}: ${what} ${value} is outside [${lo}, ${hi}]: the layout's values drive the model past where it holds (${cause})`,
      });
    }
  }

  /** A figure that must be a finite number. */
  finite(value: number, what: string, subject: FigureSubject): void {
    if (!Number.isFinite(value)) this.broken.push(`${this.name(subject)}: ${what} is ${value}`);
  }

  /** A probability or fidelity: in [0, 1]. */
  probability(value: number, what: string, subject: FigureSubject, cause: string): void {
    this.range(value, 0, 1, what, subject, cause);
  }

  /** Stop the command if any figure failed (see the banner for the exit codes). */
  throwIfAny(): void {
    if (this.broken.length > 0) {
      throw new Error(`output guard: ${this.broken.slice(0, 3).join('; ')}${this.broken.length > 3 ? `; and ${this.broken.length - 3} more` : ''}: the computation broke down`);
    }
    if (this.outOfRange.length > 0) throw new InputError(this.outOfRange);
  }

  private name(s: FigureSubject): string {
    return s.edge ? `${s.edge[0]}-${s.edge[1]}` : s.qubit ?? this.layout.chip;
  }

  private where(s: FigureSubject): Omit<Diagnostic, 'message'> {
    const file = this.layout.file;
    if (s.edge) {
      const [a, b] = s.edge;
      const c = this.layout.couplings.find((x) => (x.a === a && x.b === b) || (x.a === b && x.b === a));
      if (c && c.source.line > 0) return { file, line: c.source.line, column: c.source.column, path: c.source.path };
    }
    if (s.qubit) {
      const q = this.layout.qubits.find((x) => x.id === s.qubit);
      if (q && q.source.line > 0) return { file, line: q.source.line, column: q.source.column, path: q.source.path };
    }
    return { file };
  }
}

const DECOHERENCE_CAUSE = 'T1 and T_phi so short against the gate that the first-order decoherence estimate leaves its validity; check t1, tphi and fluxNoise of both qubits';

/** The figures of a designed CZ (gate and plan). */
export function guardDesign(
  guard: FigureGuard,
  d: { feasible: boolean; fidelity: number; leakage: number; conditionalPhase: number; durationNs: number; fidelityNoisy?: number; decoherenceEstimate?: number },
  edge: [string, string],
): void {
  if (!d.feasible) return;
  guard.probability(d.fidelity, 'the coherent fidelity', { edge }, 'the gate model');
  guard.probability(d.leakage, 'the leakage', { edge }, 'the gate model');
  guard.range(d.conditionalPhase, -Math.PI, Math.PI, 'the conditional phase', { edge }, 'the gate model');
  guard.range(d.durationNs, 0, Infinity, 'the duration (ns)', { edge }, 'the gate model');
  if (d.fidelityNoisy !== undefined) guard.probability(d.fidelityNoisy, 'the fidelity with decoherence', { edge }, DECOHERENCE_CAUSE);
  if (d.decoherenceEstimate !== undefined) guard.probability(d.decoherenceEstimate, 'the decoherence error estimate', { edge }, DECOHERENCE_CAUSE);
}

/** The figures of a plan (check and plan): parking, spectra, ZZ, margins, designed gates. */
export function guardPlan(guard: FigureGuard, plan: ChipPlan): void {
  const { ctx } = plan;
  ctx.ids.forEach((q, i) => {
    guard.finite(plan.parking.parkingGHz[i], 'the parking frequency', { qubit: q });
    const s = plan.states[i];
    guard.finite(s.flux, 'the parking flux', { qubit: q });
    guard.finite(s.f12GHz, 'f12 at parking', { qubit: q });
    guard.range(s.t1Ns, 0, Infinity, 'T1 (ns)', { qubit: q }, 'the layout\'s t1');
    if (!Number.isNaN(s.t2Ns)) guard.range(s.t2Ns, 0, Infinity, 'T2 at parking (ns)', { qubit: q }, 'the layout\'s coherence');
    else guard.finite(s.t2Ns, 'T2 at parking', { qubit: q });
    const c = plan.crowding.qubits[i];
    if (Number.isNaN(c.marginGHz)) guard.finite(c.marginGHz, 'the collision margin', { qubit: q });
    guard.probability(c.usableFraction, 'the usable fraction of the window', { qubit: q }, 'the window and rules');
  });
  ctx.edges.forEach((e) => {
    if (plan.parking.idle.states[e.a] && plan.parking.idle.states[e.b]) {
      guard.finite(plan.parking.idle.zzGHz[e.index], 'the static ZZ', { edge: [ctx.ids[e.a], ctx.ids[e.b]] });
    }
  });
  plan.gates?.forEach((g, k) => {
    if (!g) return;
    const e = ctx.edges[plan.edges[k].edge];
    guardDesign(guard, g.design, [ctx.ids[e.a], ctx.ids[e.b]]);
  });
}
