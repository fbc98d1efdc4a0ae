/**
 * Property tests (fast-check): random mutations of valid layouts never make the parser throw
 * anything but InputError. Runs are bounded (a fixed seed and a few hundred cases per property,
 * seconds in all); set FLUXLANE_FUZZ_SEED to explore other seeds, FLUXLANE_FUZZ_RUNS for more cases.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { parse, stringify } from 'yaml';
import { parseLayoutBytes, parseLayoutText } from '../../src/layout/load.js';
import { InputError } from '../../src/util/errors.js';

const SEED = Number(process.env.FLUXLANE_FUZZ_SEED ?? 20261201);
const RUNS = Number(process.env.FLUXLANE_FUZZ_RUNS ?? 150);
const SOURCES = ['layouts/bowline-5.yaml', 'layouts/clove-17.yaml'].map((f) => readFileSync(f, 'utf8'));

/** Parse and report how it ended: 'ok', 'input' (InputError) or the unexpected error. */
function outcome(run: () => unknown): 'ok' | 'input' {
  try {
    run();
    return 'ok';
  } catch (err) {
    if (err instanceof InputError) {
      expect(err.diagnostics.length).toBeGreaterThan(0);
      for (const d of err.diagnostics) expect(typeof d.message).toBe('string');
      return 'input';
    }
    throw err; // fails the property with the input that caused it
  }
}

type Json = unknown;

/** All paths (arrays of keys/indices) into a parsed document. */
function paths(value: Json, prefix: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  out.push(prefix);
  if (Array.isArray(value)) value.forEach((v, i) => paths(v, [...prefix, i], out));
  else if (value !== null && typeof value === 'object') for (const [k, v] of Object.entries(value)) paths(v, [...prefix, k], out);
  return out;
}

function setAt(root: Json, path: (string | number)[], make: (old: Json) => Json | undefined): Json {
  if (path.length === 0) return make(root);
  const parent = path.slice(0, -1).reduce<any>((v, k) => v[k], root);
  const key = path[path.length - 1];
  const next = make(parent[key]);
  if (next === undefined) {
    if (Array.isArray(parent)) parent.splice(Number(key), 1);
    else delete parent[key];
  } else parent[key] = next;
  return root;
}

const weirdValue = fc.oneof(
  fc.constant(null), fc.boolean(), fc.double(), fc.integer(), fc.constant(Number.NaN), fc.constant(1e308), fc.constant(-0),
  fc.string(), fc.string({ unit: 'grapheme' }), fc.constant(''), fc.constant('__proto__'),
  fc.array(fc.integer(), { maxLength: 3 }), fc.dictionary(fc.string({ maxLength: 5 }), fc.integer(), { maxKeys: 3 }),
  fc.constantFrom('5 GHz', '20 us', '3 uPhi0', '8 kOhm', '-210 MHz', 'GHz', '1e400 GHz', '5 Ghz', '0 MHz', '[1, 2]'),
);

const unitText = fc
  .tuple(
    fc.oneof(fc.double({ noNaN: false }), fc.integer(), fc.constantFrom('1e400', '-0', '.5', 'NaN', '0x1F', '')),
    fc.constantFrom('GHz', 'MHz', 'kHz', 'Hz', 'us', 'µs', 'μs', 'ns', 's', 'kOhm', 'Ω', 'uPhi0', 'uPhi0/sqrt(Hz)', 'Phi0 Hz^-0.5',
      'm', 'GHz^2', 'GHz/', '(GHz)', 'sqrt(', '^', '', ' ', 'GHz GHz', 'deg', 'Hz^(1/2)', 'kg m / s^2'),
  )
  .map(([n, u]) => `${n} ${u}`);

describe('the layout parser never throws anything but InputError', () => {
  it('on layouts with keys deleted or values of another type', () => {
    fc.assert(
      fc.property(fc.nat(), fc.array(fc.tuple(fc.nat(), fc.option(weirdValue, { nil: undefined })), { minLength: 1, maxLength: 4 }), (which, edits) => {
        let doc = parse(SOURCES[which % SOURCES.length]);
        for (const [pick, value] of edits) {
          const all = paths(doc);
          const path = all[pick % all.length];
          doc = setAt(doc, path, () => value);
        }
        const text = doc === undefined ? '' : stringify(doc);
        outcome(() => parseLayoutText(text, 'fuzz.yaml'));
      }),
      { seed: SEED, numRuns: RUNS },
    );
  });

  it('on layouts with random unit strings in place of quantities', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.nat(), unitText), { minLength: 1, maxLength: 6 }), (edits) => {
        const doc = parse(SOURCES[0]);
        const stringPaths = paths(doc).filter((p) => typeof p.reduce<any>((v, k) => v[k], doc) === 'string');
        for (const [pick, text] of edits) setAt(doc, stringPaths[pick % stringPaths.length], () => text);
        outcome(() => parseLayoutText(stringify(doc), 'fuzz.yaml'));
      }),
      { seed: SEED, numRuns: RUNS },
    );
  });

  it('on random edits of the YAML text', () => {
    const piece = fc.oneof(
      fc.constantFrom(':', '-', '[', ']', '{', '}', '&a', '*a', '!', '!!binary ', '\t', '\n', '#', "'", '"', '|', '>', '%', '@',
        '\u0000', '\uFEFF', '\uD83D\uDE00', '<<: ', '? ', '---\n', '...', ' ', '  ', 'null', '~', '1e400', '\\'),
      fc.string({ maxLength: 6 }),
    );
    fc.assert(
      fc.property(fc.nat(), fc.array(fc.tuple(fc.nat(), fc.nat({ max: 8 }), piece), { minLength: 1, maxLength: 8 }), (which, edits) => {
        let text = SOURCES[which % SOURCES.length];
        for (const [at, cut, insert] of edits) {
          const i = at % (text.length + 1);
          text = text.slice(0, i) + insert + text.slice(i + cut);
        }
        outcome(() => parseLayoutText(text, 'fuzz.yaml'));
      }),
      { seed: SEED, numRuns: RUNS },
    );
  });

  it('on random bytes and on valid layouts with random bytes spliced in', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 400 }), fc.nat(), (bytes, at) => {
        outcome(() => parseLayoutBytes(bytes, 'fuzz.bin'));
        const source = Buffer.from(SOURCES[0]);
        const i = at % source.length;
        outcome(() => parseLayoutBytes(Buffer.concat([source.subarray(0, i), bytes, source.subarray(i)]), 'fuzz.bin'));
      }),
      { seed: SEED, numRuns: RUNS },
    );
  });

  it('on structures nested deeply or made of aliases', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 3000 }), fc.constantFrom('[', '{a: ', '- '), fc.integer({ min: 1, max: 12 }), (depth, open, fan) => {
        const close = open === '[' ? ']' : open === '{a: ' ? '}' : '';
        outcome(() => parseLayoutText(`chip: X\nqubits: ${open.repeat(depth)}1${close.repeat(depth)}\n`, 'deep.yaml'));
        const lines = ['a0: &a0 [x]'];
        for (let k = 1; k <= 6; k++) lines.push(`a${k}: &a${k} [${Array.from({ length: fan }, () => `*a${k - 1}`).join(', ')}]`);
        outcome(() => parseLayoutText(lines.join('\n'), 'alias.yaml'));
      }),
      { seed: SEED, numRuns: 40 },
    );
  });
});
