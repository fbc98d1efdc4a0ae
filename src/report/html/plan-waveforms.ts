/**
 * The waveforms of a plan's designed gates, by edge key `A-B` (the plan's `qubits` joined by
 * `-`): what the report draws for a plan just computed, the same samples `fluxlane plan -o`
 * writes to DIR/waveforms/A-B.qubit.csv (the flux the mover sees, on its uniform grid; only for
 * edges that get waveform files, src/report/waveform-files.ts).
 */
import type { ChipPlan } from '../../plan/plan.js';
import { waveformGridRateGHz } from '../../gate/pulse.js';
import { onUniformGrid } from '../uniform-grid.js';
import { writesWaveforms } from '../waveform-files.js';
import type { GateWaveform } from './build-document.js';

export function waveformsOfPlan(plan: ChipPlan): Map<string, GateWaveform> {
  const out = new Map<string, GateWaveform>();
  const { ctx } = plan;
  const rate = waveformGridRateGHz(ctx.rules.sampleRateGHz, ctx.rules.fluxBandwidthGHz);
  plan.edges.forEach((e, k) => {
    if (!writesWaveforms(plan, k)) return;
    const edge = ctx.edges[e.edge];
    out.set(`${ctx.ids[edge.a]}-${ctx.ids[edge.b]}`, onUniformGrid(plan.gates![k]!.design.waveform, rate));
  });
  return out;
}
