/**
 * The structure of a layout file, as zod schemas: which keys exist, which are required, and the
 * rough type of each value (text, number, list, map; quantities as text). Values with units are
 * converted and range-checked afterwards (convert.ts), with messages that name the unit problem.
 *
 * The same schemas produce the published JSON Schema (json-schema.ts -> shared/layout.schema.json),
 * so the file format has one definition. Error texts: each schema's `error` returns the phrase
 * that follows "expected" in a diagnostic (see zodIssues.ts).
 */

import * as z from 'zod';
import { quantityExample, quantityNoun, type QuantityKind } from './units.js';
import { RULE_SPECS } from './rules.js';

/** Qubit ids: letters, digits and `_` (edge names join two ids with `-`, as in `Q1-Q2`). */
export const QUBIT_ID_PATTERN = /^[A-Za-z0-9_]{1,64}$/;

/** Marks a schema as a quantity of a kind (read by json-schema.ts; not part of the output). */
export const QUANTITY_META_KEY = 'x-fluxlane-quantity';

const phrase = (text: string) => ({ error: () => text });

/** A quantity with a unit, as text ("5.8 GHz"). Numbers pass here and are refused with a clear message later. */
export function quantity(kind: QuantityKind, description: string, example = quantityExample(kind)) {
  return z
    .union([z.string(), z.number()], phrase(`${quantityNoun(kind)} such as "${quantityExample(kind)}"`))
    .meta({ description, examples: [example], [QUANTITY_META_KEY]: kind });
}

const finiteNumber = (description: string) => z.number(phrase('a finite number')).meta({ description });

export const PositionSchema = z
  .tuple([z.number(phrase('a finite number')), z.number(phrase('a finite number'))], phrase('a position [x, y] (two numbers)'))
  .meta({ description: 'Position of the qubit on the chip drawing [x, y], in any length unit (e.g. grid pitches).' });

export const WindowSchema = z
  .tuple(
    [quantity('frequency', 'Lower edge.'), quantity('frequency', 'Upper edge.')],
    phrase('a window [lo, hi] (two frequencies)'),
  )
  .meta({ description: 'Allowed parking band [lo, hi] of the qubit (lo < hi).' });

export const TlsSchema = z
  .strictObject(
    {
      at: quantity('frequency', 'Frequency of the two-level defect.'),
      width: quantity('frequency', 'Half-width of the band to keep clear around it.', '3 MHz'),
    },
    phrase('a defect { at, width }'),
  )
  .meta({ description: 'A two-level defect (TLS) seen in the qubit spectrum.' });

/** Largest relative fabrication spread a layout may state for one qubit. */
export const MAX_QUBIT_SPREAD = 0.1;

const relativeSpread = (description: string) =>
  z
    .number(phrase(`a relative spread (1 sigma) from 0 to ${MAX_QUBIT_SPREAD}, e.g. 0.015`))
    .meta({ description })
    .optional();

export const SpreadSchema = z
  .strictObject(
    {
      rn: relativeSpread('Relative spread (1 sigma) of the junction normal-state resistances R_n (each junction of the SQUID): E_J ~ 1/R_n (Ambegaokar-Baratoff).'),
      ec: relativeSpread('Relative spread (1 sigma) of the shunt capacitance, i.e. of E_C = e^2 / 2C.'),
    },
    phrase('a spread map { rn, ec } of relative spreads'),
  )
  .meta({ description: 'Measured fabrication spreads of this qubit (relative, 1 sigma) for `fluxlane yield`; they replace the command\'s --spread-rn and --spread-ec for this qubit.' });

export const ResistanceSchema = z
  .union(
    [
      quantity('resistance', 'Normal-state resistance of the SQUID (both junctions in parallel).'),
      z.tuple(
        [quantity('resistance', 'Junction 1.'), quantity('resistance', 'Junction 2.')],
        phrase('two resistances [r1, r2]'),
      ),
    ],
    phrase('a resistance such as "8.2 kOhm" or two resistances [r1, r2]'),
  )
  .meta({ description: 'Junction normal-state resistance R_n (Ambegaokar-Baratoff): one value for the SQUID, or [r1, r2] for its two junctions.' });

export const QubitSchema = z
  .strictObject(
    {
      pos: PositionSchema,
      ec: quantity('frequency', 'Charging energy E_C (as E/h). With ejMax, or with rn.', '220 MHz').optional(),
      ejMax: quantity('frequency', 'Total Josephson energy E_JS of the SQUID at zero flux (as E/h). With ec.', '22 GHz').optional(),
      asymmetry: z
        .number(phrase('a number d in [0, 1)'))
        .meta({ description: 'SQUID junction asymmetry d = |E_J1 - E_J2| / (E_J1 + E_J2), 0 <= d < 1; default 0.' })
        .optional(),
      fMax: quantity('frequency', 'Maximum 0-1 frequency (upper sweet spot). With anharmonicity.').optional(),
      anharmonicity: quantity('frequency', 'Anharmonicity f12 - f01 at fMax (negative, e.g. -210 MHz). With fMax.', '-210 MHz').optional(),
      fMin: quantity('frequency', 'Minimum 0-1 frequency (lower sweet spot, half a flux quantum). With fMax, instead of asymmetry.', '4.1 GHz').optional(),
      rn: ResistanceSchema.optional(),
      t1: quantity('time', 'Energy relaxation time T1.'),
      tphi: quantity('time', 'White (flux-independent) pure-dephasing time T_phi.').optional(),
      fluxNoise: quantity('fluxNoise', '1/f flux-noise amplitude A_Phi, e.g. "3 uPhi0/sqrt(Hz)" (or "3 uPhi0").').optional(),
      window: WindowSchema.optional(),
      park: quantity('frequency', 'Fixed parking frequency the plan must keep.').optional(),
      tls: z.array(TlsSchema, phrase('a list of defects [{ at, width }, ...]')).optional(),
      readout: quantity('frequency', 'Readout resonator frequency.', '7.2 GHz').optional(),
      spread: SpreadSchema.optional(),
      note: z.string(phrase('text')).meta({ description: 'Free text kept with the qubit.' }).optional(),
    },
    phrase('a qubit map { pos, t1, ... }'),
  )
  .meta({ description: 'One flux-tunable transmon: position, transmon model (ec + ejMax, fMax + anharmonicity, or ec + rn), coherence and planning constraints.' });

export const QubitRefSchema = z.union([z.string(), z.number()], phrase('a qubit id'));

export const CouplingListSchema = z
  .tuple(
    [QubitRefSchema, QubitRefSchema, quantity('frequency', 'Exchange coupling g at maximum frequency.', '12 MHz')],
    phrase('a coupling [A, B, g]'),
  )
  .meta({ description: 'A coupling [A, B, g].' });

export const CouplingMapSchema = z
  .strictObject(
    {
      qubits: z.tuple([QubitRefSchema, QubitRefSchema], phrase('two qubit ids [A, B]')),
      g: quantity('frequency', '01-10 exchange coupling g with both qubits at their maximum frequency.', '12 MHz'),
    },
    phrase('a coupling { qubits: [A, B], g }'),
  )
  .meta({ description: 'A coupling { qubits: [A, B], g }.' });

export const CouplingSchema = z.union([CouplingListSchema, CouplingMapSchema], phrase('a coupling [A, B, g] or { qubits: [A, B], g }'));

function ruleSchema(kind: 'frequency' | 'time' | 'temperature' | 'number', doc: string, nullable: boolean) {
  const base = kind === 'number' ? finiteNumber(doc) : quantity(kind, doc);
  return nullable ? base.nullable() : base;
}

export const RulesSchema = z
  .strictObject(
    Object.fromEntries(
      RULE_SPECS.map((s) => [s.key, ruleSchema(s.kind, s.doc, s.default === null).optional()]),
    ),
    phrase('a map of rule overrides'),
  )
  .meta({ description: 'Overrides of the collision thresholds and limits (defaults: shared/rules.json).' });

/** Top level, with qubits, couplings and rules left open: they are checked one by one (convert.ts). */
export const LayoutTopSchema = z.strictObject(
  {
    chip: z.string(phrase('a chip name (text)')).min(1, phrase('a non-empty chip name')),
    description: z.string(phrase('text')).optional(),
    qubits: z.record(z.string(), z.unknown(), phrase('a map of qubits { id: { pos, ... } }')),
    couplings: z.array(z.unknown(), phrase('a list of couplings')).optional(),
    rules: z.record(z.string(), z.unknown(), phrase('a map of rule overrides')).optional(),
  },
  phrase('a layout map with chip, qubits and couplings'),
);

/** The whole file (for the JSON Schema). */
export const LayoutFileSchema = z
  .strictObject({
    chip: z.string().min(1).meta({ description: 'Name of the chip.' }),
    description: z.string().meta({ description: 'Free text about the chip.' }).optional(),
    qubits: z
      .record(z.string().regex(QUBIT_ID_PATTERN), QubitSchema)
      .meta({ description: 'Qubits by id (letters, digits, _).' }),
    couplings: z.array(CouplingSchema).meta({ description: 'Capacitive couplings between qubits.' }).optional(),
    rules: RulesSchema.optional(),
  })
  .meta({ title: 'fluxlane chip layout', description: 'A chip of flux-tunable transmons with fixed capacitive couplings.' });

export const TOP_KEYS: readonly string[] = Object.keys(LayoutTopSchema.shape);
export const QUBIT_KEYS: readonly string[] = Object.keys(QubitSchema.shape);
export const TLS_KEYS: readonly string[] = Object.keys(TlsSchema.shape);
export const SPREAD_KEYS: readonly string[] = Object.keys(SpreadSchema.shape);
export const COUPLING_KEYS: readonly string[] = Object.keys(CouplingMapSchema.shape);
export const RULE_KEYS: readonly string[] = RULE_SPECS.map((s) => s.key);

export type QubitInput = z.infer<typeof QubitSchema>;
export type CouplingListInput = z.infer<typeof CouplingListSchema>;
export type CouplingMapInput = z.infer<typeof CouplingMapSchema>;
export type LayoutTopInput = z.infer<typeof LayoutTopSchema>;
export type LayoutFileInput = z.input<typeof LayoutFileSchema>;
