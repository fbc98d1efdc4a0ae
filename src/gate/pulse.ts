/**
 * A CZ flux pulse: ramp up to the destination, hold, and the time-reversed ramp back
 * (../../shared/physics.md sec. 6), and its realisation as the waveform the lab receives:
 * samples at the AWG rate (joined piecewise-linearly by the simulator, so the exported file is
 * exactly what was simulated) and, optionally, the flux line's Gaussian low-pass filter.
 *
 * Sampling: t_k = k / f_s, k = 0..N, N = ceil(T f_s) (or more, minIntervals) for the pulse
 * duration T = 2 ramp + hold; samples after T are at the parking flux. Filter: a Gaussian impulse response with
 * sigma = sqrt(ln 2) / (2 pi f_3dB) (amplitude response exp(-(2 pi f sigma)^2 / 2) = 1/sqrt2 at the
 * -3 dB bandwidth f_3dB), applied to the sampled sequence (discrete convolution, kernel truncated
 * at 6 sigma, the tail appended at the parking flux); the exported waveform is then the flux the
 * qubit sees, so re-simulating it reproduces the metrics (pre-distorting the AWG program for a
 * real line is the lab's step).
 */
import type { Trajectory } from '../sim/trajectory.js';
import type { Ramp } from './families/index.js';

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
 */
export function rampTrajectory(p: PulseShape, sampleRateGHz: number): Trajectory {
  const t: number[] = [];
  const x: number[] = [];
  for (let k = 0; k / sampleRateGHz < p.rampNs - 1e-9; k++) {
    t.push(k / sampleRateGHz);
    x.push(k === 0 ? p.parkFlux : p.ramp(k / sampleRateGHz));
  }
  t.push(p.rampNs);
  x.push(p.destFlux);
  return { timeNs: Float64Array.from(t), flux: Float64Array.from(x) };
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
}

/** The sampled (and filtered) waveform of a pulse. */
export function sampleWaveform(p: PulseShape, o: WaveformOptions): Trajectory {
  const fs = o.sampleRateGHz;
  const T = pulseDuration(p);
  const n = Math.max(1, Math.ceil(T * fs - 1e-9), o.minIntervals ?? 0);
  let x = new Float64Array(n + 1);
  for (let k = 0; k <= n; k++) x[k] = k === n ? p.parkFlux : pulseFlux(p, k / fs);
  if (o.bandwidthGHz !== undefined && o.bandwidthGHz > 0) {
    const sigma = Math.sqrt(Math.LN2) / (2 * Math.PI * o.bandwidthGHz); // ns
    const half = Math.ceil(6 * sigma * fs);
    const kernel = new Float64Array(2 * half + 1);
    let sum = 0;
    for (let j = -half; j <= half; j++) {
      const w = Math.exp(-0.5 * (j / (sigma * fs)) ** 2);
      kernel[j + half] = w;
      sum += w;
    }
    for (let j = 0; j < kernel.length; j++) kernel[j] /= sum;
    const m = n + 2 * half;
    const y = new Float64Array(m + 1);
    for (let k = 0; k <= m; k++) {
      let acc = 0;
      for (let j = -half; j <= half; j++) {
        const idx = k - half - j;
        acc += kernel[j + half] * (idx >= 0 && idx <= n ? x[idx] : p.parkFlux);
      }
      y[k] = acc;
    }
    y[0] = p.parkFlux;
    y[m] = p.parkFlux;
    x = y;
  }
  const t = new Float64Array(x.length);
  for (let k = 0; k < x.length; k++) t[k] = k / fs;
  return { timeNs: t, flux: x };
}
