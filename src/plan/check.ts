/**
 * `checkChip`: the fast evaluation behind `fluxlane check`: the best parking assignment with every
 * idle rule, the interaction feasibility of every edge (mover, crossing, spectators, sweeps; no
 * pulse design), the layer count and the crowding margins. Findings use the JSON contract of
 * src/plan/rules/findings.ts; `data` is the SI summary the check command adds to its output.
 */
import type { ChipLayout } from '../layout/types.js';
import type { ChipGraph } from '../chip/graph.js';
import type { StageProfiler } from '../util/profile.js';
import { bandText } from './crowding.js';
import { ghz, mhz, ns, plain, prob, toHz } from './format.js';
import { planChip, type ChipPlan } from './plan.js';
import type { PlanOptionsInput } from './options.js';
import { toFindingJson, type FindingJson } from './rules/findings.js';
import { wrapLine } from '../util/wrap.js';
import { idRecord } from '../util/own.js';

export interface ChipCheck {
  plan: ChipPlan;
  violations: FindingJson[];
  flags: FindingJson[];
  data: Record<string, unknown>;
  lines: string[];
}

export function checkChip(layout: ChipLayout, graph: ChipGraph, options: PlanOptionsInput = {}, hooks: { profiler?: StageProfiler; progress?: (stage: string, done: number, total: number) => void } = {}): ChipCheck {
  // (the layers' kind-by-kind explanation is not part of the check's output)
  const plan = planChip(layout, options, { ...hooks, layerExplanation: false }, graph);
  const { ctx } = plan;
  const id = ctx.ids;
  const parking = idRecord<unknown>();
  ctx.ids.forEach((q, i) => {
    const c = plan.crowding.qubits[i];
    parking[q] = {
      parkingFrequency: toHz(plan.parking.parkingGHz[i]),
      parkingFlux: plain(plan.states[i].flux),
      f12: toHz(plan.states[i].f12GHz),
      margin: Number.isFinite(c.marginGHz) ? toHz(c.marginGHz) : null,
      marginSpreads: Number.isFinite(c.marginSpreads) ? plain(c.marginSpreads) : null,
      usableFraction: plain(c.usableFraction),
      idleError: plan.budget.cycle.qubits[i] ? plain(plan.budget.cycle.qubits[i].total) : null,
    };
  });
  const edges = plan.edges.map((e, k) => ({
    qubits: [id[ctx.edges[e.edge].a], id[ctx.edges[e.edge].b]],
    mover: id[e.mover],
    crossing: e.crossing,
    interactionFrequency: Number.isFinite(e.interactionGHz) ? toHz(e.interactionGHz) : null,
    spectatorParking: Object.fromEntries(e.parked.map((p) => [id[p.qubit], toHz(p.fGHz)])),
    layer: plan.layers.layerOf[k],
    zz: toHz(plan.parking.idle.zzGHz[e.edge]),
    feasible: e.findings.length === 0,
    // the estimated budget's sum before pulse design (src/budget/gate-estimate.ts)
    predictedError: plan.budget.gates[k] ? plain(plan.budget.gates[k]!.total) : null,
  }));
  const cycle = plan.budget.cycle;
  const data = {
    parking,
    edges,
    layers: { count: plan.layers.layers.length, lowerBound: plan.layers.lowerBound },
    cycle: { duration: plain(cycle.durationNs * 1e-9), error: plain(cycle.error), gates: plain(cycle.gates), idles: plain(cycle.idles), uncountedEdges: cycle.uncounted },
    crowding: { bands: plan.crowding.bands.map((b) => ({ from: toHz(b.loGHz), to: toHz(b.hiGHz), qubits: b.qubits, flagged: b.flagged })) },
    explanations: plan.explanations,
  };
  const feasible = edges.filter((e) => e.feasible).length;
  const parkedCount = plan.edges.reduce((s, e) => s + e.parked.length, 0);
  const worst = plan.crowding.qubits.reduce((m, c, i) => (c.marginGHz < m.margin ? { margin: c.marginGHz, i } : m), { margin: Infinity, i: -1 });
  const lines = [
    `  ${'parking'.padEnd(20)} ${plan.parking.idle.violations.length === 0 ? 'every idle rule holds' : `${plan.parking.idle.violations.length} idle rule(s) broken`} (${ghz(Math.min(...plan.parking.parkingGHz))} to ${ghz(Math.max(...plan.parking.parkingGHz))})`,
    `  ${'interactions'.padEnd(20)} ${feasible} of ${edges.length} edges clear every CZ rule; ${parkedCount} spectator move(s)`,
    `  ${'layers'.padEnd(20)} ${plan.layers.layers.length} (lower bound ${plan.layers.lowerBound})`,
    wrapLine(`  ${'reference cycle'.padEnd(20)} ${ns(cycle.durationNs)}, predicted error ${prob(cycle.error)} = gates ${prob(cycle.gates)} + idles ${prob(cycle.idles)} (estimated before pulse design; worst gate ${worstGate(plan)})${cycle.uncounted > 0 ? `; ${cycle.uncounted} edge(s) without a feasible gate not counted, so a lower bound` : ''}`, '      '),
    `  ${'smallest margin'.padEnd(20)} ${worst.i >= 0 ? `${id[worst.i]} ${mhz(worst.margin)} (${plan.crowding.qubits[worst.i].marginSpreads.toFixed(1)} spreads)` : '-'}`,
    `  parking found (f01, flux, f12, idle error per cycle, smallest margin):`,
    ...ctx.ids.map((q, i) => {
      const c = plan.crowding.qubits[i];
      const margin = Number.isFinite(c.marginGHz) ? `margin ${mhz(c.marginGHz)} (${c.marginSpreads.toFixed(1)} spreads)` : 'margin -';
      const idle = plan.budget.cycle.qubits[i];
      return `    ${q.padEnd(6)} ${ghz(plan.parking.parkingGHz[i], 4)}  flux ${plan.states[i].flux.toFixed(4)}  f12 ${ghz(plan.states[i].f12GHz)}  idle error ${idle ? prob(idle.total) : '-'}  ${margin}${ctx.fixed[i] !== undefined ? '  (fixed)' : ''}`;
    }),
    ...plan.crowding.bands.map((b) => `  crowded band ${bandText(b)}`),
    ...plan.explanations.map((x) => wrapLine(`  ${x.kind === 'parking' ? 'cannot park' : 'cannot plan CZ'}: ${x.message}`, '      ')),
  ];
  return { plan, violations: plan.violations.map(toFindingJson), flags: plan.flags.map(toFindingJson), data, lines };
}

/** The edge with the largest estimated gate error, as "A-B 1.2e-3", or "-". */
function worstGate(plan: ChipPlan): string {
  let best = -1;
  plan.budget.gates.forEach((g, k) => {
    if (g && (best < 0 || g.total > plan.budget.gates[best]!.total)) best = k;
  });
  return best < 0 ? '-' : `${plan.ctx.edges[plan.edges[best].edge].key} ${prob(plan.budget.gates[best]!.total)}`;
}
