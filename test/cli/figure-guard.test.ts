/**
 * The output guard (src/cli/figure-guard.ts): a finite figure out of its range stops the command
 * with exit 2 at the subject's place in the layout; NaN or Infinity is an internal error (70)
 * naming the subject; figures in range pass.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { FigureGuard, guardDesign } from '../../src/cli/figure-guard.js';
import { parseLayoutText } from '../../src/layout/load.js';
import { InputError } from '../../src/util/errors.js';
import { runFluxlane } from '../support/cli.js';

const layout = parseLayoutText(`chip: G
qubits:
  A: { pos: [0, 0], fMax: 6.2 GHz, anharmonicity: -215 MHz, asymmetry: 0.3, t1: 60 us, fluxNoise: 3 uPhi0 }
  B: { pos: [1, 0], fMax: 5.3 GHz, anharmonicity: -205 MHz, asymmetry: 0.3, t1: 55 us, fluxNoise: 3 uPhi0 }
couplings:
  - [A, B, 12 MHz]
`, 'g.yaml');

describe('FigureGuard', () => {
  it('passes figures in range (with a rounding tolerance of 1e-9)', () => {
    const g = new FigureGuard(layout);
    g.probability(1 + 5e-10, 'f', { edge: ['A', 'B'] }, 'x');
    g.probability(-1e-16, 'leakage', { edge: ['A', 'B'] }, 'x');
    g.finite(0, 'zz', { qubit: 'A' });
    expect(() => g.throwIfAny()).not.toThrow();
  });

  it('a finite figure out of range is bad input at the coupling\'s line, naming the edge and the cause', () => {
    const g = new FigureGuard(layout);
    guardDesign(g, { feasible: true, fidelity: 0.99, leakage: 1e-5, conditionalPhase: Math.PI, durationNs: 40, fidelityNoisy: -1.07e292, decoherenceEstimate: 1.07e292 }, ['A', 'B']);
    let err: unknown;
    try {
      g.throwIfAny();
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(InputError);
    const d = (err as InputError).diagnostics;
    expect(d).toHaveLength(2);
    expect(d[0]).toMatchObject({ file: 'g.yaml', line: 6, column: 5, path: 'couplings[0]' });
    expect(d[0].message).toMatch(/^A-B: the fidelity with decoherence -1\.07e\+292 is outside \[0, 1\]: the layout's values drive the model past where it holds \(T1 and T_phi so short/);
  });

  it('NaN or Infinity is an internal error naming the qubit or edge', () => {
    const g = new FigureGuard(layout);
    g.finite(Number.NaN, 'the static ZZ', { edge: ['A', 'B'] });
    g.range(Number.POSITIVE_INFINITY, 0, 1, 'the usable fraction', { qubit: 'B' }, 'x');
    expect(() => g.throwIfAny()).toThrow(/^output guard: A-B: the static ZZ is NaN; B: the usable fraction is Infinity: the computation broke down$/);
    expect(() => g.throwIfAny()).not.toThrow(InputError);
  });

  it('simulate stops with exit 2 when the coherence times drive the decoherence estimate above 1', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-guard-'));
    writeFileSync(join(dir, 'short.yaml'), `chip: Short
qubits:
  A: { pos: [0, 0], fMax: 6.2 GHz, anharmonicity: -215 MHz, asymmetry: 0.3, t1: 100 ns, tphi: 100 ns, fluxNoise: 3 uPhi0 }
  B: { pos: [1, 0], fMax: 5.3 GHz, anharmonicity: -205 MHz, asymmetry: 0.3, t1: 100 ns, tphi: 100 ns, fluxNoise: 3 uPhi0 }
couplings:
  - [A, B, 12 MHz]
`);
    writeFileSync(join(dir, 't.csv'), 'time_ns,flux\n0,0\n100,0.1\n200,0\n');
    const r = await runFluxlane(['simulate', 'short.yaml', '--edge', 'A-B', '--trajectory', 't.csv', '--noise'], { cwd: dir });
    expect(r.code).toBe(2);
    const lines = r.err.trimEnd().split('\n');
    expect(lines.filter((l) => l.includes('warning:'))).toHaveLength(4); // T1 and T_phi of 100 ns are unusual
    expect(lines.find((l) => !l.includes('warning:'))).toMatch(/^short\.yaml:6:5: couplings\[0\]: A-B: the decoherence error estimate \d\.\d+ is outside \[0, 1\]/);
  }, 60_000);
});
