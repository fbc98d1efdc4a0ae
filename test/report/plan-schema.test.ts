/**
 * shared/plan.schema.json (the documented plan.json schema) against the plans
 * src/report/plan-json.ts writes (validated with ajv, a general-purpose JSON Schema validator),
 * and against broken plans.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { Ajv2020 } from 'ajv/dist/2020.js';
import { loadLayoutFile } from '../../src/layout/load.js';
import { planChip } from '../../src/plan/plan.js';
import { planJson } from '../../src/report/plan-json.js';

const schema = JSON.parse(readFileSync(new URL('../../shared/plan.schema.json', import.meta.url), 'utf8'));
const ajv = new Ajv2020({ allErrors: true, strict: true });
const validate = ajv.compile(schema);

describe('shared/plan.schema.json', () => {
  it.each(['layouts/bowline-5.yaml', 'layouts/reef-49.yaml'])('accepts the plan of %s (violations and explanations included)', (file) => {
    const plan = JSON.parse(JSON.stringify(planJson(planChip(loadLayoutFile(file, file)), { file, seed: 1, pulses: false })));
    const ok = validate(plan);
    expect(ok, ajv.errorsText(validate.errors)).toBe(true);
  });

  it('refuses a plan without parking frequencies or with an unknown crossing', () => {
    expect(validate({ format: 'fluxlane-plan', version: 1, qubits: { Q1: {} }, edges: [] })).toBe(false);
    expect(validate({ format: 'fluxlane-plan', version: 1, qubits: {}, edges: [{ qubits: ['A', 'B'], mover: 'A', crossing: '11-21', interactionFrequency: 5e9, layer: 0, rampTime: 1.5e-8 }] })).toBe(false);
    expect(validate({ format: 'fluxlane-plan', version: 1, qubits: { Q1: { parkingFrequency: 5e9 } }, edges: [] })).toBe(true);
  });
});
