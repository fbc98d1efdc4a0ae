/**
 * A ramp family: the mover's flux from the parking point to the CZ destination over the ramp
 * time (the return is the time reverse). Families differ in the control variable they shape and
 * the physics they respect; each names its published source.
 */
import type { EdgeContext } from '../context.js';
import type { TwoLevelTable } from '../two-level-table.js';

export interface RampInput {
  ctx: EdgeContext;
  table: TwoLevelTable;
  parkFlux: number;
  destFlux: number;
  rampNs: number;
}

/** flux(t) for 0 <= t <= rampNs with flux(0) = parkFlux and flux(rampNs) = destFlux exactly. */
export type Ramp = (tNs: number) => number;

export interface RampFamily {
  /** Name used on the command line and in outputs. */
  name: string;
  /** One line for --help and reports. */
  summary: string;
  /** Published source of the method. */
  source: string;
  /** Build the ramp; throws RampInfeasible when the family cannot reach the destination in time. */
  ramp(input: RampInput): Ramp;
}

export class RampInfeasible extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'RampInfeasible';
  }
}

/** A table-backed ramp: values at n + 1 equally spaced times, linear in between (n large). */
export function tabulatedRamp(rampNs: number, values: Float64Array): Ramp {
  const n = values.length - 1;
  return (t: number): number => {
    if (t <= 0) return values[0];
    if (t >= rampNs) return values[n];
    const x = (t / rampNs) * n;
    const i = Math.min(n - 1, Math.floor(x));
    const f = x - i;
    return values[i] + f * (values[i + 1] - values[i]);
  };
}
