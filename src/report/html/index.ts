/** The chip report (one offline HTML page of a plan): public API (re-exports only). */
export { buildReportDocument, predictedError, pointsPerGate, reportWaveform, REPORT_CAUTIONS, REPORT_DEFAULTS, type GateWaveform, type ReportInputs, type ReportOptions } from './build-document.js';
export { chipReportHtml, planReportFile } from './chip-report.js';
export { largestTriangleThreeBuckets } from './downsample.js';
export { reportHtml, escapeHtml, jsonForScript } from './page.js';
export { pageScript } from './page-script.js';
export { waveformsOfPlan } from './plan-waveforms.js';
export { readPlanForReport, type PlanFileReport, type PlanFilePaths } from './read-plan.js';
export * from './document.js';
