/**
 * Quantities with units at the edges of fluxlane (layout files, CLI options), parsed with mathjs.
 *
 * Accepted spellings: "5.8 GHz", "-210 MHz", "45 us" / "45 µs" / "45 μs" (micro as u, µ or μ),
 * "8.2 kOhm" / "8200 Ohm" / "8.2 kΩ", "3 uPhi0" or "3 uPhi0/sqrt(Hz)" / "3 uPhi0 / Hz^0.5" for
 * flux-noise amplitudes. The dimension is checked with mathjs `equalBase`; a bare number (YAML
 * number or text without a unit) is refused. Results are plain numbers in fluxlane's internal
 * units (GHz, ns, kOhm, Phi0), rounded to 12 significant digits so that mathjs's binary float
 * artefacts (20 us -> 1.9999999999999998e-5 s) do not leak into files and messages.
 *
 * We use a private mathjs instance (`create(all)`), because `createUnit` would otherwise change
 * the global one that other code may share. mathjs is loaded from the package's single-file
 * bundle (same code as its ESM build): the ESM build is about 1,260 modules and took 1.7-5 s to
 * load on our 2-core machine, the bundle about 0.2 s. It is loaded only when a text needs it:
 * the plain form "<number> <unit>" with a unit of the kind's table and at most 12 significant
 * digits (what layouts almost always hold) is read directly, number times a power of ten, which
 * after the rounding to 12 significant digits is exactly what mathjs gives
 * (test/layout/units.test.ts compares them on random texts); everything else, and every message
 * about a wrong unit, goes through mathjs.
 */

import { createRequire } from 'node:module';
import type { Unit } from 'mathjs';

import { didYouMean } from './suggest.js';
import { describeFound, showText } from './diagnostics.js';

type MathInstance = ReturnType<typeof import('mathjs').create>;
let mathInstance: MathInstance | undefined;

/** The private mathjs instance, loaded on first use. */
function mathjsInstance(): MathInstance {
  if (!mathInstance) {
    const mathjs = createRequire(import.meta.url)('mathjs/lib/browser/math.js') as typeof import('mathjs');
    mathInstance = mathjs.create(mathjs.all, {});
    // The magnetic flux quantum as its own base dimension, with SI prefixes (mPhi0, uPhi0, nPhi0).
    mathInstance.createUnit('Phi0', { prefixes: 'short' });
  }
  return mathInstance;
}

export type QuantityKind = 'frequency' | 'time' | 'resistance' | 'fluxNoise' | 'temperature';

interface KindSpec {
  /** Noun used in messages: "expected a frequency". */
  noun: string;
  example: string;
  /** Internal unit we convert to. */
  internal: string;
  /** Reference units whose dimension is accepted (first one converts with `internal`), as mathjs texts. */
  accepts: { unit: string; internal: string }[];
  /** Spellings offered in "did you mean" for unknown units. */
  spellings: string[];
  /** Units read without mathjs: factor to the internal unit as a power of ten. */
  plain: Record<string, number>;
}

const KINDS: Record<QuantityKind, KindSpec> = {
  frequency: {
    noun: 'a frequency',
    example: '5.8 GHz',
    internal: 'GHz',
    accepts: [{ unit: '1 Hz', internal: 'GHz' }],
    spellings: ['Hz', 'kHz', 'MHz', 'GHz', 'THz'],
    plain: { Hz: -9, kHz: -6, MHz: -3, GHz: 0, THz: 3 },
  },
  time: {
    noun: 'a time',
    example: '45 us',
    internal: 'ns',
    accepts: [{ unit: '1 s', internal: 'ns' }],
    spellings: ['s', 'ms', 'us', 'ns', 'ps'],
    plain: { s: 9, ms: 6, us: 3, ns: 0, ps: -3 },
  },
  resistance: {
    noun: 'a resistance',
    example: '8.2 kOhm',
    internal: 'kOhm',
    accepts: [{ unit: '1 ohm', internal: 'kohm' }],
    spellings: ['Ohm', 'kOhm', 'MOhm'],
    plain: { ohm: -3, kohm: 0, Mohm: 3 },
  },
  fluxNoise: {
    noun: 'a flux-noise amplitude',
    example: '3 uPhi0/sqrt(Hz)',
    internal: 'Phi0',
    accepts: [
      { unit: '1 Phi0', internal: 'Phi0' },
      { unit: '1 Phi0 / Hz^0.5', internal: 'Phi0 / Hz^0.5' },
    ],
    spellings: ['Phi0', 'mPhi0', 'uPhi0', 'nPhi0'],
    plain: { Phi0: 0, mPhi0: -3, uPhi0: -6, nPhi0: -9, 'Phi0/Hz^0.5': 0, 'mPhi0/Hz^0.5': -3, 'uPhi0/Hz^0.5': -6, 'nPhi0/Hz^0.5': -9 },
  },
  temperature: {
    noun: 'a temperature',
    example: '50 mK',
    internal: 'K',
    accepts: [{ unit: '1 K', internal: 'K' }],
    spellings: ['K', 'mK', 'uK'],
    plain: { K: 0, mK: -3, uK: -6 },
  },
};

const acceptedUnits = new Map<QuantityKind, { unit: Unit; internal: string }[]>();

function accepted(kind: QuantityKind): { unit: Unit; internal: string }[] {
  let list = acceptedUnits.get(kind);
  if (!list) {
    const math = mathjsInstance();
    list = KINDS[kind].accepts.map((a) => ({ unit: math.unit(a.unit), internal: a.internal }));
    acceptedUnits.set(kind, list);
  }
  return list;
}

/** "<number> <unit>": a plain decimal (at most 12 significant digits) and one unit word. */
const PLAIN = /^([-+]?)(\d+)(?:\.(\d*))?(?:[eE]([-+]?\d+))? ?([A-Za-z][A-Za-z0-9]*(?: ?\/ ?Hz\^0\.5)?)$/;

/**
 * The value of a plain quantity text of a kind's table in its internal unit, or undefined when the
 * text needs mathjs. The digits are exact in decimal; with at most 12 significant ones and a
 * power-of-ten unit factor, rounding to 12 significant digits gives mathjs's result exactly.
 */
function plainQuantity(text: string, spec: KindSpec): number | undefined {
  const m = PLAIN.exec(text);
  if (!m) return undefined;
  const unit = m[5].replace(/ /g, '');
  const power = spec.plain[unit];
  if (power === undefined) return undefined;
  const digits = `${m[2]}${m[3] ?? ''}`.replace(/^0+/, '');
  if (digits.replace(/0+$/, '').length > 12) return undefined;
  const value = Number(`${m[1]}${m[2]}.${m[3] ?? ''}e${Number(m[4] ?? 0) + power}`);
  // far from the ends of the float range (mathjs converts through SI units, which may overflow there)
  return Math.abs(value) < 1e290 && (value === 0 || Math.abs(value) > 1e-290) ? roundSignificant(value) + 0 : undefined;
}

export function quantityNoun(kind: QuantityKind): string {
  return KINDS[kind].noun;
}

export function quantityExample(kind: QuantityKind): string {
  return KINDS[kind].example;
}

/** Internal unit of a kind, as written in names and messages (GHz, ns, kOhm, Phi0). */
export function internalUnit(kind: QuantityKind): string {
  return KINDS[kind].internal;
}

export type QuantityResult = { ok: true; value: number } | { ok: false; message: string };

const MAX_LENGTH = 80;

/** Spellings mathjs does not know, mapped to the ones it does. */
export function normaliseUnitText(text: string): string {
  return text
    .replace(/[µμ]/g, 'u')
    .replace(/Ω|[Oo]hms?\b/g, 'ohm')
    .replace(/sqrt\(\s*([A-Za-z]+)\s*\)/g, '$1^0.5')
    .replace(/\^\(\s*1\s*\/\s*2\s*\)/g, '^0.5')
    .replace(/\^\(\s*-\s*1\s*\/\s*2\s*\)/g, '^-0.5')
    .trim();
}

/** Round to 12 significant digits (removes binary float artefacts of unit conversion). */
export function roundSignificant(x: number, digits = 12): number {
  if (x === 0 || !Number.isFinite(x)) return x;
  return Number(x.toPrecision(digits));
}

/**
 * Parse a quantity of the given kind into its internal unit.
 *
 *   parseQuantity('20 us', 'time')       -> { ok: true, value: 20000 }        (ns)
 *   parseQuantity('20 us', 'frequency')  -> { ok: false, message: 'expected a frequency, found 20 us' }
 *   parseQuantity(5.8, 'frequency')      -> { ok: false, message: 'expected a frequency with a unit, found the bare number 5.8' }
 *
 * Never throws. Finite values only; the sign is checked by the caller. `plain: false` sends every
 * text through mathjs (tests compare both ways).
 */
export function parseQuantity(input: unknown, kind: QuantityKind, options: { plain?: boolean } = {}): QuantityResult {
  const spec = KINDS[kind];
  if (typeof input === 'number') {
    return { ok: false, message: `expected ${spec.noun} with a unit, found the bare number ${formatBare(input)} (write e.g. "${spec.example}")` };
  }
  if (typeof input !== 'string') {
    return { ok: false, message: `expected ${spec.noun} such as "${spec.example}", found ${describeFound(input)}` };
  }
  const shown = showText(input);
  if (input.length > MAX_LENGTH) {
    return { ok: false, message: `expected ${spec.noun} such as "${spec.example}", found a text of ${input.length} characters` };
  }
  const text = normaliseUnitText(input);
  if (/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(text)) {
    return { ok: false, message: `expected ${spec.noun} with a unit, found the bare number ${shown} (write e.g. "${spec.example}")` };
  }
  const plain = options.plain === false ? undefined : plainQuantity(text, spec);
  if (plain !== undefined) return { ok: true, value: plain };
  let unit: Unit;
  try {
    unit = mathjsInstance().unit(text);
  } catch (err) {
    const message = err instanceof Error ? err.message : '';
    const unknown = /Unit "([^"]*)" not found/.exec(message);
    if (unknown) {
      const hint = didYouMean(unknown[1], spec.spellings);
      const suggestion = hint ? ` (did you mean ${hint}?)` : '';
      return { ok: false, message: `expected ${spec.noun} such as "${spec.example}", found ${shown}: unknown unit "${unknown[1]}"${suggestion}` };
    }
    return { ok: false, message: `expected ${spec.noun} such as "${spec.example}", found ${shown}` };
  }
  if (unit.value === null || unit.value === undefined) {
    return { ok: false, message: `expected ${spec.noun} such as "${spec.example}", found ${shown} (a unit without a number)` };
  }
  if (unit.units.length === 0) {
    return { ok: false, message: `expected ${spec.noun} with a unit, found the bare number ${shown}` };
  }
  const match = accepted(kind).find((a) => unit.equalBase(a.unit));
  if (!match) {
    return { ok: false, message: `expected ${spec.noun}, found ${shown}` };
  }
  let value: number;
  try {
    value = unit.toNumber(match.internal);
  } catch {
    return { ok: false, message: `expected ${spec.noun}, found ${shown}` };
  }
  if (!Number.isFinite(value)) {
    return { ok: false, message: `expected a finite ${spec.noun.replace(/^an? /, '')}, found ${shown}` };
  }
  return { ok: true, value: roundSignificant(value) + 0 };
}

function formatBare(x: number): string {
  return Number.isNaN(x) ? 'NaN' : String(x);
}

/**
 * Print an internal value with a readable unit: formatQuantity(0.012, 'frequency') -> "12 MHz",
 * formatQuantity(20000, 'time') -> "20 us". `digits` significant digits (default 6), trailing
 * zeros dropped.
 */
export function formatQuantity(value: number, kind: QuantityKind, digits = 6): string {
  const ladders: Record<QuantityKind, [number, string][]> = {
    // [factor from the internal unit, unit], largest first
    frequency: [[1, 'GHz'], [1e3, 'MHz'], [1e6, 'kHz'], [1e9, 'Hz']],
    time: [[1e-9, 's'], [1e-6, 'ms'], [1e-3, 'us'], [1, 'ns'], [1e3, 'ps']],
    resistance: [[1e-3, 'MOhm'], [1, 'kOhm'], [1e3, 'Ohm']],
    fluxNoise: [[1, 'Phi0'], [1e3, 'mPhi0'], [1e6, 'uPhi0'], [1e9, 'nPhi0']],
    temperature: [[1, 'K'], [1e3, 'mK'], [1e6, 'uK']],
  };
  const ladder = ladders[kind];
  const magnitude = Math.abs(value);
  let [factor, unit] = ladder[ladder.length - 1];
  for (const [f, u] of ladder) {
    if (magnitude * f >= 1) {
      [factor, unit] = [f, u];
      break;
    }
  }
  if (value === 0) [factor, unit] = ladder.find(([f]) => f === 1) ?? ladder[0];
  const scaled = roundSignificant(value * factor, digits);
  return `${scaled} ${unit}`;
}
