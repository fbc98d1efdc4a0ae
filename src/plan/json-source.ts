/**
 * JSON text -> plain values plus positions, for files fluxlane reads back (plan.json): the same
 * care as the layout reader (src/layout/yaml-source.ts). A strict JSON parser (RFC 8259) written
 * out here because JSON.parse knows no positions and keeps the last of duplicate keys silently:
 *
 *   - every value keeps where it stood (1-based line and column), for located diagnostics;
 *   - a duplicate key in an object is an error naming both positions;
 *   - objects have no prototype, so a key such as `__proto__` is an ordinary key;
 *   - nesting is limited (no stack overflow on hostile input);
 *   - numbers that overflow (1e999) are kept as written and refused by the caller's checks.
 *
 * Decoding (UTF-8 with a byte-order mark dropped, non-UTF-8 bytes refused) is `decodeUtf8` of the
 * layout stage. Nothing is thrown: problems go to the collector and make the result undefined.
 */
import type { DiagnosticCollector, Path, Position } from '../layout/diagnostics.js';
import { hasOwn } from '../util/own.js';

export const JSON_LIMITS = Object.freeze({ maxDepth: 64 });

export interface JsonSource {
  value: unknown;
  /** Position of the value at `path` (or of its key, with anchor 'key'); undefined when unknown. */
  locate(path: Path, anchor: 'key' | 'value'): Position | undefined;
}

interface Located {
  value: Position;
  key?: Position;
}

class JsonSyntax extends Error {
  constructor(
    readonly offset: number,
    message: string,
  ) {
    super(message);
  }
}

/** Parse JSON text; problems go to `collector` (with positions) and make the result undefined. */
export function readJsonSource(text: string, collector: DiagnosticCollector): JsonSource | undefined {
  const lineStarts = [0];
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 10 || (c === 13 && text.charCodeAt(i + 1) !== 10)) lineStarts.push(i + 1);
  }
  const at = (offset: number): Position => {
    let lo = 0;
    let hi = lineStarts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (lineStarts[mid] <= offset) lo = mid;
      else hi = mid - 1;
    }
    return { line: lo + 1, column: offset - lineStarts[lo] + 1 };
  };
  const children = new WeakMap<object, Map<string | number, Located>>();
  let pos = 0;
  let duplicate = false;

  const ws = (): void => {
    for (;;) {
      const c = text.charCodeAt(pos);
      if (c === 32 || c === 9 || c === 10 || c === 13) pos++;
      else return;
    }
  };
  const shown = (): string => {
    if (pos >= text.length) return 'the end of the file';
    const ch = text.codePointAt(pos)!;
    const s = String.fromCodePoint(ch);
    return ch < 32 || ch === 0x7f ? `the control character U+${ch.toString(16).toUpperCase().padStart(4, '0')}` : `"${s}"`;
  };
  const fail = (what: string): never => {
    throw new JsonSyntax(pos, `expected ${what}, found ${shown()}`);
  };

  const value = (depth: number): unknown => {
    ws();
    if (depth > JSON_LIMITS.maxDepth) throw new JsonSyntax(pos, `expected at most ${JSON_LIMITS.maxDepth} levels of nesting, found more`);
    const c = text[pos];
    if (c === '{') return object(depth);
    if (c === '[') return array(depth);
    if (c === '"') return string();
    if (c === '-' || (c >= '0' && c <= '9')) return number();
    for (const [word, v] of [['true', true], ['false', false], ['null', null]] as const) {
      if (text.startsWith(word, pos)) {
        pos += word.length;
        return v;
      }
    }
    return fail('a JSON value (object, list, text, number, true, false or null)');
  };

  const object = (depth: number): Record<string, unknown> => {
    const out = Object.create(null) as Record<string, unknown>;
    const where = new Map<string | number, Located>();
    children.set(out, where);
    pos++;
    ws();
    if (text[pos] === '}') {
      pos++;
      return out;
    }
    for (;;) {
      ws();
      if (text[pos] !== '"') fail('a key in double quotes');
      const keyPos = at(pos);
      const key = string();
      ws();
      if (text[pos] !== ':') fail('":" after the key');
      pos++;
      ws();
      const valuePos = at(pos);
      const v = value(depth + 1);
      if (hasOwn(out, key)) {
        const first = where.get(key)!.key!;
        collector.addAt(keyPos, `expected each key once in an object, found ${JSON.stringify(key)} again (first at line ${first.line}, column ${first.column})`);
        duplicate = true;
      } else {
        out[key] = v;
        where.set(key, { key: keyPos, value: valuePos });
      }
      ws();
      if (text[pos] === ',') {
        pos++;
        continue;
      }
      if (text[pos] === '}') {
        pos++;
        return out;
      }
      fail('"," or "}" in an object');
    }
  };

  const array = (depth: number): unknown[] => {
    const out: unknown[] = [];
    const where = new Map<string | number, Located>();
    children.set(out, where);
    pos++;
    ws();
    if (text[pos] === ']') {
      pos++;
      return out;
    }
    for (;;) {
      ws();
      where.set(out.length, { value: at(pos) });
      out.push(value(depth + 1));
      ws();
      if (text[pos] === ',') {
        pos++;
        continue;
      }
      if (text[pos] === ']') {
        pos++;
        return out;
      }
      fail('"," or "]" in a list');
    }
  };

  const string = (): string => {
    const start = pos;
    pos++;
    let out = '';
    let run = pos;
    for (;;) {
      if (pos >= text.length) {
        pos = start;
        fail('a closing double quote for the text starting here');
      }
      const c = text.charCodeAt(pos);
      if (c === 34) {
        out += text.slice(run, pos);
        pos++;
        return out;
      }
      if (c < 32) fail('no control characters inside text (write them as \\n, \\t, \\u0000)');
      if (c === 92) {
        out += text.slice(run, pos);
        const e = text[pos + 1];
        const simple: Record<string, string> = { '"': '"', '\\': '\\', '/': '/', b: '\b', f: '\f', n: '\n', r: '\r', t: '\t' };
        if (e !== undefined && hasOwn(simple, e)) {
          out += simple[e];
          pos += 2;
        } else if (e === 'u' && /^[0-9a-fA-F]{4}$/.test(text.slice(pos + 2, pos + 6))) {
          out += String.fromCharCode(parseInt(text.slice(pos + 2, pos + 6), 16));
          pos += 6;
        } else {
          pos++;
          fail('an escape such as \\n, \\" or \\u00e9 after the backslash');
        }
        run = pos;
        continue;
      }
      pos++;
    }
  };

  const numberPattern = /-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][-+]?\d+)?/y;
  const number = (): number => {
    numberPattern.lastIndex = pos;
    const m = numberPattern.exec(text);
    if (!m) fail('a number');
    pos += m![0].length;
    return Number(m![0]);
  };

  let root: unknown;
  try {
    root = value(0);
    ws();
    if (pos < text.length) fail('the end of the file after the JSON value');
  } catch (err) {
    if (!(err instanceof JsonSyntax)) throw err;
    collector.addAt(at(err.offset), `JSON syntax: ${err.message}`);
    return undefined;
  }
  if (duplicate) return undefined;
  return {
    value: root,
    locate(path, anchor) {
      let v: unknown = root;
      let found: Position | undefined = { line: 1, column: 1 };
      for (let k = 0; k < path.length; k++) {
        const map = v !== null && typeof v === 'object' ? children.get(v) : undefined;
        const entry = map?.get(path[k]);
        if (!entry) return undefined;
        found = k === path.length - 1 && anchor === 'key' && entry.key ? entry.key : entry.value;
        v = (v as Record<string | number, unknown>)[path[k]];
      }
      return found;
    },
  };
}
