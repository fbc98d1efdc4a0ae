/** The report stage: tables and files written for the lab (re-exports only). */
export { planJson } from './plan-json.js';
export { gateJson } from './gate-json.js';
export { gateTableCsv } from './gate-table-csv.js';
export { gateTableText, gateTableFile } from './gate-table-text.js';
export { GATE_COLUMNS, gateColumnsMarkdown, type GateColumn } from './gate-columns.js';
export { planText } from './plan-text.js';
export { waveformFiles, waveformPaths, writesWaveforms, slotProgram, awgProgramCsv, qubitFluxCsv } from './waveform-files.js';
export { planFiles } from './plan-files.js';
export type { ReportFile } from './report-file.js';
