/**
 * Re-planning from an earlier plan (`fluxlane plan LAYOUT --from OLD.json [--edges A-B,...]`):
 *
 *   --edges   every qubit keeps its parking (pinned, src/plan/parking/keep.ts) and every edge not
 *             named keeps its interaction plan and its designed gate; the named edges are planned
 *             and designed again.
 *   measured  (no --edges: the layout holds what the lab measured after a cool-down) the parking
 *             search starts from the earlier frequencies and pays a penalty for each one it
 *             changes, so it keeps every frequency that still holds (the fewest changes, then the
 *             least cost of the planner's own objective); an edge keeps its interaction plan and
 *             design when its two qubits kept their parking and their device parameters, its
 *             coupling and the rules are unchanged, it broke no rule before, and its plan breaks
 *             none now; the others are planned again (their earlier mover and crossing preferred
 *             among options of the same standing) and designed again.
 *
 * Layers: kept gates stay in their earlier layer, the others go into the first layer with room
 * (./kept-layers.ts). Every change is recorded with why: which rule the earlier value breaks
 * now, and which measured value changed (`changes`, written into plan.json as `replan`).
 */
import type { ChipLayout } from '../../layout/types.js';
import type { ChipGraph } from '../../chip/graph.js';
import { InputError } from '../../util/errors.js';
import type { GateDesign } from '../gate-seam.js';
import type { EdgeContext } from '../interaction/plan-edge.js';
import type { PlanOptionsInput } from '../options.js';
import { collectFindings, edgeExplanations, planChip, type ChipPlan, type PlanHooks } from '../plan.js';
import type { PlanDocument as PlanInput, PlanDocumentEdge as PlanEdgeInput } from '../plan-read.js';
import { calibratedZzScale, crowding } from '../crowding.js';
import { freq } from '../format.js';
import { keptDesign, keptEdgePlan } from './kept-edge.js';
import { keptLayers } from './kept-layers.js';
import { planLayers } from '../layers.js';
import { changeText, measuredChanges, type MeasuredChanges } from './measured-changes.js';

export interface EarlierPlan {
  plan: PlanInput;
  /** As the user named it. */
  file: string;
  /** Its folder (waveform files are relative to it). */
  dir: string;
}

export interface ReplanRequest {
  /** Edge keys A-B to plan again (the rest kept); absent: re-plan after re-measurement. */
  edges?: string[];
  options?: PlanOptionsInput;
  /** Penalty per changed parking frequency (default src/plan/parking/keep.ts). */
  changePenalty?: number;
}

/** One recorded change, with why (SI values). */
export interface PlanChange {
  /** A qubit id, an edge key, or 'rules'. */
  subject: string;
  kind: 'measured' | 'parking' | 'edge' | 'design';
  field?: string;
  from?: number | string | null;
  to?: number | string | null;
  /** Rules the earlier value breaks now. */
  rules?: string[];
  /** Measured values behind it ("Q3 maximum frequency 6.5500 -> 6.5100 GHz"). */
  measured?: string[];
  message: string;
}

export interface Replan {
  plan: ChipPlan;
  mode: 'edges' | 'measured';
  requested: string[] | null;
  /** By edge index: its earlier interaction plan was kept. */
  kept: boolean[];
  /** By edge index: the earlier design, to hand to the pulse stage instead of designing. */
  keptDesigns: (GateDesign | null)[];
  /** By edge index: the earlier design's target phase. */
  keptTargetPhase: (number | undefined)[];
  /** By edge index: the earlier layer. */
  earlierLayer: (number | undefined)[];
  measured: MeasuredChanges;
  changes: PlanChange[];
}

const pairKey = (a: string, b: string) => (a < b ? `${a}\u0000${b}` : `${b}\u0000${a}`);

export function replanChip(layout: ChipLayout, earlier: EarlierPlan, request: ReplanRequest = {}, hooks: PlanHooks = {}, graph?: ChipGraph): Replan {
  const mode = request.edges ? 'edges' : 'measured';
  const layoutKey = new Map(layout.couplings.map((c) => [pairKey(c.a, c.b), `${c.a}-${c.b}`]));
  const requested = request.edges ? [...new Set(request.edges.map((e) => normaliseEdge(e, layout, layoutKey)))] : null;
  const oldEntry = new Map<string, PlanEdgeInput>();
  for (const e of earlier.plan.edges) {
    const key = layoutKey.get(pairKey(e.qubits[0], e.qubits[1]));
    if (key) oldEntry.set(key, e);
  }
  const parkingGHz: Record<string, number> = {};
  for (const [id, q] of Object.entries(earlier.plan.qubits)) parkingGHz[id] = q.parkingFrequency * 1e-9;
  const edgeOptions: Record<string, { mover: string; crossing: '11-20' | '11-02' }> = {};
  for (const [key, e] of oldEntry) edgeOptions[key] = { mover: e.mover, crossing: e.crossing };
  const plan = planChip(
    layout,
    { ...request.options, keep: { parkingGHz, mode: mode === 'edges' ? 'pin' : 'prefer', changePenalty: request.changePenalty, edgeOptions: mode === 'measured' ? edgeOptions : undefined } },
    hooks,
    graph,
  );
  const { ctx } = plan;
  const id = ctx.ids;
  const measured = measuredChanges(ctx, earlier.plan);
  const changes: PlanChange[] = [];
  // the values the layout gives (those derived from them changed with them)
  const measuredOf = (i: number): string[] => {
    const given = measured.qubits[i].filter((c) => !c.derived);
    return (given.length > 0 ? given : measured.qubits[i]).map((c) => `${id[i]} ${changeText(c)}`);
  };
  for (const list of measured.qubits) for (const c of list) changes.push({ subject: c.subject, kind: 'measured', field: c.field, from: c.from, to: c.to, message: `${c.subject} ${changeText(c)}${c.derived ? ' (follows from the measured values)' : ''}` });
  measured.couplings.forEach((c) => c && changes.push({ subject: c.subject, kind: 'measured', field: c.field, from: c.from, to: c.to, message: `${c.subject} ${changeText(c)}` }));
  for (const c of measured.rules) changes.push({ subject: 'rules', kind: 'measured', field: c.field, from: c.from, to: c.to, message: `rule ${changeText(c)}` });
  if (!measured.known && mode === 'measured') {
    changes.push({ subject: 'plan', kind: 'measured', message: `${earlier.file} records no device parameters or rules (made before plans did): every gate is planned and designed again` });
  }

  // Parking: what changed, and why its earlier value could not stay.
  const parkingChanged = ctx.ids.map((q, i) => {
    const old = parkingGHz[q];
    return old === undefined || Math.abs(plan.parking.parkingGHz[i] - old) > 1e-6;
  });
  const state = plan.parking.state;
  ctx.ids.forEach((q, i) => {
    if (!parkingChanged[i]) return;
    const old = parkingGHz[q];
    const now = plan.parking.parkingGHz[i];
    const from = old === undefined ? null : old * 1e9;
    if (old === undefined) {
      changes.push({ subject: q, kind: 'parking', field: 'parkingFrequency', from, to: now * 1e9, message: `${q} parks at ${freq(now, 5)}: the earlier plan has no parking for it` });
      return;
    }
    const d = ctx.domains[i];
    const base = { subject: q, kind: 'parking' as const, field: 'parkingFrequency', from, to: now * 1e9 };
    if (!d || old < d.lo - 1e-9 || old > d.hi + 1e-9) {
      const where = d ? `its allowed band ${freq(d.lo, 5)} to ${freq(d.hi, 5)}` : 'its window and planning range, which no longer meet';
      changes.push({ ...base, rules: ['window'], measured: measuredOf(i), message: `${q} ${freq(old, 5)} -> ${freq(now, 5)}: its earlier parking is outside ${where} (rule window)${measured.qubits[i].length > 0 ? `; measured: ${measuredOf(i).join('; ')}` : ''}` });
      return;
    }
    const blocking = state.blockersOf(i).filter((b) => old > b.lo && old < b.hi);
    if (blocking.length > 0) {
      const others = [...new Set(blocking.map((b) => b.other).filter((o) => o >= 0))];
      const because = [...measuredOf(i), ...others.flatMap((o) => measuredOf(o))];
      const words = [...new Set(blocking.map((b) => (b.other >= 0 ? `${b.rule} with ${id[b.other]} (now at ${freq(state.freq[b.other], 5)})` : `${b.rule}`)))];
      changes.push({ ...base, rules: [...new Set(blocking.map((b) => b.rule))], measured: because,
        message: `${q} ${freq(old, 5)} -> ${freq(now, 5)}: at its earlier frequency it would break ${words.join(', ')}${because.length > 0 ? `; measured: ${because.join('; ')}` : ''}` });
      return;
    }
    changes.push({ ...base, measured: measuredOf(i), message: `${q} ${freq(old, 5)} -> ${freq(now, 5)}: no idle rule blocks its earlier frequency; the search or the gate-aware repair moved it` });
  });

  // Edges: keep what still holds.
  const ec: EdgeContext = { ctx, options: plan.options, blockers: state.blockers, states: plan.states };
  const kept = plan.edges.map(() => false);
  const keptDesigns: (GateDesign | null)[] = plan.edges.map(() => null);
  const keptTargetPhase: (number | undefined)[] = plan.edges.map(() => undefined);
  const earlierLayer: (number | undefined)[] = plan.edges.map(() => undefined);
  const requestedSet = new Set(requested ?? []);
  plan.edges.forEach((fresh, k) => {
    const key = ctx.edges[k].key;
    const entry = oldEntry.get(key);
    if (entry) earlierLayer[k] = entry.layer;
    const why: string[] = [];
    const because: string[] = [];
    if (!entry) why.push('the earlier plan has no entry for it');
    else if (mode === 'edges') {
      if (requestedSet.has(key)) why.push('named in --edges');
    } else {
      if (!measured.known) why.push('the earlier plan records no device parameters');
      if ((entry as Record<string, unknown>).feasible === false) why.push('it broke a rule in the earlier plan');
      for (const q of [ctx.edges[k].a, ctx.edges[k].b]) {
        if (parkingChanged[q]) why.push(`${id[q]}'s parking changed`);
        if (measured.qubits[q].length > 0) {
          why.push(`${id[q]} was measured differently`);
          because.push(...measuredOf(q));
        }
      }
      if (measured.couplings[k]) {
        why.push('its coupling was measured differently');
        because.push(`${key} ${changeText(measured.couplings[k]!)}`);
      }
      if (measured.rules.length > 0) {
        why.push('the rules changed');
        because.push(...measured.rules.map((c) => `rule ${changeText(c)}`));
      }
    }
    let rules: string[] = [];
    if (why.length === 0 && entry) {
      const rebuilt = keptEdgePlan(ec, k, entry, fresh);
      if ('why' in rebuilt) why.push(rebuilt.why);
      else if (mode === 'measured' && rebuilt.plan.findings.length > 0) {
        rules = [...new Set(rebuilt.plan.findings.map((f) => f.rule))];
        why.push(`its earlier plan breaks ${rules.join(', ')} now: ${rebuilt.plan.findings[0].message}`);
      } else {
        plan.edges[k] = rebuilt.plan;
        kept[k] = true;
        const d = keptDesign(ec, k, entry, earlier.dir);
        if ('design' in d) {
          keptDesigns[k] = d.design;
          const phase = entry.gate?.targetPhase;
          if (typeof phase === 'number') keptTargetPhase[k] = phase;
        } else if (entry.gate) {
          changes.push({ subject: key, kind: 'design', message: `${key}: its interaction plan is kept, its gate is designed again: ${d.why}` });
        }
        return;
      }
    }
    const now = plan.edges[k];
    const what: string[] = [];
    if (entry) {
      if (entry.mover !== id[now.mover] || entry.crossing !== now.crossing) what.push(`mover ${entry.mover} ${entry.crossing} -> ${id[now.mover]} ${now.crossing}`);
      const before = Object.keys(entry.spectatorParking).sort().join(', ') || 'none';
      const after = now.parked.map((p) => id[p.qubit]).sort().join(', ') || 'none';
      if (before !== after) what.push(`spectators moved: ${before} -> ${after}`);
    }
    changes.push({ subject: key, kind: 'edge', rules: rules.length > 0 ? rules : undefined, measured: because.length > 0 ? [...new Set(because)] : undefined,
      message: `${key} planned again: ${why.join('; ')}${what.length > 0 ? ` (${what.join('; ')})` : ''}${because.length > 0 ? `; measured: ${[...new Set(because)].join('; ')}` : ''}` });
  });
  refresh(plan, earlierLayer);
  // the layers are the earlier plan's where they still hold (keptLayers), not the fitting's candidates
  plan.parking.stats.layerFitting = null;
  return { plan, mode, requested, kept, keptDesigns, keptTargetPhase, earlierLayer, measured, changes };
}

/** Layers (kept where they were), crowding, findings and explanations after edges were swapped or designed. */
export function refresh(plan: ChipPlan, earlierLayer: readonly (number | undefined)[]): void {
  const { ctx } = plan;
  const f12 = plan.states.map((s) => s.f12GHz);
  const conflicts = planLayers(ctx, plan.edges, f12, plan.parking.parkingGHz).conflicts;
  plan.layers = keptLayers(ctx, plan.edges, f12, plan.parking.parkingGHz, earlierLayer, conflicts);
  plan.crowding = crowding(ctx, plan.parking.parkingGHz, plan.states, calibratedZzScale(ctx, plan.parking.parkingGHz, plan.parking.idle.zzGHz), plan.edges);
  collectFindings(plan);
  plan.explanations = [...plan.explanations.filter((x) => x.kind === 'parking'), ...edgeExplanations(plan)];
}

/** After the pulse stage: kept designs keep their target phase, layers stay where they were. */
export function finishReplan(r: Replan): void {
  r.plan.gates?.forEach((g, k) => {
    if (g && r.keptDesigns[k] && r.keptTargetPhase[k] !== undefined) g.targetPhase = r.keptTargetPhase[k];
  });
  refresh(r.plan, r.earlierLayer);
}

/** The plan.json `replan` block. */
export function replanJson(r: Replan, from: string): Record<string, unknown> {
  return {
    from,
    mode: r.mode,
    edges: r.requested,
    keptEdges: r.kept.filter(Boolean).length,
    keptDesigns: r.keptDesigns.filter(Boolean).length,
    changes: r.changes.map((c) => Object.fromEntries(Object.entries(c).filter(([, v]) => v !== undefined))),
  };
}

function normaliseEdge(text: string, layout: ChipLayout, layoutKey: Map<string, string>): string {
  const ids = new Set(layout.qubits.map((q) => q.id));
  for (let i = text.indexOf('-'); i >= 0; i = text.indexOf('-', i + 1)) {
    const a = text.slice(0, i).trim();
    const b = text.slice(i + 1).trim();
    if (ids.has(a) && ids.has(b)) {
      const key = layoutKey.get(pairKey(a, b));
      if (key) return key;
    }
  }
  throw new InputError({ file: layout.file, message: `option --edges: expected coupled pairs of ${layout.chip} such as ${[...layoutKey.values()].slice(0, 3).join(',')}, found ${JSON.stringify(text)}` });
}
