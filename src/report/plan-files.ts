/**
 * Every file `fluxlane plan -o DIR` writes, in a fixed order: DIR/plan.json, DIR/gates.csv,
 * DIR/gates.txt and, per edge with a designed gate (src/report/waveform-files.ts), DIR/waveforms/A-B.awg.csv
 * and DIR/waveforms/A-B.qubit.csv (./waveform-files.ts). The list is complete: nothing else
 * belongs to a plan's folder.
 */
import type { ChipPlan } from '../plan/plan.js';
import { gateTableCsv } from './gate-table-csv.js';
import { gateTableFile } from './gate-table-text.js';
import type { ReportFile } from './report-file.js';
import { waveformFiles } from './waveform-files.js';

/** The files of a plan in `dir` (`json` is the plan.json document of `plan`). */
export function planFiles(plan: ChipPlan, json: Record<string, unknown>, dir: string): ReportFile[] {
  return [
    { path: `${dir}/plan.json`, contents: `${JSON.stringify(json, null, 2)}\n` },
    { path: `${dir}/gates.csv`, contents: gateTableCsv(json) },
    { path: `${dir}/gates.txt`, contents: gateTableFile(json) },
    ...waveformFiles(plan, dir),
  ];
}
