/**
 * onUniformGrid (src/report/uniform-grid.ts): a designed waveform with plateaus kept as their ends,
 * written on its uniform grid, is the same piecewise-linear flux: every kept sample bit for bit,
 * every time's flux equal, the grid uniform.
 */
import { describe, expect, it } from 'vitest';
import { sampleWaveform, waveformGridRateGHz } from '../../src/gate/pulse.js';
import { fluxAt, mergePlateaus } from '../../src/sim/trajectory.js';
import { onUniformGrid } from '../../src/report/uniform-grid.js';

describe('onUniformGrid', () => {
  const shape = { ramp: (t: number) => 0.3 * (1 - Math.cos((Math.PI * t) / 6)) / 2, rampNs: 6, holdNs: 17.3, parkFlux: 0, destFlux: 0.3 };
  const w = sampleWaveform(shape, { sampleRateGHz: 2.4, bandwidthGHz: 1 });
  const rate = waveformGridRateGHz(2.4, 1);

  it('the filtered waveform lies on the fine grid 7 x 2.4 GS/s with its plateaus cut to their ends', () => {
    expect(rate).toBeCloseTo(16.8, 12);
    w.timeNs.forEach((t) => expect(Math.abs(t * rate - Math.round(t * rate))).toBeLessThan(1e-9));
    expect(w.flux.filter((x) => x === 0.3).length).toBe(2);
  });

  it('fills the grid: uniform steps, kept samples bit for bit, the same flux at any time, and merging the plateaus again gives the original', () => {
    const u = onUniformGrid(w, rate);
    expect(u.timeNs.length).toBe(Math.round((w.timeNs[w.timeNs.length - 1] - w.timeNs[0]) * rate) + 1);
    for (let j = 1; j < u.timeNs.length; j++) expect(Math.abs(u.timeNs[j] - u.timeNs[j - 1] - 1 / rate)).toBeLessThan(1e-12);
    const at = new Map(Array.from(u.timeNs, (t, j) => [t, u.flux[j]]));
    w.timeNs.forEach((t, k) => expect(at.get(t)).toBe(w.flux[k]));
    for (let t = 0; t < w.timeNs[w.timeNs.length - 1]; t += 0.0137) expect(Math.abs(fluxAt(u, t) - fluxAt(w, t))).toBeLessThan(1e-15);
    const back = mergePlateaus(u);
    expect(Array.from(back.timeNs)).toEqual(Array.from(w.timeNs));
    expect(Array.from(back.flux)).toEqual(Array.from(w.flux));
  });
});
