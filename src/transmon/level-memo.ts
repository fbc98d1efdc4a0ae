/**
 * Remembered lowest levels of a transmon at one (E_C, E_J, charge cutoff): E_0, E_1, E_2 and the
 * diagonal cos(phi) elements <0|cos phi|0>, <1|cos phi|1>, <2|cos phi|2> from the parity-block
 * eigenbasis (./parity-eigenbasis.ts), for the scalar spectrum functions of ./spectrum.ts and
 * ./resolve.ts. A planner's run asks the same point again and again (the slope of a qubit where it
 * stands, the two ends of every resonance search, Newton steps that land where an earlier solve
 * did): on a 1,024-qubit check about a third of the eigen-solves repeat an earlier one.
 *
 * A remembered value is the one solving again gives, to the last bit: parityEigenbasis is a
 * function of its arguments, levels 0 and 1 (and their vectors) come from their own Newton solves
 * and twisted factorisations whatever the number of levels asked for, and the eigenvalues do not
 * depend on whether vectors are computed (test/transmon/level-memo.test.ts checks every
 * combination against direct solves). So an entry filled by a three-level solve answers a
 * two-level question, and an entry missing what a question needs is solved again and completed.
 *
 * Storage: an open-addressing table of SLOTS entries keyed by the two doubles and the cutoff
 * (home slot a multiplicative hash of their bits, PROBES slots probed; a full run forgets its
 * home slot's entry). Which entries stay decides only how often a solve is saved. Single-threaded
 * per module instance (each worker thread has its own).
 */
import { cosPhiElement, parityEigenbasis, type ParityEigenbasis } from './parity-eigenbasis.js';

/** Entries (a power of two): 16,384, about 1.1 MB of keys and values. */
const SLOTS = 1 << 14;
const MASK = SLOTS - 1;
const PROBES = 4;

const keyEc = new Float64Array(SLOTS).fill(NaN);
const keyEj = new Float64Array(SLOTS).fill(NaN);
const keyCut = new Int32Array(SLOTS).fill(-1);
/** Per entry E_0, E_1, E_2 and then <m|cos phi|m>, m = 0, 1, 2 (NaN: not known yet). */
const values = new Float64Array(SLOTS * 6).fill(NaN);

const BITS = new Float64Array(2);
const WORDS = new Uint32Array(BITS.buffer);

function home(ec: number, ej: number, nCut: number): number {
  BITS[0] = ec;
  BITS[1] = ej;
  let h = Math.imul(WORDS[0] ^ Math.imul(WORDS[1], 0x85ebca6b), 0x9e3779b1);
  h = Math.imul(h ^ WORDS[2] ^ Math.imul(WORDS[3], 0xc2b2ae35), 0x9e3779b1);
  return ((h ^ nCut) >>> 0) & MASK;
}

/** What lowestLevels fills (read right after the call; overwritten by the next). */
export interface LowestLevels {
  e0: number;
  e1: number;
  /** NaN unless three levels were asked for. */
  e2: number;
  /** <m|cos phi|m>; NaN unless asked for (c2 only with three levels). */
  c0: number;
  c1: number;
  c2: number;
}

const OUT: LowestLevels = { e0: NaN, e1: NaN, e2: NaN, c0: NaN, c1: NaN, c2: NaN };

/**
 * The lowest `k` levels (2 or 3) at (E_C, E_J, charge cutoff), with their diagonal cos(phi)
 * elements when `cos`: the numbers parityEigenbasis(ec, ej, k, nCut, cos) and cosPhiElement give,
 * remembered. The answer object is shared: read it before the next call.
 */
export function lowestLevels(ecGHz: number, ejGHz: number, nCut: number, k: 2 | 3, cos: boolean): LowestLevels {
  const h = home(ecGHz, ejGHz, nCut);
  let slot = -1;
  let free = -1;
  for (let p = 0; p < PROBES; p++) {
    const s = (h + p) & MASK;
    if (keyEc[s] === ecGHz && keyEj[s] === ejGHz && keyCut[s] === nCut) {
      slot = s;
      break;
    }
    if (free < 0 && keyCut[s] < 0) free = s;
  }
  const o = OUT;
  if (slot >= 0) {
    const v = slot * 6;
    const has = (k === 2 || values[v + 2] === values[v + 2]) && (!cos || (values[v + 3] === values[v + 3] && (k === 2 || values[v + 5] === values[v + 5])));
    if (has) {
      o.e0 = values[v];
      o.e1 = values[v + 1];
      o.e2 = k === 3 ? values[v + 2] : NaN;
      o.c0 = cos ? values[v + 3] : NaN;
      o.c1 = cos ? values[v + 4] : NaN;
      o.c2 = cos && k === 3 ? values[v + 5] : NaN;
      return o;
    }
  } else {
    slot = free >= 0 ? free : h;
    keyEc[slot] = ecGHz;
    keyEj[slot] = ejGHz;
    keyCut[slot] = nCut;
    values.fill(NaN, slot * 6, slot * 6 + 6);
  }
  const b = parityEigenbasis(ecGHz, ejGHz, k, nCut, cos, workFor(nCut));
  const e = b.energies;
  const v = slot * 6;
  o.e0 = values[v] = e[0];
  o.e1 = values[v + 1] = e[1];
  o.e2 = NaN;
  if (k === 3) o.e2 = values[v + 2] = e[2];
  o.c0 = o.c1 = o.c2 = NaN;
  if (cos) {
    o.c0 = values[v + 3] = cosPhiElement(b, 0, 0);
    o.c1 = values[v + 4] = cosPhiElement(b, 1, 1);
    if (k === 3) o.c2 = values[v + 5] = cosPhiElement(b, 2, 2);
  }
  return o;
}

/** The basis a solve fills (read at once above): three levels' room, grown with the cutoff. */
let work: ParityEigenbasis | undefined;

function workFor(nCut: number): ParityEigenbasis {
  if (!work || work.blockVectors.length < 3 * (nCut + 1)) work = { levels: 3, chargeCutoff: nCut, energies: new Float64Array(3), blockVectors: new Float64Array(3 * (nCut + 1)) };
  return work;
}

/** Forget every entry (tests). */
export function clearLowestLevels(): void {
  keyEc.fill(NaN);
  keyEj.fill(NaN);
  keyCut.fill(-1);
  values.fill(NaN);
}
