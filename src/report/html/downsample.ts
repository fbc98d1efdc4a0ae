/**
 * Downsampling a sampled curve for drawing: Largest-Triangle-Three-Buckets (S. Steinarsson,
 * "Downsampling Time Series for Visual Representation", MSc thesis, University of Iceland, 2013,
 * sec. 4.2). The first and last samples are kept; the samples between are split into `m - 2`
 * buckets of (nearly) equal count, and from each bucket the sample is kept that spans the
 * largest triangle with the sample kept from the previous bucket and the mean of the next
 * bucket. Triangle areas scale by the same factor under any rescaling of either axis, so the
 * choice does not depend on the units of x and y. Peaks survive because a sample far from its
 * neighbours spans a large triangle.
 *
 *     const keep = largestTriangleThreeBuckets(timeNs, flux, 200);   // indices, increasing
 */

/**
 * Indices of the samples to keep, strictly increasing, first 0 and last n - 1. When `m >= n`
 * every index is returned; `m` below 3 is raised to 3 (first, one middle, last) when n >= 3.
 */
export function largestTriangleThreeBuckets(x: ArrayLike<number>, y: ArrayLike<number>, m: number): Int32Array {
  const n = x.length;
  if (y.length !== n) throw new RangeError(`largestTriangleThreeBuckets: x has ${n} samples, y has ${y.length}`);
  const target = Math.max(3, Math.floor(m));
  if (target >= n) return Int32Array.from({ length: n }, (_, i) => i);
  const out = new Int32Array(target);
  const every = (n - 2) / (target - 2);
  let a = 0;
  out[0] = 0;
  for (let i = 0; i < target - 2; i++) {
    // Mean of the next bucket (the last sample for the final bucket).
    const nextStart = Math.floor((i + 1) * every) + 1;
    const nextEnd = Math.min(Math.floor((i + 2) * every) + 1, n);
    let avgX = 0;
    let avgY = 0;
    for (let j = nextStart; j < nextEnd; j++) {
      avgX += x[j];
      avgY += y[j];
    }
    const count = nextEnd - nextStart;
    avgX /= count;
    avgY /= count;
    // The sample of this bucket with the largest triangle (a, sample, next mean).
    const start = Math.floor(i * every) + 1;
    const end = Math.floor((i + 1) * every) + 1;
    const ax = x[a];
    const ay = y[a];
    let best = start;
    let bestArea = -1;
    for (let j = start; j < end; j++) {
      const area = Math.abs((ax - avgX) * (y[j] - ay) - (ax - x[j]) * (avgY - ay));
      if (area > bestArea) {
        bestArea = area;
        best = j;
      }
    }
    out[i + 1] = best;
    a = best;
  }
  out[target - 1] = n - 1;
  return out;
}
