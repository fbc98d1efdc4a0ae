/**
 * One edge as a plan.json read back describes it (src/plan/plan-read.ts), in internal units, for
 * the per-edge commands' `--plan` (gate, simulate, pair): the mover and partner, the crossing,
 * both qubits' parking fluxes, every other qubit's flux during the gate (a spectator the plan
 * moves sits at its temporary point, the others at parking), and the designed gate's family, ramp,
 * target phase and waveform file when it has one. A flux missing from the file is recomputed from
 * its frequency on the layout's transmon (the branch 0 <= Phi <= 1/2).
 */
import type { ChipLayout } from '../layout/types.js';
import { Transmon } from '../transmon/transmon.js';
import { InputError } from '../util/errors.js';
import type { PlanDocumentEdge as PlanEdgeInput, PlanDocument as PlanInput } from './plan-read.js';

export interface EdgeFromPlan {
  mover: string;
  partner: string;
  crossing: '11-20' | '11-02';
  /** Parking flux of every qubit (Phi0). */
  parkingFlux: Map<string, number>;
  /** Flux of every qubit during this edge's gate: the plan's temporary point for a moved spectator, else parking. */
  duringGateFlux: Map<string, number>;
  /** Spectators the plan moves for this gate. */
  moved: string[];
  /** The plan's ramp (ns): the spectators' move time. */
  planRampNs: number;
  design: null | { family?: string; rampNs?: number; targetPhase?: number; waveform?: string; feasible?: boolean; noiseMethod?: 'lindblad' | 'estimate' };
  entry: PlanEdgeInput;
}

/** The plan's entry for the edge a-b (either order); throws an InputError naming the plan when it has none. */
export function edgeFromPlan(plan: PlanInput, planFile: string, layout: ChipLayout, a: string, b: string): EdgeFromPlan {
  const entry = plan.edges.find((e) => (e.qubits[0] === a && e.qubits[1] === b) || (e.qubits[0] === b && e.qubits[1] === a));
  if (!entry) throw new InputError({ file: planFile, message: `expected an entry for the edge ${a}-${b} in the plan, found none` });
  const byId = new Map(layout.qubits.map((q) => [q.id, q]));
  const transmons = new Map<string, Transmon>();
  const transmon = (id: string): Transmon => {
    let t = transmons.get(id);
    if (!t) transmons.set(id, (t = Transmon.fromLayout(byId.get(id)!)));
    return t;
  };
  const fluxOf = (id: string, fHz: number, given: number | undefined, what: string): number => {
    if (given !== undefined) return given;
    return transmon(id).fluxForF01(fHz * 1e-9, { file: planFile, path: what });
  };
  const parkingFlux = new Map<string, number>();
  for (const [id, q] of Object.entries(plan.qubits)) {
    if (!byId.has(id)) continue;
    parkingFlux.set(id, fluxOf(id, q.parkingFrequency, q.parkingFlux, `qubits.${id}.parkingFrequency`));
  }
  const duringGateFlux = new Map(parkingFlux);
  const moved = Object.keys(entry.spectatorParking);
  for (const s of moved) {
    const k = plan.edges.indexOf(entry);
    duringGateFlux.set(s, fluxOf(s, entry.spectatorParking[s], entry.spectatorParkingFlux?.[s], `edges[${k}].spectatorParking.${s}`));
  }
  const g = entry.gate ?? null;
  const design = g
    ? {
        family: g.family,
        rampNs: g.rampTime != null ? g.rampTime * 1e9 : undefined,
        targetPhase: g.targetPhase ?? undefined,
        waveform: g.waveform,
        feasible: g.feasible,
        noiseMethod: g.fidelityNoisyMethod ?? undefined,
      }
    : null;
  const partner = entry.qubits[0] === entry.mover ? entry.qubits[1] : entry.qubits[0];
  return { mover: entry.mover, partner, crossing: entry.crossing, parkingFlux, duringGateFlux, moved, planRampNs: entry.rampTime * 1e9, design, entry };
}
