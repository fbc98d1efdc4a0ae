/**
 * One chip drawn from the fabrication spread (src/yield/spread.ts): sample `index` of a run with
 * seed `seed` uses the stream Random.forStream(seed, index) (src/util/random.ts) and nothing
 * else, so any thread count and any slicing of the run draw the same chips. Draw order: for each
 * qubit in layout order z_J1, z_J2, z_C, then for each coupling in layout order z_g (standard
 * normal deviates, redrawn outside |z| <= 6, which changes nothing at the spreads allowed).
 *
 *     E_J,k = E_J,k0 / (1 + s_rn z_Jk)      (Ambegaokar-Baratoff: E_J ~ 1 / R_n)
 *     E_C   = E_C0 / (1 + s_ec z_C)         (E_C = e^2 / 2C)
 *     E_JS  = E_J,1 + E_J,2,  d = |E_J,1 - E_J,2| / E_JS
 *     G     = G0 (1 + s_g z_g) (E_C,A / E_C,A0) (E_C,B / E_C,B0)
 */
import { Random } from '../util/random.js';
import type { NominalChip } from './chip-model.js';

export interface DrawnChip {
  index: number;
  ecGHz: Float64Array;
  ejsGHz: Float64Array;
  asymmetry: Float64Array;
  gChargeGHz: Float64Array;
}

/** Deviates per qubit and per coupling. */
export const DRAWS_PER_QUBIT = 3;
export const DRAWS_PER_COUPLING = 1;
const Z_LIMIT = 6;

/** The standard normal deviates of sample `index` (qubits first, then couplings). */
export function sampleDeviates(seed: number, index: number, qubits: number, couplings: number): Float64Array {
  const rng = Random.forStream(seed, index);
  const z = new Float64Array(DRAWS_PER_QUBIT * qubits + DRAWS_PER_COUPLING * couplings);
  for (let k = 0; k < z.length; k++) {
    let x = rng.normal();
    while (!(Math.abs(x) <= Z_LIMIT)) x = rng.normal();
    z[k] = x;
  }
  return z;
}

/** The chip of sample `index` from its deviates. */
export function chipFromDeviates(chip: NominalChip, index: number, z: Float64Array): DrawnChip {
  const n = chip.n;
  const { rn, ec } = chip.spreads;
  const ecGHz = new Float64Array(n);
  const ejsGHz = new Float64Array(n);
  const asymmetry = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const j1 = chip.ej1GHz[i] / (1 + rn[i] * z[3 * i]);
    const j2 = chip.ej2GHz[i] / (1 + rn[i] * z[3 * i + 1]);
    ecGHz[i] = chip.ecGHz[i] / (1 + ec[i] * z[3 * i + 2]);
    ejsGHz[i] = j1 + j2;
    asymmetry[i] = Math.abs(j1 - j2) / (j1 + j2);
  }
  const edges = chip.ctx.edges;
  const gChargeGHz = new Float64Array(edges.length);
  const sg = chip.spread.g;
  for (const e of edges) {
    const zg = z[DRAWS_PER_QUBIT * n + e.index];
    gChargeGHz[e.index] = chip.gChargeGHz[e.index] * (1 + sg * zg) * (ecGHz[e.a] / chip.ecGHz[e.a]) * (ecGHz[e.b] / chip.ecGHz[e.b]);
  }
  return { index, ecGHz, ejsGHz, asymmetry, gChargeGHz };
}

export function drawChip(chip: NominalChip, seed: number, index: number): DrawnChip {
  return chipFromDeviates(chip, index, sampleDeviates(seed, index, chip.n, chip.ctx.edges.length));
}
