/**
 * A finding: one rule condition that failed (a violation) or that is worth a look (a flag), with
 * the qubits involved, the value and the threshold in internal units (GHz, ns, plain numbers),
 * and one sentence with units for people. `toFindingJson` gives the SI form of the CLI's JSON
 * contract: `{ rule, qubits, value, threshold, unit, message, details }`.
 */
import { plain, toHz, toSeconds } from '../format.js';
import { ruleByName, type RuleName } from './catalogue.js';

export interface Finding {
  rule: RuleName;
  /** Qubit ids involved (the qubit the finding is about first). */
  qubits: string[];
  /** The measured value (internal units; null when the rule has none). */
  value: number | null;
  threshold: number | null;
  message: string;
  /** The edge (`A-B`) of a cz finding. */
  edge?: string;
  /** Extra numbers, internal units, keys carry the unit (e.g. `crossingGHz`). */
  details?: Record<string, number | string | boolean | null>;
}

export interface FindingJson {
  rule: RuleName;
  qubits: string[];
  value: number | null;
  threshold: number | null;
  unit: 'Hz' | 's' | '1' | 'spreads' | null;
  message: string;
  edge?: string;
  details?: Record<string, number | string | boolean | null>;
}

/** SI form of a finding (frequencies in Hz, times in s; `details` keys ending in GHz/Ns converted). */
export function toFindingJson(f: Finding): FindingJson {
  const q = ruleByName(f.rule).quantity;
  const conv = (x: number | null): number | null => {
    if (x === null) return null;
    if (q === 'frequency') return toHz(x);
    if (q === 'time') return toSeconds(x);
    return plain(x);
  };
  const unit = q === 'frequency' ? 'Hz' : q === 'time' ? 's' : q === 'probability' ? '1' : q === 'spreads' ? 'spreads' : null;
  const out: FindingJson = { rule: f.rule, qubits: f.qubits, value: conv(f.value), threshold: conv(f.threshold), unit, message: f.message };
  if (f.edge !== undefined) out.edge = f.edge;
  if (f.details) out.details = detailsToSi(f.details);
  return out;
}

/** `fooGHz` -> `foo` in Hz, `fooNs` -> `foo` in s; other keys unchanged. */
export function detailsToSi(d: Record<string, number | string | boolean | null>): Record<string, number | string | boolean | null> {
  const out: Record<string, number | string | boolean | null> = {};
  for (const [k, v] of Object.entries(d)) {
    if (typeof v === 'number' && k.endsWith('GHz')) out[k.slice(0, -3)] = toHz(v);
    else if (typeof v === 'number' && k.endsWith('Ns')) out[k.slice(0, -2)] = toSeconds(v);
    else out[k] = typeof v === 'number' ? plain(v) : v;
  }
  return out;
}

/** Stable order: by rule (catalogue order), then edge, then qubits. */
export function sortFindings(list: Finding[], ruleOrder: readonly RuleName[]): Finding[] {
  const rank = new Map(ruleOrder.map((r, k) => [r, k]));
  return list.sort(
    (a, b) =>
      (rank.get(a.rule) ?? 99) - (rank.get(b.rule) ?? 99) ||
      (a.edge ?? '').localeCompare(b.edge ?? '') ||
      a.qubits.join(',').localeCompare(b.qubits.join(',')),
  );
}
