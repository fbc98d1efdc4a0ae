/**
 * The waveforms of a plan's designed gates, by edge key `A-B` (the plan's `qubits` joined by
 * `-`): what the report draws for a plan just computed, the same samples `fluxlane plan -o`
 * writes to DIR/waveforms/A-B.csv.
 */
import type { ChipPlan } from '../../plan/plan.js';
import type { GateWaveform } from './build-document.js';

export function waveformsOfPlan(plan: ChipPlan): Map<string, GateWaveform> {
  const out = new Map<string, GateWaveform>();
  const { ctx } = plan;
  plan.gates?.forEach((g, k) => {
    if (!g || g.design.waveform.timeNs.length === 0) return;
    const edge = ctx.edges[plan.edges[k].edge];
    out.set(`${ctx.ids[edge.a]}-${ctx.ids[edge.b]}`, g.design.waveform);
  });
  return out;
}
