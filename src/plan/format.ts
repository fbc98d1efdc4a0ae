/**
 * Human-readable numbers for planner messages (internal units in, units printed) and SI
 * conversion for JSON output (Hz, s; rounded to 12 significant digits so that float artefacts
 * such as 5.120000000000001e9 do not reach the files).
 */
import { roundSignificant } from '../layout/units.js';

/** "5.123 GHz" */
export function ghz(fGHz: number, digits = 3): string {
  return `${fGHz.toFixed(digits)} GHz`;
}

/** "12.3 MHz" */
export function mhz(fGHz: number, digits = 1): string {
  return `${(fGHz * 1e3).toFixed(digits)} MHz`;
}

/**
 * A frequency with its unit chosen by size (GHz, MHz, kHz or Hz) and `sig` significant digits:
 * freq(-0.087274) -> "-87.3 MHz", freq(5.1204, 5) -> "5.1204 GHz", freq(3.2e-5) -> "32.0 kHz".
 */
export function freq(fGHz: number, sig = 3): string {
  return sized(fGHz, FREQUENCY_UNITS, sig);
}

const FREQUENCY_UNITS: readonly (readonly [number, string])[] = [[1, 'GHz'], [1e3, 'MHz'], [1e6, 'kHz'], [1e9, 'Hz']];

/** `value` in the largest unit of `ladder` (factor from the internal unit, name) in which it is at least 1. */
function sized(value: number, ladder: readonly (readonly [number, string])[], sig: number): string {
  if (!Number.isFinite(value)) return String(value);
  const magnitude = Math.abs(value);
  let k = ladder.length - 1;
  for (let i = 0; i < ladder.length; i++) {
    if (magnitude * ladder[i][0] >= 1) {
      k = i;
      break;
    }
  }
  if (value === 0) k = Math.max(0, ladder.findIndex(([f]) => f === 1));
  const text = (i: number, decimals?: number): string => {
    const x = value * ladder[i][0];
    return x.toFixed(decimals ?? (x === 0 ? sig - 1 : Math.max(0, sig - 1 - Math.floor(Math.log10(Math.abs(x))))));
  };
  let s = text(k);
  // rounding up to 1000 (999.96 MHz at 3 digits) reads better one unit up, where it is 1.00
  if (k > 0 && Math.abs(Number(s)) >= 1000) s = text(--k, sig - 1);
  return `${s} ${ladder[k][1]}`;
}

/** "152 kHz" */
export function khz(fGHz: number, digits = 0): string {
  return `${(fGHz * 1e6).toFixed(digits)} kHz`;
}

/** "5.100-5.400 GHz" */
export function band(loGHz: number, hiGHz: number, digits = 3): string {
  return `${loGHz.toFixed(digits)}-${hiGHz.toFixed(digits)} GHz`;
}

/** "42.0 ns" */
export function ns(tNs: number, digits = 1): string {
  return `${tNs.toFixed(digits)} ns`;
}

/** A probability: "3.2e-4" */
export function prob(p: number): string {
  if (p === 0) return '0';
  if (p >= 0.01) return p.toFixed(3);
  return p.toExponential(1);
}

/** GHz -> Hz for JSON. */
export function toHz(fGHz: number): number {
  return roundSignificant(fGHz * 1e9);
}

/** ns -> s for JSON. */
export function toSeconds(tNs: number): number {
  return Number.isFinite(tNs) ? roundSignificant(tNs * 1e-9) : tNs;
}

/** A plain number for JSON (rounded to 12 significant digits). */
export function plain(x: number): number {
  return roundSignificant(x);
}

/** Hz -> GHz when reading JSON. */
export function fromHz(fHz: number): number {
  return fHz * 1e-9;
}
