/**
 * What a plan was made for, in plan.json: each qubit's device parameters (src/plan/device.ts,
 * SI: Hz, s; flux noise in Phi0) and the rules, so a later plan of a re-measured chip can say
 * what changed (`fluxlane plan --from`, `fluxlane diff`).
 */
import type { PlanContext } from '../plan/context.js';
import { DEVICE_FIELDS } from '../plan/device.js';
import { plain, toHz, toSeconds } from '../plan/format.js';
import { RULE_SPECS } from '../layout/rules.js';
import type { Rules } from '../layout/types.js';

export function deviceJson(ctx: PlanContext, i: number): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const f of DEVICE_FIELDS) {
    const v = f.of(ctx, i);
    out[f.key] = v === undefined ? null : f.kind === 'frequency' ? toHz(v) : f.kind === 'time' ? toSeconds(v) : plain(v);
  }
  out.tls = ctx.qubits[i].tls.map((d) => ({ at: toHz(d.atGHz), width: toHz(d.widthGHz) }));
  return out;
}

/** The rules the plan was made with, by their layout key (SI: Hz, s; null for one not set). */
export function rulesJson(rules: Rules): Record<string, number | null> {
  const out: Record<string, number | null> = {};
  for (const spec of RULE_SPECS) {
    const v = rules[spec.field];
    out[spec.key] = v === undefined ? null : spec.kind === 'frequency' ? toHz(v) : spec.kind === 'time' ? toSeconds(v) : plain(v);
  }
  return out;
}
