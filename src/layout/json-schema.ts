/**
 * The JSON Schema (draft 2020-12) of the layout format, made from the zod schemas in schema.ts
 * with `z.toJSONSchema`, for editors (completion, hover docs, checks). Published as
 * shared/layout.schema.json (test/tools/write-generated.ts writes it; a test keeps it in step).
 *
 * Adjustments to zod's output:
 * - quantities become text with a pattern (a number and a unit of the right family), so editors
 *   flag bare numbers; fluxlane itself also checks the dimension with mathjs;
 * - a qubit must give one of the three transmon models (anyOf of the required keys) and
 *   tphi or fluxNoise.
 */

import * as z from 'zod';
import { LayoutFileSchema, QUANTITY_META_KEY } from './schema.js';
import type { QuantityKind } from './units.js';

const NUMBER = '[-+]?(?:[0-9]+(?:\\.[0-9]*)?|\\.[0-9]+)(?:[eE][-+]?[0-9]+)?';

/** Unit spellings accepted for each kind (a subset of what mathjs reads, enough for editors). */
const UNIT_PATTERNS: Record<QuantityKind, string> = {
  frequency: '(?:[kMGT]?Hz)',
  time: '(?:[mun\u00b5\u03bcp]?s)',
  resistance: '(?:[kM]?(?:[Oo]hm|\u03a9|ohm))',
  fluxNoise: '(?:[mun\u00b5\u03bc]?Phi0(?:\\s*/\\s*(?:sqrt\\(Hz\\)|Hz\\^0\\.5|Hz\\^\\(1/2\\)))?)',
  temperature: '(?:[mu\u00b5\u03bc]?K)',
};

export function quantityPattern(kind: QuantityKind): string {
  return `^\\s*${NUMBER}\\s*${UNIT_PATTERNS[kind]}\\s*$`;
}

export function layoutJsonSchema(): Record<string, unknown> {
  const schema = z.toJSONSchema(LayoutFileSchema, {
    target: 'draft-2020-12',
    unrepresentable: 'throw',
    override: (ctx) => {
      const js = ctx.jsonSchema as Record<string, unknown>;
      const kind = js[QUANTITY_META_KEY] as QuantityKind | undefined;
      if (kind !== undefined) {
        delete js[QUANTITY_META_KEY];
        delete js.anyOf;
        delete js.type;
        js.type = 'string';
        js.pattern = quantityPattern(kind);
      }
    },
  }) as Record<string, unknown>;
  const qubits = (schema.properties as Record<string, Record<string, unknown>>).qubits;
  const qubit = qubits.additionalProperties as Record<string, unknown>;
  qubit.allOf = [
    {
      description: 'A transmon model: ec + ejMax (+ asymmetry), fMax + anharmonicity (+ asymmetry or fMin), or ec + rn.',
      oneOf: [
        { required: ['ec', 'ejMax'], not: { anyOf: [{ required: ['fMax'] }, { required: ['anharmonicity'] }, { required: ['fMin'] }, { required: ['rn'] }] } },
        { required: ['fMax', 'anharmonicity'], not: { anyOf: [{ required: ['ec'] }, { required: ['ejMax'] }, { required: ['rn'] }, { required: ['asymmetry', 'fMin'] }] } },
        { required: ['ec', 'rn'], not: { anyOf: [{ required: ['ejMax'] }, { required: ['fMax'] }, { required: ['anharmonicity'] }, { required: ['fMin'] }] } },
      ],
    },
    {
      description: 'Dephasing: tphi, fluxNoise or both.',
      anyOf: [{ required: ['tphi'] }, { required: ['fluxNoise'] }],
    },
  ];
  return schema;
}
