/**
 * Up-front work limits (src/cli/work-limits.ts): the estimates follow their documented models
 * (README "Guarantees and limits"), and the refusals name the limit, the estimate and the value
 * to pass.
 */
import { describe, expect, it } from 'vitest';
import { parseLayoutText } from '../../src/layout/load.js';
import { DEFAULT_RULES } from '../../src/layout/rules.js';
import { designSeconds, enforceChipLimits, enforceWork, MAX_DEGREE, plannerWork, simulateWork, WORK_MODEL } from '../../src/cli/work-limits.js';
import { MAX_SCHEDULE_STEPS } from '../../src/sim/propagate-frame.js';

function chain(n: number, extra: [number, number][] = []): string {
  const q = Array.from({ length: n }, (_, i) => `  Q${i}: { pos: [${i}, 0], fMax: ${(5 + (i % 3) * 0.6).toFixed(1)} GHz, anharmonicity: -210 MHz, asymmetry: 0.3, t1: 60 us, fluxNoise: 3 uPhi0 }`);
  const c = Array.from({ length: n - 1 }, (_, i) => `  - [Q${i}, Q${i + 1}, 12 MHz]`).concat(extra.map(([a, b]) => `  - [Q${a}, Q${b}, 12 MHz]`));
  return `chip: C\nqubits:\n${q.join('\n')}\ncouplings:\n${c.join('\n')}\n`;
}

describe('work limits', () => {
  it('the planner estimate is (0.015 n + 6e-6 n^2) s, times (degree / 4)^2 above degree 4', () => {
    expect(plannerWork(parseLayoutText(chain(100), 'c.yaml')).seconds).toBeCloseTo(WORK_MODEL.plannerPerQubit * 100 + WORK_MODEL.plannerPerQubitSquared * 1e4, 12);
    const star = parseLayoutText(chain(8, [[0, 2], [0, 3], [0, 4], [0, 5]]), 's.yaml'); // Q0: degree 5
    expect(plannerWork(star).seconds).toBeCloseTo((0.015 * 8 + 6e-6 * 64) * (5 / 4) ** 2, 12);
  });

  it('refuses a qubit with more than 6 couplings, at its place in the layout', () => {
    const layout = parseLayoutText(chain(9, [[0, 2], [0, 3], [0, 4], [0, 5], [0, 6], [0, 7]]), 'd.yaml');
    expect(() => enforceChipLimits(layout, 'check')).toThrow(`expected at most ${MAX_DEGREE} couplings per qubit`);
    try {
      enforceChipLimits(layout, 'check');
    } catch (e) {
      expect((e as { diagnostics: unknown[] }).diagnostics[0]).toMatchObject({ file: 'd.yaml', line: 3, column: 3, path: 'qubits.Q0' });
    }
  });

  it('a design at the default rules costs about 0.1 s, more with a faster line grid, Lindblad and spectators', () => {
    const base = designSeconds(DEFAULT_RULES, 0.012);
    expect(base).toBeGreaterThan(0.08);
    expect(base).toBeLessThan(0.12);
    expect(designSeconds(DEFAULT_RULES, 0.012, { lindblad: true })).toBeCloseTo(8 * base, 12);
    expect(designSeconds(DEFAULT_RULES, 0.012, { spectators: 1 })).toBeCloseTo(3 * base, 12);
    expect(designSeconds({ ...DEFAULT_RULES, sampleRateGHz: 50, fluxBandwidthGHz: 0.1, maxGateNs: 2000 }, 0.002)).toBeGreaterThan(5);
  });

  it('simulate counts steps as the schedule does: holds are one step, ramps 0.2 ns each, and over 4e6 steps is refused', () => {
    const ej = () => 20;
    const hold = simulateWork([0, 1000, 2000], [0.1, 0.1, 0.1], ej, { levels: 6, noise: false, spectators: 0 });
    expect(hold.seconds).toBeCloseTo(2 * WORK_MODEL.stepSeconds, 12);
    const ramp = simulateWork([0, 100, 200], [0, 0.1, 0], (k) => 20 - k, { levels: 6, noise: false, spectators: 0 });
    expect(ramp.seconds).toBeCloseTo(1000 * WORK_MODEL.stepSeconds, 12);
    expect(() => simulateWork([0, 1e9, 2e9], [0, 0.1, 0], (k) => 20 - k, { levels: 6, noise: false, spectators: 0, file: 't.csv' })).toThrow(`in at most ${MAX_SCHEDULE_STEPS} steps`);
  });

  it('enforceWork refuses over --max-seconds with the estimate and the value to pass', () => {
    expect(() => enforceWork({ seconds: 10, what: 'x' }, 20, 'plan')).not.toThrow();
    expect(() => enforceWork({ seconds: 750, what: 'planning 10000 qubits' }, undefined, 'check')).toThrow(
      'check: expected work of at most 300 s (--max-seconds), found an estimated 750 s for planning 10000 qubits; pass --max-seconds 1125 to run it anyway',
    );
  });
});
