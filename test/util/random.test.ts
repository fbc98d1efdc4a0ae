/**
 * Random.forStream: the per-item streams of Monte Carlo runs (src/yield). The state words are
 * SplitMix64 outputs, checked against an independent Python implementation
 * (test/reference/splitmix64.py) and the published first output from state 0,
 * 0xe220a8397b1dcdaf (from memory: the reference splitmix64.c); streams of different items differ,
 * and their normal deviates have mean 0 and variance 1 within sampling error.
 */
import { describe, expect, it } from 'vitest';
import { Random } from '../../src/util/random.js';
import { runPython } from '../support/python.js';

/** The four state words of a Random (test-only peek at its private fields). */
function state(r: Random): number[] {
  const x = r as unknown as { s0: number; s1: number; s2: number; s3: number };
  return [x.s0 >>> 0, x.s1 >>> 0, x.s2 >>> 0, x.s3 >>> 0];
}

describe('Random.forStream(seed, index)', () => {
  it('its state is the first two SplitMix64 outputs from seed * 2^32 + index (Python reference)', () => {
    const keys: [number, number][] = [[0, 0], [1, 0], [1, 1], [42, 9999], [0xffffffff, 0xffffffff], [123456789, 3]];
    const ref = runPython<{ outputs: [string, string][] }>('splitmix64.py', { keys: keys.map(([s, i]) => String((BigInt(s) << 32n) | BigInt(i))) }).outputs;
    keys.forEach(([seed, index], k) => {
      const [a, b] = ref[k].map(BigInt);
      const words = [Number(a >> 32n), Number(a & 0xffffffffn), Number(b >> 32n), Number(b & 0xffffffffn)];
      expect(state(Random.forStream(seed, index)), `${seed}, ${index}`).toEqual(words);
    });
    expect(state(Random.forStream(0, 0)).slice(0, 2)).toEqual([0xe220a839, 0x7b1dcdaf]);
  });

  it('depends on (seed, index) only: the same pair gives the same numbers, any other pair others', () => {
    const draw = (s: number, i: number) => Array.from({ length: 4 }, () => Random.forStream(s, i).uniform());
    expect(draw(7, 5)).toEqual(draw(7, 5));
    const seen = new Set<number>();
    for (let s = 0; s < 20; s++) for (let i = 0; i < 50; i++) seen.add(Random.forStream(s, i).nextUint32());
    expect(seen.size).toBe(1000);
  });

  it('normal deviates of 20,000 streams (one each) have mean 0 and variance 1 within 5 standard errors', () => {
    const n = 20_000;
    let sum = 0;
    let sq = 0;
    for (let i = 0; i < n; i++) {
      const z = Random.forStream(3, i).normal();
      sum += z;
      sq += z * z;
    }
    const mean = sum / n;
    const variance = sq / n - mean * mean;
    expect(Math.abs(mean)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(variance - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
  });

  it('refuses seeds and indices outside [0, 2^32)', () => {
    expect(() => Random.forStream(-1, 0)).toThrow(RangeError);
    expect(() => Random.forStream(0, 2 ** 32)).toThrow(RangeError);
    expect(() => Random.forStream(0.5, 0)).toThrow(RangeError);
  });
});
