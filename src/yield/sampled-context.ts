/**
 * The planner's context (src/plan/context.ts) for a drawn chip, built in microseconds: the
 * nominal chip's structure (graph, neighbours, next-nearest pairs, windows, defects, readout,
 * rules) with the drawn transmons, their spectra from the reduced table
 * (./sampled-spectrum.ts), the drawn charge couplings, planning ranges and domains. The rule
 * evaluations of the planner (src/plan/rules/*.ts, src/plan/layers.ts) run on it unchanged.
 * Exact coupled pairs (CoupledPair, for the exact static ZZ) are built on first use.
 *
 * `sampledLayout` writes the same chip as a ChipLayout (ec + ejMax + asymmetry per qubit, g at
 * the upper sweet spots from the drawn G and the exact charge matrix elements), the input of the
 * exact reference (fluxlane verify's evaluation, src/plan/verify.ts) and of re-planning.
 */
import type { ChipLayout, CouplingLayout, QubitLayout } from '../layout/types.js';
import type { PlanContext, PlanEdge } from '../plan/context.js';
import { QUBIT_TABLE_DEFAULTS, QubitTable, type SpectrumTable } from '../plan/qubit-table.js';
import { CoupledPair } from '../pair/pair.js';
import { chargeCutoffFor } from '../transmon/charge-cutoff.js';
import { parityEigenbasis } from '../transmon/parity-eigenbasis.js';
import type { ReducedSpectrum } from '../transmon/reduced-spectrum.js';
import { Transmon, type SweetSpotLevels } from '../transmon/transmon.js';
import type { NominalChip } from './chip-model.js';
import type { DrawnChip } from './draw.js';
import { SampledSpectrum } from './sampled-spectrum.js';
import { TabulatedTransmon, TabulatedWork } from './tabulated-transmon.js';

/** f01, f12 and alpha at the two sweet spots from the reduced table (an exact solve below its range). */
export function sweetSpotLevels(table: ReducedSpectrum, ecGHz: number, ejsGHz: number, d: number): SweetSpotLevels {
  const rTop = ejsGHz / ecGHz;
  const rBottom = d * rTop;
  const levels = (r: number): [number, number] => {
    if (table.covers(r)) {
      const s = table.at(r);
      return [ecGHz * s.e1, ecGHz * (s.e2 - s.e1)];
    }
    const e = parityEigenbasis(ecGHz, r * ecGHz, 3, chargeCutoffFor(rTop), false).energies;
    return [e[1] - e[0], e[2] - e[1]];
  };
  const [fMax, f12Max] = levels(rTop);
  const [fMin, f12Min] = levels(rBottom);
  return { fMaxGHz: fMax, f12MaxGHz: f12Max, anharmonicityMaxGHz: f12Max - fMax, fMinGHz: fMin, f12MinGHz: f12Min };
}

/**
 * The drawn transmons: their tunable ranges, spectra, inverse maps and |<0|n|1>| from the reduced
 * table (./tabulated-transmon.ts; exact outside it), eigenbases exact.
 */
export function drawnTransmons(chip: NominalChip, drawn: DrawnChip, table: ReducedSpectrum, works?: TabulatedWork[]): Transmon[] {
  return chip.ctx.transmons.map((t, i) => {
    const work = works ? (works[i] ??= new TabulatedWork()) : undefined;
    const ec = drawn.ecGHz[i];
    const ejs = drawn.ejsGHz[i];
    const d = drawn.asymmetry[i];
    return new TabulatedTransmon(table, t.id, { ecGHz: ec, ejsGHz: ejs, asymmetry: d }, {
      coherenceSpec: t.coherenceSpec,
      source: t.source,
      range: sweetSpotLevels(table, ec, ejs, d),
    }, work);
  });
}

/**
 * The planner context of a drawn chip. `reuse` (one slot per qubit) keeps the spectrum objects
 * from one sample to the next; a context is then valid until the next call with the same `reuse`.
 */
export function sampledContext(chip: NominalChip, drawn: DrawnChip, table: ReducedSpectrum, reuse?: (SampledSpectrum | undefined)[]): PlanContext {
  const nominal = chip.ctx;
  const transmons = drawnTransmons(chip, drawn, table, reuse ? worksFor(reuse) : undefined);
  // (an exact QubitTable for a transmon the reduced table does not cover: only extreme draws)
  const tables: SpectrumTable[] = transmons.map((t, i) => {
    if (!coversPlanningRange(table, t)) return new QubitTable(t);
    const noise = t.coherenceSpec?.fluxNoisePhi0;
    const old = reuse?.[i];
    const s = old ? old.reset(t.ecGHz, t.ejsGHz, t.asymmetry, noise) : new SampledSpectrum(table, t.ecGHz, t.ejsGHz, t.asymmetry, noise);
    if (reuse) reuse[i] = s;
    return s;
  });
  const edges: PlanEdge[] = nominal.edges.map((e) => ({ ...e, gChargeGHz: drawn.gChargeGHz[e.index] }));
  const ranges = tables.map((t, i) => ({ lo: t.fLowGHz, hi: Math.min(t.fMaxGHz, transmons[i].fMaxGHz) }));
  const domains = nominal.qubits.map((q, i) => {
    const r = ranges[i];
    const lo = Math.max(r.lo, q.windowGHz ? q.windowGHz[0] : -Infinity);
    const hi = Math.min(r.hi, q.windowGHz ? q.windowGHz[1] : Infinity);
    return lo <= hi ? { lo, hi } : null;
  });
  const pairs = new Map<number, CoupledPair>();
  return {
    ...nominal,
    transmons,
    tables,
    edges,
    ranges,
    domains,
    pair(edge: number): CoupledPair {
      let p = pairs.get(edge);
      if (!p) {
        const e = edges[edge];
        p = new CoupledPair(transmons[e.a], transmons[e.b], exchangeAtTop(transmons[e.a], transmons[e.b], e.gChargeGHz));
        pairs.set(edge, p);
      }
      return p;
    },
  };
}

/** The transmons' scratch kept beside a `reuse` array of spectrum objects (one per qubit). */
const works = new WeakMap<object, TabulatedWork[]>();

function worksFor(reuse: object): TabulatedWork[] {
  let w = works.get(reuse);
  if (!w) works.set(reuse, (w = []));
  return w;
}

function coversPlanningRange(table: ReducedSpectrum, t: Transmon): boolean {
  const rTop = t.ejsGHz / t.ecGHz;
  const rLow = Math.min(1, Math.max(t.asymmetry, QUBIT_TABLE_DEFAULTS.minEjOverEc / rTop)) * rTop;
  return table.covers(rTop) && table.covers(rLow);
}

/** The layout's g (both transmons at Phi = 0) for charge coupling G: G |n01_A(0)| |n01_B(0)|, exact. */
export function exchangeAtTop(a: Transmon, b: Transmon, gChargeGHz: number): number {
  return gChargeGHz * a.chargeElement01(0) * b.chargeElement01(0);
}

/** The drawn chip as a layout (for the exact reference and for re-planning). */
export function sampledLayout(chip: NominalChip, drawn: DrawnChip, transmons?: readonly Transmon[]): ChipLayout {
  const layout = chip.layout;
  const qubits: QubitLayout[] = layout.qubits.map((q, i) => ({
    ...q,
    transmon: { kind: 'energies', ecGHz: drawn.ecGHz[i], ejMaxGHz: drawn.ejsGHz[i], asymmetry: drawn.asymmetry[i] },
  }));
  const ts = transmons ?? chip.ctx.transmons.map((t, i) => new Transmon(t.id, { ecGHz: drawn.ecGHz[i], ejsGHz: drawn.ejsGHz[i], asymmetry: drawn.asymmetry[i] }));
  const couplings: CouplingLayout[] = layout.couplings.map((c, k) => {
    const e = chip.ctx.edges[k];
    return { ...c, gGHz: exchangeAtTop(ts[e.a], ts[e.b], drawn.gChargeGHz[k]) };
  });
  return { ...layout, qubits, couplings };
}
