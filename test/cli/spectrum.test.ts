/**
 * `fluxlane spectrum` end to end on the demo chip: the JSON contract of issue 3 in SI units, the
 * values equal the library's (Transmon, checked against SciPy Mathieu values in
 * test/transmon/spectrum.test.ts), and bad input exits 2 with a message naming the problem.
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { runFluxlane } from '../support/cli.js';
import { expectClose } from '../support/close.js';

const LAYOUT = 'layouts/bowline-5.yaml';
const q1 = Transmon.fromLayout(loadLayoutFile(LAYOUT).qubits.find((q) => q.id === 'Q1')!);

describe('fluxlane spectrum', () => {
  it('spectrum LAYOUT --qubit Q1 --json sweeps 51 fluxes over 0..1/2 with the contract fields in SI units', async () => {
    const r = await runFluxlane(['spectrum', LAYOUT, '--qubit', 'Q1', '--json']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const j = r.json();
    expect(j.qubit).toBe('Q1');
    expect(j.points).toHaveLength(51);
    for (const key of ['flux', 'f01', 'f12', 'anharmonicity', 'df01dflux', 't2']) expect(j.points[0]).toHaveProperty(key);
    expect(j.points[0].flux).toBe(0);
    expect(j.points[50].flux).toBe(0.5);
    // Q1 is given as fMax = 6.32 GHz, anharmonicity -228 MHz (resolved on the exact spectrum).
    expectClose(j.points[0].f01, 6.32e9, 1e-9, 'f01 at Phi = 0 (Hz)');
    expectClose(j.points[0].anharmonicity, -228e6, 1e-9, 'alpha at Phi = 0 (Hz)');
    expectClose(j.fMax, 6.32e9, 1e-9, 'fMax');
    for (const p of j.points) {
      const s = q1.spectrum(p.flux);
      expectClose(p.f01, s.f01GHz * 1e9, 1e-11, `f01 at ${p.flux}`);
      expectClose(p.df01dflux, s.df01dFluxGHz * 1e9, 1e-11, `slope at ${p.flux}`);
      expectClose(p.t2, q1.coherence(p.flux).t2Ns * 1e-9, 1e-11, `T2 at ${p.flux}`);
      expect(p.t2).toBeGreaterThan(0);
      expect(p.t2).toBeLessThanOrEqual(2 * 85e-6 * (1 + 1e-12));
    }
    // At the sweet spots first-order flux noise vanishes; the second-order (curvature) term of the
    // quasi-static model leaves T2 within 1e-5 of 2 T1 (no white part for Q1).
    expect(j.points[0].tphi).toBeNull();
    expectClose(j.points[0].t2 / 170e-6, 1, 1e-5, 'T2 = 2 T1');
  });

  it('--flux F ... evaluates exactly those fluxes (negative flux = mirror image)', async () => {
    const r = await runFluxlane(['spectrum', LAYOUT, '--qubit', 'Q2', '--flux', '0.1', '-0.1', '0.25 Phi0', '--json']);
    expect(r.code).toBe(0);
    const pts = r.json().points;
    expect(pts.map((p: { flux: number }) => p.flux)).toEqual([0.1, -0.1, 0.25]);
    expectClose(pts[0].f01, pts[1].f01, 1e-12, 'even in flux');
    expect(pts[0].df01dflux).toBeLessThan(0);
    expect(pts[1].df01dflux).toBeGreaterThan(0);
  });

  it('prints a table with units without --json', async () => {
    const r = await runFluxlane(['spectrum', LAYOUT, '--qubit', 'Q0', '--points', '3']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/f01 \[GHz\]/);
    expect(r.out).toMatch(/T2 \[us\]/);
    expect(r.out).toMatch(/verify on hardware/);
    expect(r.out.trim().split('\n')).toHaveLength(6);
  });

  it('bad input exits 2 with one clear message: unknown qubit, flux outside [-0.5, 0.5], bad number, conflicting options', async () => {
    const cases: [string[], RegExp][] = [
      [['--qubit', 'Q9'], /option --qubit: expected a qubit of Bowline-5 \(Q0, Q1, Q2, Q3, Q4\), found "Q9"/],
      [['--qubit', 'Q1', '--flux', '0.7'], /option --flux: expected a flux in Phi0 from -0.5 to 0.5.*found "0.7"/],
      [['--qubit', 'Q1', '--flux', 'abc'], /option --flux: expected a flux in Phi0.*found "abc"/],
      [['--qubit', 'Q1', '--points', '1'], /option --points: expected an integer from 2 to 10001, found "1"/],
      [['--qubit', 'Q1', '--points', '5', '--flux', '0.1'], /expected one of them/],
    ];
    for (const [args, pattern] of cases) {
      const r = await runFluxlane(['spectrum', LAYOUT, ...args]);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.out).toBe('');
      expect(r.err).toMatch(pattern);
      expect(r.err).not.toMatch(/at .*\.ts:\d+/); // no stack trace
    }
    // With --json the same diagnostics also come as JSON on stdout.
    const j = await runFluxlane(['spectrum', LAYOUT, '--qubit', 'Q9', '--json']);
    expect(j.code).toBe(2);
    expect(j.json().ok).toBe(false);
    expect(j.json().diagnostics[0].message).toMatch(/found "Q9"/);
  });
});
