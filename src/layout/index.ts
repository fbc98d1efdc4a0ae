/** The layout stage: layout files -> validated ChipLayout (re-exports only). */
export type * from './types.js';
export { loadLayoutFile, parseLayoutBytes, parseLayoutText } from './load.js';
export { DEFAULT_RULES, RULE_SPECS, RULES_FILE, parseRuleValue, ruleSpecByKey, rulesTableMarkdown, type RuleSpec } from './rules.js';
export { formatQuantity, parseQuantity, roundSignificant, type QuantityKind } from './units.js';
export { layoutJsonSchema } from './json-schema.js';
export { layoutToYaml, yamlScalar, type LayoutDocument, type QubitDocument } from './write.js';
export { formatPath, type Path, type Position } from './diagnostics.js';
export { YAML_LIMITS } from './yaml-source.js';
