/**
 * `fluxlane pair` end to end on the demo chip: the JSON contract of issue 3 in SI units, values
 * equal to the pair library (checked against NumPy and perturbation theory in test/pair/), the
 * conventions of README physics conventions sec. 6 (A moves unless --mover; g at the evaluated fluxes; null
 * resonances outside the mover range), --sweep, and bad input exiting 2.
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { CoupledPair } from '../../src/pair/pair.js';
import { runFluxlane } from '../support/cli.js';
import { expectClose } from '../support/close.js';

const LAYOUT = 'layouts/bowline-5.yaml';
const layout = loadLayoutFile(LAYOUT);
const transmon = (id: string) => Transmon.fromLayout(layout.qubits.find((q) => q.id === id)!);
const [q0, q1, q4] = [transmon('Q0'), transmon('Q1'), transmon('Q4')];

describe('fluxlane pair', () => {
  it('pair LAYOUT --edge Q0-Q1 --json: contract fields; both at Phi = 0 so g is the layout g (10.6 MHz)', async () => {
    const r = await runFluxlane(['pair', LAYOUT, '--edge', 'Q0-Q1', '--json']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const j = r.json();
    expect(j.edge).toEqual(['Q0', 'Q1']);
    expect(j.mover).toBe('Q0');
    expectClose(j.g, 10.6e6, 1e-10, 'g (Hz)');
    expect(Object.keys(j.levels).sort()).toEqual(['00', '01', '02', '10', '11', '20']);
    expect(j.levels['00']).toBe(0);
    expect(Object.keys(j.resonances).sort()).toEqual(['01-10', '11-02', '11-20']);
    const pair = new CoupledPair(q0, q1, 0.0106);
    const s = pair.spectrum(0, 0);
    expectClose(j.zz, s.zzGHz * 1e9, 1e-10, 'zz (Hz)');
    expectClose(j.levels['11'], (s.energy(1, 1) - s.energy(0, 0)) * 1e9, 1e-11, 'E11 - E00 (Hz)');
    // Q1 at 6.32 GHz lies above the whole range of Q0 (max 5.34 GHz): every resonance is null.
    expect(j.resonances).toEqual({ '01-10': null, '11-20': null, '11-02': null });
  });

  it('with --mover Q1 the resonances are those of Q1 against Q0, each the mover f01 at the bare crossing', async () => {
    const r = await runFluxlane(['pair', LAYOUT, '--edge', 'Q0-Q1', '--mover', 'Q1', '--flux-a', '0.1', '--json']);
    expect(r.code).toBe(0);
    const j = r.json();
    expect(j.mover).toBe('Q1');
    expect(j.flux).toEqual({ Q0: 0.1, Q1: 0 });
    const s0 = q0.spectrum(0.1);
    expectClose(j.resonances['01-10'], s0.f01GHz * 1e9, 1e-10, '01-10: f01_Q1 = f01_Q0');
    expectClose(j.resonances['11-02'], s0.f12GHz * 1e9, 1e-10, '11-02: f01_Q1 = f12_Q0');
    const f12AtCrossing = q1.spectrum(j.resonanceFlux['11-20']).f12GHz;
    expectClose(f12AtCrossing * 1e9, s0.f01GHz * 1e9, 1e-10, '11-20: f12_Q1 = f01_Q0');
    // g is quoted at the fluxes evaluated: smaller than the layout value once Q0 tunes down.
    expect(j.g).toBeLessThan(10.6e6);
    expectClose(j.g, new CoupledPair(q0, q1, 0.0106).exchangeCoupling(0.1, 0) * 1e9, 1e-10, 'g(0.1, 0)');
  });

  it('defaults a qubit with a fixed park frequency to it (Q4 parks at 6.44 GHz)', async () => {
    const j = (await runFluxlane(['pair', LAYOUT, '--edge', 'Q4-Q0', '--json'])).json();
    expectClose(j.f01.Q4, 6.44e9, 1e-10, 'Q4 at its park frequency');
    expectClose(j.flux.Q4, q4.fluxForF01(6.44), 1e-12, 'park flux');
    expect(j.edge).toEqual(['Q4', 'Q0']);
  });

  it('--sweep gives ZZ against the mover frequency across its range (201 points by default, --points N)', async () => {
    const j = (await runFluxlane(['pair', LAYOUT, '--edge', 'Q0-Q2', '--sweep', '--json'])).json();
    expect(j.sweep).toHaveLength(201);
    expectClose(j.sweep[0].moverF01, q0.fMinGHz * 1e9, 1e-10, 'first point at f_min');
    expectClose(j.sweep[200].moverF01, q0.fMaxGHz * 1e9, 1e-10, 'last point at f_max');
    for (const p of j.sweep) for (const k of ['moverFlux', 'moverF01', 'zz', 'g']) expect(typeof p[k]).toBe('number');
    const few = (await runFluxlane(['pair', LAYOUT, '--edge', 'Q0-Q2', '--sweep', '--points', '7'])).out;
    expect(few).toMatch(/ZZ sweep of Q0 \(7 points\)/);
  });

  it('bad input exits 2 naming the problem: unknown or uncoupled edge, bad mover, flux out of range, --points without --sweep', async () => {
    const cases: [string[], RegExp][] = [
      [['--edge', 'Q0-Q9'], /option --edge: expected two qubit ids joined by "-", a coupled pair of Bowline-5 \(Q0-Q1, Q0-Q2, Q0-Q3, Q0-Q4\), found "Q0-Q9"/],
      [['--edge', 'Q1-Q2'], /found Q1-Q2, which are not coupled/],
      [['--edge', 'Q0-Q1', '--mover', 'Q3'], /option --mover: expected Q0 or Q1/],
      [['--edge', 'Q0-Q1', '--flux-b', '-0.6'], /option --flux-b: expected a flux in Phi0 from -0.5 to 0.5/],
      [['--edge', 'Q0-Q1', '--points', '9'], /option --points: expected together with --sweep/],
      [['--edge', 'Q0-Q1', '--levels', '3'], /option --levels: expected an integer from 4 to 12, found "3"/],
    ];
    for (const [args, pattern] of cases) {
      const r = await runFluxlane(['pair', LAYOUT, ...args]);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.out).toBe('');
      expect(r.err).toMatch(pattern);
    }
  });
});
