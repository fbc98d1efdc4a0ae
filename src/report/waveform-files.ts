/**
 * The per-edge waveform files of a plan: `waveforms/A-B.csv` (time_ns,flux: the CSV the
 * simulator reads, src/sim/trajectory.ts), one per designed gate, in edge order.
 */
import { formatTrajectoryCsv } from '../sim/trajectory.js';
import type { ChipPlan } from '../plan/plan.js';
import type { ReportFile } from './report-file.js';

/** Waveform file of an edge, relative to the plan's folder. */
export function waveformPath(edgeKey: string): string {
  return `waveforms/${edgeKey}.csv`;
}

/** Waveform files of the designed gates. */
export function waveformFiles(plan: ChipPlan, dir: string): ReportFile[] {
  const out: ReportFile[] = [];
  plan.gates?.forEach((g, k) => {
    if (!g || g.design.waveform.timeNs.length === 0) return;
    const key = plan.ctx.edges[plan.edges[k].edge].key;
    out.push({ path: `${dir}/${waveformPath(key)}`, contents: formatTrajectoryCsv({ timeNs: g.design.waveform.timeNs, flux: g.design.waveform.flux }) });
  });
  return out;
}
