/**
 * One drawn chip in detail (`fluxlane yield --sample K`): its circuit parameters next to the
 * nominal ones, in SI units, and every rule it breaks, for a look at why a chip fails.
 */
import { toHz } from '../plan/format.js';
import type { Finding } from '../plan/rules/findings.js';
import type { SampleEvaluator } from './job.js';
import type { SampleOutcome } from './outcome.js';

export interface SampleDetails {
  outcome: SampleOutcome;
  findings: Finding[];
  parameters: {
    qubits: Record<string, { ec: number; ejs: number; asymmetry: number }>;
    couplings: Record<string, { gCharge: number }>;
  };
}

export function sampleFindings(evaluator: SampleEvaluator, index: number, row = 0): SampleDetails {
  const d = evaluator.inDetail(row, index);
  const qubits: SampleDetails['parameters']['qubits'] = {};
  d.ids.forEach((q, i) => {
    qubits[q] = { ec: toHz(d.drawn.ecGHz[i]), ejs: toHz(d.drawn.ejsGHz[i]), asymmetry: Number(d.drawn.asymmetry[i].toPrecision(12)) };
  });
  const couplings: SampleDetails['parameters']['couplings'] = {};
  d.edgeKeys.forEach((k, e) => {
    couplings[k] = { gCharge: toHz(d.drawn.gChargeGHz[e]) };
  });
  return { outcome: d.outcome, findings: d.findings, parameters: { qubits, couplings } };
}
