/** The report stage: tables and files written for the lab (re-exports only). */
export { planJson } from './plan-json.js';
export { gateJson } from './gate-json.js';
export { gateTableCsv } from './gate-table-csv.js';
export { gateTableText } from './gate-table-text.js';
export { planText } from './plan-text.js';
export { waveformFiles, waveformPath } from './waveform-files.js';
export { planFiles } from './plan-files.js';
export type { ReportFile } from './report-file.js';
