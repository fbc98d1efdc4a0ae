import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { Ajv2020 } from 'ajv/dist/2020.js';
import { parse } from 'yaml';
import { schemaText } from '../tools/write-generated.js';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { quantityPattern } from '../../src/layout/json-schema.js';

const schema = JSON.parse(readFileSync('shared/layout.schema.json', 'utf8'));
const ajv = new Ajv2020({ allErrors: true, strict: false });
const validate = ajv.compile(schema);
const check = (doc: unknown) => ({ ok: validate(doc) as boolean, errors: ajv.errorsText(validate.errors) });

describe('shared/layout.schema.json', () => {
  it('is the schema generated from the zod schemas (run npm run generated after a change)', () => {
    expect(readFileSync('shared/layout.schema.json', 'utf8')).toBe(schemaText());
  });

  it('is a draft 2020-12 schema that ajv compiles in strict mode too', () => {
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    // strictRequired is off: the transmon-model rules name keys defined one level up, which is valid JSON Schema
    expect(() => new Ajv2020({ strict: true, strictRequired: false, allowUnionTypes: true }).compile(schema)).not.toThrow();
  });

  it.each(readdirSync('layouts').filter((f) => f.endsWith('.yaml')))('accepts the demo layouts/%s', (name) => {
    const r = check(parse(readFileSync(`layouts/${name}`, 'utf8')));
    expect(r.errors).toBe('No errors');
    expect(r.ok).toBe(true);
  });

  it('accepts generated square and heavy-hex layouts', () => {
    for (const kind of ['square', 'heavy-hex'] as const) {
      expect(check(parse(layoutToYaml(generateLayout({ kind, rows: 3, cols: 3 })))).ok).toBe(true);
    }
  });

  const base = () => parse(readFileSync('layouts/bowline-5.yaml', 'utf8'));
  it.each([
    ['an unknown top-level key', (d: any) => { d.colour = 'red'; }],
    ['an unknown qubit key', (d: any) => { d.qubits.Q1.ejmax = '1 GHz'; }],
    ['a bare number for a frequency', (d: any) => { d.qubits.Q1.fMax = 6.3; }],
    ['a time where a frequency belongs', (d: any) => { d.qubits.Q1.fMax = '20 us'; }],
    ['no transmon model', (d: any) => { delete d.qubits.Q1.fMax; delete d.qubits.Q1.anharmonicity; delete d.qubits.Q1.asymmetry; }],
    ['two transmon models', (d: any) => { d.qubits.Q1.ec = '200 MHz'; }],
    ['asymmetry and fMin together', (d: any) => { d.qubits.Q1.fMin = '4 GHz'; }],
    ['no dephasing', (d: any) => { delete d.qubits.Q3.fluxNoise; }],
    ['a missing t1', (d: any) => { delete d.qubits.Q0.t1; }],
    ['a bad qubit id', (d: any) => { d.qubits['Q-9'] = d.qubits.Q0; }],
    ['a short position', (d: any) => { d.qubits.Q0.pos = [1]; }],
    ['a coupling without g', (d: any) => { d.couplings[0] = ['Q0', 'Q1']; }],
    ['an unknown rule', (d: any) => { d.rules.zzlimit = '1 kHz'; }],
    ['a missing chip name', (d: any) => { delete d.chip; }],
  ])('refuses %s', (_name, mutate) => {
    const d = base();
    mutate(d);
    expect(check(d).ok).toBe(false);
  });

  it('quantity patterns accept what the parser accepts and refuse bare numbers', () => {
    const f = new RegExp(quantityPattern('frequency'));
    for (const ok of ['5.8 GHz', '-210 MHz', '200 kHz', '.5 GHz', '5e9 Hz']) expect(f.test(ok), ok).toBe(true);
    for (const bad of ['5.8', 'GHz', '5 Ghz', '20 us']) expect(f.test(bad), bad).toBe(false);
    const n = new RegExp(quantityPattern('fluxNoise'));
    for (const ok of ['3 uPhi0', '3 uPhi0/sqrt(Hz)', '3 µPhi0 / Hz^0.5']) expect(n.test(ok), ok).toBe(true);
  });
});
