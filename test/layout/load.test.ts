import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { parseLayoutBytes, parseLayoutText, loadLayoutFile } from '../../src/layout/load.js';
import { InputError } from '../../src/util/errors.js';
import { DEFAULT_RULES } from '../../src/layout/rules.js';

/** The messages of the InputError `fn` throws, formatted as the CLI prints them. */
function problems(text: string, file = 'chip.yaml'): string[] {
  try {
    parseLayoutText(text, file);
  } catch (err) {
    expect(err).toBeInstanceOf(InputError);
    return (err as InputError).message.split('\n');
  }
  throw new Error('expected the layout to be refused');
}

const BASE = `chip: Test
qubits:
  Q1:
    pos: [0, 0]
    fMax: 6.1 GHz
    anharmonicity: -210 MHz
    asymmetry: 0.3
    t1: 50 us
    fluxNoise: 3 uPhi0
  Q2:
    pos: [1, 0]
    ec: 220 MHz
    ejMax: 22 GHz
    t1: 40 us
    tphi: 60 us
couplings:
  - [Q1, Q2, 12 MHz]
`;

/** BASE with one line replaced (1-based line number). */
function withLine(line: number, text: string): string {
  const lines = BASE.split('\n');
  lines[line - 1] = text;
  return lines.join('\n');
}

describe('parseLayoutText: valid input', () => {
  it('converts units to GHz, ns and Phi0 and keeps source positions', () => {
    const layout = parseLayoutText(BASE, 'chip.yaml');
    expect(layout.chip).toBe('Test');
    expect(layout.qubits.map((q) => q.id)).toEqual(['Q1', 'Q2']);
    const [q1, q2] = layout.qubits;
    expect(q1.transmon).toEqual({ kind: 'frequencies', fMaxGHz: 6.1, anharmonicityGHz: -0.21, asymmetry: 0.3 });
    expect(q1.t1Ns).toBe(50_000);
    expect(q1.fluxNoisePhi0).toBe(3e-6);
    expect(q1.source).toEqual({ file: 'chip.yaml', line: 3, column: 3, path: 'qubits.Q1' });
    expect(q2.transmon).toEqual({ kind: 'energies', ecGHz: 0.22, ejMaxGHz: 22, asymmetry: 0 });
    expect(q2.tphiNs).toBe(60_000);
    expect(q2.tls).toEqual([]);
    expect(layout.couplings).toEqual([{ a: 'Q1', b: 'Q2', gGHz: 0.012, source: { file: 'chip.yaml', line: 17, column: 5, path: 'couplings[0]' } }]);
    expect(layout.rules).toEqual(DEFAULT_RULES);
  });

  it('accepts micro as u, µ (U+00B5) and μ (U+03BC), and Ohm, ohm, Ω, kOhm', () => {
    const text = BASE.replace('t1: 50 us', 't1: 50 µs').replace('t1: 40 us', 't1: 40 μs')
      .replace('    ec: 220 MHz\n    ejMax: 22 GHz\n', '    ec: 220 MHz\n    rn: [6.2 kΩ, 7300 Ohm]\n');
    const layout = parseLayoutText(text, 'x');
    expect(layout.qubits[0].t1Ns).toBe(50_000);
    expect(layout.qubits[1].t1Ns).toBe(40_000);
    expect(layout.qubits[1].transmon).toEqual({ kind: 'resistance', ecGHz: 0.22, rnKOhm: [6.2, 7.3] });
  });

  it('fMax + anharmonicity + fMin, ec + rn with asymmetry, window, park, tls, readout, note, both couplings forms', () => {
    const text = `chip: All
qubits:
  A:
    pos: [0, 0]
    fMax: 6 GHz
    anharmonicity: -0.2 GHz
    fMin: 4 GHz
    t1: 20 us
    tphi: 30 us
    fluxNoise: 2 uPhi0/sqrt(Hz)
    window: [5 GHz, 6 GHz]
    park: 5.5 GHz
    tls:
      - { at: 5.2 GHz, width: 3 MHz }
      - { at: 4.8 GHz, width: 1 MHz }
    readout: 7.1 GHz
    note: hello
  B:
    pos: [1.5, -2]
    ec: 200 MHz
    rn: 8 kOhm
    asymmetry: 0.4
    t1: 30 us
    fluxNoise: 4 uPhi0 / Hz^0.5
couplings:
  - { qubits: [A, B], g: 15 MHz }
rules:
  zzLimit: 100 kHz
  maxGate: 60 ns
  fluxBandwidth: 0.5 GHz
  marginFlagSpreads: 2
`;
    const layout = parseLayoutText(text, 'x');
    const [a, b] = layout.qubits;
    expect(a.transmon).toEqual({ kind: 'frequencies', fMaxGHz: 6, anharmonicityGHz: -0.2, fMinGHz: 4 });
    expect(a.windowGHz).toEqual([5, 6]);
    expect(a.parkGHz).toBe(5.5);
    expect(a.tls).toEqual([{ atGHz: 5.2, widthGHz: 0.003 }, { atGHz: 4.8, widthGHz: 0.001 }]);
    expect(a.readoutGHz).toBe(7.1);
    expect(a.note).toBe('hello');
    expect(a.fluxNoisePhi0).toBe(2e-6);
    expect(b.pos).toEqual([1.5, -2]);
    expect(b.transmon).toEqual({ kind: 'resistance', ecGHz: 0.2, rnKOhm: 8, asymmetry: 0.4 });
    expect(b.fluxNoisePhi0).toBe(4e-6);
    expect(layout.couplings[0]).toMatchObject({ a: 'A', b: 'B', gGHz: 0.015 });
    expect(layout.rules).toEqual({ ...DEFAULT_RULES, zzLimitGHz: 1e-4, maxGateNs: 60, fluxBandwidthGHz: 0.5, marginFlagSpreads: 2 });
  });

  it('a qubit may state its measured fabrication spreads: spread { rn, ec } (relative, 1 sigma)', () => {
    const layout = parseLayoutText(withLine(9, '    fluxNoise: 3 uPhi0\n    spread: { rn: 0.015, ec: 0.008 }'), 'chip.yaml');
    expect(layout.qubits[0].spread).toEqual({ rn: 0.015, ec: 0.008 });
    expect(layout.qubits[1].spread).toBeUndefined();
    expect(parseLayoutText(withLine(9, '    fluxNoise: 3 uPhi0\n    spread: { ec: 0 }'), 'c.yaml').qubits[0].spread).toEqual({ ec: 0 });
  });

  it('merge keys share qubit defaults; explicit keys win', () => {
    const text = `chip: Merge
defaults: &d { t1: 50 us, fluxNoise: 3 uPhi0, fMax: 6 GHz, anharmonicity: -200 MHz }
`;
    // `defaults` is not a layout key: anchors must live inside known keys
    expect(problems(text)).toContain('chip.yaml:2:1: defaults: unknown key "defaults"; expected one of: chip, description, qubits, couplings, rules');
    const ok = `chip: Merge
qubits:
  Q1: &q { pos: [0, 0], t1: 50 us, fluxNoise: 3 uPhi0, fMax: 6 GHz, anharmonicity: -200 MHz }
  Q2:
    <<: *q
    pos: [1, 0]
    fMax: 5.5 GHz
`;
    const layout = parseLayoutText(ok, 'x');
    expect(layout.qubits[1]).toMatchObject({ id: 'Q2', pos: [1, 0], t1Ns: 50_000 });
    expect(layout.qubits[1].transmon).toMatchObject({ fMaxGHz: 5.5 });
  });

  it('numeric ids are names: 1: and [1, 2, g] refer to the same qubit', () => {
    const text = BASE.replace('  Q1:', '  1:').replace('[Q1, Q2, 12 MHz]', '[1, Q2, 12 MHz]');
    expect(parseLayoutText(text, 'x').couplings[0]).toMatchObject({ a: '1', b: 'Q2' });
  });

  it.each(readdirSync('layouts').filter((f) => f.endsWith('.yaml')))('demo layouts/%s parses', (name) => {
    const layout = loadLayoutFile(`layouts/${name}`);
    expect(layout.qubits.length).toBeGreaterThanOrEqual(5);
    for (const q of layout.qubits) {
      expect(q.t1Ns).toBeGreaterThanOrEqual(20_000);
      expect(q.t1Ns).toBeLessThanOrEqual(200_000);
    }
    for (const c of layout.couplings) {
      expect(c.gGHz).toBeGreaterThanOrEqual(0.008);
      expect(c.gGHz).toBeLessThanOrEqual(0.02);
    }
  });

  it('the demos use all three transmon forms, windows, parking points, defects and readout resonators', () => {
    const all = readdirSync('layouts').filter((f) => f.endsWith('.yaml')).flatMap((f) => loadLayoutFile(`layouts/${f}`).qubits);
    expect(new Set(all.map((q) => q.transmon.kind))).toEqual(new Set(['energies', 'frequencies', 'resistance']));
    expect(all.some((q) => q.windowGHz)).toBe(true);
    expect(all.some((q) => q.parkGHz !== undefined)).toBe(true);
    expect(all.some((q) => q.tls.length > 0)).toBe(true);
    expect(all.every((q) => q.readoutGHz !== undefined)).toBe(true);
    for (const q of all) {
      if (q.transmon.kind === 'frequencies') {
        expect(q.transmon.fMaxGHz).toBeGreaterThanOrEqual(4.5);
        expect(q.transmon.fMaxGHz).toBeLessThanOrEqual(7);
        expect(-q.transmon.anharmonicityGHz).toBeGreaterThanOrEqual(0.18);
        expect(-q.transmon.anharmonicityGHz).toBeLessThanOrEqual(0.26);
      } else {
        expect(q.transmon.ecGHz).toBeGreaterThanOrEqual(0.18);
        expect(q.transmon.ecGHz).toBeLessThanOrEqual(0.26);
      }
    }
  });
});

describe('parseLayoutText: bad input gives file:line:column: path: expected ..., found ...', () => {
  it.each([
    ['wrong dimension', withLine(5, '    fMax: 20 us'), 'chip.yaml:5:11: qubits.Q1.fMax: expected a frequency, found 20 us'],
    ['bare number', withLine(5, '    fMax: 5.8'), 'chip.yaml:5:11: qubits.Q1.fMax: expected a frequency with a unit, found the bare number 5.8 (write e.g. "5.8 GHz")'],
    ['bare number as text', withLine(5, '    fMax: "5.8"'), 'chip.yaml:5:11: qubits.Q1.fMax: expected a frequency with a unit, found the bare number 5.8 (write e.g. "5.8 GHz")'],
    ['unknown unit', withLine(5, '    fMax: 6 Ghz'), 'chip.yaml:5:11: qubits.Q1.fMax: expected a frequency such as "5.8 GHz", found 6 Ghz: unknown unit "Ghz" (did you mean GHz?)'],
    ['unit without a number', withLine(5, '    fMax: GHz'), 'chip.yaml:5:11: qubits.Q1.fMax: expected a frequency such as "5.8 GHz", found GHz (a unit without a number)'],
    ['negative time', withLine(8, '    t1: -50 us'), 'chip.yaml:8:9: qubits.Q1.t1: expected a positive time, found -50 us'],
    ['zero time', withLine(8, '    t1: 0 us'), 'chip.yaml:8:9: qubits.Q1.t1: expected a positive time, found 0 us'],
    ['NaN', withLine(7, '    asymmetry: .nan'), 'chip.yaml:7:16: qubits.Q1.asymmetry: expected a number d in [0, 1), found NaN'],
    ['infinite quantity', withLine(5, '    fMax: 1e400 GHz'), 'chip.yaml:5:11: qubits.Q1.fMax: expected a finite frequency, found 1e400 GHz'],
    ['positive anharmonicity', withLine(6, '    anharmonicity: 210 MHz'), 'chip.yaml:6:20: qubits.Q1.anharmonicity: expected a negative frequency (transmon anharmonicity f12 - f01 is below zero, e.g. "-210 MHz"), found 210 MHz'],
    ['asymmetry of 1', withLine(7, '    asymmetry: 1'), 'chip.yaml:7:16: qubits.Q1.asymmetry: expected a SQUID asymmetry d in [0, 1), found 1'],
    ['negative asymmetry', withLine(7, '    asymmetry: -0.1'), 'chip.yaml:7:16: qubits.Q1.asymmetry: expected a SQUID asymmetry d in [0, 1), found -0.1'],
    ['unknown key', withLine(7, '    asymetry: 0.3'), 'chip.yaml:7:5: qubits.Q1.asymetry: unknown key "asymetry" (did you mean "asymmetry"?)'],
    ['case typo', withLine(13, '    ejmax: 22 GHz'), 'chip.yaml:13:5: qubits.Q2.ejmax: unknown key "ejmax" (did you mean "ejMax"?)'],
    ['self coupling', withLine(17, '  - [Q1, Q1, 12 MHz]'), 'chip.yaml:17:5: couplings[0]: expected two different qubits, found Q1 coupled to itself'],
    ['unknown qubit', withLine(17, '  - [Q1, Q3, 12 MHz]'), 'chip.yaml:17:10: couplings[0][1]: expected a qubit id listed under qubits, found "Q3" (did you mean "Q1"?)'],
    ['coupling without unit', withLine(17, '  - [Q1, Q2, 12]'), 'chip.yaml:17:14: couplings[0][2]: expected a frequency with a unit, found the bare number 12 (write e.g. "5.8 GHz")'],
    ['negative g', withLine(17, '  - [Q1, Q2, -12 MHz]'), 'chip.yaml:17:14: couplings[0][2]: expected a positive frequency, found -12 MHz'],
    ['short coupling', withLine(17, '  - [Q1, Q2]'), 'chip.yaml:17:5: couplings[0]: expected a coupling [A, B, g], found a list of 2 items'],
    ['coupling of the wrong type', withLine(17, '  - 12 MHz'), 'chip.yaml:17:5: couplings[0]: expected a coupling [A, B, g] or { qubits: [A, B], g }, found the text "12 MHz"'],
    ['bad id', BASE.replace('  Q1:', '  Q-1:').replace('[Q1, Q2', '[Q-1, Q2'), 'chip.yaml:3:3: qubits["Q-1"]: expected a qubit id of letters, digits and _ (edges are written A-B), found "Q-1"'],
    ['position of one number', withLine(4, '    pos: [0]'), 'chip.yaml:4:10: qubits.Q1.pos: expected a position [x, y] (two numbers), found a list of 1 item'],
    ['position as text', withLine(4, '    pos: here'), 'chip.yaml:4:10: qubits.Q1.pos: expected a position [x, y] (two numbers), found the text "here"'],
    ['qubits as a list', 'chip: X\nqubits:\n  - Q1\n', 'chip.yaml:3:3: qubits: expected a map of qubits { id: { pos, ... } }, found a list of 1 item'],
    ['empty qubits', 'chip: X\nqubits: {}\n', 'chip.yaml:2:9: qubits: expected at least one qubit, found an empty map'],
    ['missing chip', BASE.replace('chip: Test\n', ''), 'chip.yaml:1:1: missing key "chip": expected a chip name (text)'],
    ['chip as a number', withLine(1, 'chip: 17'), 'chip.yaml:1:7: chip: expected a chip name (text), found the number 17'],
    ['a scalar instead of a map', 'hello', 'chip.yaml:1:1: expected a layout map with chip, qubits and couplings, found the text "hello"'],
    ['an empty file', '', 'chip.yaml:1:1: expected a layout map with chip, qubits and couplings, found an empty value'],
    ['missing t1', BASE.replace('    t1: 50 us\n', ''), 'chip.yaml:3:3: qubits.Q1: missing key "t1": expected a time such as "45 us"'],
    ['missing dephasing', BASE.replace('    fluxNoise: 3 uPhi0\n', ''), 'chip.yaml:3:3: qubits.Q1: missing dephasing: expected tphi (white dephasing time) or fluxNoise (1/f flux-noise amplitude), or both'],
    ['flux noise in the wrong unit', withLine(9, '    fluxNoise: 3 uPhi0/Hz'), 'chip.yaml:9:16: qubits.Q1.fluxNoise: expected a flux-noise amplitude, found 3 uPhi0/Hz'],
    ['no transmon model', BASE.replace('    ec: 220 MHz\n    ejMax: 22 GHz\n', ''), 'chip.yaml:10:3: qubits.Q2: missing transmon model: expected ec + ejMax (+ asymmetry), fMax + anharmonicity (+ asymmetry or fMin), or ec + rn (+ asymmetry), found none'],
    ['ec alone', BASE.replace('    ejMax: 22 GHz\n', ''), 'chip.yaml:10:3: qubits.Q2: missing transmon model: expected ec + ejMax (+ asymmetry), fMax + anharmonicity (+ asymmetry or fMin), or ec + rn (+ asymmetry), found ec alone'],
    ['two models', BASE.replace('    ejMax: 22 GHz\n', '    ejMax: 22 GHz\n    fMax: 6 GHz\n'), 'chip.yaml:10:3: qubits.Q2: expected one transmon model (ec + ejMax (+ asymmetry), fMax + anharmonicity (+ asymmetry or fMin), or ec + rn (+ asymmetry)), found keys of several: ec, ejMax, fMax'],
    ['fMax without anharmonicity', BASE.replace('    anharmonicity: -210 MHz\n', ''), 'chip.yaml:3:3: qubits.Q1: missing key "anharmonicity": expected the anharmonicity (e.g. "-210 MHz") to go with fMax'],
    ['fMin and asymmetry', BASE.replace('    asymmetry: 0.3\n', '    asymmetry: 0.3\n    fMin: 4 GHz\n'), 'chip.yaml:8:5: qubits.Q1.fMin: expected asymmetry or fMin (each fixes the tunable range), found both'],
    ['fMin above fMax', BASE.replace('    asymmetry: 0.3\n', '    fMin: 6.5 GHz\n'), 'chip.yaml:7:11: qubits.Q1.fMin: expected fMin below fMax (6.1 GHz), found 6.5 GHz'],
    ['asymmetry with two resistances', BASE.replace('    ejMax: 22 GHz\n', '    rn: [6 kOhm, 7 kOhm]\n    asymmetry: 0.1\n'), 'chip.yaml:14:5: qubits.Q2.asymmetry: expected no asymmetry with two junction resistances (it follows from them), found asymmetry'],
    ['resistance in the wrong unit', BASE.replace('    ejMax: 22 GHz\n', '    rn: 6 GHz\n'), 'chip.yaml:13:9: qubits.Q2.rn: expected a resistance, found 6 GHz'],
    ['window reversed', BASE.replace('    fluxNoise: 3 uPhi0\n', '    fluxNoise: 3 uPhi0\n    window: [6 GHz, 5 GHz]\n'), 'chip.yaml:10:13: qubits.Q1.window: expected a window [lo, hi] with lo < hi, found [6 GHz, 5 GHz]'],
    ['window empty', BASE.replace('    fluxNoise: 3 uPhi0\n', '    fluxNoise: 3 uPhi0\n    window: [5 GHz, 5 GHz]\n'), 'chip.yaml:10:13: qubits.Q1.window: expected a window [lo, hi] with lo < hi, found [5 GHz, 5 GHz]'],
    ['park outside window', BASE.replace('    fluxNoise: 3 uPhi0\n', '    fluxNoise: 3 uPhi0\n    window: [5 GHz, 5.5 GHz]\n    park: 5.7 GHz\n'), 'chip.yaml:11:11: qubits.Q1.park: expected a parking frequency inside window [5 GHz, 5.5 GHz], found 5.7 GHz'],
    ['park above fMax', BASE.replace('    fluxNoise: 3 uPhi0\n', '    fluxNoise: 3 uPhi0\n    park: 6.2 GHz\n'), 'chip.yaml:10:11: qubits.Q1.park: expected a parking frequency at or below fMax (6.1 GHz), found 6.2 GHz'],
    ['tls without width', BASE.replace('    fluxNoise: 3 uPhi0\n', '    fluxNoise: 3 uPhi0\n    tls: [{ at: 5 GHz }]\n'), 'chip.yaml:10:11: qubits.Q1.tls[0]: missing key "width": expected a frequency such as "5.8 GHz"'],
    ['tls with a typo', BASE.replace('    fluxNoise: 3 uPhi0\n', '    fluxNoise: 3 uPhi0\n    tls: [{ at: 5 GHz, widht: 2 MHz }]\n'), 'chip.yaml:10:24: qubits.Q1.tls[0].widht: unknown key "widht" (did you mean "width"?)'],
    ['tls of zero width', BASE.replace('    fluxNoise: 3 uPhi0\n', '    fluxNoise: 3 uPhi0\n    tls: [{ at: 5 GHz, width: 0 MHz }]\n'), 'chip.yaml:10:31: qubits.Q1.tls[0].width: expected a positive frequency, found 0 MHz'],
    ['readout as time', BASE.replace('    fluxNoise: 3 uPhi0\n', '    fluxNoise: 3 uPhi0\n    readout: 7 ns\n'), 'chip.yaml:10:14: qubits.Q1.readout: expected a frequency, found 7 ns'],
    ['unknown rule', BASE + 'rules:\n  zzlimit: 100 kHz\n', 'chip.yaml:19:3: rules.zzlimit: unknown key "zzlimit" (did you mean "zzLimit"?)'],
    ['rule of the wrong kind', BASE + 'rules:\n  maxGate: 5 GHz\n', 'chip.yaml:19:12: rules.maxGate: expected a time, found 5 GHz'],
    ['rule out of range', BASE + 'rules:\n  sweptTransferLimit: 1.5\n', 'chip.yaml:19:23: rules.sweptTransferLimit: expected a number between 0 and 1 (exclusive), found 1.5'],
    ['rule as text where a number is needed', BASE + 'rules:\n  resistanceSpread: 2 %\n', 'chip.yaml:19:21: rules.resistanceSpread: expected a number, found the text "2 %"'],
    ['rules as a list', BASE + 'rules: [1]\n', 'chip.yaml:18:8: rules: expected a map of rule overrides, found a list of 1 item'],
  ])('%s', (_name, text, message) => {
    expect(problems(text)).toEqual([message]);
  });

  it('A-B and B-A are the same coupling: the second is a duplicate', () => {
    expect(problems(BASE + '  - { qubits: [Q2, Q1], g: 11 MHz }\n')).toEqual([
      'chip.yaml:18:5: couplings[1]: expected each pair coupled once, found Q2-Q1 again (first as Q1-Q2 at line 17)',
    ]);
  });

  it('a duplicate qubit id names both positions', () => {
    expect(problems(BASE.replace('  Q2:', '  Q1:'))).toEqual([
      'chip.yaml:10:3: qubits.Q1: expected each key once in a map, found "Q1" again (first given at line 3, column 3)',
    ]);
  });

  it('1 and "1" are the same id', () => {
    const text = BASE.replace('  Q1:', '  1:').replace('  Q2:', '  "1":');
    expect(problems(text)[0]).toBe('chip.yaml:10:3: qubits["1"]: expected each key once in a map, found "1" again (first given at line 3, column 3)');
  });

  it('collects every problem of a file into one InputError, sorted by position', () => {
    const text = BASE.replace('t1: 50 us', 't1: 50 GHz').replace('ec: 220 MHz', 'ec: 220').replace('[Q1, Q2, 12 MHz]', '[Q1, Q9, 12 MHz]') +
      'rules:\n  maxGat: 80 ns\n';
    let error: InputError | undefined;
    try {
      parseLayoutText(text, 'multi.yaml');
    } catch (err) {
      error = err as InputError;
    }
    expect(error).toBeInstanceOf(InputError);
    expect(error!.diagnostics.map((d) => [d.line, d.path])).toEqual([
      [8, 'qubits.Q1.t1'],
      [12, 'qubits.Q2.ec'],
      [17, 'couplings[0][1]'],
      [19, 'rules.maxGat'],
    ]);
    expect(error!.diagnostics[3].message).toBe('unknown key "maxGat" (did you mean "maxGate"?)');
  });

  it.each([
    ['    spread: { rn: 0.5 }', 'chip.yaml:10:19: qubits.Q1.spread.rn: expected a relative spread (1 sigma) from 0 to 0.1, e.g. 0.015, found 0.5'],
    ['    spread: { rn: -0.01 }', 'chip.yaml:10:19: qubits.Q1.spread.rn: expected a relative spread (1 sigma) from 0 to 0.1, e.g. 0.015, found -0.01'],
    ['    spread: { rn: "2 %" }', 'chip.yaml:10:19: qubits.Q1.spread.rn: expected a relative spread (1 sigma) from 0 to 0.1, e.g. 0.015, found the text "2 %"'],
    ['    spread: { rm: 0.01 }', 'chip.yaml:10:15: qubits.Q1.spread.rm: unknown key "rm" (did you mean "rn"?)'],
    ['    spread: 0.02', 'chip.yaml:10:13: qubits.Q1.spread: expected a spread map { rn, ec } of relative spreads, found the number 0.02'],
  ])('a bad spread is one message with its position: %s', (line, message) => {
    expect(problems(withLine(9, `    fluxNoise: 3 uPhi0\n${line}`))).toEqual([message]);
  });

  it('a misspelt key is reported once, without follow-up "missing" messages', () => {
    expect(problems(BASE.replace('    ejMax: 22 GHz', '    ejMAX: 22 GHz'))).toEqual([
      'chip.yaml:13:5: qubits.Q2.ejMAX: unknown key "ejMAX" (did you mean "ejMax"?)',
    ]);
  });

  it('non-UTF-8 bytes are refused with their position', () => {
    const bytes = Buffer.concat([Buffer.from('chip: X\nqubits:\n  Q'), Buffer.from([0xff, 0xfe, 0x0a])]);
    expect(() => parseLayoutBytes(bytes, 'bin.yaml')).toThrow(InputError);
    try {
      parseLayoutBytes(bytes, 'bin.yaml');
    } catch (err) {
      expect((err as InputError).message).toBe('bin.yaml:3:4: expected UTF-8 text, found bytes that are not UTF-8 (is this a YAML file?)');
    }
  });

  it('a byte-order mark is accepted', () => {
    const layout = parseLayoutBytes(Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(BASE)]), 'bom.yaml');
    expect(layout.chip).toBe('Test');
  });

  it('a missing file and a folder give one message each', () => {
    expect(() => loadLayoutFile('no-such.yaml')).toThrow('no-such.yaml: expected a readable layout file, found no such file');
    expect(() => loadLayoutFile('layouts')).toThrow('layouts: expected a readable layout file, found a folder, not a file');
  });

  it('a binary file (the package lock read as layout) is refused with InputError', () => {
    expect(() => parseLayoutText(readFileSync('package-lock.json', 'utf8'), 'package-lock.json')).toThrow(InputError);
  });
});
