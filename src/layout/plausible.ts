/**
 * Plausible ranges of a layout's physical inputs: a value outside the hard range is an error
 * (the model cannot give a meaningful answer, or the number is surely a slip: a coupling of
 * 1e300 MHz, a T1 of 1e-300 s); a value inside it but outside the usual range is a warning
 * (printed, exit code unchanged), with a hint at the likely slip (a g of 0.3 GHz is probably
 * 0.3 written for 30 MHz... or GHz for MHz; a T1 of 50 ms probably ms for us).
 *
 * The usual ranges are common practice for flux-tunable transmons with fixed capacitive couplings
 * (published devices and reviews; from memory, not a measurement: see the README's "Guarantees
 * and limits"); the hard ranges are a decade or more beyond them, or where the model stops
 * (the transmon regime E_J/E_C from 20 to 2000 is checked by src/transmon/resolve.ts).
 * Units inside: GHz, ns, kOhm, Phi0.
 */
import { formatQuantity, type QuantityKind } from './units.js';

export interface PlausibleRange {
  /** Unit kind of the value ('number': a plain number). */
  kind: QuantityKind | 'number';
  /** What the value is, after "expected" ("a T1"). */
  noun: string;
  /** Outside: an error. */
  hard: [number, number];
  /** Outside (but inside hard): a warning. */
  usual: [number, number];
  /** A hint printed with the warning, by side. */
  hintHigh?: string;
  hintLow?: string;
}

/** Layout fields (the key under a qubit, or `g` of a coupling; tls.at / tls.width of a defect). */
export const PLAUSIBLE: Readonly<Record<string, PlausibleRange>> = Object.freeze({
  ec: { kind: 'frequency', noun: 'a charging energy E_C', hard: [0.01, 2], usual: [0.1, 0.5], hintHigh: 'MHz written as GHz?' },
  ejMax: { kind: 'frequency', noun: 'a Josephson energy E_JS', hard: [0.5, 1000], usual: [5, 80], hintLow: 'GHz written as MHz?' },
  fMax: { kind: 'frequency', noun: 'a maximum frequency', hard: [0.5, 30], usual: [3, 9] },
  fMin: { kind: 'frequency', noun: 'a minimum frequency', hard: [0.1, 30], usual: [1, 9] },
  anharmonicity: { kind: 'frequency', noun: 'an anharmonicity', hard: [-2, -0.01], usual: [-0.4, -0.1], hintLow: 'MHz written as GHz?' },
  rn: { kind: 'resistance', noun: 'a junction resistance', hard: [0.1, 1000], usual: [2, 40] },
  t1: { kind: 'time', noun: 'a T1', hard: [100, 1e10], usual: [5e3, 2e6], hintHigh: 'ms written for us?', hintLow: 'ns written for us?' },
  tphi: { kind: 'time', noun: 'a white dephasing time T_phi', hard: [100, 1e10], usual: [1e3, 1e7], hintHigh: 'ms written for us?', hintLow: 'ns written for us?' },
  fluxNoise: { kind: 'fluxNoise', noun: 'a 1/f flux-noise amplitude', hard: [1e-9, 1e-3], usual: [3e-7, 3e-5], hintHigh: 'mPhi0 written for uPhi0?', hintLow: 'nPhi0 written for uPhi0?' },
  park: { kind: 'frequency', noun: 'a parking frequency', hard: [0.1, 30], usual: [1, 9] },
  window: { kind: 'frequency', noun: 'a window edge', hard: [0.1, 30], usual: [1, 10] },
  readout: { kind: 'frequency', noun: 'a readout resonator frequency', hard: [0.1, 50], usual: [3, 12] },
  'tls.at': { kind: 'frequency', noun: 'a defect frequency', hard: [0.1, 50], usual: [1, 12] },
  'tls.width': { kind: 'frequency', noun: 'a defect width', hard: [1e-6, 1], usual: [1e-5, 0.05], hintHigh: 'GHz written for MHz?' },
  g: { kind: 'frequency', noun: 'a coupling g', hard: [1e-6, 1], usual: [1e-3, 0.1], hintHigh: 'GHz written for MHz?', hintLow: 'kHz written for MHz?' },
});

export type PlausibleVerdict = { level: 'ok' } | { level: 'error' | 'warning'; message: string };

/** Judge one value (internal units) of field `key`; `shown` is the value as the user wrote it. */
export function judgePlausible(key: string, value: number, shown: string): PlausibleVerdict {
  const r = PLAUSIBLE[key];
  if (!r) return { level: 'ok' };
  return judgeRange(r, value, shown);
}

/** Judge a value against a range (also used for the rules of shared/rules.json). */
export function judgeRange(r: PlausibleRange, value: number, shown: string): PlausibleVerdict {
  const f = (x: number): string => (r.kind === 'number' ? String(x) : formatQuantity(x, r.kind, 6));
  if (!(value >= r.hard[0] && value <= r.hard[1])) {
    return { level: 'error', message: `expected ${r.noun} from ${f(r.hard[0])} to ${f(r.hard[1])}, found ${shown} (outside what the model can answer; see README "Guarantees and limits")` };
  }
  if (value < r.usual[0] || value > r.usual[1]) {
    const hint = value > r.usual[1] ? r.hintHigh : r.hintLow;
    return { level: 'warning', message: `${shown} is unusual for ${r.noun.replace(/^an? /, '')} (usually ${f(r.usual[0])} to ${f(r.usual[1])})${hint ? `: ${hint}` : ''}` };
  }
  return { level: 'ok' };
}
