/**
 * A CZ flux pulse: ramp up to the destination, hold, and the time-reversed ramp back
 * (README physics conventions sec. 6), and its realisation as the waveform the lab receives:
 * samples at the AWG rate (joined piecewise-linearly by the simulator, so the exported file is
 * exactly what was simulated) and, optionally, the flux line's Gaussian low-pass filter.
 *
 * Sampling: t_k = k / f_s, k = 0..N, N = ceil(T f_s) (or more, minIntervals) for the pulse
 * duration T = 2 ramp + hold; samples after T are at the parking flux. Filter: a Gaussian impulse
 * response with sigma = sqrt(ln 2) / (2 pi f_3dB) (amplitude response exp(-(2 pi f sigma)^2 / 2)
 * = 1/sqrt2 at the -3 dB bandwidth f_3dB), applied in continuous time to the linearly joined
 * samples and evaluated on a finer grid (filterThroughLine); the exported waveform is then the
 * flux the qubit sees, so re-simulating it reproduces the metrics (pre-distorting the AWG program
 * for a real line is the lab's step).
 */
import type { Trajectory } from '../sim/trajectory.js';
import type { Ramp } from './families/index.js';
import { erfc } from '../util/erf.js';

export interface PulseShape {
  ramp: Ramp;
  rampNs: number;
  holdNs: number;
  parkFlux: number;
  destFlux: number;
}

/** Flux of the continuous pulse at time t (parking outside [0, T]). */
export function pulseFlux(p: PulseShape, t: number): number {
  const T = 2 * p.rampNs + p.holdNs;
  if (t <= 0 || t >= T) return p.parkFlux;
  if (t < p.rampNs) return p.ramp(t);
  if (t <= p.rampNs + p.holdNs) return p.destFlux;
  return p.ramp(T - t);
}

export function pulseDuration(p: PulseShape): number {
  return 2 * p.rampNs + p.holdNs;
}

/**
 * The ramp up as the waveform will sample it (t_k = k / f_s while t_k < ramp, then the ramp's
 * end point), for the tuner's ramp-only simulations: the final waveform's ramp up has exactly
 * these samples, and its ramp down differs only by where the sample grid falls.
 *
 * Through a band-limited line (bandwidthGHz) the samples continue at the destination and the
 * result is the filtered flux (delayed by lineDelayNs, on the AWG grid or, with fineGrid, on the
 * filter's fine grid) up to where it has settled exactly on the destination. A hold h after it,
 * mirrored, is the filtered pulse with hold h + 2 (duration - rampNs - lineDelayNs).
 */
export function rampTrajectory(p: PulseShape, sampleRateGHz: number, line: { bandwidthGHz?: number; fineGrid?: boolean } = {}): Trajectory {
  const t: number[] = [];
  const x: number[] = [];
  for (let k = 0; k / sampleRateGHz < p.rampNs - 1e-9; k++) {
    t.push(k / sampleRateGHz);
    x.push(k === 0 ? p.parkFlux : p.ramp(k / sampleRateGHz));
  }
  if (line.bandwidthGHz !== undefined && line.bandwidthGHz > 0) {
    x.push(p.destFlux);
    return filterThroughLine(Float64Array.from(x), sampleRateGHz, line.bandwidthGHz, p.parkFlux, p.destFlux, line.fineGrid ?? true);
  }
  t.push(p.rampNs);
  x.push(p.destFlux);
  return { timeNs: Float64Array.from(t), flux: Float64Array.from(x) };
}

/** Delay of the filtered waveform (ns): whole AWG intervals covering the filter's reach (0 for an ideal line). */
export function lineDelayNs(sampleRateGHz: number, bandwidthGHz?: number): number {
  if (bandwidthGHz === undefined || !(bandwidthGHz > 0)) return 0;
  return Math.ceil(FILTER_REACH_SIGMAS * lineSigmaNs(bandwidthGHz) * sampleRateGHz - 1e-9) / sampleRateGHz;
}

/** sigma of the Gaussian impulse response with -3 dB bandwidth f_3dB: sqrt(ln 2) / (2 pi f_3dB), ns. */
export function lineSigmaNs(bandwidthGHz: number): number {
  return Math.sqrt(Math.LN2) / (2 * Math.PI * bandwidthGHz);
}

export interface WaveformOptions {
  sampleRateGHz: number;
  /** -3 dB bandwidth of the flux line's Gaussian filter; undefined = ideal line. */
  bandwidthGHz?: number;
  /**
   * At least this many sample intervals (trailing samples at parking). Holding the count fixed
   * keeps the waveform's duration, and so the idle phase at its end, continuous in the hold.
   */
  minIntervals?: number;
  /**
   * Through a line: false gives the filtered flux on the AWG grid only (cheaper to simulate; its
   * corners bring back the squeezing kick of filterThroughLine's note, so only for references
   * that do not need it). Default true.
   */
  fineGrid?: boolean;
}

/**
 * The AWG program of a pulse: its samples x_k = flux(k / f_s), k = 0..N (the last at parking),
 * what the generator plays before the line. sampleWaveform joins them and passes them through it.
 */
export function awgSamples(p: PulseShape, o: Pick<WaveformOptions, 'sampleRateGHz' | 'minIntervals'>): Float64Array {
  const fs = o.sampleRateGHz;
  const T = pulseDuration(p);
  const n = Math.max(1, Math.ceil(T * fs - 1e-9), o.minIntervals ?? 0);
  const x = new Float64Array(n + 1);
  for (let k = 0; k <= n; k++) x[k] = k === n ? p.parkFlux : pulseFlux(p, k / fs);
  return x;
}

/**
 * Sample rate of the waveform sampleWaveform returns (GHz): the filter's fine grid m f_s through
 * a band-limited line (fine grid), else the AWG rate. Its samples all lie on this uniform grid
 * (plateaus keep only their ends).
 */
export function waveformGridRateGHz(sampleRateGHz: number, bandwidthGHz?: number, fineGrid = true): number {
  if (bandwidthGHz === undefined || !(bandwidthGHz > 0) || !fineGrid) return sampleRateGHz;
  return Math.max(1, Math.ceil(FILTERED_GRID_MIN_RATE_GHZ / sampleRateGHz - 1e-9)) * sampleRateGHz;
}

/** The sampled (and filtered) waveform of a pulse. */
export function sampleWaveform(p: PulseShape, o: WaveformOptions): Trajectory {
  const fs = o.sampleRateGHz;
  const x = awgSamples(p, o);
  const n = x.length - 1;
  if (o.bandwidthGHz !== undefined && o.bandwidthGHz > 0) return filterThroughLine(x, fs, o.bandwidthGHz, p.parkFlux, p.parkFlux, o.fineGrid ?? true);
  const t = new Float64Array(x.length);
  for (let k = 0; k < x.length; k++) t[k] = k / fs;
  return { timeNs: t, flux: x };
}

/** Fine grid of the filtered waveform: at least this rate (GHz), an integer multiple of f_s. */
export const FILTERED_GRID_MIN_RATE_GHZ = 16;
/** The Gaussian's reach (sigmas) kept in the filtered waveform; beyond it its weight is < 1e-15. */
const FILTER_REACH_SIGMAS = 8;

/**
 * The AWG samples x_k (t_k = k / f_s; `before` earlier, the last sample later) joined
 * piecewise-linearly and passed, in continuous time, through the Gaussian line filter; evaluated
 * on a grid m times finer than the AWG's (m f_s >= FILTERED_GRID_MIN_RATE_GHZ; m = 1 without
 * `fine`) and delayed by a whole number of AWG intervals so it starts at `before` and ends at the
 * last sample exactly.
 *
 * Exact form: the linear join is L(t) = x_before + sum_k c_k R(t - t_k) with R(u) = max(u, 0) and
 * c_k the change of slope at sample k; its Gaussian smoothing replaces R by
 * R_s(u) = u Phi(u/s) + s phi(u/s), and R_s - R = s phi(|u|/s) - |u| Phi(-|u|/s) is even and
 * negligible beyond 8 s, so y(t) = L(t) + sum_{|t - t_k| < 8 s} c_k (R_s - R)(t - t_k). On a
 * plateau farther than 8 s from any corner y equals the plateau exactly.
 *
 * Why the fine grid: joined at the AWG rate, the corners at every sample carry spectral weight
 * near the mover's 0-2 frequency (aliased, ~7-14 GHz) and drive squeezing leakage of up to ~1e-3
 * on large excursions, which no band-limited line passes; on the fine grid the filtered
 * waveform's own corners are too small to matter (tested against a much finer grid).
 */
function filterThroughLine(x: Float64Array, fs: number, bandwidthGHz: number, before: number, after: number, fine: boolean): Trajectory {
  const n = x.length - 1;
  const sigma = lineSigmaNs(bandwidthGHz);
  const reach = FILTER_REACH_SIGMAS * sigma;
  const m = fine ? Math.max(1, Math.ceil(FILTERED_GRID_MIN_RATE_GHZ / fs - 1e-9)) : 1;
  const delay = Math.round(lineDelayNs(fs, bandwidthGHz) * fs); // AWG intervals
  // slope changes c_k at the AWG samples (flux per ns)
  const c = new Float64Array(n + 1);
  let prev = 0;
  for (let k = 0; k <= n; k++) {
    const s = k < n ? (x[k + 1] - x[k]) * fs : 0;
    c[k] = s - prev;
    prev = s;
  }
  const total = (n + 2 * delay) * m;
  const t = new Float64Array(total + 1);
  const y = new Float64Array(total + 1);
  const dtFine = 1 / (fs * m);
  const invSigma = 1 / sigma;
  const phiNorm = 1 / Math.sqrt(2 * Math.PI);
  for (let j = 0; j <= total; j++) {
    t[j] = j * dtFine;
    const tau = (j - delay * m) * dtFine; // time on the AWG's clock
    // the linear join at tau
    let v: number;
    if (tau <= 0) v = before;
    else if (tau >= n / fs) v = after;
    else {
      const kk = Math.min(n - 1, Math.floor(tau * fs));
      const f = tau * fs - kk;
      v = x[kk] + f * (x[kk + 1] - x[kk]);
    }
    const kLo = Math.max(0, Math.ceil((tau - reach) * fs - 1e-9));
    const kHi = Math.min(n, Math.floor((tau + reach) * fs + 1e-9));
    for (let k = kLo; k <= kHi; k++) {
      if (c[k] === 0) continue;
      const au = Math.abs(tau - k / fs);
      const z = au * invSigma;
      v += c[k] * (sigma * phiNorm * Math.exp(-0.5 * z * z) - au * 0.5 * erfc(z / Math.SQRT2));
    }
    y[j] = Math.max(-0.5, Math.min(0.5, v));
  }
  y[0] = before;
  y[total] = after;
  // plateaus: keep only the ends of runs of equal samples (any spacing is a valid trajectory)
  const keep: number[] = [];
  for (let j = 0; j <= total; j++) if (j === 0 || j === total || y[j] !== y[j - 1] || y[j] !== y[j + 1]) keep.push(j);
  return { timeNs: Float64Array.from(keep, (j) => t[j]), flux: Float64Array.from(keep, (j) => y[j]) };
}
