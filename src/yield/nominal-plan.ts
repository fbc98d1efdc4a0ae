/**
 * The plan a `fixed` yield study keeps: a plan.json given by the user (read as `fluxlane verify`
 * reads it, src/plan/plan-read.ts), or the planner's plan of the nominal layout without pulses
 * (what `fluxlane plan --no-pulses --seed S` writes), in the same form.
 */
import type { ChipLayout } from '../layout/types.js';
import type { ChipGraph } from '../chip/graph.js';
import { planChip } from '../plan/plan.js';
import { planJson } from '../report/plan-json.js';
import { readPlan, type PlanInput } from '../plan/plan-read.js';
import type { StageProfiler } from '../util/profile.js';

/** The planner's plan of `layout` (no pulses, seed `seed`) as plan.json reads back. */
export function nominalPlan(layout: ChipLayout, seed: number, graph?: ChipGraph, profiler?: StageProfiler): { plan: PlanInput; ok: boolean; violations: number } {
  const plan = planChip(layout, { seed }, { profiler }, graph);
  const json = planJson(plan, { file: layout.file, seed, pulses: false });
  return { plan: readPlan(JSON.stringify(json), `${layout.file} (nominal plan)`, layout), ok: plan.violations.length === 0, violations: plan.violations.length };
}

/**
 * The plan as a drawn chip is checked against it: interaction and crossing frequencies left to
 * be found again on that chip (verify then takes the crossing at the drawn parking spectra), and
 * designed gates dropped (their pulses would be re-tuned; every CZ is checked with the plan's ramp).
 */
export function planForDrawnChip(plan: PlanInput): PlanInput {
  // the document verify reads claims from keeps only the choices (the nominal chip's derived
  // numbers - spectra, margins, ZZ, durations - are not claims about a drawn chip)
  const raw = Object.create(null) as Record<string, unknown>;
  raw.format = plan.raw.format;
  raw.version = plan.raw.version;
  return {
    ...plan,
    raw,
    layers: null,
    layerSummary: null,
    edges: plan.edges.map((e) => ({ ...e, interactionFrequency: null, crossingFrequency: null, duration: null, gate: null })),
  };
}
