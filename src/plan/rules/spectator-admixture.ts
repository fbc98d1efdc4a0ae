/**
 * Spectator conditions during a CZ as admixtures (README physics conventions sec. 5).
 *
 * While a CZ runs, the qubit that carries the excitation (the mover on an 11-20 crossing; on an
 * 11-02 crossing the mover and, in |2>, the partner) sits at its gate frequencies and occupies
 * |1> (and |2>); each other neighbour S sits still in |0> or |1>. A transition k -> k+1 of the
 * excited qubit E and a transition l -> l+1 of S exchange energy through the charge coupling
 * G n_E n_S with coupling g_c = G |<k|n|k+1>_E| |<l|n|l+1>_S|; at distance Delta between the two
 * transition frequencies the states mix with amplitude about g_c / Delta, so the admixture
 * (g_c / Delta)^2 is what the rule `spectatorAdmixture` limits (it replaces a fixed distance: it
 * scales with the coupling). The pairs that can meet (E in |1> or |2>, S in |0> or |1>):
 *
 *   cz-spectator-01-01  E 0-1 vs S 0-1   |10> <-> |01>         (E in |1>)
 *   cz-spectator-11-02  E 0-1 vs S 1-2   |11> <-> |02>         (E in |1>, S in |1>)
 *   cz-spectator-11-20  E 1-2 vs S 0-1   |11> <-> |20>         (E in |1>, S in |1>; or E in |2>)
 *   cz-spectator-21-12  E 1-2 vs S 1-2   |21> <-> |12>         (E in |2>, S in |1>)
 *   cz-spectator-21-30  E 2-3 vs S 0-1   |21> <-> |30>         (E in |2>, S in |1>)
 *
 * (the last two only when E reaches |2>, labels |E S>). Three-transmon simulations of the demos
 * show each of them costing percent-level errors when the admixture is a few per cent
 * (src/budget/spectator-error.ts). Frequencies and matrix elements come from the qubit tables
 * (src/plan/qubit-table.ts; f01 exact where given).
 */
import type { PlanContext } from '../context.js';
import { emptyTableState, type TableState } from '../qubit-table.js';
import type { RuleName } from './catalogue.js';

export interface AdmixtureCheck {
  rule: RuleName;
  /** Transition frequencies of E and S compared (GHz). */
  excitedGHz: number;
  spectatorGHz: number;
  /** |difference| (GHz). */
  distanceGHz: number;
  couplingGHz: number;
  /** (g_c / Delta)^2. */
  admixture: number;
  /** Names of the transitions, for messages ("f12", "f23"). */
  excitedTransition: string;
  spectatorTransition: string;
}

export { SPECTATOR_ERROR_PER_ADMIXTURE } from '../../budget/spectator-error.js';

const scratchE = emptyTableState();
const scratchS = emptyTableState();

/**
 * The admixture checks of excited qubit E (f01 = fE, table state there) against spectator S
 * (f01 = fS), coupling charge G; `withLevel2`: E reaches |2> during the gate.
 */
export function admixtureChecks(ctx: PlanContext, E: number, fE: number, S: number, fS: number, gChargeGHz: number, withLevel2: boolean): AdmixtureCheck[] {
  lastCtx = null;
  const e: TableState = ctx.tables[E].at(fE, scratchE);
  const s: TableState = ctx.tables[S].at(fS, scratchS);
  const e12 = e.f12;
  const e23 = e.e3 - e.e2;
  const s12 = s.f12;
  const out: AdmixtureCheck[] = [];
  const G = gChargeGHz;
  out.push(admixtureCheck('cz-spectator-01-01', fE, fS, G, e.n01, s.n01, 'f01', 'f01'));
  out.push(admixtureCheck('cz-spectator-11-02', fE, s12, G, e.n01, s.n12, 'f01', 'f12'));
  out.push(admixtureCheck('cz-spectator-11-20', e12, fS, G, e.n12, s.n01, 'f12', 'f01'));
  if (withLevel2) {
    out.push(admixtureCheck('cz-spectator-21-12', e12, s12, G, e.n12, s.n12, 'f12', 'f12'));
    out.push(admixtureCheck('cz-spectator-21-30', e23, fS, G, e.n23, s.n01, 'f23', 'f01'));
  }
  return out;
}

/**
 * The checks of admixtureChecks whose admixture is not within `limit` (not <= limit), in the same
 * order and with the same fields; the others are not built (the rule evaluation of every gate
 * scenario asks, and most checks pass).
 */
export function admixtureChecksBeyond(ctx: PlanContext, E: number, fE: number, S: number, fS: number, gChargeGHz: number, withLevel2: boolean, limit: number): AdmixtureCheck[] {
  const e: TableState = ctx.tables[E].at(fE, scratchE);
  const s: TableState = ctx.tables[S].at(fS, scratchS);
  lastCtx = ctx;
  lastEState = e;
  lastSState = s;
  lastE = E;
  lastFE = fE;
  lastS = S;
  lastFS = fS;
  const e12 = e.f12;
  const s12 = s.f12;
  const G = gChargeGHz;
  let out: AdmixtureCheck[] | null = null;
  if (!(admixtureOf(fE, fS, G, e.n01, s.n01) <= limit)) (out ??= []).push(admixtureCheck('cz-spectator-01-01', fE, fS, G, e.n01, s.n01, 'f01', 'f01'));
  if (!(admixtureOf(fE, s12, G, e.n01, s.n12) <= limit)) (out ??= []).push(admixtureCheck('cz-spectator-11-02', fE, s12, G, e.n01, s.n12, 'f01', 'f12'));
  if (!(admixtureOf(e12, fS, G, e.n12, s.n01) <= limit)) (out ??= []).push(admixtureCheck('cz-spectator-11-20', e12, fS, G, e.n12, s.n01, 'f12', 'f01'));
  if (withLevel2) {
    const e23 = e.e3 - e.e2;
    if (!(admixtureOf(e12, s12, G, e.n12, s.n12) <= limit)) (out ??= []).push(admixtureCheck('cz-spectator-21-12', e12, s12, G, e.n12, s.n12, 'f12', 'f12'));
    if (!(admixtureOf(e23, fS, G, e.n23, s.n01) <= limit)) (out ??= []).push(admixtureCheck('cz-spectator-21-30', e23, fS, G, e.n23, s.n01, 'f23', 'f01'));
  }
  return out ?? NONE;
}

const NONE: AdmixtureCheck[] = [];

/** Arguments and table states of the last admixtureChecksBeyond (the states are scratch: valid until the next look-up here, which clears lastCtx or sets them anew). */
let lastE = -1;
let lastFE = NaN;
let lastS = -1;
let lastFS = NaN;
let lastCtx: PlanContext | null = null;
let lastEState: TableState = scratchE;
let lastSState: TableState = scratchS;

/**
 * admixtureSum(ctx, E, fE, S, fS, G, withLevel2) right after admixtureChecksBeyond(ctx, E, fE, S,
 * fS, ...) asked for the same E, fE, S and fS: from the table states it looked up (the same
 * doubles a new look-up gives), without looking them up again. Throws when called otherwise.
 */
export function lastAdmixtureSum(ctx: PlanContext, E: number, fE: number, S: number, fS: number, gChargeGHz: number, withLevel2: boolean): number {
  if (lastCtx !== ctx || E !== lastE || S !== lastS || !Object.is(fE, lastFE) || !Object.is(fS, lastFS)) {
    throw new Error('lastAdmixtureSum: not right after admixtureChecksBeyond with the same qubits and frequencies');
  }
  return admixtureSumOf(lastEState, fE, lastSState, fS, gChargeGHz, withLevel2);
}

/** The admixture of admixtureCheck (the same arithmetic). */
function admixtureOf(a: number, b: number, gChargeGHz: number, n1: number, n2: number): number {
  const g = Math.abs(gChargeGHz * n1 * n2);
  const d = Math.abs(a - b);
  return d > 0 ? (g / d) ** 2 : Infinity;
}

/** One check of admixtureChecks (module level: no closure made per call on the planner's hot path). */
function admixtureCheck(rule: RuleName, a: number, b: number, gChargeGHz: number, n1: number, n2: number, ta: string, tb: string): AdmixtureCheck {
  const g = Math.abs(gChargeGHz * n1 * n2);
  const d = Math.abs(a - b);
  return { rule, excitedGHz: a, spectatorGHz: b, distanceGHz: d, couplingGHz: g, admixture: d > 0 ? (g / d) ** 2 : Infinity, excitedTransition: ta, spectatorTransition: tb };
}

/**
 * The sum over the checks of admixtureChecks of min(1, (g_c / Delta)^2), without building them
 * (the parking cost calls it in its inner loop; src/plan/interaction/plan-edge.ts estimateEdgeBudget
 * turns it into an error estimate). The same numbers as summing admixtureChecks (tested).
 */
export function admixtureSum(ctx: PlanContext, E: number, fE: number, S: number, fS: number, gChargeGHz: number, withLevel2: boolean): number {
  lastCtx = null;
  return admixtureSumOf(ctx.tables[E].at(fE, scratchE), fE, ctx.tables[S].at(fS, scratchS), fS, gChargeGHz, withLevel2);
}

/**
 * admixtureSum with the two table states given (E's at fE, S's at fS, as their tables return
 * them): the parking cost keeps the states it has already looked up.
 */
export function admixtureSumOf(e: TableState, fE: number, s: TableState, fS: number, gChargeGHz: number, withLevel2: boolean): number {
  const G = gChargeGHz;
  let sum = admixtureTerm(fE, fS, G * e.n01 * s.n01) + admixtureTerm(fE, s.f12, G * e.n01 * s.n12) + admixtureTerm(e.f12, fS, G * e.n12 * s.n01);
  if (withLevel2) sum += admixtureTerm(e.f12, s.f12, G * e.n12 * s.n12) + admixtureTerm(e.e3 - e.e2, fS, G * e.n23 * s.n01);
  return sum;
}

/**
 * One term of admixtureSumOf: min(1, (g / (a - b))^2), 1 at a = b. A module-level function, not a
 * closure made on each call: the parking cost calls admixtureSumOf millions of times on a large
 * chip, and a closure made per call (named by the TypeScript runner's helper) cost more than the
 * arithmetic.
 */
function admixtureTerm(a: number, b: number, g: number): number {
  const d = a - b;
  return d === 0 ? 1 : Math.min(1, (g * g) / (d * d));
}

/**
 * The half-width (GHz) of the band of spectator frequencies a check blocks: |Delta| below
 * g_c / sqrt(limit) breaks the admixture limit.
 */
export function admixtureHalfWidth(couplingGHz: number, limit: number): number {
  return couplingGHz / Math.sqrt(limit);
}
