/**
 * Error types shared by every stage.
 *
 * - `InputError`: the user's input (layout file, CLI option, trajectory, plan file) is wrong.
 *   It carries one or more diagnostics, each naming where (file:line:column when known),
 *   what was expected and what was found. The CLI prints them and exits with code 2.
 * - Anything else that escapes a command is a bug: the CLI prints one line asking for a report
 *   (never a stack trace unless FLUXLANE_DEBUG=1) and exits with code 70.
 */

export interface Diagnostic {
  /** File the problem is in (as given by the user), if any. */
  file?: string;
  /** 1-based line and column in `file`. */
  line?: number;
  column?: number;
  /** Dotted path inside the document, e.g. `qubits.Q1.t1`. */
  path?: string;
  /** The whole sentence, e.g. `expected a frequency, found 20 us`. */
  message: string;
}

/** Format a diagnostic as `file:line:col: path: message` (parts that are unknown are left out). */
export function formatDiagnostic(d: Diagnostic): string {
  let where = '';
  if (d.file !== undefined) {
    where = d.file;
    if (d.line !== undefined) {
      where += `:${d.line}`;
      if (d.column !== undefined) where += `:${d.column}`;
    }
  }
  const path = d.path ? `${d.path}: ` : '';
  return where ? `${where}: ${path}${d.message}` : `${path}${d.message}`;
}

export class InputError extends Error {
  readonly diagnostics: readonly Diagnostic[];
  constructor(diagnostics: Diagnostic | readonly Diagnostic[]) {
    const list = Array.isArray(diagnostics) ? [...diagnostics] : [diagnostics as Diagnostic];
    super(list.map(formatDiagnostic).join('\n'));
    this.name = 'InputError';
    this.diagnostics = list;
  }
}

/** Throw an InputError with one message (convenience for option and physics checks). */
export function inputError(message: string, where: Omit<Diagnostic, 'message'> = {}): never {
  throw new InputError({ ...where, message });
}
