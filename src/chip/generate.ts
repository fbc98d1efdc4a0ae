/**
 * Synthetic chips for benchmarks and yield studies: a square or heavy-hex lattice with a seeded
 * spread of parameters, as a layout document (the YAML text comes from src/layout/write.ts).
 *
 * The defaults make chips whose nominal plan holds every default rule, the error ceilings
 * (gate-error 1 %, idle-error 2 % per cycle) included: measured without pulse design on square
 * 5 x 5 (seeds 1-6), 7 x 7 (seed 1), 10 x 10 (seeds 1-5), 16 x 16 (seed 1; seed 2 breaks
 * idle-error on one qubit, 0.021) and heavy-hex 2 x 2, 3 x 3 (seeds 1-2) and 6 x 6 cells (seed 1),
 * and with pulse design on the 5 x 5 and 10 x 10 of seed 1 (README "fluxlane generate";
 * test/chip/generate-plan.test.ts, test/cli/generate.test.ts).
 * Why the earlier defaults broke the ceilings (open issue 13, item 6; README "fluxlane generate"):
 * a mover's four low-group neighbours lie within ~135 MHz, so every CZ moves some of them out of
 * the way (or parks its partner far below its sweet spot), and the moved spectators, the mover far
 * down its flux curve (flux ~0.3, |df/dPhi| ~10 GHz/Phi0) and the partners parked off their sweet
 * spots paid quasi-static 1/f dephasing proportional to the noise amplitude squared; spectators
 * whose own defect lay in the way, or whose gate was too slow to afford the two extra ramps within
 * maxGate (g of 5-6 MHz), could not be moved at all. The parameters below are the ones a designer
 * of such a chip would draw:
 * - maximum frequencies in `groups` frequency groups (default 2) by a proper colouring of the
 *   coupling graph (./colouring.ts: on the bipartite square and heavy-hex lattices two groups are
 *   the two sides), so coupled neighbours are 1.3-1.7 GHz apart and their static ZZ stays small
 *   for every g of the range. The group bands lie inside fMaxRangeGHz (4.9-6.6 GHz), the first
 *   group at its top;
 * - inside a group, qubits that share a neighbour (next-nearest neighbours) get different levels
 *   (a DSATUR colouring, ./colouring.ts), levelStepGHz apart: they stay clear of each other at
 *   idle, and a CZ's mover, sweeping to its partner's crossing, meets the partner's fellow
 *   next-nearest neighbours only where spectator moves (README "The planner") can clear them,
 *   since the level span stays below |alpha| minus the spectator detuning;
 * - each qubit scattered uniformly by +-groupJitterGHz and by a normal scatter of fabSigmaGHz;
 * - a parking window [f_max - parkingWindowGHz, f_max] on every qubit (50 MHz): the frequency plan
 *   parks each qubit at or just below its upper sweet spot, first-order insensitive to flux noise
 *   (common practice for fixed-coupling chips of flux-tunable transmons); without it the parking
 *   search moved low-group qubits 0.5-0.7 GHz down to clear their neighbours' spectators and their
 *   idle dephasing broke the ceiling;
 * - anharmonicity -E_C with E_C uniform in ecRangeGHz (0.20-0.24 GHz: one design value with a few
 *   per cent of spread, common practice; alpha ~ -E_C in the transmon regime, Koch et al., Phys.
 *   Rev. A 76, 042319 (2007)); the transmon stage solves the exact E_C;
 * - SQUID asymmetry uniform in asymmetryRange (so f_min lies well below f_max);
 * - T1 log-uniform in t1RangeUs (60-250 us: median T1 of recent multi-qubit transmon processors
 *   lie at roughly 60-300 us, from memory); 1/f flux-noise amplitude at 1 Hz uniform in
 *   fluxNoiseRangeUPhi0 (1-3 uPhi0/sqrt(Hz), reported for the small SQUID loops of recent
 *   tunable transmons, from memory); a white T_phi in tphiRangeUs (100-400 us, from memory: at
 *   the sweet spot echo-limited pure dephasing of such devices is of order T1 or longer) for a
 *   fraction of the qubits. (The demo layouts, an invented scenario of mixed quality, use T1
 *   22-146 us and 2-5 uPhi0/sqrt(Hz).)
 * - couplings g uniform in gRangeMHz (7-9 MHz: a CZ at the 11-20 crossing takes about
 *   1 / (2 sqrt(2) g) = 39-51 ns plus ramps, which leaves room for spectator moves within maxGate
 *   (100 ns; at 5-6 MHz it did not); residual ZZ of tens of kHz across the groups, small enough
 *   over the cycles of a 16 x 16 chip (at up to 10 MHz it broke the idle ceiling there));
 *   readout resonators on a 70 MHz comb above readoutBaseGHz;
 * - a two-level defect 0.6-1.5 GHz below f_max (tlsBelowMaxGHz) on a fraction of the qubits, of
 *   half-width tlsWidthRangeMHz (coupling width / 2, weak enough that a CZ sweep passes it): below
 *   the band the CZs and spectator moves use near the sweet spot (a moved spectator does not cross
 *   its own defect), so a nominal chip is not a defect case; measured defects go in a bring-up
 *   layout.
 *
 * All random draws come from one seeded stream in a fixed order, so the same options give the
 * same bytes.
 */

import { Random } from '../util/random.js';
import type { LayoutDocument, QubitDocument } from '../layout/write.js';
import { adjacencyLists, frequencyGroups, levelsInGroups } from './colouring.js';
import { lattice, type LatticeKind } from './lattice.js';

export interface GenerateOptions {
  kind: LatticeKind;
  /** square: qubit rows; heavy-hex: rows of hexagonal cells. */
  rows: number;
  /** square: qubit columns; heavy-hex: columns of hexagonal cells. */
  cols: number;
  seed: number;
  /** Chip name; default `<kind>-<rows>x<cols>-seed<seed>`. */
  name?: string;
  groups: number;
  fMaxRangeGHz: [number, number];
  /** Detuning between the levels of next-nearest neighbours inside a group. */
  levelStepGHz: number;
  groupJitterGHz: number;
  fabSigmaGHz: number;
  ecRangeGHz: [number, number];
  asymmetryRange: [number, number];
  t1RangeUs: [number, number];
  fluxNoiseRangeUPhi0: [number, number];
  tphiFraction: number;
  tphiRangeUs: [number, number];
  gRangeMHz: [number, number];
  readoutBaseGHz: number;
  tlsFraction: number;
  tlsWidthRangeMHz: [number, number];
  /** How far below f_max a listed defect lies (GHz). */
  tlsBelowMaxGHz: [number, number];
  /** Each qubit's parking window [f_max - w, f_max]; 0 for none. */
  parkingWindowGHz: number;
  /** Text after `fluxlane generate` for the header comment, e.g. `square --rows 7 --cols 7 --seed 1`. */
  commandLine?: string;
}

export const GENERATE_DEFAULTS: Readonly<Omit<GenerateOptions, 'kind' | 'rows' | 'cols'>> = Object.freeze({
  seed: 1,
  groups: 2,
  fMaxRangeGHz: [4.9, 6.6] as [number, number],
  levelStepGHz: 0.045,
  groupJitterGHz: 0.005,
  fabSigmaGHz: 0.003,
  ecRangeGHz: [0.2, 0.24] as [number, number],
  asymmetryRange: [0.2, 0.5] as [number, number],
  t1RangeUs: [60, 250] as [number, number],
  fluxNoiseRangeUPhi0: [1, 3] as [number, number],
  tphiFraction: 0.5,
  tphiRangeUs: [100, 400] as [number, number],
  gRangeMHz: [7, 9] as [number, number],
  readoutBaseGHz: 7.1,
  tlsFraction: 0.15,
  tlsWidthRangeMHz: [0.5, 2] as [number, number],
  tlsBelowMaxGHz: [0.6, 1.5] as [number, number],
  parkingWindowGHz: 0.05,
});

/** Hard bounds on the size of a synthetic chip. */
export const GENERATE_LIMITS = Object.freeze({ maxSide: 500, maxCells: 20_000 });

const ghz = (x: number) => `${x.toFixed(3)} GHz`;
const mhz = (x: number, digits = 0) => `${(x * 1000).toFixed(digits)} MHz`;

export function generateLayout(options: Partial<GenerateOptions> & Pick<GenerateOptions, 'kind' | 'rows' | 'cols'>): LayoutDocument {
  const o: GenerateOptions = { ...GENERATE_DEFAULTS, ...options };
  const { sites, edges } = lattice(o.kind, o.rows, o.cols);
  const adjacency = adjacencyLists(sites.length, edges);
  const groups = frequencyGroups(adjacency, o.groups);
  const levels = levelsInGroups(adjacency, groups);
  const rng = new Random(o.seed);
  const [fLo, fHi] = o.fMaxRangeGHz;
  // Each group's band: its levels plus room for the scatter; bands spread evenly over the range, the first at its top.
  const scatter = o.groupJitterGHz + 3 * o.fabSigmaGHz;
  const levelCount = levels.reduce((m, l) => Math.max(m, l + 1), 1);
  const bandGHz = (levelCount - 1) * o.levelStepGHz + 2 * scatter;
  const top = (g: number) => (o.groups === 1 ? fHi : fHi - ((fHi - fLo - bandGHz) * g) / (o.groups - 1));

  const qubits: [string, QubitDocument][] = sites.map((site, i) => {
    const fMax = clamp(
      top(groups[i]) - scatter - levels[i] * o.levelStepGHz + rng.between(-o.groupJitterGHz, o.groupJitterGHz) + o.fabSigmaGHz * rng.normal(),
      o.fMaxRangeGHz,
    );
    const ec = rng.between(o.ecRangeGHz[0], o.ecRangeGHz[1]);
    const asymmetry = rng.between(o.asymmetryRange[0], o.asymmetryRange[1]);
    const t1 = Math.exp(rng.between(Math.log(o.t1RangeUs[0]), Math.log(o.t1RangeUs[1])));
    const fluxNoise = rng.between(o.fluxNoiseRangeUPhi0[0], o.fluxNoiseRangeUPhi0[1]);
    const withTphi = rng.uniform() < o.tphiFraction;
    const tphi = rng.between(o.tphiRangeUs[0], o.tphiRangeUs[1]);
    const readout = o.readoutBaseGHz + 0.07 * (i % 8) + rng.between(-0.01, 0.01);
    const withTls = rng.uniform() < o.tlsFraction;
    const tlsAt = fMax - rng.between(o.tlsBelowMaxGHz[0], o.tlsBelowMaxGHz[1]);
    const tlsWidth = rng.between(o.tlsWidthRangeMHz[0] / 1000, o.tlsWidthRangeMHz[1] / 1000);

    const q: QubitDocument = {
      pos: site.pos,
      fMax: ghz(fMax),
      anharmonicity: `-${mhz(ec)}`,
      asymmetry: Number(asymmetry.toFixed(2)),
      t1: `${Math.round(t1)} us`,
      fluxNoise: `${fluxNoise.toFixed(1)} uPhi0/sqrt(Hz)`,
      readout: ghz(readout),
    };
    if (o.parkingWindowGHz > 0) q.window = [ghz(fMax - o.parkingWindowGHz), ghz(fMax)];
    if (withTphi) q.tphi = `${Math.round(tphi)} us`;
    if (withTls) q.tls = [{ at: ghz(tlsAt), width: mhz(tlsWidth, 2) }];
    return [site.id, q];
  });

  const couplings = edges.map(([a, b]): [string, string, string] => [
    sites[a].id,
    sites[b].id,
    mhz(rng.between(o.gRangeMHz[0] / 1000, o.gRangeMHz[1] / 1000), 1),
  ]);

  const name = o.name ?? `${o.kind}-${o.rows}x${o.cols}-seed${o.seed}`;
  const header = [
    `Synthetic ${o.kind} chip made by fluxlane generate${o.commandLine ? ` ${o.commandLine}` : ''}.`,
    `${sites.length} qubits in ${o.groups} frequency groups, ${edges.length} couplings; parameters drawn from seed ${o.seed}.`,
  ];
  return {
    header,
    chip: name,
    description: `Synthetic ${o.kind} lattice, ${o.rows} x ${o.cols}${o.kind === 'heavy-hex' ? ' cells' : ''}, seed ${o.seed}.`,
    qubits,
    couplings,
  };
}

function clamp(x: number, [lo, hi]: [number, number]): number {
  return Math.min(hi, Math.max(lo, x));
}
