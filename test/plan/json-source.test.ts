/**
 * The positional JSON reader of plan files (src/plan/json-source.ts) against Node's JSON.parse
 * (the reference for values: ECMA-404 / RFC 8259), on random documents; and its own promises:
 * positions, duplicate keys, depth, prototype-free objects.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DiagnosticCollector } from '../../src/layout/diagnostics.js';
import { readJsonSource } from '../../src/plan/json-source.js';

function read(text: string) {
  const c = new DiagnosticCollector('p.json');
  const src = readJsonSource(text, c);
  return { src, messages: c.diagnostics.map((d) => `${d.line}:${d.column}: ${d.message}`) };
}

describe('readJsonSource', () => {
  it('gives the values JSON.parse gives, on random documents (reference: Node JSON.parse)', () => {
    fc.assert(
      fc.property(fc.jsonValue({ maxDepth: 6 }), fc.boolean(), (value, pretty) => {
        const text = JSON.stringify(value, null, pretty ? 2 : undefined);
        const { src, messages } = read(text);
        expect(messages).toEqual([]);
        expect(JSON.stringify(src!.value)).toBe(JSON.stringify(JSON.parse(text)));
      }),
      { seed: 20261202, numRuns: 300 },
    );
  });

  it('refuses what JSON.parse refuses and reads the rest alike, on random edits of a document (reference: Node JSON.parse)', () => {
    const base = JSON.stringify({ format: 'fluxlane-plan', version: 1, qubits: { A: { parkingFrequency: 5.1e9 } }, edges: [{ qubits: ['A', 'B'], layer: 0 }] }, null, 2);
    fc.assert(
      fc.property(fc.nat(), fc.constantFrom('{', '}', '[', ']', ',', ':', '"', '\\', 'x', '1e', '-', '\u0001', 'tru', '.5', '01'), (at, piece) => {
        const text = base.slice(0, at % base.length) + piece + base.slice(at % base.length);
        let reference: unknown;
        let ok = true;
        try {
          reference = JSON.parse(text);
        } catch {
          ok = false;
        }
        const { src, messages } = read(text);
        if (!ok) {
          expect(src).toBeUndefined();
          expect(messages[0]).toMatch(/^\d+:\d+: JSON syntax: expected .+, found .+/);
        } else if (src) expect(JSON.stringify(src.value)).toBe(JSON.stringify(reference));
        else expect(messages[0]).toMatch(/expected each key once in an object/); // JSON.parse keeps the last of duplicate keys
      }),
      { seed: 20261202, numRuns: 300 },
    );
  });

  it('locates values and keys, 1-based, with CR LF and lone CR line ends', () => {
    for (const nl of ['\n', '\r\n', '\r']) {
      const { src } = read(['{', '  "a": [1,', '    {"b": true}]', '}'].join(nl));
      expect(src!.locate(['a'], 'key')).toEqual({ line: 2, column: 3 });
      expect(src!.locate(['a'], 'value')).toEqual({ line: 2, column: 8 });
      expect(src!.locate(['a', 1, 'b'], 'value')).toEqual({ line: 3, column: 11 });
      expect(src!.locate(['a', 5], 'value')).toBeUndefined();
    }
  });

  it('refuses duplicate keys naming both places, and nesting deeper than 64', () => {
    expect(read('{"q": 1,\n "q": 2}').messages).toEqual(['2:2: expected each key once in an object, found "q" again (first at line 1, column 2)']);
    expect(read(`${'['.repeat(70)}${']'.repeat(70)}`).messages).toEqual(['1:66: JSON syntax: expected at most 64 levels of nesting, found more']);
    expect(read('"a\u0001"').messages).toEqual(['1:3: JSON syntax: expected no control characters inside text (write them as \\n, \\t, \\u0000), found the control character U+0001']);
  });

  it('keeps __proto__ and constructor as ordinary keys of prototype-free objects', () => {
    const { src } = read('{"__proto__": {"x": 1}, "constructor": 2}');
    const v = src!.value as Record<string, unknown>;
    expect(Object.getPrototypeOf(v)).toBeNull();
    expect(Object.keys(v)).toEqual(['__proto__', 'constructor']);
    expect(JSON.stringify(v)).toBe('{"__proto__":{"x":1},"constructor":2}');
  });
});
