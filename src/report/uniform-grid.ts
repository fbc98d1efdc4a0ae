/**
 * A waveform on its uniform grid: the designer's filtered waveform keeps only the two ends of
 * each plateau (src/gate/pulse.ts); the file the lab reads has every sample of the grid
 * t_j = j / rate. Kept samples are copied bit for bit and the dropped ones are their plateau's
 * value, so the piecewise-linear flux is the same function (and simulates to the same numbers).
 */
import { fluxAt, type Trajectory } from '../sim/trajectory.js';

export function onUniformGrid(w: Trajectory, rateGHz: number): Trajectory {
  const n = w.timeNs.length;
  if (n < 2) return w;
  const dt = 1 / rateGHz;
  const t0 = w.timeNs[0];
  const count = Math.round((w.timeNs[n - 1] - t0) / dt);
  const t = new Float64Array(count + 1);
  const x = new Float64Array(count + 1);
  let k = 0;
  for (let j = 0; j <= count; j++) {
    const tj = t0 + j * dt;
    while (k < n - 1 && w.timeNs[k] < tj - 1e-9 * dt) k++;
    if (Math.abs(w.timeNs[k] - tj) <= 1e-9 * dt) {
      t[j] = w.timeNs[k];
      x[j] = w.flux[k];
    } else {
      t[j] = tj;
      x[j] = fluxAt(w, tj);
    }
  }
  return { timeNs: t, flux: x };
}
