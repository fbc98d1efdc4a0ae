/**
 * Collecting layout diagnostics: every problem of a file is gathered with its dotted path and
 * its source position, then thrown at once as one InputError.
 *
 * Message shape (see src/util/errors.ts formatDiagnostic):
 *   file:line:column: path: expected <what>, found <what>
 */

import { InputError, type Diagnostic } from '../util/errors.js';

export type PathSegment = string | number;
export type Path = readonly PathSegment[];

export interface Position {
  /** 1-based. */
  line: number;
  /** 1-based. */
  column: number;
}

/** Where a path points in the source: at the key of a map entry or at its value. */
export type Anchor = 'key' | 'value';

export type Locate = (path: Path, anchor: Anchor) => Position | undefined;

const PLAIN_NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;

/** `['qubits', 'Q1', 'tls', 0, 'at']` -> `qubits.Q1.tls[0].at`; odd names are quoted: `qubits["a.b"]`. */
export function formatPath(path: Path): string {
  let out = '';
  for (const segment of path) {
    if (typeof segment === 'number') out += `[${segment}]`;
    else if (PLAIN_NAME.test(segment)) out += out === '' ? segment : `.${segment}`;
    else out += `[${JSON.stringify(segment)}]`;
  }
  return out;
}

const MAX_SHOWN = 60;

/**
 * A user's text as it should appear after "found": unquoted when it is short and printable
 * (`found 20 us`), JSON-quoted when it holds control characters or surrounding blanks, and cut
 * to 60 characters.
 */
export function showText(text: string): string {
  const cut = text.length > MAX_SHOWN ? `${text.slice(0, MAX_SHOWN)}...` : text;
  // eslint-disable-next-line no-control-regex
  const odd = /[\u0000-\u001f\u007f-\u009f\u2028\u2029]/.test(cut) || cut.trim() !== cut || cut === '';
  return odd ? JSON.stringify(cut) : cut;
}

/** A description of any parsed YAML value for "found ...": `the text "abc"`, `a list of 3 items`. */
export function describeFound(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (value === null) return 'an empty value';
  if (typeof value === 'string') return value === '' ? 'an empty text' : `the text ${JSON.stringify(cutText(value))}`;
  if (typeof value === 'number') {
    if (Number.isNaN(value)) return 'NaN';
    if (!Number.isFinite(value)) return value > 0 ? 'an infinite number' : 'a negative infinite number';
    return `the number ${value}`;
  }
  if (typeof value === 'boolean') return `the value ${value}`;
  if (typeof value === 'bigint') return `the number ${value}`;
  if (value instanceof Uint8Array) return 'binary data';
  if (Array.isArray(value)) {
    if (value.length === 0) return 'an empty list';
    return value.length === 1 ? 'a list of 1 item' : `a list of ${value.length} items`;
  }
  if (typeof value === 'object') {
    const keys = Object.keys(value as object);
    if (keys.length === 0) return 'an empty map';
    const shown = keys.slice(0, 4).map((k) => cutText(k)).join(', ');
    return `a map (keys ${shown}${keys.length > 4 ? ', ...' : ''})`;
  }
  return `a value of type ${typeof value}`;
}

function cutText(text: string): string {
  return text.length > MAX_SHOWN ? `${text.slice(0, MAX_SHOWN)}...` : text;
}

/** `expected <what>, found <description of value>`. */
export function expectedFound(expected: string, value: unknown): string {
  return `expected ${expected}, found ${describeFound(value)}`;
}

/**
 * Gathers the diagnostics of one file. `add` locates a path through `locate` (the YAML source
 * map) unless its position is given; a path the source does not know falls back to its nearest
 * known ancestor.
 */
export class DiagnosticCollector {
  readonly diagnostics: Diagnostic[] = [];

  constructor(
    readonly file: string,
    private readonly locate: Locate = () => undefined,
  ) {}

  add(path: Path, message: string, anchor: Anchor = 'value', known?: Position): void {
    let position: Position | undefined = known;
    for (let n = path.length; n >= 0 && position === undefined; n--) {
      position = this.locate(path.slice(0, n), n === path.length ? anchor : 'value');
    }
    this.diagnostics.push({
      file: this.file,
      line: position?.line,
      column: position?.column,
      path: path.length > 0 ? formatPath(path) : undefined,
      message,
    });
  }

  /** Add a diagnostic that already has its position (YAML syntax errors). */
  addAt(position: Position | undefined, message: string): void {
    this.diagnostics.push({ file: this.file, line: position?.line, column: position?.column, message });
  }

  get count(): number {
    return this.diagnostics.length;
  }

  /** Throw one InputError holding every diagnostic, sorted by position, if there are any. */
  throwIfAny(): void {
    if (this.diagnostics.length === 0) return;
    const sorted = [...this.diagnostics].sort(
      (a, b) => (a.line ?? 0) - (b.line ?? 0) || (a.column ?? 0) - (b.column ?? 0),
    );
    throw new InputError(sorted);
  }
}
