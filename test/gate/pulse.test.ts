import { describe, expect, it } from 'vitest';
import { lineDelayNs, lineSigmaNs, pulseFlux, sampleWaveform, rampTrajectory } from '../../src/gate/pulse.js';
import { buildManifoldFrame } from '../../src/sim/manifold-frame.js';
import { simulateGate } from '../../src/sim/simulate-gate.js';
import { edgeSimModel, moverEjRange } from '../../src/sim/pair-model.js';
import { G_LAYOUT, Q0, Q1 } from './support.js';
import { assertTrajectory, fluxAt } from '../../src/sim/trajectory.js';
import { runPython } from '../support/python.js';

const linear = (park: number, dest: number, ramp: number) => (t: number) => park + ((dest - park) * t) / ramp;

describe('pulse and waveform', () => {
  it('the pulse is ramp, hold, time-reversed ramp', () => {
    const p = { ramp: linear(0, 0.2, 4), rampNs: 4, holdNs: 3, parkFlux: 0, destFlux: 0.2 };
    expect(pulseFlux(p, 2)).toBeCloseTo(0.1, 15);
    expect(pulseFlux(p, 5)).toBe(0.2);
    expect(pulseFlux(p, 9)).toBeCloseTo(0.1, 15);
    expect(pulseFlux(p, 11)).toBe(0);
  });

  it('samples sit on the AWG grid k / f_s, end at the parking flux and form a valid trajectory', () => {
    const p = { ramp: linear(0.01, 0.2, 4), rampNs: 4, holdNs: 3.3, parkFlux: 0.01, destFlux: 0.2 };
    const w = sampleWaveform(p, { sampleRateGHz: 2.4 });
    assertTrajectory(w);
    w.timeNs.forEach((t, k) => expect(t).toBeCloseTo(k / 2.4, 12));
    expect(w.flux[w.flux.length - 1]).toBe(0.01);
    expect(w.timeNs[w.timeNs.length - 1]).toBeGreaterThanOrEqual(11.3);
    expect(sampleWaveform(p, { sampleRateGHz: 2.4, minIntervals: 40 }).timeNs.length).toBe(41);
  });

  const f3 = 0.8;
  const sigma = Math.sqrt(Math.LN2) / (2 * Math.PI * f3);
  const fs = 2.4;
  const big = { ramp: (t: number) => 0.35 * (1 - Math.cos((Math.PI * t) / 6)) / 2, rampNs: 6, holdNs: 7.3, parkFlux: 0, destFlux: 0.35 };

  it('the Gaussian line filter matches an independent convolution (NumPy/SciPy fftconvolve of the linear join, test/reference/gaussian_line.py) to 1e-7', () => {
    const raw = sampleWaveform(big, { sampleRateGHz: fs });
    const w = sampleWaveform(big, { sampleRateGHz: fs, bandwidthGHz: f3 });
    assertTrajectory(w);
    const delay = Math.ceil(8 * sigma * fs - 1e-9) / fs;
    const ref = runPython<{ flux: number[] }>('gaussian_line.py', { samples: Array.from(raw.flux), fs, sigma, park: 0, times: Array.from(w.timeNs, (t) => t - delay), h: 2e-4 });
    let worst = 0;
    w.flux.forEach((v, j) => (worst = Math.max(worst, Math.abs(v - ref.flux[j]))));
    expect(worst).toBeLessThan(1e-7);
    // fine grid: at least 16 GS/s on the AWG clock; plateaus kept as their two ends only
    const steps = Array.from(w.timeNs.subarray(1), (t, j) => t - w.timeNs[j]);
    expect(Math.min(...steps)).toBeCloseTo(1 / (7 * fs), 12);
    expect(w.flux.filter((v) => v === 0.35).length).toBe(2);
  });

  it('the filter passes DC exactly, keeps the area and attenuates a sinusoid at f_3dB by 1/sqrt2 (its definition)', () => {
    const w = sampleWaveform(big, { sampleRateGHz: fs, bandwidthGHz: f3 });
    const raw = sampleWaveform(big, { sampleRateGHz: fs });
    const trapz = (tr: { timeNs: Float64Array; flux: Float64Array }) => {
      let a = 0;
      for (let j = 1; j < tr.flux.length; j++) a += 0.5 * (tr.flux[j] + tr.flux[j - 1]) * (tr.timeNs[j] - tr.timeNs[j - 1]);
      return a;
    };
    expect(Math.abs(trapz(w) - trapz(raw))).toBeLessThan(1e-9);
    expect(Math.max(...w.flux)).toBe(0.35);
    // a plateau modulated at f_3dB: the filtered modulation has amplitude 1/sqrt2 of the input
    // (the linear join at 50 GS/s costs < 1e-3 of it)
    const amp = 0.01;
    const rate = 50;
    const mod = { ramp: (t: number) => (t < 2 ? 0.05 * (t / 2) : 0.05 + (t > 5 && t < 55 ? amp * Math.sin(2 * Math.PI * f3 * (t - 5)) : 0)), rampNs: 60, holdNs: 0, parkFlux: 0, destFlux: 0.05 };
    const f = sampleWaveform(mod, { sampleRateGHz: rate, bandwidthGHz: f3 });
    const delay = Math.ceil(8 * sigma * rate - 1e-9) / rate;
    let peak = 0;
    f.timeNs.forEach((t, j) => {
      if (t - delay > 20 && t - delay < 40) peak = Math.max(peak, Math.abs(f.flux[j] - 0.05));
    });
    expect(Math.abs(peak / amp - Math.SQRT1_2)).toBeLessThan(2e-3);
  });

  it('through the line, the fine grid removes the sample corners\' squeezing kick: vacuum and |10> keep their population, as with the NumPy-filtered flux on a 10 ps grid', () => {
    // Bowline-5 Q1 (mover) and Q0: a 6 ns cosine ramp from the sweet spot down 1.3 GHz and back
    const shape = { ramp: (t: number) => (0.3 * (1 - Math.cos((Math.PI * t) / 6))) / 2, rampNs: 6, holdNs: 4, parkFlux: 0, destFlux: 0.3 };
    const model = edgeSimModel({ mover: Q1, partner: Q0, gGHz: G_LAYOUT, partnerFlux: 0 });
    const raw = sampleWaveform(shape, { sampleRateGHz: fs });
    const filt = sampleWaveform(shape, { sampleRateGHz: fs, bandwidthGHz: 1 });
    const delay = lineDelayNs(fs, 1);
    const end = filt.timeNs[filt.timeNs.length - 1];
    const times = Array.from({ length: Math.round(end / 0.01) + 1 }, (_, j) => j * 0.01);
    const ref = runPython<{ flux: number[] }>('gaussian_line.py', { samples: Array.from(raw.flux), fs, sigma: lineSigmaNs(1), park: 0, times: times.map((t) => t - delay), h: 2e-4 });
    const refW = { timeNs: Float64Array.from(times), flux: Float64Array.from(ref.flux, (v, j) => (j === 0 || j === times.length - 1 ? 0 : v)) };
    const frame = buildManifoldFrame(model, moverEjRange(Q1, refW));
    const lost = (w: typeof raw, col: number): number => {
      const s = simulateGate(frame, w);
      let n = 0;
      for (let r = 0; r < 4; r++) n += s.m.re[r * 4 + col] ** 2 + s.m.im[r * 4 + col] ** 2;
      return 1 - n;
    };
    // |00> and |10> can only leave the computational space by the mover's 0-2 / 1-3 transitions
    for (const col of [0, 2]) {
      expect(lost(raw, col)).toBeGreaterThan(1e-7); // measured 2.7e-7, 2.5e-7
      expect(lost(filt, col)).toBeLessThan(1e-9); // measured 2e-11
      expect(lost(refW, col)).toBeLessThan(1e-9);
    }
    const a = simulateGate(frame, filt);
    const b = simulateGate(frame, refW);
    // the remaining difference is the fine grid's linear join of a smooth curve
    expect(Math.abs(a.leakage - b.leakage)).toBeLessThan(1e-4);
    expect(Math.abs(a.conditionalPhase - b.conditionalPhase)).toBeLessThan(2e-4);
  }, 60_000);

  it('through the line, rampTrajectory is the start of the filtered pulse, settled on the destination, with the hold shifted by 2 ext', () => {
    const shape = { ramp: (t: number) => (0.2 * (1 - Math.cos((Math.PI * t) / 5.1))) / 2, rampNs: 5.1, holdNs: 0, parkFlux: 0.02, destFlux: 0.2 };
    const up = rampTrajectory(shape, fs, { bandwidthGHz: 1 });
    assertTrajectory({ timeNs: up.timeNs, flux: Float64Array.from(up.flux, (v, j) => (j === up.flux.length - 1 ? 0.02 : v)) });
    expect(up.flux[up.flux.length - 1]).toBe(0.2);
    const ext = up.timeNs[up.timeNs.length - 1] - shape.rampNs - lineDelayNs(fs, 1);
    expect(ext).toBeGreaterThan(0);
    const full = sampleWaveform({ ...shape, holdNs: 3 + 2 * ext }, { sampleRateGHz: fs, bandwidthGHz: 1 });
    const at = (w: typeof up, t: number) => fluxAt(w, t);
    up.timeNs.forEach((t, j) => expect(Math.abs(at(full, t) - up.flux[j])).toBeLessThan(1e-12));
    // after it a plateau at the destination exactly, then the mirror: the pulse lasts the ramp
    // trajectory twice plus the 3 ns, up to the rounding to the AWG grid
    const tEnd = up.timeNs[up.timeNs.length - 1];
    for (let t = tEnd; t <= tEnd + 3 - 1 / fs; t += 0.05) expect(at(full, t)).toBe(0.2);
    const excess = full.timeNs[full.timeNs.length - 1] - (2 * tEnd + 3);
    expect(excess).toBeGreaterThanOrEqual(-1e-9);
    expect(excess).toBeLessThan(1 / fs);
  });

  it('rampTrajectory samples the ramp up on the AWG grid and ends at the destination', () => {
    const p = { ramp: linear(0, 0.2, 4), rampNs: 4, holdNs: 0, parkFlux: 0, destFlux: 0.2 };
    const r = rampTrajectory(p, 2.4);
    expect(r.timeNs[r.timeNs.length - 1]).toBe(4);
    expect(r.flux[r.flux.length - 1]).toBe(0.2);
    expect(r.timeNs[1]).toBeCloseTo(1 / 2.4, 14);
  });
});
