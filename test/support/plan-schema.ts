/** shared/plan.schema.json compiled with ajv (a general-purpose JSON Schema validator), for tests. */
import { readFileSync } from 'node:fs';
import { Ajv2020 } from 'ajv/dist/2020.js';

const schema = JSON.parse(readFileSync(new URL('../../shared/plan.schema.json', import.meta.url), 'utf8'));
const ajv = new Ajv2020({ allErrors: true, strict: true });
const validate = ajv.compile(schema);

/** The schema's complaints about a plan document ('' when it is valid). */
export function planSchemaErrors(doc: unknown): string {
  return validate(doc) ? '' : ajv.errorsText(validate.errors);
}
