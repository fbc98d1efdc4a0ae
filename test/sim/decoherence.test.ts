/**
 * Decoherence of simulated gates (README physics conventions sec. 4): the weak-noise idle formula
 * 1 - F ~ (2/5) t sum_q (1/T1_q + 1/T_phi_q) (derived from the process fidelity of amplitude
 * damping and dephasing and F_avg = (d F_pro + 1)/(d + 1), d = 4), and the first-order estimate
 * against the Lindblad channel.
 */
import { describe, expect, it } from 'vitest';
import { buildManifoldFrame, NOISE_TABLE_INTERVALS } from '../../src/sim/manifold-frame.js';
import { noiseColumnPattern, simulateGate } from '../../src/sim/simulate-gate.js';
import { josephsonEnergy } from '../../src/transmon/josephson.js';
import { fluxAt } from '../../src/sim/trajectory.js';
import { MOVER, cosineRamps, crossingFlux, ejRange, pairModel } from './support.js';

const T1A = 30000;
const T1B = 50000;
const TPA = 40000;
const TPB = 60000;
const noise = {
  a: { t1Ns: T1A, dephasingRate: () => 1 / TPA },
  b: { t1Ns: T1B, dephasingRate: () => 1 / TPB },
};

describe('decoherence', () => {
  it('an idle follows (2/5) t sum (1/T1 + 1/T_phi): first-order estimate exactly, Lindblad to second order', () => {
    const t = 60;
    const traj = { timeNs: Float64Array.from([0, t]), flux: Float64Array.from([0, 0]) };
    const u = josephsonEnergy(MOVER.ejsGHz, MOVER.asymmetry, 0);
    const frame = buildManifoldFrame(pairModel(6, 4, noise), { ejLo: u, ejHi: u, noiseOperators: true });
    // target CPhase(theta) with theta = the idle's own ZZ phase, so the coherent part is ideal
    const phi = simulateGate(frame, traj, { targetPhase: 0 }).conditionalPhase;
    const sim = simulateGate(frame, traj, { lindblad: true, targetPhase: phi });
    const formula = 0.4 * t * (1 / T1A + 1 / T1B + 1 / TPA + 1 / TPB);
    expect(1 - sim.fidelity).toBeLessThan(1e-12);
    expect(Math.abs(sim.decoherenceEstimate - formula) / formula).toBeLessThan(2e-3);
    // the Lindblad result differs only at second order in t / T (~ (2.3e-3)^2)
    expect(Math.abs(1 - sim.noisy!.fidelity - formula)).toBeLessThan(1e-5);
  });

  it('on a gate excursion the first-order estimate agrees with the Lindblad infidelity within 2 %', () => {
    const traj = cosineRamps(0.9 * crossingFlux(), 10, 20, 0.5);
    const frame = buildManifoldFrame(pairModel(6, 4, noise), { ...ejRange(traj), noiseOperators: true });
    const phi = simulateGate(frame, traj).conditionalPhase;
    const sim = simulateGate(frame, traj, { lindblad: true, targetPhase: phi });
    const lindblad = sim.fidelity - sim.noisy!.fidelity;
    expect(lindblad).toBeGreaterThan(1e-3);
    expect(Math.abs(sim.decoherenceEstimate - lindblad) / lindblad).toBeLessThan(0.02);
  });

  it('its split into the T1 and white-dephasing terms matches Lindblad runs with only that noise, within 2 % each (the error budget\'s t1 and whiteDephasing)', () => {
    const traj = cosineRamps(0.9 * crossingFlux(), 10, 20, 0.5);
    const only = (kind: 't1' | 'dephasing') => ({
      a: { t1Ns: kind === 't1' ? T1A : Infinity, dephasingRate: () => (kind === 't1' ? 0 : 1 / TPA) },
      b: { t1Ns: kind === 't1' ? T1B : Infinity, dephasingRate: () => (kind === 't1' ? 0 : 1 / TPB) },
    });
    const both = simulateGate(buildManifoldFrame(pairModel(6, 4, noise), { ...ejRange(traj), noiseOperators: true }), traj);
    for (const kind of ['t1', 'dephasing'] as const) {
      const frame = buildManifoldFrame(pairModel(6, 4, only(kind)), { ...ejRange(traj), noiseOperators: true });
      const phi = simulateGate(frame, traj).conditionalPhase;
      const sim = simulateGate(frame, traj, { lindblad: true, targetPhase: phi });
      const lindblad = sim.fidelity - sim.noisy!.fidelity;
      expect(Math.abs(both.decoherenceSplit[kind] - lindblad) / lindblad, kind).toBeLessThan(0.02);
    }
    expect(both.decoherenceSplit.t1 + both.decoherenceSplit.dephasing).toBeCloseTo(both.decoherenceEstimate, 15);
  });

  it('a flux-dependent T_phi enters through the mover flux along the trajectory', () => {
    // an excursion far from the 11-20 crossing, so the states stay computational
    const traj = cosineRamps(0.6 * crossingFlux(), 10, 20, 0.5);
    const flat = { a: { t1Ns: Infinity, dephasingRate: (_x: number) => 1e-5 }, b: { t1Ns: Infinity, dephasingRate: (_x: number) => 0 } };
    const slope = { a: { t1Ns: Infinity, dephasingRate: (x: number) => 1e-5 * (1 + 100 * x * x) }, b: { t1Ns: Infinity, dephasingRate: (_x: number) => 0 } };
    const est = (n: typeof flat): number => simulateGate(buildManifoldFrame(pairModel(6, 4, n), { ...ejRange(traj), noiseOperators: true }), traj).decoherenceEstimate;
    const e0 = est(flat);
    const e1 = est(slope);
    // Away from leakage the estimate is the idle formula with the time-averaged rate:
    // (2/5) int dt / T_phi(Phi(t)) (integral by a fine trapezoid rule over the samples).
    const T = traj.timeNs[traj.timeNs.length - 1];
    let integral = 0;
    const m = 20000;
    for (let k = 0; k < m; k++) {
      const t0 = (T * k) / m;
      const t1 = (T * (k + 1)) / m;
      integral += 0.5 * (slope.a.dephasingRate(fluxAt(traj, t0)) + slope.a.dephasingRate(fluxAt(traj, t1))) * (t1 - t0);
    }
    expect(Math.abs(e0 - 0.4 * 1e-5 * T) / e0).toBeLessThan(0.01);
    expect(Math.abs(e1 - 0.4 * integral) / e1).toBeLessThan(0.01);
    expect(e1 / e0).toBeGreaterThan(1.5);
  });
  it('the first-order estimate reads only the jump operators\' entries that are non-zero somewhere on the table: every other entry is exactly 0 (a ladder operator joins the two parity sectors, a number operator keeps its own; common practice: b changes the excitation number by one, b^dag b keeps it)', () => {
    const traj = cosineRamps(0.9 * crossingFlux(), 10, 20, 0.5);
    const frame = buildManifoldFrame(pairModel(6, 4, noise), { ...ejRange(traj), noiseOperators: true });
    const tables = frame.noise!;
    const dt = tables.size;
    const points = tables.ladder[0].length / (dt * dt);
    for (let s = 0; s < 2; s++) {
      const off = tables.offsets[s];
      const ds = frame.sectors[s].size;
      const otherOff = tables.offsets[1 - s];
      const otherSize = frame.sectors[1 - s].size;
      for (let i = 0; i < 2; i++) {
        for (const [values, slopes, kind] of [[tables.ladder[i], tables.ladderSlope[i], 'ladder'], [tables.number[i], tables.numberSlope[i], 'number']] as const) {
          const pattern = noiseColumnPattern(frame, values, slopes, off, ds);
          const listed = new Set(pattern.at);
          expect(pattern.at.length).toBeGreaterThan(0);
          for (let t = 0; t < pattern.rows.length; t++) {
            const r = pattern.rows[t];
            // the rows the operator can reach from this sector
            if (kind === 'ladder') expect(r >= otherOff && r < otherOff + otherSize).toBe(true);
            else expect(r >= off && r < off + ds).toBe(true);
            for (let e = pattern.rowStart[t]; e < pattern.rowStart[t + 1]; e++) expect(pattern.at[e]).toBe(r * dt + off + pattern.cols[e]);
          }
          for (let r = 0; r < dt; r++)
            for (let k = 0; k < ds; k++) {
              const q = r * dt + off + k;
              if (listed.has(q)) continue;
              for (let p = 0; p < points; p++) {
                expect(values[p * dt * dt + q]).toBe(0);
                expect(slopes[p * dt * dt + q]).toBe(0);
              }
            }
        }
      }
    }
  });
  it(`the jump operators' own table grid (${NOISE_TABLE_INTERVALS} intervals) gives the first-order estimate, its split and the Lindblad fidelity of the 128-interval tables within 1e-9 relative`, () => {
    const traj = cosineRamps(0.9 * crossingFlux(), 10, 20, 0.5);
    const coarse = buildManifoldFrame(pairModel(6, 4, noise), { ...ejRange(traj), noiseOperators: true });
    const fine = buildManifoldFrame(pairModel(6, 4, noise), { ...ejRange(traj), noiseOperators: true, noiseTableIntervals: 128 });
    expect(coarse.noise!.intervals).toBe(NOISE_TABLE_INTERVALS);
    expect(fine.noise!.intervals).toBe(128);
    const phi = simulateGate(fine, traj).conditionalPhase;
    const a = simulateGate(coarse, traj, { lindblad: true, targetPhase: phi });
    const b = simulateGate(fine, traj, { lindblad: true, targetPhase: phi });
    const rel = (x: number, y: number) => Math.abs(x - y) / Math.abs(y);
    expect(rel(a.decoherenceEstimate, b.decoherenceEstimate)).toBeLessThan(1e-9);
    expect(rel(a.decoherenceSplit.t1, b.decoherenceSplit.t1)).toBeLessThan(1e-9);
    expect(rel(a.decoherenceSplit.dephasing, b.decoherenceSplit.dephasing)).toBeLessThan(1e-9);
    expect(rel(1 - a.noisy!.fidelity, 1 - b.noisy!.fidelity)).toBeLessThan(1e-9);
  });
});
