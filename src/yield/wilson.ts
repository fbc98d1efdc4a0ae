/**
 * The Wilson score interval of a binomial proportion (E. B. Wilson, J. Am. Stat. Assoc. 22, 209
 * (1927)): with p = k / n and z the two-sided normal quantile of the confidence,
 *
 *     centre = (p + z^2 / 2n) / (1 + z^2 / n),
 *     half   = z / (1 + z^2 / n) * sqrt(p (1 - p) / n + z^2 / 4n^2).
 *
 * Unlike the normal approximation it stays inside [0, 1] and is sensible at k = 0 and k = n
 * (a yield of 0 or 1 in a few samples). Checked against scipy.stats.binomtest(k, n).proportion_ci(
 * method='wilson') in test/yield/wilson.test.ts.
 */

/** z of a two-sided 95 % interval: the 0.975 quantile of the standard normal (scipy.stats.norm.ppf(0.975)). */
export const Z_95 = 1.959963984540054;

export interface ProportionInterval {
  low: number;
  high: number;
}

export function wilsonInterval(successes: number, samples: number, z: number = Z_95): ProportionInterval {
  if (!(Number.isInteger(samples) && samples > 0 && Number.isInteger(successes) && successes >= 0 && successes <= samples)) {
    throw new RangeError(`wilsonInterval: need integers 0 <= successes <= samples, samples > 0 (got ${successes}, ${samples})`);
  }
  const n = samples;
  const p = successes / n;
  const z2 = z * z;
  const denom = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denom;
  const half = (z / denom) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  return { low: Math.max(0, centre - half), high: Math.min(1, centre + half) };
}
