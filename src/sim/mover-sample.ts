/**
 * The transmons of a moving-basis model at one point: the mover (transmon 0) in its K_0 lowest
 * eigenstates at E_J = u, with its wave-function derivative T_mm' = <m|d/du m'> (the squeezing
 * term; levels and derivatives by src/transmon/level-derivatives.ts), and the static transmons
 * at their fluxes. Shared by the plain moving-basis model (./moving-basis.ts) and the manifold
 * frame (./manifold-frame.ts), so both see the same numbers.
 */
import { josephsonEnergy } from '../transmon/josephson.js';
import { transmonLevelDerivatives } from '../transmon/level-derivatives.js';
import { transmonLevels } from '../transmon/levels.js';
import { chargeMatrix } from '../transmon/matrix-elements.js';
import type { TransmonPart } from '../pair/product-basis.js';
import type { SimModel } from './model.js';

/** The mover's levels (GHz), charge matrix and T (K_0 x K_0, per GHz of E_J) at one E_J. */
export interface MoverSample {
  energies: Float64Array;
  charge: Float64Array;
  tm: Float64Array;
}

export function moverSample(ecGHz: number, u: number, k0: number, nCut: number): MoverSample {
  const lv = transmonLevels(ecGHz, u, { levels: k0, chargeCutoff: nCut, vectors: true });
  const der = transmonLevelDerivatives(ecGHz, u, lv);
  const dim = 2 * nCut + 1;
  const tm = new Float64Array(k0 * k0);
  for (let m = 0; m < k0; m++)
    for (let q = 0; q < k0; q++) {
      let acc = 0;
      for (let j = 0; j < dim; j++) acc += lv.vectors[m * dim + j] * der.vectors[q * dim + j];
      tm[m * k0 + q] = acc;
    }
  return { energies: lv.energies, charge: chargeMatrix(lv), tm };
}

/**
 * moverSample, kept: the frames of one gate's budget (the pair alone and each spectator's
 * three-transmon model, or the nominal and the partner-offset frames) sample the mover at the
 * same Chebyshev points of the same E_J range, so its levels there are computed once and kept
 * (deterministic, never modified by the callers, so a kept sample gives the same numbers as a
 * new one). A small first-in first-out store: the points of a few frames' ranges.
 */
export function keptMoverSample(ecGHz: number, u: number, k0: number, nCut: number): MoverSample {
  const key = `${ecGHz} ${u} ${k0} ${nCut}`;
  const kept = KEPT.get(key);
  if (kept) return kept;
  const out = moverSample(ecGHz, u, k0, nCut);
  if (KEPT.size >= KEPT_MAX) KEPT.delete(KEPT.keys().next().value as string);
  KEPT.set(key, out);
  return out;
}

const KEPT = new Map<string, MoverSample>();
const KEPT_MAX = 512;

/**
 * Every transmon's part of the product Hamiltonian with the static ones at their fluxes; the
 * mover's (index 0) is a zero placeholder that the caller replaces per point.
 */
export function staticTransmonParts(model: SimModel, nCut: number): TransmonPart[] {
  return model.transmons.map((t, i) => {
    if (i === 0) return { energies: new Float64Array(t.levels), charge: new Float64Array(t.levels * t.levels) };
    const lv = transmonLevels(t.ecGHz, josephsonEnergy(t.ejsGHz, t.asymmetry, t.flux), { levels: t.levels, chargeCutoff: nCut, vectors: true });
    return { energies: lv.energies, charge: chargeMatrix(lv) };
  });
}
