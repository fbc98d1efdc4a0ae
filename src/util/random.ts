/**
 * Seeded pseudo-random numbers: xoshiro128** (Blackman and Vigna, "Scrambled linear
 * pseudorandom number generators", ACM TOMS 47 (2021)), seeded through splitmix32 so that any
 * integer seed gives a well-mixed state. Every random process in fluxlane takes a `Random`,
 * so the same seed gives byte-identical output.
 */

export class Random {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;
  private spare: number | undefined;

  constructor(seed: number) {
    let x = seed >>> 0;
    const next = (): number => {
      // splitmix32
      x = (x + 0x9e3779b9) | 0;
      let z = x;
      z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
      z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
      return (z ^ (z >>> 16)) >>> 0;
    };
    this.s0 = next();
    this.s1 = next();
    this.s2 = next();
    this.s3 = next();
    if ((this.s0 | this.s1 | this.s2 | this.s3) === 0) this.s0 = 1;
  }

  /** Next 32-bit unsigned integer. */
  nextUint32(): number {
    const result = Math.imul(rotl(Math.imul(this.s1, 5), 7), 9) >>> 0;
    const t = this.s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= this.s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = rotl(this.s3, 11);
    return result;
  }

  /** Uniform in [0, 1) with 53 random bits. */
  uniform(): number {
    const hi = this.nextUint32() >>> 5; // 27 bits
    const lo = this.nextUint32() >>> 6; // 26 bits
    return (hi * 67108864 + lo) / 9007199254740992;
  }

  /** Uniform in [lo, hi). */
  between(lo: number, hi: number): number {
    return lo + (hi - lo) * this.uniform();
  }

  /** Integer in [0, n). */
  int(n: number): number {
    return Math.floor(this.uniform() * n);
  }

  /** Standard normal deviate (Marsaglia polar method). */
  normal(): number {
    if (this.spare !== undefined) {
      const s = this.spare;
      this.spare = undefined;
      return s;
    }
    let u: number, v: number, s: number;
    do {
      u = 2 * this.uniform() - 1;
      v = 2 * this.uniform() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const m = Math.sqrt((-2 * Math.log(s)) / s);
    this.spare = v * m;
    return u * m;
  }

  /**
   * The stream of item `index` of a run with seed `seed` (e.g. one Monte Carlo sample): it depends
   * on the pair only, never on which thread or slice computes the item or in which order. The
   * 128-bit xoshiro state is two SplitMix64 outputs (Steele, Lea and Flood, OOPSLA 2014) from the
   * 64-bit key seed * 2^32 + index; SplitMix64's output function is a bijection of its counter,
   * so distinct keys give distinct states. Both numbers are unsigned 32-bit integers.
   */
  static forStream(seed: number, index: number): Random {
    if (!(Number.isInteger(seed) && seed >= 0 && seed <= 0xffffffff && Number.isInteger(index) && index >= 0 && index <= 0xffffffff)) {
      throw new RangeError(`Random.forStream: seed and index must be integers in [0, 2^32), got ${seed}, ${index}`);
    }
    let x = (BigInt(seed) << 32n) | BigInt(index);
    const next = (): bigint => {
      x = (x + 0x9e3779b97f4a7c15n) & MASK64;
      let z = x;
      z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
      z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
      return z ^ (z >> 31n);
    };
    const a = next();
    const b = next();
    const r = new Random(0);
    r.s0 = Number(a >> 32n);
    r.s1 = Number(a & 0xffffffffn);
    r.s2 = Number(b >> 32n);
    r.s3 = Number(b & 0xffffffffn);
    if ((r.s0 | r.s1 | r.s2 | r.s3) === 0) r.s0 = 1;
    return r;
  }

  /** A new independent stream derived from this one (for sharding work deterministically). */
  fork(): Random {
    return new Random(this.nextUint32());
  }
}

const MASK64 = 0xffffffffffffffffn;

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}
