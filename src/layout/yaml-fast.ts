/**
 * A fast reader for the plain subset of YAML that `fluxlane generate` and most hand-written
 * layouts use, giving exactly what the full reader of ./yaml-source.ts gives for such text (the
 * same values and the same position of every key and value), or undefined for anything outside
 * the subset, which the full reader (the `yaml` package) then reads.
 *
 * Why: the `yaml` package's parser is general and, started cold in a short-lived process, takes
 * about 1 s of CPU for the 270 kB of a generated 1,024-qubit layout (about 0.15 s once its code
 * is warm); this reader needs a few tens of milliseconds.
 *
 * The subset, line by line (LF line breaks; no tabs, no CR, no document markers or directives):
 *   - blank lines and comment lines (first non-space character `#`); no comments after content;
 *   - `key: value` and `key:` followed by a more deeply indented block (a map or a list); keys
 *     are names ([A-Za-z_][A-Za-z0-9_.-]*) that the core schema reads as strings;
 *   - `- item` list entries (not `- key: value`);
 *   - a value or item is a plain scalar, a one-line flow list `[a, b]` or a one-line flow map
 *     `{ k: v, k: v }` of plain scalars; a plain scalar uses only the characters
 *     [A-Za-z0-9 ._+-/()%,;=] (`,` not inside flow collections) and starts with [A-Za-z0-9._+-],
 *     `-` not followed by a space; no empty values.
 * Plain scalars are resolved by the very tags the `yaml` package's core schema uses (null, bool,
 * int, float, else string), with the options of ./yaml-source.ts. A repeated key, a key the
 * core schema does not read as a string, more values than the limit: undefined (the full reader
 * reports them). test/layout/yaml-fast.test.ts checks the equivalence on generated and demo
 * layouts and on variants of every construct, and that anything else is left to the full reader.
 */
import { isScalar, parseDocument, type Schema } from 'yaml';
import type { Position } from './diagnostics.js';

/** Values and positions as the full reader's walk records them (keys: JSON.stringify(path)). */
export interface FastYaml {
  value: unknown;
  valuePositions: Map<string, Position>;
  keyPositions: Map<string, Position>;
}

/** The parse options of ./yaml-source.ts (the schema's tags and their options come from a document parsed with them). */
export const YAML_PARSE_OPTIONS = Object.freeze({ prettyErrors: false, uniqueKeys: false, merge: true, strict: true });

interface ScalarTag {
  default?: boolean | 'key';
  test?: RegExp;
  resolve: (value: string, onError: (message: string) => void, options: object) => unknown;
}

let coreSchema: { tags: readonly ScalarTag[]; options: object } | undefined;

function schema(): { tags: readonly ScalarTag[]; options: object } {
  if (!coreSchema) {
    const doc = parseDocument('', YAML_PARSE_OPTIONS);
    coreSchema = { tags: (doc.schema as Schema).tags as unknown as ScalarTag[], options: doc.options };
  }
  return coreSchema;
}

/** Outside the subset: the caller falls back to the full reader. */
class NotSimple extends Error {}

const KEY = /^([A-Za-z_][A-Za-z0-9_.-]*):(?: +(.*))?$/;
const PLAIN = /^[A-Za-z0-9._+-][A-Za-z0-9 ._+\-/()%,;=]*$/;
const FLOW_PLAIN = /^[A-Za-z0-9._+-][A-Za-z0-9 ._+\-/()%;=]*$/;

interface Line {
  /** 1-based line number. */
  line: number;
  indent: number;
  /** The line without its indentation and trailing spaces. */
  text: string;
}

/**
 * The value and positions of `text` when it lies in the subset, else undefined. `maxNodes`: more
 * values than this gives undefined (the full reader reports it).
 */
export function readSimpleYaml(text: string, maxNodes: number): FastYaml | undefined {
  if (/[\t\r\uFEFF]/.test(text)) return undefined;
  const lines: Line[] = [];
  let n = 0;
  for (const raw of text.split('\n')) {
    n++;
    const body = raw.trimEnd();
    const indent = body.length - body.trimStart().length;
    const t = body.slice(indent);
    if (t === '' || t.startsWith('#')) continue;
    if (indent === 0 && (t.startsWith('---') || t.startsWith('...') || t.startsWith('%'))) return undefined;
    if (t.includes(' #') || t.includes('\u0000')) return undefined;
    lines.push({ line: n, indent, text: t });
  }
  if (lines.length === 0 || lines[0].indent !== 0) return undefined;
  const reader = new Reader(lines, maxNodes);
  try {
    const value = reader.block(0, ROOT_KEY, 0);
    if (reader.at < lines.length) return undefined;
    return { value, valuePositions: reader.valuePositions, keyPositions: reader.keyPositions };
  } catch (e) {
    if (e instanceof NotSimple) return undefined;
    throw e;
  }
}

/** The key of the root's path, JSON.stringify([]). */
const ROOT_KEY = '[]';

/**
 * The key of a child's path, JSON.stringify([...path, segment]), from the key of the parent's
 * path: JSON.stringify writes an array's items joined by commas, without spaces, so the child's
 * key is the parent's with the segment's own JSON added before the closing bracket (no path
 * arrays copied and no whole path written again for each of the ~22,000 values of a generated
 * 1,024-qubit layout; test/layout/yaml-fast.test.ts compares the positions with the full reader's).
 */
function childKey(parent: string, segment: string | number): string {
  return parent === ROOT_KEY ? `[${JSON.stringify(segment)}]` : `${parent.slice(0, -1)},${JSON.stringify(segment)}]`;
}

class Reader {
  at = 0;
  private nodes = 0;
  readonly valuePositions = new Map<string, Position>();
  readonly keyPositions = new Map<string, Position>();

  constructor(
    private readonly lines: readonly Line[],
    private readonly maxNodes: number,
  ) {}

  /** The block (map or list) starting at the current line, which has indentation `indent`; `path`: its path's key (childKey). */
  block(indent: number, path: string, depth: number): unknown {
    const first = this.lines[this.at];
    this.value(path, { line: first.line, column: indent + 1 });
    if (depth > 30) throw new NotSimple();
    return first.text === '-' || first.text.startsWith('- ') ? this.list(indent, path) : this.map(indent, path, depth);
  }

  private map(indent: number, path: string, depth: number): Record<string, unknown> {
    const out: Record<string, unknown> = {};
    while (this.at < this.lines.length) {
      const l = this.lines[this.at];
      if (l.indent < indent) break;
      if (l.indent > indent) throw new NotSimple();
      const m = KEY.exec(l.text);
      if (!m) throw new NotSimple();
      const key = this.key(m[1]);
      if (Object.prototype.hasOwnProperty.call(out, key)) throw new NotSimple();
      const childPath = childKey(path, key);
      this.keyPositions.set(childPath, { line: l.line, column: indent + 1 });
      this.at++;
      let v: unknown;
      if (m[2] === undefined) {
        const next = this.lines[this.at];
        if (!next || next.indent <= indent) throw new NotSimple();
        v = this.block(next.indent, childPath, depth + 1);
      } else {
        v = this.inline(m[2], l.line, indent + 1 + l.text.length - m[2].length, childPath);
      }
      setOwn(out, key, v);
    }
    return out;
  }

  private list(indent: number, path: string): unknown[] {
    const out: unknown[] = [];
    while (this.at < this.lines.length) {
      const l = this.lines[this.at];
      if (l.indent < indent) break;
      if (l.indent > indent || !l.text.startsWith('- ')) throw new NotSimple();
      const item = l.text.slice(2).trimStart();
      if (item === '' || KEY.test(item) || /^[A-Za-z_][A-Za-z0-9_.-]*:$/.test(item)) throw new NotSimple();
      this.at++;
      out.push(this.inline(item, l.line, indent + 1 + l.text.length - item.length, childKey(path, out.length)));
    }
    return out;
  }

  /** A value on one line: a flow list, a flow map or a plain scalar, starting at 1-based `column`. */
  private inline(s: string, line: number, column: number, path: string): unknown {
    this.value(path, { line, column });
    if (s.startsWith('[')) {
      if (!s.endsWith(']')) throw new NotSimple();
      return this.flowItems(s, column).map(({ text, column: c }, i) => {
        this.value(childKey(path, i), { line, column: c });
        return this.scalar(text, FLOW_PLAIN);
      });
    }
    if (s.startsWith('{')) {
      if (!s.endsWith('}')) throw new NotSimple();
      const out: Record<string, unknown> = {};
      for (const { text, column: c } of this.flowItems(s, column)) {
        const m = /^([A-Za-z_][A-Za-z0-9_.-]*): +(.+)$/.exec(text);
        if (!m) throw new NotSimple();
        const key = this.key(m[1]);
        if (Object.prototype.hasOwnProperty.call(out, key)) throw new NotSimple();
        const childPath = childKey(path, key);
        this.keyPositions.set(childPath, { line, column: c });
        this.value(childPath, { line, column: c + text.length - m[2].length });
        setOwn(out, key, this.scalar(m[2], FLOW_PLAIN));
      }
      return out;
    }
    return this.scalar(s, PLAIN);
  }

  /** The items of a one-line flow collection `s` (brackets included) with their 1-based columns; none for an empty one. */
  private flowItems(s: string, column: number): { text: string; column: number }[] {
    const inner = s.slice(1, -1);
    if (inner.trim() === '') {
      if (inner !== '') throw new NotSimple();
      return [];
    }
    const out: { text: string; column: number }[] = [];
    let start = 0;
    for (const part of inner.split(',')) {
      const lead = part.length - part.trimStart().length;
      const text = part.trim();
      if (text === '') throw new NotSimple();
      out.push({ text, column: column + 1 + start + lead });
      start += part.length + 1;
    }
    return out;
  }

  /** A map key: a name the core schema reads as a string (an implicit key has at most 1024 characters). */
  private key(name: string): string {
    if (name.length > 1000 || this.resolve(name) !== name) throw new NotSimple();
    return name;
  }

  private scalar(s: string, pattern: RegExp): unknown {
    // (not `- x`, `-`, `--...` nor `.` other than before a digit: list entries, markers and
    // special floats are left to the full reader; .inf and .nan too)
    if (!pattern.test(s) || s === '-' || s.startsWith('- ') || s.startsWith('--') || (s.startsWith('.') && !/^\.[0-9]/.test(s))) throw new NotSimple();
    return this.resolve(s);
  }

  /** A plain scalar as the core schema reads it (the first default tag whose test matches; else a string). */
  private resolve(s: string): unknown {
    const { tags, options } = schema();
    for (const tag of tags) {
      if (tag.default !== true || !tag.test || !tag.test.test(s)) continue;
      let failed = false;
      const v = tag.resolve(s, () => (failed = true), options);
      if (failed) throw new NotSimple();
      // (as the composer: a tag may give a Scalar node, e.g. a float keeping its written digits; its value is the value)
      const value = isScalar(v) ? v.value : v;
      if (value !== null && typeof value === 'object') throw new NotSimple();
      return value;
    }
    return s;
  }

  private value(path: string, position: Position): void {
    if (++this.nodes > this.maxNodes) throw new NotSimple();
    if (!this.valuePositions.has(path)) this.valuePositions.set(path, position);
  }
}

/**
 * Adds `key` to a map's object as an own, enumerable, writable data property, as the yaml
 * package's plain reading does: an assignment makes exactly that for every key but `__proto__`,
 * which an assignment would take as the object's prototype (defined as a property instead).
 */
function setOwn(out: Record<string, unknown>, key: string, value: unknown): void {
  if (key === '__proto__') Object.defineProperty(out, key, { value, enumerable: true, writable: true, configurable: true });
  else out[key] = value;
}
