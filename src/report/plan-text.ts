/** The human summary `fluxlane plan` prints: parking, the gate table, layers, crowding, explanations, findings. */
import type { ChipPlan } from '../plan/plan.js';
import { bandText } from '../plan/crowding.js';
import { ghz, mhz, ns, prob } from '../plan/format.js';
import { layerExplanationText } from '../plan/layers.js';
import { gateTableText } from './gate-table-text.js';
import { wrapLine } from '../util/wrap.js';

/** The human summary of a plan. */
export function planText(plan: ChipPlan, json: Record<string, unknown>, file: string): string {
  const { ctx } = plan;
  const lines: string[] = [];
  lines.push(`${ctx.layout.chip} (${file}): ${ctx.n} qubits, ${ctx.edges.length} couplings`);
  lines.push('parking:');
  ctx.ids.forEach((q, i) => {
    const s = plan.states[i];
    const c = plan.crowding.qubits[i];
    const margin = Number.isFinite(c.marginGHz) ? `margin ${mhz(c.marginGHz)} (${c.marginSpreads.toFixed(1)} spreads)` : 'margin -';
    const idle = plan.budget.cycle.qubits[i];
    lines.push(`  ${q.padEnd(6)} ${ghz(plan.parking.parkingGHz[i], 4)}  flux ${s.flux.toFixed(4)}  f12 ${ghz(s.f12GHz)}  idle error ${idle ? prob(idle.total) : '-'}  ${margin}${ctx.fixed[i] !== undefined ? '  (fixed)' : ''}`);
  });
  lines.push('gates:');
  for (const row of gateTableText(json).trimEnd().split('\n')) lines.push(`  ${row}`);
  lines.push(`layers: ${plan.layers.layers.length} (lower bound ${plan.layers.lowerBound}, the largest degree)`);
  if (plan.layers.layers.length > plan.layers.lowerBound) lines.push(wrapLine(`  ${layerExplanationText(plan.layers.explanation, plan.layers.lowerBound)}`, '    '));
  plan.layers.layers.forEach((list, k) => lines.push(`  ${k}: ${list.map((e) => ctx.edges[e].key).join(' ')}`));
  const c = plan.budget.cycle;
  lines.push(wrapLine(`reference cycle: ${ns(c.durationNs)} (${ns(ctx.rules.cycleOverheadNs)} outside the CZ layers); predicted error ${prob(c.error)} = gates ${prob(c.gates)} + idles ${prob(c.idles)} (sums of average infidelities; model estimates)${c.uncounted > 0 ? `; ${c.uncounted} edge(s) without a feasible gate not counted, so a lower bound` : ''}`, '  '));
  const replan = json.replan as { from: string; mode: string; keptEdges: number; keptDesigns: number; changes: { message: string }[] } | undefined;
  if (replan) {
    lines.push(`re-planned from ${replan.from}${replan.mode === 'edges' ? ' (named edges only)' : ''}: ${replan.keptEdges} of ${ctx.edges.length} edges kept (${replan.keptDesigns} designs), ${replan.changes.length} change(s):`);
    for (const c of replan.changes) lines.push(wrapLine(`  ${c.message}`, '      '));
  }
  for (const b of plan.crowding.bands) lines.push(`crowded band ${bandText(b)}`);
  for (const x of plan.explanations) lines.push(wrapLine(`${x.kind === 'parking' ? 'cannot park' : 'cannot plan CZ'}: ${x.message}`));
  for (const v of plan.violations) lines.push(wrapLine(`violation [${v.rule}] ${v.qubits.join(', ')}: ${v.message}`));
  for (const f of plan.flags) lines.push(wrapLine(`flag [${f.rule}] ${f.qubits.join(', ')}: ${f.message}`));
  lines.push(
    plan.violations.length === 0
      ? `ok: every rule holds; ${plan.flags.length} flag(s). Model estimates: verify on hardware, respect flux-line current limits.`
      : `FAILED: ${plan.violations.length} violation(s), ${plan.flags.length} flag(s). Model estimates: verify on hardware.`,
  );
  return lines.join('\n');
}
