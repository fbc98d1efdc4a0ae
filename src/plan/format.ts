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
