/**
 * Remembered answers keyed on a frequency (a double), for the spectrum tables' memos
 * (src/plan/qubit-table.ts, src/yield/sampled-spectrum.ts): an open-addressing hash table of
 * MEMO_SLOTS keys (NaN: empty), the home slot a multiplicative hash of the key's bits, a lookup
 * probing MEMO_PROBES slots from there. The caller keeps its values in arrays beside the keys, by
 * slot. A key is found only when it is the same double (===), so a remembered answer is the one
 * computing it again gives; which slot an answer lands in decides only how long it is remembered.
 */

/** Slots of one memo (a power of two). */
export const MEMO_SLOTS = 128;
const MEMO_MASK = MEMO_SLOTS - 1;
/** Slots a lookup probes from the home slot. */
const MEMO_PROBES = 4;
const BITS = new Float64Array(1);
const WORDS = new Uint32Array(BITS.buffer);

/** Home slot of a key (a multiplicative hash of its bits). */
export function memoSlot(f: number): number {
  BITS[0] = f;
  return Math.imul(WORDS[0] ^ Math.imul(WORDS[1], 0x85ebca6b), 0x9e3779b1) >>> 25;
}

/** Keys of an empty memo. */
export function emptyMemoKeys(): Float64Array {
  return new Float64Array(MEMO_SLOTS).fill(NaN);
}

/**
 * The slot of key f (>= 0) when it is remembered; else -1 - s, s the slot to store it in: the
 * first empty slot of its probe run, else (a full run) its home slot, whose answer is forgotten.
 */
export function memoLookup(keys: Float64Array, f: number): number {
  const home = memoSlot(f);
  let free = -1;
  for (let p = 0; p < MEMO_PROBES; p++) {
    const k = (home + p) & MEMO_MASK;
    const key = keys[k];
    if (key === f) return k;
    if (free < 0 && key !== key) free = k;
  }
  return -1 - (free >= 0 ? free : home);
}
