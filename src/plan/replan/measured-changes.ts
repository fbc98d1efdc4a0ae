/**
 * What was measured differently since an earlier plan: each qubit's device parameters
 * (src/plan/device.ts) and each coupling's g in the earlier plan.json against the new layout, and
 * the rules. Values compare equal within the 12 significant digits plan.json keeps.
 */
import type { PlanContext } from '../context.js';
import { DEVICE_FIELDS, deviceToSi, type DeviceKind } from '../device.js';
import { RULE_SPECS } from '../../layout/rules.js';
import type { PlanDocument as PlanInput } from '../plan-read.js';

export interface ValueChange {
  /** Qubit id, edge key, or 'rules'. */
  subject: string;
  /** plan.json key (`fMax`, `gMax`, a rule's key, `tls`). */
  field: string;
  /** In words ("maximum frequency"). */
  name: string;
  kind: DeviceKind | 'list';
  /** SI values (null: not given); lists as text. */
  from: number | string | null;
  to: number | string | null;
  /** True when the layout's transmon form does not give it (it changed because a given value did). */
  derived?: boolean;
}

export interface MeasuredChanges {
  /** False when the earlier plan records no device parameters (made before plans did): every model counts as changed. */
  known: boolean;
  /** By qubit index. */
  qubits: ValueChange[][];
  /** By edge index (the coupling's g). */
  couplings: (ValueChange | null)[];
  rules: ValueChange[];
}

const same = (a: number | null, b: number | null): boolean => (a === null || b === null ? a === b : Math.abs(a - b) <= 1e-11 * Math.max(Math.abs(a), Math.abs(b)));

const pairKey = (a: string, b: string) => (a < b ? `${a}\u0000${b}` : `${b}\u0000${a}`);

export function measuredChanges(ctx: PlanContext, old: PlanInput): MeasuredChanges {
  const qubits: ValueChange[][] = ctx.ids.map(() => []);
  let known = true;
  ctx.ids.forEach((id, i) => {
    const device = (old.qubits[id] as Record<string, unknown> | undefined)?.device as Record<string, unknown> | undefined;
    if (!device) {
      known = false;
      return;
    }
    for (const f of DEVICE_FIELDS) {
      const v = f.of(ctx, i);
      const to = v === undefined ? null : deviceToSi(f.kind, v);
      const from = typeof device[f.key] === 'number' ? (device[f.key] as number) : null;
      const derived = f.given !== undefined && !f.given(ctx.qubits[i].transmon);
      if (!same(from, to)) qubits[i].push({ subject: id, field: f.key, name: f.name, kind: f.kind, from, to, ...(derived ? { derived } : {}) });
    }
    const tls = (list: { at: number; width: number }[]) => list.map((d) => `${(d.at * 1e-9).toFixed(6)} GHz +- ${(d.width * 1e-6).toFixed(3)} MHz`).join(', ') || 'none';
    const oldTls = tls(Array.isArray(device.tls) ? (device.tls as { at: number; width: number }[]) : []);
    const newTls = tls(ctx.qubits[i].tls.map((d) => ({ at: d.atGHz * 1e9, width: d.widthGHz * 1e9 })));
    if (oldTls !== newTls) qubits[i].push({ subject: id, field: 'tls', name: 'defects', kind: 'list', from: oldTls, to: newTls });
  });
  const oldG = new Map(old.edges.map((e) => [pairKey(e.qubits[0], e.qubits[1]), (e as Record<string, unknown>).gMax]));
  const couplings = ctx.edges.map((e) => {
    const g = oldG.get(pairKey(ctx.ids[e.a], ctx.ids[e.b]));
    if (typeof g !== 'number') {
      known = false;
      return null;
    }
    return same(g, e.gGHz * 1e9) ? null : { subject: e.key, field: 'gMax', name: 'coupling g', kind: 'frequency' as const, from: g, to: e.gGHz * 1e9 };
  });
  const rules: ValueChange[] = [];
  const oldRules = (old as Record<string, unknown>).rules as Record<string, number | null> | undefined;
  if (!oldRules) known = false;
  else {
    for (const spec of RULE_SPECS) {
      const v = ctx.rules[spec.field];
      const to = v === undefined ? null : deviceToSi(spec.kind, v);
      const from = oldRules[spec.key] ?? null;
      if (!same(from, to)) rules.push({ subject: 'rules', field: spec.key, name: spec.key, kind: spec.kind, from, to });
    }
  }
  return { known, qubits, couplings, rules };
}

/** "maximum frequency 6.550 -> 6.510 GHz" */
export function changeText(c: ValueChange): string {
  const v = (x: number | string | null): string => {
    if (x === null) return 'none';
    if (typeof x === 'string') return x;
    if (c.kind === 'frequency') return Math.abs(x) >= 1e9 ? `${(x * 1e-9).toFixed(4)} GHz` : `${(x * 1e-6).toFixed(3)} MHz`;
    if (c.kind === 'time') return Math.abs(x) >= 1e-6 ? `${(x * 1e6).toFixed(2)} us` : `${(x * 1e9).toFixed(2)} ns`;
    return String(x);
  };
  return `${c.name} ${v(c.from)} -> ${v(c.to)}`;
}
