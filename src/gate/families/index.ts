/** The ramp families, by name. */
import { erfFamily } from './erf.js';
import { fastAdiabaticFamily } from './fast-adiabatic.js';
import { faquadFamily } from './faquad.js';
import { linearFamily } from './linear.js';
import { squeezingAwareFamily } from './squeezing-aware.js';
import type { RampFamily } from './family.js';

export const RAMP_FAMILIES: readonly RampFamily[] = [faquadFamily, fastAdiabaticFamily, squeezingAwareFamily, erfFamily, linearFamily];

export function rampFamily(name: string): RampFamily | undefined {
  return RAMP_FAMILIES.find((f) => f.name === name);
}

export { RampInfeasible, type Ramp, type RampFamily, type RampInput } from './family.js';
