/**
 * The chip report in one call: the document of a plan (./build-document.ts) drawn into one
 * self-contained HTML page (./page.ts) with the page script (./page-script.ts).
 *
 *     const html = await chipReportHtml({ plan: planJson(chipPlan, meta), layout, waveforms: waveformsOfPlan(chipPlan) });
 */
import type { ChipLayout } from '../../layout/types.js';
import type { ChipPlan } from '../../plan/plan.js';
import { buildReportDocument, type ReportInputs, type ReportOptions } from './build-document.js';
import type { ReportDocument } from './document.js';
import { reportHtml } from './page.js';
import { pageScript } from './page-script.js';
import { waveformsOfPlan } from './plan-waveforms.js';

export async function chipReportHtml(inputs: ReportInputs, options: ReportOptions = {}): Promise<{ html: string; doc: ReportDocument }> {
  const doc = buildReportDocument(inputs, options);
  return { html: reportHtml(doc, await pageScript()), doc };
}

/**
 * DIR/report.html of `fluxlane plan -o DIR`: the report of a plan just computed, from its plan
 * document as plan.json holds it (a JSON round trip, so the page is the same bytes as
 * `fluxlane report DIR/plan.json` gives) and its designed waveforms.
 */
export async function planReportFile(dir: string, plan: Record<string, unknown>, layout: ChipLayout, chipPlan: ChipPlan): Promise<{ path: string; contents: string }> {
  const { html } = await chipReportHtml({ plan: JSON.parse(JSON.stringify(plan)) as Record<string, unknown>, layout, waveforms: waveformsOfPlan(chipPlan) });
  return { path: `${dir}/report.html`, contents: html };
}
