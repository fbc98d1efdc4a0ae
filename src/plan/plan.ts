/**
 * `planChip`: the whole planner on one chip, stage by stage (internal units):
 *
 *   1. context      transmons, tabulated spectra, neighbourhoods (./context.ts)
 *   2. parking      frequency groups, seeded search, exact check, explanations (./parking/assign.ts)
 *   3. interaction  mover, crossing, destination, path, spectator parking per edge (./interaction/plan-edge.ts)
 *   4. layers       conflict graph of the gates, coloured (./layers.ts)
 *   5. crowding     margins in MHz and fabrication spreads, usable windows, crowded bands (./crowding.ts)
 *
 * and, with a gate designer (./gate-seam.ts), `designPulses` (./pulses.ts) adds a CZ design per edge.
 * Findings: `violations` (rules broken: `fluxlane check` and `plan` exit 1) and `flags` (margins).
 * Same layout and options (seed) -> same plan, bit for bit.
 */
import type { ChipLayout } from '../layout/types.js';
import type { ChipGraph } from '../chip/graph.js';
import { NO_PROFILE, type StageProfiler } from '../util/profile.js';
import { buildPlanContext, type ContextOptions, type PlanContext } from './context.js';
import { calibratedZzScale, crowding, type Crowding } from './crowding.js';
import { exactQubitState, type ExactQubitState } from './exact-state.js';
import { parkingOf, planEdge, type EdgePlan } from './interaction/plan-edge.js';
import { type LayerPlan } from './layers.js';
import { fitMovesToLayers } from './layer-moves.js';
import { planOptions, type PlanOptions, type PlanOptionsInput } from './options.js';
import { assignParking, type ParkingResult } from './parking/assign.js';
import { repairInfeasibleEdges } from './interaction/repair.js';
import { evaluateIdle } from './rules/idle-evaluate.js';
import type { Explanation } from './parking/explain.js';
import { COLLISION_RULES } from './rules/catalogue.js';
import { sortFindings, type Finding } from './rules/findings.js';
import type { GateDesign } from './gate-seam.js';
import { budgetFindings, planBudget, type EstimateMemo, type PlanBudget } from './plan-budget.js';

export interface PlannedGate {
  design: GateDesign;
  /** Findings on the designed gate (destination and waveform sweep), replacing the plan's estimate. */
  findings: Finding[];
  /** The conditional phase the design aimed at (rad; default pi). */
  targetPhase?: number;
}

export interface ChipPlan {
  ctx: PlanContext;
  options: PlanOptions;
  parking: ParkingResult;
  /** Exact state of every qubit at its parking frequency. */
  states: ExactQubitState[];
  edges: EdgePlan[];
  layers: LayerPlan;
  crowding: Crowding;
  /** Per edge (by edge index), when pulses were designed. */
  gates: (PlannedGate | null)[] | null;
  /** Gate budgets, idle budgets and the reference cycle (./plan-budget.ts). */
  budget: PlanBudget;
  violations: Finding[];
  flags: Finding[];
  explanations: Explanation[];
}

export interface PlanHooks {
  profiler?: StageProfiler;
  /** Progress of a stage: called with (stage, done, total). */
  progress?: (stage: string, done: number, total: number) => void;
  /** Transmons and spectrum tables given by the caller (src/yield re-plans drawn chips with them). */
  context?: Pick<ContextOptions, 'transmons' | 'tableFor'>;
  /**
   * false: the layers' kind-by-kind explanation (LayerPlan.explanation) is left out, its counts
   * NaN (`fluxlane check` does not report it; every other part of the plan is the same).
   */
  layerExplanation?: boolean;
}

export function planChip(layout: ChipLayout, input: PlanOptionsInput = {}, hooks: PlanHooks = {}, graph?: ChipGraph): ChipPlan {
  const options = planOptions(input);
  const profiler = hooks.profiler ?? NO_PROFILE;
  const n = layout.qubits.length;
  let tabulated = 0;
  const ctx = profiler.time('spectra', () =>
    buildPlanContext(layout, { table: options.table, onQubit: () => hooks.progress?.('spectra', ++tabulated, n), ...hooks.context }, graph),
  );
  const parking = profiler.time('parking', () => assignParking(ctx, options));
  hooks.progress?.('parking', 1, 1);
  const states = parking.idle.states.map((s, i) => s ?? fallbackState(ctx, i, parking.parkingGHz[i]));
  const blockersView = parking.state.blockers;
  let done = 0;
  // (the states do not change while the edges are planned: their parking list is made once)
  const planning = { ctx, options, blockers: blockersView, states, parking: parkingOf(states) };
  const edges = profiler.time('interaction', () =>
    ctx.edges.map((e) => {
      const plan = planEdge(planning, e.index);
      hooks.progress?.('interaction', ++done, ctx.edges.length);
      return plan;
    }),
  );
  const repair = profiler.time('repair', () => repairInfeasibleEdges({ ctx, options, blockers: blockersView, states }, parking.state, states, edges));
  if (repair.moves > 0) {
    // The parking changed: evaluate the idle rules again, exactly.
    parking.parkingGHz = Float64Array.from(parking.state.freq);
    parking.idle = evaluateIdle(ctx, parking.parkingGHz);
    parking.explanations = parking.idle.violations.length > 0 ? parking.explanations : [];
    profiler.time('interaction', () => repair.touched.forEach((k) => (edges[k] = planEdge({ ctx, options, blockers: blockersView, states }, k))));
  }
  parking.stats.repairTrials = repair.trials;
  parking.stats.repairMoves = repair.moves;
  const parkingF12 = states.map((s) => s.f12GHz);
  const ec = { ctx, options, blockers: blockersView, states, parking: parkingOf(states) };
  // (the states stay as they are from here on: the fitting's candidates and the plan's own budget
  // share the estimates of the plan objects they have in common)
  const estimates: EstimateMemo = new WeakMap();
  const cycleError = (list: readonly EdgePlan[], layers: LayerPlan) =>
    planBudget({ ctx, options, parking, states, edges: [...list], layers, gates: null }, estimates).cycle.error;
  const fit = profiler.time('layers', () => fitMovesToLayers(ec, edges, parkingF12, parking.parkingGHz, cycleError, hooks.layerExplanation !== false));
  edges.splice(0, edges.length, ...fit.edges);
  const layers = fit.layers;
  parking.stats.layerFitting = fit.fitting;
  const crowd = profiler.time('crowding', () => crowding(ctx, parking.parkingGHz, states, calibratedZzScale(ctx, parking.parkingGHz, parking.idle.zzGHz), edges));
  const plan: ChipPlan = {
    ctx, options, parking, states, edges, layers, crowding: crowd, gates: null, violations: [], flags: [], explanations: parking.explanations,
    budget: { gates: [], slotsNs: [], cycle: { durationNs: 0, layerNs: [], gates: 0, idles: 0, error: 0, qubits: [], uncounted: 0 } },
  };
  plan.budget = profiler.time('budget', () => planBudget(plan, estimates));
  collectFindings(plan);
  plan.explanations = [...parking.explanations, ...edgeExplanations(plan)];
  return plan;
}

/**
 * One explanation per edge that cannot be run cleanly: no option clears it (its reason names
 * what each option ran into), or its designed gate breaks a rule.
 */
export function edgeExplanations(plan: ChipPlan): Explanation[] {
  const { ctx } = plan;
  const out: Explanation[] = [];
  plan.edges.forEach((e, k) => {
    const key = ctx.edges[e.edge].key;
    const gate = plan.gates?.[k];
    const findings = gate ? gate.findings : e.findings;
    if (findings.length === 0) return;
    const qubits = [...new Set([ctx.ids[e.mover], ctx.ids[e.partner], ...findings.flatMap((f) => f.qubits)])];
    const rules = [...new Set(findings.map((f) => f.rule))];
    const message = gate && e.findings.length === 0
      ? `${key}: the designed CZ (${gate.design.family}) breaks ${rules.join(', ')}: ${findings[0].message}`
      : `${key}: ${e.reason}`;
    out.push({ kind: 'edge', qubits, rules, message, lines: findings.map((f) => f.message) });
  });
  return out;
}

/** Recompute `violations` and `flags` from the stages (after pulses replace an edge's findings). */
export function collectFindings(plan: ChipPlan): void {
  const order = COLLISION_RULES.map((r) => r.name);
  const violations: Finding[] = [...plan.parking.idle.violations];
  plan.edges.forEach((e, k) => {
    const gate = plan.gates?.[k];
    for (const f of gate ? gate.findings : e.findings) violations.push(stripBlame(f));
  });
  violations.push(...budgetFindings(plan.ctx, plan.edges, plan.states, plan.budget));
  plan.violations = sortFindings(violations, order);
  plan.flags = sortFindings([...plan.crowding.flags], order);
}

function stripBlame(f: Finding & { blame?: number }): Finding {
  const { blame: _blame, ...rest } = f;
  return rest;
}

/** A state for a qubit whose parking lies outside its tunable range (clamped; it carries a window violation). */
function fallbackState(ctx: PlanContext, i: number, f: number): ExactQubitState {
  const t = ctx.transmons[i];
  return exactQubitState(t, Math.min(t.fMaxGHz, Math.max(t.fMinGHz, f)), ctx.rules.resistanceSpread);
}
