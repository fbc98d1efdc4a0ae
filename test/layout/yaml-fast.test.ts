/**
 * The fast reader of the plain YAML subset (src/layout/yaml-fast.ts) against the `yaml` package
 * (the general-purpose YAML 1.2 reader the full path of src/layout/yaml-source.ts uses): for text
 * in the subset the same values (types included) and the same position of every key and value;
 * for anything outside it no answer, so the full reader reads it.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { DiagnosticCollector } from '../../src/layout/diagnostics.js';
import { readSimpleYaml, YAML_PARSE_OPTIONS } from '../../src/layout/yaml-fast.js';
import { readYamlSource, YAML_LIMITS } from '../../src/layout/yaml-source.js';

type Seg = string | number;

/** Every path of a plain value (maps' keys, lists' indices), the root first. */
function pathsOf(v: unknown, path: Seg[] = [], out: Seg[][] = []): Seg[][] {
  out.push(path);
  if (Array.isArray(v)) v.forEach((x, i) => pathsOf(x, [...path, i], out));
  else if (v !== null && typeof v === 'object') for (const [k, x] of Object.entries(v)) pathsOf(x, [...path, k], out);
  return out;
}

/** The fast reading of `text` equals the full one: values (Object.is on leaves) and every position. */
function expectSameReading(text: string): void {
  const fast = readYamlSource(text, new DiagnosticCollector('test.yaml'));
  const full = readYamlSource(text, new DiagnosticCollector('test.yaml'), { fast: false });
  expect(full).toBeDefined();
  expect(fast).toBeDefined();
  expect(fast!.value).toStrictEqual(full!.value);
  // and the yaml package's own plain reading
  expect(fast!.value).toStrictEqual(parse(text, YAML_PARSE_OPTIONS));
  for (const p of pathsOf(full!.value)) {
    expect(fast!.locate(p, 'key'), `key ${JSON.stringify(p)}`).toEqual(full!.locate(p, 'key'));
    expect(fast!.locate(p, 'value'), `value ${JSON.stringify(p)}`).toEqual(full!.locate(p, 'value'));
  }
  for (const p of [['nowhere'], [0], ['qubits', 'none', 'x']] as Seg[][]) expect(fast!.locate(p, 'value')).toEqual(full!.locate(p, 'value'));
}

const inSubset = (text: string) => readSimpleYaml(text, YAML_LIMITS.maxNodes) !== undefined;

describe('readSimpleYaml against the yaml package', () => {
  it('reads generated layouts (square and heavy-hex) in the subset, with the same values and positions', () => {
    for (const spec of [
      { kind: 'square' as const, rows: 10, cols: 10, seed: 1 },
      { kind: 'square' as const, rows: 32, cols: 32, seed: 1 },
      { kind: 'square' as const, rows: 5, cols: 7, seed: 4 },
      { kind: 'heavy-hex' as const, rows: 3, cols: 3, seed: 2 },
    ]) {
      const text = layoutToYaml(generateLayout(spec));
      expect(inSubset(text), `${spec.kind} ${spec.rows}x${spec.cols}`).toBe(true);
      expectSameReading(text);
    }
  });

  it('reads the demo layouts the same way (through the subset or the full reader)', () => {
    for (const name of ['bowline-5', 'clove-17', 'hitch-30', 'reef-49']) expectSameReading(readFileSync(`layouts/${name}.yaml`, 'utf8'));
  });

  it('resolves plain scalars as the core schema does: numbers, booleans, null and strings', () => {
    const values = ['0', '-0', '7', '+5', '007', '1.5', '-2.25', '5.', '.5', '1e3', '1.5e-3', '2E+2', '0x1F', '0o17', '12345678901234567890',
      'true', 'True', 'FALSE', 'null', 'Null', 'NULL', 'yes', 'no', 'on', 'NaN', 'Infinity', '6.590 GHz', '-214 MHz', '2.2 uPhi0/sqrt(Hz)',
      'a, b and c', 'x=1; y=2', '50%', 'Q0', 'square-32x32-seed1', 'e5', '1_000', '1.2.3', '+', '3-4'];
    const text = `values:\n${values.map((v, i) => `  k${i}: ${v}`).join('\n')}\nlist: [${values.filter((v) => !v.includes(',')).join(', ')}]\n`;
    expect(inSubset(text)).toBe(true);
    expectSameReading(text);
  });

  it('gives the positions of nested maps, lists of flow lists and flow maps, comments and blank lines between', () => {
    const text = [
      '# a comment', '', 'chip: Test-1', 'qubits:', '  A:', '    pos: [0, 0]', '', '    # inside', '    tls:', '      - { at: 3.5 GHz, width: 1 MHz }',
      '      -   {at: 4 GHz,width: 2 MHz}', '    window: [ 5 GHz ,6 GHz ]', '  B:', '      deep: 1', '      deeper:', '          - x',
      '          - []', '          - {}', 'couplings:', ' - [A, B, 12 MHz]', ' -    [A,B,3]', 'end: done   ', '',
    ].join('\n');
    expect(inSubset(text)).toBe(true);
    expectSameReading(text);
  });

  it('reads keys an object has on its prototype (__proto__, constructor) as the own keys the yaml package gives', () => {
    // (an assignment to __proto__ would set the object's prototype instead of adding a key)
    const text = ['m:', '  __proto__: 1', '  constructor: 2', '  toString: x', 'f: { __proto__: 3, valueOf: 4 }', ''].join('\n');
    expect(inSubset(text)).toBe(true);
    expectSameReading(text);
    const v = readSimpleYaml(text, YAML_LIMITS.maxNodes)!.value as Record<string, Record<string, unknown>>;
    for (const [map, keys] of [[v.m, ['__proto__', 'constructor', 'toString']], [v.f, ['__proto__', 'valueOf']]] as const) {
      expect(Object.getPrototypeOf(map)).toBe(Object.prototype);
      expect(Object.keys(map)).toEqual(keys);
    }
    expect(Object.getOwnPropertyDescriptor(v.m, '__proto__')).toEqual({ value: 1, enumerable: true, writable: true, configurable: true });
  });

  it('leaves text outside the subset to the full reader', () => {
    const outside = [
      'a: "quoted"', "a: 'quoted'", 'a: b # trailing comment', 'a:\tb', 'a: b\r\nc: d', 'a: &x 1\nb: *x', 'a: !!str 1', 'a: |\n  text', 'a: >\n  text',
      'a: b\n  continued', 'a:\n- x', 'a:\nb: 1', 'a: 1\na: 2', 'list:\n  - k: v', 'list:\n  - - x', '---\na: 1', '%YAML 1.2\n---\na: 1', 'a: µs',
      'a: [x, [y]]', 'a: {k: {j: 1}}', 'a: [x, ]', 'a: b: c', 'a: 12:30', 'true: 1', 'null: 1', '1: x', '<<: {a: 1}', 'a: .inf', 'a: .nan', 'a: ~',
      'a: -', 'a: --x', 'a: [x', 'a: { }', '  a: 1', 'just a scalar', 'a: *', 'a: @x', 'a: `x`', `${'k'.repeat(1100)}: 1`,
    ];
    for (const text of outside) {
      expect(inSubset(text), JSON.stringify(text)).toBe(false);
      // the full reading is what the reader gives for it (with or without the fast path)
      const a = new DiagnosticCollector('test.yaml');
      const b = new DiagnosticCollector('test.yaml');
      const fast = readYamlSource(text, a);
      const full = readYamlSource(text, b, { fast: false });
      expect(fast?.value).toStrictEqual(full?.value);
    }
  });

  it('leaves a text with more values than the limit to the full reader (which reports it)', () => {
    const text = `list: [${Array.from({ length: 50 }, (_, i) => i).join(', ')}]\n`;
    expect(readSimpleYaml(text, 40)).toBeUndefined();
    expect(readSimpleYaml(text, 60)).toBeDefined();
  });
});
