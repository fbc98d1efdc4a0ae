/**
 * The spectrum tables' memo kernel (src/util/frequency-memo.ts) against a plain model of what it
 * promises, written out here: a key is found only where it was stored and not overwritten since,
 * an empty slot of the probe run is filled before a full run's home slot is overwritten, and the
 * home slot lies in [0, MEMO_SLOTS). Seeded keys (src/util/random.ts), with repeats, nearby
 * doubles (one ulp apart) and enough distinct keys to fill and overwrite slots.
 */
import { describe, expect, it } from 'vitest';
import { emptyMemoKeys, memoLookup, memoSlot, MEMO_SLOTS } from '../../src/util/frequency-memo.js';
import { Random } from '../../src/util/random.js';

describe('frequency memo', () => {
  it('finds exactly the keys stored and not overwritten since (a model of the table kept beside it)', () => {
    const rng = new Random(7);
    const keys = emptyMemoKeys();
    const values = new Float64Array(MEMO_SLOTS);
    /** model: slot -> key stored there */
    const model = new Map<number, number>();
    const pool: number[] = [];
    for (let i = 0; i < 400; i++) {
      const f = 3 + 4 * rng.uniform();
      pool.push(f, f, f + f * Number.EPSILON);
    }
    let hits = 0;
    let overwrites = 0;
    for (let n = 0; n < 5000; n++) {
      const f = pool[rng.int(pool.length)];
      const k = memoLookup(keys, f);
      const storedAt = [...model.entries()].find(([, key]) => key === f)?.[0];
      if (k >= 0) {
        hits++;
        expect(storedAt).toBe(k);
        expect(values[k]).toBe(f * 2);
        continue;
      }
      // not stored (or overwritten): the model agrees
      expect(storedAt).toBeUndefined();
      const slot = -1 - k;
      expect(slot).toBeGreaterThanOrEqual(0);
      expect(slot).toBeLessThan(MEMO_SLOTS);
      // the slot to fill lies on the key's probe run; an overwrite only when that run is full
      const home = memoSlot(f);
      const run = [0, 1, 2, 3].map((p) => (home + p) % MEMO_SLOTS);
      expect(run).toContain(slot);
      const firstEmpty = run.find((s) => !model.has(s));
      if (firstEmpty !== undefined) expect(slot).toBe(firstEmpty);
      else {
        expect(slot).toBe(home);
        overwrites++;
      }
      keys[slot] = f;
      values[slot] = f * 2;
      model.set(slot, f);
    }
    expect(hits).toBeGreaterThan(500);
    expect(overwrites).toBeGreaterThan(100);
  });

  it('tells keys one ulp apart by ===, and has home slots spread over the table', () => {
    const f = 5.123456789;
    const g = f + f * Number.EPSILON;
    expect(g).not.toBe(f);
    const keys = emptyMemoKeys();
    const k = -1 - memoLookup(keys, f);
    keys[k] = f;
    expect(memoLookup(keys, f)).toBe(k);
    expect(memoLookup(keys, g)).toBeLessThan(0);
    const used = new Set<number>();
    const rng = new Random(3);
    for (let i = 0; i < 1000; i++) used.add(memoSlot(4 + 2 * rng.uniform()));
    expect(used.size).toBeGreaterThan(0.9 * MEMO_SLOTS);
  });
});
