/**
 * The offset search of the tuner (src/gate/tune.ts) on synthetic landscapes with a known answer:
 * a window of solutions narrower than the scan grid (as where a near-sudden ramp's phi_c only
 * touches pi at the full 11-20 cycle) is found through the phase miss, and the least score
 * inside it is located by golden-section search.
 */
import { describe, expect, it } from 'vitest';
import { searchOffset, type HoldSolution, type OffsetEvaluation } from '../../src/gate/tune.js';

const solution = (score: number): HoldSolution => ({ holdNs: 10, leakage: 0, conditionalPhase: Math.PI, infidelity: score, score });

/** Solutions only for |x - centre| < halfWidth (score (x - best)^2 + 1e-6); elsewhere a miss growing with the distance. */
function narrowWindow(centre: number, halfWidth: number, best: number) {
  const calls: number[] = [];
  const evaluate = (x: number): OffsetEvaluation => {
    calls.push(x);
    const d = Math.abs(x - centre);
    return d < halfWidth ? { solution: solution((x - best) ** 2 + 1e-6), miss: 0 } : { solution: null, miss: d - halfWidth + 1e-3 };
  };
  return { evaluate, calls };
}

describe('searchOffset', () => {
  it('finds a window of solutions narrower than the grid spacing through the phase miss', () => {
    // grid: 11 points on [-1, 3] (spacing 0.4); the window is 0.02 wide around 0.23
    const w = narrowWindow(0.23, 0.01, 0.232);
    const r = searchOffset(w.evaluate, -1, 3, 11, 12, 2);
    expect(r).not.toBeNull();
    expect(Math.abs(r!.offsetGHz - 0.23)).toBeLessThan(0.01);
    // the score search then runs inside that bracket: within the window, near its best point
    expect(Math.abs(r!.offsetGHz - 0.232)).toBeLessThan(0.006);
    expect(r!.evaluations).toBe(w.calls.length);
  });

  it('returns null when no offset has a solution and the miss never closes', () => {
    const r = searchOffset((x) => ({ solution: null, miss: 0.1 + (x - 0.5) ** 2 }), -1, 3, 11, 7, 2);
    expect(r).toBeNull();
  });

  it('returns null when no offset can be reached at all', () => {
    expect(searchOffset(() => null, -1, 3, 11, 7, 2)).toBeNull();
  });

  it('with solutions on the grid, minimises the score (golden-section on a parabola)', () => {
    const r = searchOffset((x) => ({ solution: solution((x - 0.77) ** 2), miss: 0 }), -1, 3, 11, 20, 2);
    expect(Math.abs(r!.offsetGHz - 0.77)).toBeLessThan(1e-3);
  });
});
