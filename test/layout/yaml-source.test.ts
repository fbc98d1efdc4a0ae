import { describe, expect, it } from 'vitest';
import { parseLayoutText } from '../../src/layout/load.js';
import { InputError } from '../../src/util/errors.js';
import { DiagnosticCollector } from '../../src/layout/diagnostics.js';
import { readYamlSource, YAML_LIMITS } from '../../src/layout/yaml-source.js';

function messages(text: string): string[] {
  try {
    parseLayoutText(text, 'y.yaml');
  } catch (err) {
    expect(err).toBeInstanceOf(InputError);
    return (err as InputError).message.split('\n');
  }
  throw new Error('expected an InputError');
}

describe('readYamlSource: guards', () => {
  it('refuses a billion-laughs alias bomb with one message', () => {
    const bomb = [
      'a: &a [x, x, x, x, x, x, x, x, x]',
      'b: &b [*a, *a, *a, *a, *a, *a, *a, *a, *a]',
      'c: &c [*b, *b, *b, *b, *b, *b, *b, *b, *b]',
      'd: &d [*c, *c, *c, *c, *c, *c, *c, *c, *c]',
      'e: &e [*d, *d, *d, *d, *d, *d, *d, *d, *d]',
      'f: &f [*e, *e, *e, *e, *e, *e, *e, *e, *e]',
      'g: [*f, *f, *f, *f, *f, *f, *f, *f, *f]',
    ].join('\n');
    // counted without expanding: a = 1 + 9 = 10 values, each level 1 + 9 x the one below
    // (b 91, c 820, d 7381, e 66430, f 597871, g 5380840), plus the 7 keys and the root map
    expect(messages(bomb)).toEqual([
      `y.yaml: expected at most ${YAML_LIMITS.maxNodes} values once aliases are expanded, found 6053451 (YAML alias bombs are refused)`,
    ]);
    const deeper = `${bomb.replace('g: [', 'g: &g [')}\n${'hijklmnopqrstuvwxyz'.split('').map((k, i) => `${k}${i}: &${k}${i} [${Array(9).fill(i === 0 ? '*g' : `*${'hijklmnopqrstuvwxyz'[i - 1]}${i - 1}`).join(', ')}]`).join('\n')}`;
    expect(messages(deeper)).toEqual([
      `y.yaml: expected at most ${YAML_LIMITS.maxNodes} values once aliases are expanded, found far more (YAML alias bombs are refused)`,
    ]);
  });

  it('accepts 150 qubits sharing their defaults through <<: *defaults (the expanded size counts, not the uses)', () => {
    const first = '  Q0: &defaults { fMax: 6.1 GHz, anharmonicity: -210 MHz, asymmetry: 0.3, t1: 60 us, tphi: 80 us, fluxNoise: 3 uPhi0, readout: 7.2 GHz, pos: [0, 0] }';
    const rest = Array.from({ length: 149 }, (_, k) => `  Q${k + 1}: { <<: *defaults, pos: [${k + 1}, 0] }`);
    const layout = parseLayoutText(['chip: Shared', 'qubits:', first, ...rest, ''].join('\n'), 'shared.yaml');
    expect(layout.qubits).toHaveLength(150);
    expect(layout.qubits[149].pos).toEqual([149, 0]);
    expect(layout.qubits[149].t1Ns).toBe(60000);
  });

  it('reads CR-only line endings like LF (YAML 1.2 line breaks), with the same positions', () => {
    const lf = 'chip: X\nqubits:\n  Q1:\n    pos: [0, 0]\n    fMax: 6 GHz\n    anharmonicity: -210 MHz\n    t1: 5 GHz\n    tphi: 50 us\n';
    const cr = lf.replace(/\n/g, '\r');
    expect(messages(cr)).toEqual(messages(lf));
    expect(messages(cr)).toEqual(['y.yaml:7:9: qubits.Q1.t1: expected a time, found 5 GHz']);
    expect(parseLayoutText(cr.replace('5 GHz', '50 us'), 'y.yaml').qubits[0].t1Ns).toBe(50000);
  });

  it('refuses an alias to an unknown anchor, with its position', () => {
    expect(messages('chip: X\nqubits: *nothing\n')).toEqual([
      'y.yaml:2:9: qubits: expected a known anchor, found the alias *nothing (define &nothing before it)',
    ]);
  });

  it('refuses an alias that refers to the value containing it (a cycle)', () => {
    expect(messages('chip: X\nqubits: &q { Q1: *q }\n')).toEqual([
      'y.yaml:2:18: qubits.Q1: expected an alias to an earlier value, found *q inside the value it names (a cycle)',
    ]);
  });

  it('refuses nesting deeper than the limit without a stack overflow', () => {
    const deep = `${'['.repeat(YAML_LIMITS.maxDepth + 5)}${']'.repeat(YAML_LIMITS.maxDepth + 5)}`;
    expect(messages(`chip: X\nqubits: ${deep}\n`)[0]).toMatch(/^y\.yaml:2:\d+: qubits(\[0\])+: expected at most 32 levels of nesting, found more$/);
    const veryDeep = `${'['.repeat(20000)}${']'.repeat(20000)}`;
    expect(messages(veryDeep)).toHaveLength(1);
  });

  it('refuses several documents, unknown tags, tabs and syntax errors with positions', () => {
    expect(messages('chip: X\n---\nchip: Y\n')).toEqual(['y.yaml:2:1: expected one YAML document, found several (remove the extra `---`)']);
    expect(messages('chip: !weird X\n')).toEqual(['y.yaml:1:7: expected plain YAML values, found the unknown tag: !weird']);
    expect(messages('chip: X\nqubits: [1, 2\n')[0]).toMatch(/^y\.yaml:\d+:\d+: YAML syntax: /);
    expect(messages('chip: X\n\tqubits: {}\n')[0]).toMatch(/^y\.yaml:2:1: YAML syntax: Tabs are not allowed as indentation/);
  });

  it('refuses a list or map as a key, and an empty key', () => {
    expect(messages('chip: X\n? [a, b]\n: 1\n')).toContain('y.yaml:2:3: expected a name as map key, found a list or map used as a key');
    expect(messages('chip: X\n: 1\n')).toContain('y.yaml:2:1: expected a name as map key, found an empty key');
  });

  it('keeps __proto__ as an ordinary (unknown) key without touching prototypes', () => {
    expect(messages('chip: X\n__proto__: { polluted: 1 }\nqubits: {}\n')).toContain(
      'y.yaml:2:1: __proto__: unknown key "__proto__"; expected one of: chip, description, qubits, couplings, rules',
    );
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  it('locates keys and values (1-based line and column)', () => {
    const collector = new DiagnosticCollector('z.yaml');
    const tree = readYamlSource('a:\n  b: [1, 2]\n  c: x\n', collector)!;
    expect(tree.value).toEqual({ a: { b: [1, 2], c: 'x' } });
    expect(tree.locate(['a', 'b'], 'key')).toEqual({ line: 2, column: 3 });
    expect(tree.locate(['a', 'b'], 'value')).toEqual({ line: 2, column: 6 });
    expect(tree.locate(['a', 'b', 1], 'value')).toEqual({ line: 2, column: 10 });
    expect(tree.locate(['a', 'c'], 'value')).toEqual({ line: 3, column: 6 });
  });
});
