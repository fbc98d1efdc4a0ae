import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { layoutToYaml, yamlScalar } from '../../src/layout/write.js';
import { parseLayoutText } from '../../src/layout/load.js';

describe('yamlScalar', () => {
  it.each(['5.8 GHz', '-210 MHz', 'Q1', 'yes', 'No', 'null', 'true', 'y', '1.5', '1e3', '0x1F', '.inf', 'a: b', '#x', ' lead', 'x"y', 'multi\nline', '', '3 uPhi0/sqrt(Hz)', '2.0 MHz'])(
    'yamlScalar(%j) reads back as the same text',
    (text) => {
      expect(parse(`v: ${yamlScalar(text)}`).v).toBe(text);
    },
  );
  it('writes numbers as numbers and refuses non-finite ones', () => {
    expect(yamlScalar(0.25)).toBe('0.25');
    expect(() => yamlScalar(Number.NaN)).toThrow(RangeError);
  });
});

describe('layoutToYaml', () => {
  it('writes a layout the parser reads back', () => {
    const text = layoutToYaml({
      header: ['made in a test'],
      chip: 'W: 1',
      description: 'two qubits',
      qubits: [
        ['A', { pos: [0, 0], fMax: '6 GHz', anharmonicity: '-200 MHz', asymmetry: 0.3, t1: '40 us', tphi: '50 us', tls: [{ at: '5.5 GHz', width: '2 MHz' }], note: 'x: y' }],
        ['B', { pos: [1, 0], ec: '210 MHz', rn: ['6 kOhm', '9 kOhm'], t1: '40 us', fluxNoise: '3 uPhi0', window: ['5 GHz', '6 GHz'], park: '5.5 GHz', readout: '7.2 GHz' }],
      ],
      couplings: [['A', 'B', '12 MHz']],
      rules: [['maxGate', '90 ns'], ['fluxBandwidth', null]],
    });
    expect(text.startsWith('# made in a test\nchip: "W: 1"\n')).toBe(true);
    const layout = parseLayoutText(text, 'w.yaml');
    expect(layout.chip).toBe('W: 1');
    expect(layout.qubits[0].note).toBe('x: y');
    expect(layout.qubits[1].transmon).toEqual({ kind: 'resistance', ecGHz: 0.21, rnKOhm: [6, 9] });
    expect(layout.rules.maxGateNs).toBe(90);
  });
});
