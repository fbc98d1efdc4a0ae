/**
 * The fluxlane library (package entry, dist/index.js): re-exports of each stage's public API.
 * Stages add their exports here as they land.
 */
export { InputError, formatDiagnostic, inputError, type Diagnostic } from './util/errors.js';
export { Random } from './util/random.js';
export { StageProfiler, NO_PROFILE } from './util/profile.js';
export * from './transmon/index.js';
export * from './layout/index.js';
export * from './chip/index.js';
export * from './pair/index.js';
export * from './sim/index.js';
export * from './gate/index.js';
export * from './plan/index.js';
export * from './report/index.js';
export * from './report/html/index.js';
export { buildProgram, runCli, loadCommands, COMMANDS, type CommandRegistration, type CommandEntry, type LazyCommand } from './cli/main.js';
export * from './yield/index.js';
export { memoryIo, processIo, type CliIo, type MemoryIo } from './cli/io.js';
export type { CommandOutcome, OutputFile } from './cli/outcome.js';
