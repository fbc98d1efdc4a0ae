/**
 * Why no parking exists: the smallest set of qubits whose windows, fixed values and idle rules
 * cannot all hold, said in words a designer can act on, e.g.
 *
 *     Q7: window 5.100-5.400 GHz is fully blocked by Q3 01-01 and Q8 01-12
 *
 * Method (a deletion filter for an irreducible infeasible subset: Chinneck and Dravnieks, ORSA
 * J. Comput. 3, 157 (1991)): group the broken rules into clusters of qubits, take each cluster
 * with its neighbours and next-nearest neighbours, confirm that this subset alone has no
 * assignment (same search, same rules, only the subset's qubits and the rules among them), then
 * drop qubits one at a time while the rest stays infeasible. What is left is minimal: removing any
 * one of its qubits (with the rules it takes part in) makes the rest plannable. The words come
 * from the subset's best assignment: each qubit whose allowed set is empty, with the fewest
 * blocked intervals that cover its window (src/plan/intervals.ts minimalCover).
 *
 * "Infeasible" here means: the planner's search finds no assignment. The search is a heuristic,
 * so the core is minimal with respect to it; for the small subsets this runs on it is thorough.
 */
import { RULE_SPECS } from '../../layout/rules.js';
import { Random } from '../../util/random.js';
import type { PlanContext } from '../context.js';
import { band, ghz, mhz, khz } from '../format.js';
import { minimalCover } from '../intervals.js';
import type { PlanOptions } from '../options.js';
import { ruleByName, type RuleName } from '../rules/catalogue.js';
import type { Finding } from '../rules/findings.js';
import type { Blocker } from '../rules/idle-blockers.js';
import { allViolating, construct, constructionOrder, localSearch } from './search.js';
import { ParkingState } from './state.js';

export interface Explanation {
  /** What cannot be planned: the parking of some qubits, or the CZ of an edge. */
  kind: 'parking' | 'edge';
  /** The qubits of the minimal conflicting set, in layout order. */
  qubits: string[];
  /** The rules in conflict. */
  rules: RuleName[];
  /** One paragraph. */
  message: string;
  /** One line per qubit whose window is blocked, plus the constraints of the others. */
  lines: string[];
}

const SUBSET_LIMITS = Object.freeze({ sweeps: 25, kicks: 120 });

export function explainInfeasible(ctx: PlanContext, options: PlanOptions, main: ParkingState, groups: readonly number[], violations: readonly Finding[]): Explanation[] {
  const out: Explanation[] = [];
  const windowQubits = new Set<number>();
  // Windows that miss the tunable range are their own explanation.
  for (let i = 0; i < ctx.n; i++) {
    if (ctx.domains[i] !== null && (ctx.fixed[i] === undefined || inRange(ctx, i, ctx.fixed[i]!))) continue;
    windowQubits.add(i);
    const r = ctx.ranges[i];
    const w = ctx.qubits[i].windowGHz;
    const id = ctx.ids[i];
    const line = ctx.domains[i] === null
      ? `${id}: window ${band(w![0], w![1])} lies outside its planning range ${band(r.lo, r.hi)} (tunable range up to the sweet spot, E_J/E_C >= 30)`
      : `${id}: fixed park ${ghz(ctx.fixed[i]!)} lies outside its window or planning range ${band(ctx.domains[i]!.lo, ctx.domains[i]!.hi)}`;
    out.push({ kind: 'parking', qubits: [id], rules: ['window'], message: `${line}. Move the window or the park value, or change the transmon parameters.`, lines: [line] });
  }
  // Clusters of qubits in broken rules.
  const parent = ctx.ids.map((_, i) => i);
  const find = (x: number): number => (parent[x] === x ? x : (parent[x] = find(parent[x])));
  const inViolation = new Set<number>();
  for (const v of violations) {
    if (v.rule === 'window') continue;
    const idx = v.qubits.map((q) => ctx.index.get(q)!).filter((i) => !windowQubits.has(i));
    for (const i of idx) inViolation.add(i);
    for (let k = 1; k < idx.length; k++) parent[find(idx[k])] = find(idx[0]);
  }
  const clusters = new Map<number, number[]>();
  for (const i of [...inViolation].sort((a, b) => a - b)) {
    const root = find(i);
    clusters.set(root, [...(clusters.get(root) ?? []), i]);
  }
  for (const cluster of clusters.values()) {
    out.push(explainCluster(ctx, options, main, groups, cluster, violations));
  }
  return out;
}

function inRange(ctx: PlanContext, i: number, f: number): boolean {
  const d = ctx.domains[i];
  return d !== null && f >= d.lo - 1e-9 && f <= d.hi + 1e-9;
}

function explainCluster(ctx: PlanContext, options: PlanOptions, main: ParkingState, groups: readonly number[], cluster: number[], violations: readonly Finding[]): Explanation {
  const around = new Set<number>(cluster);
  for (const i of cluster) {
    for (const j of ctx.neighbours[i]) around.add(j);
    for (const p of ctx.nextNearestOf[i]) around.add(ctx.nextNearest[p].a === i ? ctx.nextNearest[p].b : ctx.nextNearest[p].a);
  }
  const members = [...around].filter((i) => ctx.domains[i] !== null).sort((a, b) => a - b);
  const solve = (set: readonly number[]) => solveSubset(ctx, options, main, groups, set);
  const first = solve(members);
  const ids = (list: readonly number[]) => list.map((i) => ctx.ids[i]);
  if (first.feasible) {
    const rules = [...new Set(violations.filter((v) => v.qubits.some((q) => cluster.includes(ctx.index.get(q)!))).map((v) => v.rule))];
    const message =
      `The search found no parking that satisfies every idle rule around ${ids(cluster).join(', ')} (${rules.join(', ')}), ` +
      `although these qubits and their neighbours alone can be parked; the conflict reaches further across the chip. ` +
      `Try another --seed, widen windows nearby, or relax the rules listed.`;
    return { kind: 'parking', qubits: ids(cluster), rules, message, lines: [] };
  }
  // Deletion filter: qubits outside the cluster first, then the cluster's own.
  let core = members;
  const order = [...members.filter((i) => !cluster.includes(i)), ...members.filter((i) => cluster.includes(i))];
  for (const q of order) {
    const trial = core.filter((i) => i !== q);
    if (trial.length === 0) continue;
    if (!solve(trial).feasible) core = trial;
  }
  const best = solve(core).state;
  const lines: string[] = [];
  const rules = new Set<RuleName>();
  const coreSet = new Set(core);
  for (const i of core) {
    const id = ctx.ids[i];
    const blockers = best.blockersOf(i).filter((b) => b.other < 0 || coreSet.has(b.other)).map((b) => ({ ...b }));
    const f = best.freq[i];
    const broken = blockers.filter((b) => f > b.lo && f < b.hi);
    const d = ctx.domains[i]!;
    const where = ctx.fixed[i] !== undefined ? `fixed park ${ghz(ctx.fixed[i]!)}` : ctx.qubits[i].windowGHz ? `window ${band(d.lo, d.hi)}` : `range ${band(d.lo, d.hi)}`;
    if (broken.length === 0) {
      lines.push(`${id}: ${describeRole(ctx, i)}`);
      continue;
    }
    const cover = ctx.fixed[i] !== undefined ? broken.map((_, k) => k) : minimalCover(d, blockers);
    const used: Blocker[] = cover ? cover.map((k) => (ctx.fixed[i] !== undefined ? broken[k] : blockers[k])) : broken;
    for (const b of used) rules.add(b.rule);
    const by = used.map((b) => describeBlocker(ctx, b)).join(', ').replace(/, ([^,]*)$/, ' and $1');
    lines.push(ctx.fixed[i] !== undefined ? `${id}: ${where} is blocked by ${by}` : `${id}: ${where} is fully blocked by ${by}`);
  }
  const ruleList = [...rules];
  const relax = ruleList
    .map((r) => ruleByName(r).threshold)
    .filter((f): f is NonNullable<typeof f> => f !== null)
    .map((field) => {
      const spec = RULE_SPECS.find((s) => s.field === field);
      const v = ctx.rules[field];
      const shown = typeof v === 'number' ? (field === 'zzLimitGHz' ? khz(v) : field.endsWith('GHz') ? mhz(v) : String(v)) : '';
      return spec ? `${spec.key} (${shown})` : String(field);
    });
  const message =
    `No parking satisfies every idle rule for ${ids(core).join(', ')}: ${lines.join('; ')}. ` +
    `Removing any one of these qubits (or its rules) makes the rest plannable. ` +
    `Widen a window, move a fixed park${relax.length > 0 ? `, or relax ${[...new Set(relax)].join(', ')}` : ''}.`;
  return { kind: 'parking', qubits: ids(core), rules: ruleList, message, lines };
}

function describeBlocker(ctx: PlanContext, b: Blocker): string {
  if (b.other < 0) {
    if (b.rule === 'tls') return 'its defect (tls)';
    if (b.rule === 'idle-error') return 'its own idle error over the reference idle time (idle-error: off its sweet spots the quasi-static 1/f dephasing, with T1 and the rest, exceeds idleErrorLimit)';
    return 'its readout resonator (readout)';
  }
  return `${ctx.ids[b.other]} ${b.rule}`;
}

function describeRole(ctx: PlanContext, i: number): string {
  if (ctx.fixed[i] !== undefined) return `fixed at ${ghz(ctx.fixed[i]!)} (park)`;
  const d = ctx.domains[i]!;
  return ctx.qubits[i].windowGHz ? `window ${band(d.lo, d.hi)}` : `tunable ${band(d.lo, d.hi)}`;
}

/** Search on a subset of qubits only (the others and their rules left out). */
export function solveSubset(
  ctx: PlanContext,
  options: PlanOptions,
  main: ParkingState,
  groups: readonly number[],
  members: readonly number[],
): { feasible: boolean; state: ParkingState } {
  const state = new ParkingState(ctx, options);
  state.zzScale.set(main.zzScale);
  construct(state, constructionOrder(state, members, groups));
  localSearch(state, new Random(options.seed), SUBSET_LIMITS);
  return { feasible: allViolating(state).length === 0, state };
}
