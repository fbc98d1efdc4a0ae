/**
 * A chip as a yield study sees it: the nominal planner context (built once) and the nominal
 * circuit parameters the fabrication spread acts on (src/yield/spread.ts): per qubit E_C and the
 * two junction energies of its SQUID, E_J1 = E_JS (1 + d) / 2 and E_J2 = E_JS (1 - d) / 2
 * (d = (E_J1 - E_J2) / E_JS, README physics conventions sec. 1), per coupling the charge
 * coupling G; and the per-qubit spreads.
 */
import type { ChipLayout } from '../layout/types.js';
import { buildPlanContext, type PlanContext } from '../plan/context.js';
import { qubitSpreads, type FabricationSpread, type QubitSpreads } from './spread.js';

export interface NominalChip {
  layout: ChipLayout;
  ctx: PlanContext;
  n: number;
  ecGHz: Float64Array;
  ej1GHz: Float64Array;
  ej2GHz: Float64Array;
  gChargeGHz: Float64Array;
  spread: FabricationSpread;
  spreads: QubitSpreads;
}

export function nominalChip(layout: ChipLayout, spread: FabricationSpread, ctx: PlanContext = buildPlanContext(layout), options: { ignoreMeasuredRn?: boolean } = {}): NominalChip {
  const n = ctx.n;
  const ecGHz = new Float64Array(n);
  const ej1GHz = new Float64Array(n);
  const ej2GHz = new Float64Array(n);
  ctx.transmons.forEach((t, i) => {
    ecGHz[i] = t.ecGHz;
    ej1GHz[i] = (t.ejsGHz * (1 + t.asymmetry)) / 2;
    ej2GHz[i] = (t.ejsGHz * (1 - t.asymmetry)) / 2;
  });
  const gChargeGHz = Float64Array.from(ctx.edges, (e) => e.gChargeGHz);
  return { layout, ctx, n, ecGHz, ej1GHz, ej2GHz, gChargeGHz, spread, spreads: qubitSpreads(layout, spread, options) };
}

/** The same chip with another resistance spread for every qubit (a row of --sweep-spread). */
export function withResistanceSpread(chip: NominalChip, rn: number): NominalChip {
  const spread = { ...chip.spread, rn };
  return { ...chip, spread, spreads: qubitSpreads(chip.layout, spread, { ignoreMeasuredRn: true }) };
}
