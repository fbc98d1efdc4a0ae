/**
 * The manifold frame's early give-up (src/sim/manifold-frame.ts frameTailHopeless) on Chebyshev
 * tails whose decay is known in closed form (Trefethen, "Approximation Theory and Approximation
 * Practice", SIAM 2013, chs. 7-8; from memory): a function analytic in a Bernstein ellipse has
 * coefficients falling like rho^-N (a pole at distance eps from the interval: rho - 1 ~ eps), a
 * function with a jump like 1/N, one with a kink like 1/N^2. The rule must never stop a series
 * that reaches the tolerance by the largest degree, and should stop the ones that never do. The
 * coefficients come from chebyshevCoefficientRows (checked against NumPy in
 * test/linalg/chebyshev-series.test.ts); the frame build that gives up is checked in
 * test/budget/spectator-moving-basis.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { chebyshevCoefficientRows, chebyshevPoints } from '../../src/linalg/chebyshev-series.js';
import { BUDGET_QL_FROM_SIZE, buildManifoldFrame, frameTailHopeless, MANIFOLD_FRAME_DEFAULTS, QL_FROM_SIZE } from '../../src/sim/manifold-frame.js';
import { simulateGate } from '../../src/sim/simulate-gate.js';
import { cosineRamps, crossingFlux, ejRange, pairModel } from './support.js';

const TOL = 1e-11;
const MAX = MANIFOLD_FRAME_DEFAULTS.maxDegree;

/** Tail ratios at degrees 16, 32, ..., MAX and the degree at which the rule gives up (0: never). */
function run(f: (x: number) => number): { tails: number[]; stop: number } {
  const tails: number[] = [];
  let stop = 0;
  for (let n = MANIFOLD_FRAME_DEFAULTS.firstDegree; n <= MAX; n *= 2) {
    const v = Float64Array.from(chebyshevPoints(2, 5, n), f);
    const c = chebyshevCoefficientRows(v, n, 1, [n - 1, n]);
    tails.push(Math.max(Math.abs(c[0]), Math.abs(c[1])) / TOL);
    if (!stop && tails[tails.length - 1] > 1 && frameTailHopeless(tails, n, MAX)) stop = n;
  }
  return { tails, stop };
}

const pole = (eps: number) => (x: number) => 1 / (1 + ((x - 3.5) / eps) ** 2);

describe('frameTailHopeless', () => {
  it('never stops a geometrically converging series that reaches the tolerance by the largest degree', () => {
    for (const [name, f] of [['pole at 0.3', pole(0.3)], ['pole at 0.2', pole(0.2)], ['exp', Math.exp]] as const) {
      const r = run(f);
      expect(r.tails[r.tails.length - 1], `${name} converges by ${MAX}`).toBeLessThanOrEqual(1);
      expect(r.stop, name).toBe(0);
    }
  });

  it('stops series that never reach it: a jump (1/N) and a near pole by degree 32, a kink (1/N^2) by 64', () => {
    const cases: [string, (x: number) => number, number][] = [
      ['near jump', (x) => Math.tanh((x - 3.3) / 1e-4), 32],
      ['pole at 0.1', pole(0.1), 32],
      ['kink', (x) => Math.abs(x - 3.3), 64],
    ];
    for (const [name, f, by] of cases) {
      const r = run(f);
      expect(r.tails[r.tails.length - 1], `${name} does not converge by ${MAX}`).toBeGreaterThan(1);
      expect(r.stop, name).toBeGreaterThan(0);
      expect(r.stop, name).toBeLessThanOrEqual(by);
    }
  });

  it('asks for two tails and a tail above tolerance', () => {
    expect(frameTailHopeless([1e6], 16, MAX)).toBe(false);
    expect(frameTailHopeless([1e6, 0.5], 32, MAX)).toBe(false);
    // no reachable degree left: above tolerance is hopeless
    expect(frameTailHopeless([1e3, 2], 256, 256)).toBe(true);
  });
});

describe('the frame\'s eigensolver threshold (qlFromSize)', () => {
  it('a pair frame (12-state sectors) from Householder + QL equals the Jacobi one to 1e-10 in its tables and 1e-12 in the simulated gate (both solvers checked against numpy.linalg.eigh in test/linalg/)', () => {
    const traj = cosineRamps(0.9 * crossingFlux(), 10, 20, 0.5);
    const range = ejRange(traj);
    const jacobi = buildManifoldFrame(pairModel(6, 4), { ...range, qlFromSize: QL_FROM_SIZE });
    const ql = buildManifoldFrame(pairModel(6, 4), { ...range, qlFromSize: BUDGET_QL_FROM_SIZE });
    expect(jacobi.sectors.map((s) => s.size)).toEqual(ql.sectors.map((s) => s.size));
    // the eigensolver sees whole parity sectors of the 6 x 4 product space: 12 states each
    const solved = (6 * 4) / 2;
    expect(solved).toBeLessThan(QL_FROM_SIZE);
    expect(solved).toBeGreaterThanOrEqual(BUDGET_QL_FROM_SIZE);
    let worst = 0;
    jacobi.sectors.forEach((s, k) => {
      const t = ql.sectors[k];
      for (const field of ['energy', 'coupling'] as const) for (let q = 0; q < s[field].length; q++) worst = Math.max(worst, Math.abs(s[field][q] - t[field][q]));
    });
    expect(worst).toBeLessThan(1e-10);
    // (the two solvers really ran: their rounding differs)
    expect(worst).toBeGreaterThan(0);
    const a = simulateGate(jacobi, traj);
    const b = simulateGate(ql, traj);
    expect(Math.abs(a.fidelity - b.fidelity)).toBeLessThan(1e-12);
    expect(Math.abs(a.leakage - b.leakage)).toBeLessThan(1e-12);
    expect(Math.abs(a.conditionalPhase - b.conditionalPhase)).toBeLessThan(1e-10);
  });
});
