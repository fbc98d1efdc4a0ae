/**
 * `--plan PLAN.json` of the per-edge commands (gate, simulate, pair) and the fluxes they use:
 * each qubit's flux comes from the command's own option, else the plan, else the layout's fixed
 * `park`, else its upper sweet spot (Phi = 0), which the output then says was assumed
 * (README physics conventions sec. 6).
 */
import { readFileSync } from 'node:fs';
import { dirname } from 'node:path';
import type { ChipLayout, QubitLayout } from '../layout/types.js';
import { Transmon } from '../transmon/transmon.js';
import { findQubit } from './commands/spectrum.js';
import { planDocument, readPlanFile, type PlanDocument as PlanInput } from '../plan/plan-read.js';
import { edgeFromPlan, type EdgeFromPlan } from '../plan/edge-from-plan.js';
import { InputError } from '../util/errors.js';
import type { CommandContext } from './handler.js';

export interface PlanOption {
  plan: PlanInput;
  /** As the user gave it. */
  file: string;
  /** The plan's folder (waveform paths are relative to it). */
  dir: string;
}

/** Read and check `--plan` against the layout (JSON and schema problems are InputErrors with positions). */
export function readPlanOption(ctx: CommandContext, file: string, layout: ChipLayout): PlanOption {
  const full = ctx.resolvePath(file);
  // the one plan reader (UTF-8, positions, the layout's qubits and couplings), then its choices as typed objects
  return { plan: planDocument(readPlanFile(full, file, layout)), file, dir: dirname(full) };
}

/** The plan's view of the edge a-b, or null without --plan. */
export function planEdge(p: PlanOption | null, layout: ChipLayout, a: string, b: string): EdgeFromPlan | null {
  return p ? edgeFromPlan(p.plan, p.file, layout, a, b) : null;
}

/** A spectator as a third transmon (the gate designer's and the simulator's form). */
export interface SpectatorTransmon {
  transmon: Transmon;
  coupledTo: 'mover' | 'partner';
  gGHz: number;
  flux: number;
}

export type FluxSource = 'option' | 'plan' | 'plan, moved for the gate' | 'layout park' | 'assumed: upper sweet spot';

export interface FluxChoice {
  id: string;
  flux: number;
  source: FluxSource;
}

/** A qubit's flux: the option's, else the plan's, else its layout `park`, else Phi = 0 (assumed). */
export function chooseFlux(t: Transmon, q: QubitLayout, option: number | undefined, fromPlan: number | undefined, planSource: FluxSource = 'plan'): FluxChoice {
  if (option !== undefined) return { id: q.id, flux: option, source: 'option' };
  if (fromPlan !== undefined) return { id: q.id, flux: fromPlan, source: planSource };
  if (q.parkGHz !== undefined) {
    const flux = t.fluxForF01(q.parkGHz, { file: q.source.file, line: q.source.line, column: q.source.column, path: `${q.source.path}.park` });
    return { id: q.id, flux, source: 'layout park' };
  }
  return { id: q.id, flux: 0, source: 'assumed: upper sweet spot' };
}

/** "Q0 at 0.2017 Phi0 (f01 5.0500 GHz; plan)" */
export function fluxText(c: FluxChoice, t: Transmon): string {
  return `${c.id} at ${c.flux.toFixed(4)} Phi0 (f01 ${t.f01(c.flux).toFixed(4)} GHz; ${c.source})`;
}

/** One line naming the qubits whose flux was assumed, or none. */
export function assumedLine(choices: readonly FluxChoice[], planGiven: boolean): string[] {
  const assumed = choices.filter((c) => c.source === 'assumed: upper sweet spot').map((c) => c.id);
  if (assumed.length === 0) return [];
  const why = planGiven ? 'no flux option and no layout park' : 'no --plan, no flux option and no layout park';
  return [`assumed: ${assumed.join(', ')} at the upper sweet spot (Phi = 0), since ${why} gives ${assumed.length > 1 ? 'their' : 'its'} flux; pass --plan PLAN.json to use a plan's parking`];
}

/** The JSON form of the flux choices: { id: { flux, source } }. */
export function fluxSourcesJson(choices: readonly FluxChoice[], si: (x: number) => number | null): Record<string, { flux: number | null; source: FluxSource }> {
  return Object.fromEntries(choices.map((c) => [c.id, { flux: si(c.flux), source: c.source }]));
}

/**
 * A neighbour of the mover or partner as a third transmon: at its flux during the plan's gate
 * (its temporary point when the plan moves it), else its layout park, else Phi = 0.
 */
export function spectatorRequest(layout: ChipLayout, id: string, mover: QubitLayout, partner: QubitLayout, fromPlan: EdgeFromPlan | null): { request: SpectatorTransmon; choice: FluxChoice } {
  const lq = findQubit(layout, id, '--spectator');
  if (id === mover.id || id === partner.id) throw new InputError({ message: `option --spectator: expected a qubit outside the edge, found ${id}` });
  const c = layout.couplings.find((x) => (x.a === id || x.b === id) && [x.a, x.b].some((q) => q === mover.id || q === partner.id));
  if (!c) throw new InputError({ message: `option --spectator: expected a neighbour of ${mover.id} or ${partner.id}, found ${id}` });
  const t = Transmon.fromLayout(lq);
  const moved = fromPlan?.moved.includes(id) ?? false;
  const choice = chooseFlux(t, lq, undefined, fromPlan?.duringGateFlux.get(id), moved ? 'plan, moved for the gate' : 'plan');
  const coupledTo = c.a === mover.id || c.b === mover.id ? 'mover' : 'partner';
  return { request: { transmon: t, coupledTo, gGHz: c.gGHz, flux: choice.flux }, choice };
}
