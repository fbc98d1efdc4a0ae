/**
 * Options of the planner, merged with frozen DEFAULTS. Every weight of the parking cost is an
 * estimated error over one reference cycle (see src/plan/parking/cost.ts for the formulas).
 */
import { QUBIT_TABLE_DEFAULTS, type QubitTableOptions } from './qubit-table.js';
import type { KeepParking } from './parking/keep.js';

/**
 * Multipliers of the parking cost's terms (src/plan/parking/cost.ts). The error terms (idle,
 * zz, gate, tls) are predicted errors of one reference cycle and weigh 1: the planner minimises
 * the cycle's error, not a mix of hand-set weights; change them only to study a term's effect.
 * `band` and `margin` are the weights of the two tie-breakers.
 */
export interface CostWeights {
  /** The f-dependent idle error of a qubit (dephasing, thermal excitation). */
  dephasing: number;
  /** Residual ZZ error of a coupled pair over the cycle. */
  zz: number;
  /** The estimated budget of the pair's usual CZ. */
  gate: number;
  /** The defects' hybridised loss. */
  tls: number;
  /** Prior for the designed band: ((f_max - f) / 1 GHz)^2. */
  band: number;
  /** Robustness: sum over blocked intervals of exp(-distance / sigma_fab). */
  margin: number;
}

export interface ParkingSearchOptions {
  /** Full sweeps of the local search per calibration round. */
  sweeps: number;
  /** Random kicks allowed when a sweep is stuck with violations. */
  kicks: number;
  /** Rounds of (search, exact ZZ, recalibration). */
  calibrationRounds: number;
  /** The search aims at zzLimit * (1 - zzSafety), so the exact check has headroom. */
  zzSafety: number;
  /** Candidates are nudged this far inside an allowed interval (GHz). */
  nudgeGHz: number;
  /** Cost of being inside one blocked interval (dominates every soft term). */
  violationPenalty: number;
}

export interface PlanOptions {
  /** Seed of the local search (src/util/random.ts). */
  seed: number;
  /**
   * Reference idle time of the parking search (ns): about one error-correction cycle (common
   * practice). The plan's reported cycle uses its real layers (src/plan/cycle-budget.ts).
   */
  cycleNs: number;
  /**
   * Ramp time assumed for each sweep from parking to the interaction point when no pulse is
   * designed (ns): sets the Landau-Zener sweep rate v = |f_int - f_park| / rampNs. Designed gates
   * use their own waveforms.
   */
  rampNs: number;
  /**
   * Shortest ramp the planner may fall back to (ns) when no option of an edge clears the rules with
   * rampNs: it then tries 10, 7.5 and 5 ns (those between this and rampNs). A faster sweep passes
   * weak crossings (defects, next-nearest neighbours) more diabatically and shortens the gate.
   */
  minRampNs: number;
  weights: CostWeights;
  search: ParkingSearchOptions;
  table: QubitTableOptions;
  /** Parking (and edge options) kept from an earlier plan when re-planning (./parking/keep.ts); none by default. */
  keep?: KeepParking;
}

export const PLAN_DEFAULTS: Readonly<PlanOptions> = Object.freeze({
  seed: 1,
  cycleNs: 1000,
  rampNs: 15,
  minRampNs: 5,
  weights: Object.freeze({ dephasing: 1, zz: 1, gate: 1, tls: 1, band: 0.01, margin: 1e-3 }),
  search: Object.freeze({ sweeps: 40, kicks: 200, calibrationRounds: 4, zzSafety: 0.05, nudgeGHz: 5e-4, violationPenalty: 1000 }),
  table: QUBIT_TABLE_DEFAULTS,
});

export type PlanOptionsInput = Partial<Omit<PlanOptions, 'weights' | 'search' | 'table'>> & {
  weights?: Partial<CostWeights>;
  search?: Partial<ParkingSearchOptions>;
  table?: Partial<QubitTableOptions>;
};

export function planOptions(input: PlanOptionsInput = {}): PlanOptions {
  return {
    ...PLAN_DEFAULTS,
    ...input,
    weights: { ...PLAN_DEFAULTS.weights, ...input.weights },
    search: { ...PLAN_DEFAULTS.search, ...input.search },
    table: { ...PLAN_DEFAULTS.table, ...input.table },
  };
}
