/**
 * What a command returns to the one top-level handler (handler.ts). A command gathers its data,
 * builds the human text from the same data, and lists the files it wants written; it never
 * prints, exits or writes files itself. Bad input is thrown as InputError.
 */

export interface OutputFile {
  /** As the user gave it (relative paths are resolved against the io's cwd). */
  path: string;
  contents: string | Uint8Array;
}

/** An output folder, replaced whole (src/cli/output-write.ts writeOutputFolder). */
export interface OutputFolder {
  /** As the user gave it (relative paths are resolved against the io's cwd). */
  path: string;
  /** The command that writes it (recorded in the folder's marker file). */
  command: string;
  /** Paths relative to the folder. */
  files: OutputFile[];
  /** Replace a non-empty folder that is not fluxlane output (--force). */
  force?: boolean;
}

export interface CommandOutcome {
  /** The `--json` payload: an object, numbers in SI units (Hz, s, rad; flux in Phi0). */
  data: Record<string, unknown>;
  /** The human output (units printed), shown without `--json`. */
  text: string;
  /** 0: fine; 1: a check found violations. */
  exitCode: 0 | 1;
  /** Written by the handler after the command has finished, each atomically (temp file + rename). */
  files?: OutputFile[];
  /** Written by the handler after the command has finished, whole (sibling folder + swap). */
  folder?: OutputFolder;
  /** Not written: a page a command computed for another (plan's chip report for `fluxlane report LAYOUT`). */
  page?: OutputFile;
}
