/**
 * Dressed eigenstates of every kept frame state at one value of the mover's E_J (the
 * computational and leakage states at parking, README physics conventions secs. 2-3): eigenvectors of the
 * frame's manifold blocks of E(u), labelled inside each block by matching the energy order to
 * the order of the bare product energies (levels keep their order as the coupling is switched
 * on; src/pair/dressed-spectrum.ts uses the same rule), with the component on their own bare
 * state positive.
 */
import { symmetricEigen } from '../linalg/symmetric-eigen.js';
import { transmonLevels } from '../transmon/levels.js';
import { josephsonEnergy } from '../transmon/josephson.js';
import { DEFAULT_CHARGE_CUTOFF } from './model.js';
import { evaluateFrame, type ManifoldFrame } from './manifold-frame.js';

/** A dressed state at parking in frame coordinates. */
export interface DressedState {
  label: number[];
  sector: number;
  /** Real amplitudes in the sector's frame basis. */
  vector: Float64Array;
  /** Dressed energy (GHz, absolute). */
  energy: number;
}

/** Dressed eigenstates of every kept frame state at E_J = u (one per label). */
export function dressedStatesAt(frame: ManifoldFrame, u: number): DressedState[] {
  const out: DressedState[] = [];
  const model = frame.model;
  const nCut = model.chargeCutoff ?? DEFAULT_CHARGE_CUTOFF;
  const bareLevels = model.transmons.map((t, i) =>
    transmonLevels(t.ecGHz, i === 0 ? u : josephsonEnergy(t.ejsGHz, t.asymmetry, t.flux), { levels: t.levels, chargeCutoff: nCut }).energies,
  );
  const bare = (label: number[]): number => label.reduce((acc, m, i) => acc + bareLevels[i][m], 0);
  frame.sectors.forEach((sector, s) => {
    const d = sector.size;
    const e = new Float64Array(d * d);
    const a = new Float64Array(d * d);
    evaluateFrame(frame, sector, u, e, a);
    for (const blk of sector.blocks) {
      const m = blk.size;
      const sub = new Float64Array(m * m);
      for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) sub[i * m + j] = e[(blk.start + i) * d + blk.start + j];
      const ev = symmetricEigen(sub, m);
      const order = Array.from({ length: m }, (_, i) => i).sort((x, y) => bare(sector.labels[blk.start + x]) - bare(sector.labels[blk.start + y]) || x - y);
      order.forEach((local, rank) => {
        const vector = new Float64Array(d);
        const sign = ev.vectors[local * m + rank] < 0 ? -1 : 1;
        for (let j = 0; j < m; j++) vector[blk.start + j] = sign * ev.vectors[j * m + rank];
        out.push({ label: sector.labels[blk.start + local], sector: s, vector, energy: ev.values[rank] });
      });
    }
  });
  return out;
}
