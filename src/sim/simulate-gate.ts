/**
 * Simulate one two-qubit gate trajectory: the coherent propagator's computational block and its
 * metrics (README physics conventions sec. 3), and with noise the Lindblad channel's average gate
 * fidelity and the first-order (weak-noise) estimate (src/sim/decoherence.ts).
 *
 * The trajectory starts and ends at the parking point (its first sample). Computational states
 * are the dressed |00>, |01>, |10>, |11> at parking (order |AB>, A the mover), with spectators
 * (transmons 2, 3, ...) in `spectatorLevels` (default ground).
 */
import { josephsonEnergy } from '../transmon/josephson.js';
import { averageFromProcessInfidelity, jumpRates } from './decoherence.js';
import { dressedStatesAt, type DressedState } from './dressed-states.js';
import { conditionalPhase, gateMetrics, wrapAngle, type Block4 } from './gate-metrics.js';
import { evaluateNoiseTable, frameState, noiseHermite, type ManifoldFrame } from './manifold-frame.js';
import { propagateInFrame, SectorStepper, stepSchedule, type FrameInitial, type FramePropagationOptions } from './propagate-frame.js';
import type { Trajectory } from './trajectory.js';

export interface GateSimulationOptions extends FramePropagationOptions {
  /** Target conditional phase theta (CPhase(theta)); pi is CZ. */
  targetPhase?: number;
  /** Levels of the spectators (transmons 2, 3, ...) in the computational block. */
  spectatorLevels?: number[];
  /** Also integrate the Lindblad equation (needs a frame built with noiseOperators). */
  lindblad?: boolean;
  /** Step of the Lindblad integration (ns). */
  noiseStepNs?: number;
  /** Frame states with at most this many excitations carry the Lindblad dynamics. */
  noiseExcitations?: number;
  /** Hold sub-step for the first-order estimate (ns). */
  estimateStepNs?: number;
  /** Compute the first-order decoherence estimate (when the frame has noise data). */
  estimate?: boolean;
  /**
   * Dressed energies E_00, E_01, E_10 (GHz) that set the lab frame R(T) (README physics
   * conventions sec. 3); default those of this model at parking. A gate simulated with a flux
   * offset keeps the nominal frame: the lab does not recalibrate per shot.
   */
  labEnergies?: readonly [number, number, number];
}

export const GATE_SIMULATION_DEFAULTS = Object.freeze({
  targetPhase: Math.PI,
  lindblad: false,
  noiseStepNs: 0.2,
  noiseExcitations: Infinity,
  estimateStepNs: 0.25,
});

export interface NoisyMetrics {
  /** Average gate fidelity of the Lindblad channel (after its own optimal virtual-Z phases). */
  fidelity: number;
  virtualZ: { a: number; b: number };
  /** Population outside the computational states after the channel, averaged over the 4 inputs. */
  leakage: number;
}

export interface GateSimulation {
  /** 4 x 4 lab-frame block (order 00, 01, 10, 11). */
  m: Block4;
  conditionalPhase: number;
  leakage: number;
  fidelity: number;
  virtualZ: { a: number; b: number };
  /** Final populations of the dressed 20 and 02 from 11. */
  populations: { '20': number; '02': number };
  /** Dressed energies at parking (GHz). */
  energies: Record<'00' | '01' | '10' | '11' | '20' | '02', number>;
  /** First-order decoherence estimate of the average infidelity (0 without noise data). */
  decoherenceEstimate: number;
  /** Its split: relaxation (T1) and white dephasing. */
  decoherenceSplit: { t1: number; dephasing: number };
  /** Lindblad result (with lindblad: true). */
  noisy?: NoisyMetrics;
  steps: number;
}

const PAIR_LABELS = [
  [0, 0],
  [0, 1],
  [1, 0],
  [1, 1],
];

/** The dressed states 00, 01, 10, 11, 20, 02 at parking. */
export function computationalStates(frame: ManifoldFrame, parkFlux: number, spectatorLevels?: number[]): { comp: DressedState[]; leak20: DressedState; leak02: DressedState } {
  const model = frame.model;
  const mover = model.transmons[0];
  const spect = spectatorLevels ?? new Array(Math.max(0, model.transmons.length - 2)).fill(0);
  const dressed = dressedStatesAt(frame, josephsonEnergy(mover.ejsGHz, mover.asymmetry, parkFlux));
  const find = (ab: number[]): DressedState => {
    const label = [...ab, ...spect];
    frameState(frame, label);
    const st = dressed.find((x) => x.label.every((m, i) => m === label[i]));
    if (!st) throw new RangeError(`simulate: no dressed state ${label.join('')}`);
    return st;
  };
  return { comp: PAIR_LABELS.map(find), leak20: find([2, 0]), leak02: find([0, 2]) };
}

function hasNoise(frame: ManifoldFrame): boolean {
  return frame.noise !== undefined && frame.model.transmons.some((t) => t.noise !== undefined);
}

export function simulateGate(frame: ManifoldFrame, traj: Trajectory, options: GateSimulationOptions = {}): GateSimulation {
  const o = { ...GATE_SIMULATION_DEFAULTS, ...options };
  const { comp, leak20, leak02 } = computationalStates(frame, traj.flux[0], o.spectatorLevels);
  const initial: FrameInitial[] = comp.map((st) => ({ sector: st.sector, re: st.vector, im: new Float64Array(st.vector.length) }));
  const noise = hasNoise(frame) && o.estimate !== false;
  const propOptions = { ...o, maxHoldStepNs: noise ? o.estimateStepNs : Infinity };
  const estimate = noise ? new FirstOrderEstimate(frame, traj, stepSchedule(frame, traj, propOptions)) : undefined;
  const res = propagateInFrame(frame, traj, initial, propOptions, estimate?.observer);
  const T = traj.timeNs[traj.timeNs.length - 1] - traj.timeNs[0];
  const m = labFrameBlock(comp, res.re, res.im, T, o.labEnergies);
  const metrics = gateMetrics(m, o.targetPhase);
  const pop = (st: DressedState): number => {
    if (st.sector !== comp[3].sector) return 0;
    let xr = 0;
    let xi = 0;
    for (let k = 0; k < st.vector.length; k++) {
      xr += st.vector[k] * res.re[3][k];
      xi += st.vector[k] * res.im[3][k];
    }
    return xr * xr + xi * xi;
  };
  const out: GateSimulation = {
    m,
    conditionalPhase: metrics.conditionalPhase,
    leakage: metrics.leakage,
    fidelity: metrics.fidelity,
    virtualZ: metrics.virtualZ,
    populations: { '20': pop(leak20), '02': pop(leak02) },
    energies: { '00': comp[0].energy, '01': comp[1].energy, '10': comp[2].energy, '11': comp[3].energy, '20': leak20.energy, '02': leak02.energy },
    decoherenceEstimate: 0,
    decoherenceSplit: { t1: 0, dephasing: 0 },
    steps: res.steps,
  };
  if (estimate) {
    out.decoherenceSplit = estimate.split();
    out.decoherenceEstimate = out.decoherenceSplit.t1 + out.decoherenceSplit.dephasing;
  }
  if (o.lindblad) {
    if (!frame.noise) throw new RangeError('simulate: the frame has no noise operators (build it with noiseOperators: true)');
    out.noisy = lindbladChannel(frame, traj, comp, o, metrics.virtualZ);
  }
  return out;
}

/**
 * One coherent propagation for several sets of spectator levels: the computational blocks of the
 * same trajectory with the spectators (transmons 2, 3, ...) in each of `spectatorLevels` (e.g.
 * [[0], [1]]). Every parity sector's steps are prepared once and applied to all the columns, so
 * k sets cost about one simulation instead of k; each column sees the same steps as in its own
 * simulateGate call, so the blocks are the same numbers. The first set's lab frame is
 * `labEnergies` (default its own energies); every later set is taken in the first set's lab
 * frame (the lab calibrates with the spectators in the first set's levels). Coherent only.
 */
export function simulateSpectatorStates(
  frame: ManifoldFrame,
  traj: Trajectory,
  spectatorLevels: readonly number[][],
  options: FramePropagationOptions & { labEnergies?: readonly [number, number, number] } = {},
): { m: Block4; energies: readonly [number, number, number] }[] {
  const sets = spectatorLevels.map((levels) => computationalStates(frame, traj.flux[0], levels).comp);
  const initial: FrameInitial[] = sets.flatMap((comp) => comp.map((st) => ({ sector: st.sector, re: st.vector, im: new Float64Array(st.vector.length) })));
  const res = propagateInFrame(frame, traj, initial, { ...options, maxHoldStepNs: Infinity });
  const T = traj.timeNs[traj.timeNs.length - 1] - traj.timeNs[0];
  const first = sets[0];
  const lab = options.labEnergies ?? ([first[0].energy, first[1].energy, first[2].energy] as const);
  return sets.map((comp, k) => ({
    m: labFrameBlock(comp, res.re.slice(4 * k, 4 * k + 4), res.im.slice(4 * k, 4 * k + 4), T, k === 0 ? options.labEnergies : lab),
    energies: [comp[0].energy, comp[1].energy, comp[2].energy] as const,
  }));
}

/**
 * M = R(T) P^dag U P from the final frame columns of the four computational states; the frame's
 * energies are the states' own unless `labEnergies` (E_00, E_01, E_10) are given.
 */
export function labFrameBlock(comp: DressedState[], re: Float64Array[], im: Float64Array[], T: number, labEnergies?: readonly [number, number, number]): Block4 {
  const e00 = labEnergies ? labEnergies[0] : comp[0].energy;
  const e01 = labEnergies ? labEnergies[1] : comp[1].energy;
  const e10 = labEnergies ? labEnergies[2] : comp[2].energy;
  const mre = new Float64Array(16);
  const mim = new Float64Array(16);
  for (let r = 0; r < 4; r++) {
    const [i, j] = PAIR_LABELS[r];
    const ph = 2 * Math.PI * (e00 + i * (e10 - e00) + j * (e01 - e00)) * T;
    const c = Math.cos(ph);
    const s = Math.sin(ph);
    for (let col = 0; col < 4; col++) {
      if (comp[r].sector !== comp[col].sector) continue;
      let xr = 0;
      let xi = 0;
      const v = comp[r].vector;
      for (let k = 0; k < v.length; k++) {
        xr += v[k] * re[col][k];
        xi += v[k] * im[col][k];
      }
      mre[r * 4 + col] = c * xr - s * xi;
      mim[r * 4 + col] = s * xr + c * xi;
    }
  }
  return { re: mre, im: mim };
}

/**
 * Accumulates the first-order infidelity along the coherent propagation (trapezoid rule over the
 * schedule's step boundaries).
 */
class FirstOrderEstimate {
  private readonly times: number[] = [];
  /** per boundary b, per jump operator j: P = rate sum_k ||O psi_k||^2, Q = sqrt(rate) sum_k <psi_k|O|psi_k> */
  private readonly p: Float64Array[] = [];
  private readonly q: Float64Array[] = [];
  private readonly nOps: number;
  private readonly schedule: ReturnType<typeof stepSchedule>;
  readonly observer: (stepIndex: number, sector: number, re: Float64Array[], im: Float64Array[], columns: number[]) => void;

  /** `schedule` must be the one the propagation uses (same options). */
  constructor(frame: ManifoldFrame, traj: Trajectory, schedule: ReturnType<typeof stepSchedule>) {
    const model = frame.model;
    const noise = frame.noise!;
    this.schedule = schedule;
    this.nOps = 2 * model.transmons.length;
    const dt = noise.size;
    const mover = model.transmons[0];
    // Per sector and jump operator: the entries of the operator's columns of that sector that are
    // non-zero somewhere on the table (noiseColumnPattern; every other entry is exactly 0), their
    // values at the last u evaluated (a hold split into pieces keeps u: the same numbers, computed once).
    const nT = 2 * model.transmons.length;
    const patterns = frame.sectors.map((sec, s) =>
      Array.from({ length: nT }, (_, j) => {
        const i = j >> 1;
        return j % 2 === 0 ? noiseColumnPattern(frame, noise.ladder[i], noise.ladderSlope[i], noise.offsets[s], sec.size) : noiseColumnPattern(frame, noise.number[i], noise.numberSlope[i], noise.offsets[s], sec.size);
      }),
    );
    const opVals = patterns.map((ps) => ps.map((pt) => new Float64Array(pt.cols.length)));
    const opAt = frame.sectors.map(() => new Float64Array(nT).fill(NaN));
    this.observer = (stepIndex, sector, re, im, columns) => {
      const b = stepIndex + 1;
      if (this.p[b] === undefined) {
        this.p[b] = new Float64Array(this.nOps);
        this.q[b] = new Float64Array(this.nOps);
      }
      const prev = b === 0 ? undefined : this.schedule[b - 1];
      const x = prev ? prev.x0 + prev.v * prev.h : traj.flux[0];
      this.times[b] = prev ? prev.t0 + prev.h : traj.timeNs[0];
      const u = josephsonEnergy(mover.ejsGHz, mover.asymmetry, x);
      const off = noise.offsets[sector];
      const ds = frame.sectors[sector].size;
      for (let i = 0; i < model.transmons.length; i++) {
        const rates = jumpRates(model, i, x);
        for (let kind = 0; kind < 2; kind++) {
          const rate = kind === 0 ? rates.relax : rates.dephase * 2;
          if (rate === 0) continue;
          const j0 = 2 * i + kind;
          const pt = patterns[sector][j0];
          const vals = opVals[sector][j0];
          if (opAt[sector][j0] !== u) {
            noiseEntries(frame, kind === 0 ? noise.ladder[i] : noise.number[i], kind === 0 ? noise.ladderSlope[i] : noise.numberSlope[i], u, pt, vals);
            opAt[sector][j0] = u;
          }
          let pSum = 0;
          let qSum = 0;
          const nRows = pt.rows.length;
          for (const c of columns) {
            const xr = re[c];
            const xi = im[c];
            // y = O psi over the rows with a non-zero entry (psi lives in this sector's columns;
            // the other rows of y are exactly 0 and add nothing to either sum)
            for (let t = 0; t < nRows; t++) {
              const r = pt.rows[t];
              let yr = 0;
              let yi = 0;
              for (let e = pt.rowStart[t]; e < pt.rowStart[t + 1]; e++) {
                const ok = vals[e];
                const k = pt.cols[e];
                yr += ok * xr[k];
                yi += ok * xi[k];
              }
              pSum += yr * yr + yi * yi;
              if (kind === 1 && r >= off && r < off + ds) qSum += xr[r - off] * yr + xi[r - off] * yi;
            }
          }
          const j = 2 * i + kind;
          this.p[b][j] += rate * pSum;
          this.q[b][j] += Math.sqrt(rate) * qSum;
        }
      }
    };
  }

  /** Average gate infidelity estimate (d = 4), trapezoid rule over the step boundaries. */
  result(): number {
    const s = this.split();
    return s.t1 + s.dephasing;
  }

  /**
   * The estimate split by jump operator kind: relaxation (the ladder operators) and white
   * dephasing (the number operators); each is the same integral over its operators alone (the
   * first-order estimate is a sum over jump operators).
   */
  split(): { t1: number; dephasing: number } {
    const part = (kind: number): number => {
      let integral = 0;
      let prev = 0;
      for (let b = 0; b < this.p.length; b++) {
        let g = 0;
        for (let j = kind; j < this.nOps; j += 2) g += 4 * this.p[b][j] - this.q[b][j] * this.q[b][j];
        g /= 16;
        if (b > 0) integral += 0.5 * (g + prev) * (this.times[b] - this.times[b - 1]);
        prev = g;
      }
      return averageFromProcessInfidelity(integral);
    };
    return { t1: part(0), dephasing: part(1) };
  }
}

const NOISE_WEIGHTS = new Float64Array(4);

/**
 * The entries of a noise table's operator (Dt x Dt) in columns [off, off + ds) that are non-zero
 * at some table point (value or slope), row by row in increasing row and column order: rows[t]
 * is a row with such entries, cols[rowStart[t] .. rowStart[t + 1]) their columns (relative to
 * off), at[e] the entry's index in a Dt x Dt matrix. Every other entry of these columns is exactly
 * 0 at every u (the tables interpolate only entries that are non-zero somewhere,
 * src/sim/manifold-frame.ts tabulateNoise): a ladder operator keeps only the other sector's rows,
 * a number operator only its own. Remembered per table.
 */
interface NoisePattern {
  rows: Int32Array;
  rowStart: Int32Array;
  cols: Int32Array;
  at: Int32Array;
}

const noisePatterns = new WeakMap<Float64Array, Map<string, NoisePattern>>();

export function noiseColumnPattern(frame: ManifoldFrame, values: Float64Array, slopes: Float64Array, off: number, ds: number): NoisePattern {
  let byCols = noisePatterns.get(values);
  if (!byCols) noisePatterns.set(values, (byCols = new Map()));
  const key = `${off} ${ds}`;
  const hit = byCols.get(key);
  if (hit) return hit;
  const dt = frame.noise!.size;
  const w = dt * dt;
  const points = values.length / w;
  const rows: number[] = [];
  const rowStart: number[] = [0];
  const cols: number[] = [];
  const at: number[] = [];
  for (let r = 0; r < dt; r++) {
    for (let k = 0; k < ds; k++) {
      const q = r * dt + off + k;
      for (let p = 0; p < points; p++) {
        if (values[p * w + q] !== 0 || slopes[p * w + q] !== 0) {
          cols.push(k);
          at.push(q);
          break;
        }
      }
    }
    if (cols.length > rowStart[rowStart.length - 1]) {
      rows.push(r);
      rowStart.push(cols.length);
    }
  }
  const pattern = { rows: Int32Array.from(rows), rowStart: Int32Array.from(rowStart), cols: Int32Array.from(cols), at: Int32Array.from(at) };
  byCols.set(key, pattern);
  return pattern;
}

/**
 * The pattern's entries of a noise table's operator at u, into out (one per entry): the same
 * cubic Hermite weights (noiseHermite), entry by entry, as evaluateNoiseTable
 * (src/sim/manifold-frame.ts), so the same numbers, for the entries the observer reads.
 */
function noiseEntries(frame: ManifoldFrame, values: Float64Array, slopes: Float64Array, u: number, pattern: NoisePattern, out: Float64Array): void {
  const i = noiseHermite(frame, u, NOISE_WEIGHTS);
  const h00 = NOISE_WEIGHTS[0];
  const h10 = NOISE_WEIGHTS[1];
  const h01 = NOISE_WEIGHTS[2];
  const h11 = NOISE_WEIGHTS[3];
  const dt = frame.noise!.size;
  const w = dt * dt;
  const p0 = i * w;
  const p1 = p0 + w;
  const at = pattern.at;
  for (let e = 0; e < at.length; e++) {
    const q = at[e];
    out[e] = h00 * values[p0 + q] + h10 * slopes[p0 + q] + h01 * values[p1 + q] + h11 * slopes[p1 + q];
  }
}

/**
 * The Lindblad channel on the computational inputs and its average gate fidelity
 * (README physics conventions sec. 3: F = [sum_c Tr_P E(|c><c|) + sum_kl <k|V^dag E(|k><l|) V|l>] / 20).
 */
export function lindbladChannel(
  frame: ManifoldFrame,
  traj: Trajectory,
  comp: DressedState[],
  o: Required<Pick<GateSimulationOptions, 'noiseStepNs' | 'noiseExcitations' | 'targetPhase'>> & FramePropagationOptions,
  startVz: { a: number; b: number },
): NoisyMetrics {
  const noise = frame.noise!;
  const model = frame.model;
  const mover = model.transmons[0];
  // Reduced state set R (combined ordering indices), per sector positions.
  const rIdx: number[] = [];
  const rSector: number[] = [];
  const rPos: number[] = [];
  frame.sectors.forEach((sec, s) => {
    sec.labels.forEach((lv, pos) => {
      if (lv.reduce((a, b) => a + b, 0) <= o.noiseExcitations) {
        rIdx.push(noise.offsets[s] + pos);
        rSector.push(s);
        rPos.push(pos);
      }
    });
  });
  const n = rIdx.length;
  // Computational vectors in R coordinates.
  const compR = comp.map((st) => {
    const v = new Float64Array(n);
    for (let r = 0; r < n; r++) if (rSector[r] === st.sector) v[r] = st.vector[rPos[r]];
    return v;
  });
  // Inputs |k><l| for k <= l (others by Hermitian conjugation).
  const pairs: [number, number][] = [];
  for (let k = 0; k < 4; k++) for (let l = k; l < 4; l++) pairs.push([k, l]);
  const rhoR = pairs.map(([k, l]) => {
    const m = new Float64Array(n * n);
    for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) m[a * n + b] = compR[k][a] * compR[l][b];
    return m;
  });
  const rhoI = pairs.map(() => new Float64Array(n * n));
  const schedule = stepSchedule(frame, traj, { ...o, maxStepNs: Math.min(o.maxStepNs ?? Infinity, o.noiseStepNs), maxHoldStepNs: o.noiseStepNs });
  const steppers = frame.sectors.map((sec) => new SectorStepper(frame, sec, o.scheme ?? 'blocks'));
  const ur = new Float64Array(n * n);
  const ui = new Float64Array(n * n);
  const dt = noise.size;
  const opBuf = new Float64Array(dt * dt);
  const nOps = 2 * model.transmons.length;
  const ops = Array.from({ length: nOps }, () => new Float64Array(n * n));
  const rates = new Float64Array(nOps);
  const kOp = new Float64Array(n * n);
  const work = { ar: new Float64Array(n * n), ai: new Float64Array(n * n), br: new Float64Array(n * n), bi: new Float64Array(n * n) };
  const colR = frame.sectors.map((sec) => new Float64Array(sec.size));
  const colI = frame.sectors.map((sec) => new Float64Array(sec.size));
  let lastHoldKey = '';
  let pending = 0;
  // States of R are ordered by sector: sector 0 is [0, n0), sector 1 is [n0, n).
  const n0 = rSector.filter((x) => x === 0).length;
  // Parity class of each input |k><l| (the Lindblad equation keeps sector(bra) xor sector(ket)).
  const classes = pairs.map(([k, l]) => comp[k].sector ^ comp[l].sector);
  // Jump operators alternate ladder (flips the sector) and number (keeps it).
  const flips = Array.from({ length: nOps }, (_, j) => (j % 2 === 0 ? 1 : 0));
  for (const step of schedule) {
    // Coherent step restricted to R.
    const holdKey = step.hold ? `${step.x0}:${step.h}` : '';
    if (!step.hold || holdKey !== lastHoldKey) {
      ur.fill(0);
      ui.fill(0);
      frame.sectors.forEach((_, s) => {
        steppers[s].prepare(step);
        for (let c = 0; c < n; c++) {
          if (rSector[c] !== s) continue;
          colR[s].fill(0);
          colI[s].fill(0);
          colR[s][rPos[c]] = 1;
          steppers[s].apply(colR[s], colI[s]);
          for (let r = 0; r < n; r++) {
            if (rSector[r] !== s) continue;
            ur[r * n + c] = colR[s][rPos[r]];
            ui[r * n + c] = colI[s][rPos[r]];
          }
        }
      });
      lastHoldKey = holdKey;
    }
    // Jump operators at the step midpoint.
    const xm = step.x0 + 0.5 * step.v * step.h;
    const um = josephsonEnergy(mover.ejsGHz, mover.asymmetry, xm);
    kOp.fill(0);
    for (let i = 0; i < model.transmons.length; i++) {
      const rt = jumpRates(model, i, xm);
      for (let kind = 0; kind < 2; kind++) {
        const j = 2 * i + kind;
        rates[j] = kind === 0 ? rt.relax : 2 * rt.dephase;
        if (rates[j] === 0) continue;
        evaluateNoiseTable(frame, kind === 0 ? noise.ladder[i] : noise.number[i], kind === 0 ? noise.ladderSlope[i] : noise.numberSlope[i], um, opBuf);
        const op = ops[j];
        for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) op[a * n + b] = opBuf[rIdx[a] * dt + rIdx[b]];
        // K += rate O^T O
        for (let a = 0; a < n; a++)
          for (let b = 0; b < n; b++) {
            let acc = 0;
            for (let c = 0; c < n; c++) acc += op[c * n + a] * op[c * n + b];
            kOp[a * n + b] += rates[j] * acc;
          }
      }
    }
    // Strang splitting with the half dissipator steps of consecutive steps merged:
    // D((h_prev + h)/2) U D(h/2) ... (the dissipator varies slowly along the trajectory).
    const tau = pending + 0.5 * step.h;
    for (let p = 0; p < pairs.length; p++) {
      dissipateBlocks(rhoR[p], rhoI[p], ops, flips, rates, kOp, n, n0, classes[p], tau, work);
      unitaryConjugateBlocks(rhoR[p], rhoI[p], ur, ui, n, n0, classes[p], work);
    }
    pending = 0.5 * step.h;
  }
  for (let p = 0; p < pairs.length; p++) dissipateBlocks(rhoR[p], rhoI[p], ops, flips, rates, kOp, n, n0, classes[p], pending, work);
  // Project onto computational states with lab-frame phases.
  const T = traj.timeNs[traj.timeNs.length - 1] - traj.timeNs[0];
  const e00 = comp[0].energy;
  const eLoc = PAIR_LABELS.map(([i, j]) => e00 + i * (comp[2].energy - e00) + j * (comp[1].energy - e00));
  const proj = (p: number, a: number, b: number): [number, number] => {
    // <a| rho_p |b> with a, b computational vectors (real)
    let sr = 0;
    let si = 0;
    const va = compR[a];
    const vb = compR[b];
    for (let x = 0; x < n; x++) {
      if (va[x] === 0) continue;
      for (let y = 0; y < n; y++) {
        sr += va[x] * rhoR[p][x * n + y] * vb[y];
        si += va[x] * rhoI[p][x * n + y] * vb[y];
      }
    }
    return [sr, si];
  };
  const pairIndex = (k: number, l: number): { p: number; conj: boolean } => {
    const p = pairs.findIndex(([a, b]) => (a === k && b === l) || (a === l && b === k));
    return { p, conj: k > l };
  };
  // C_kl = <k|E_lab(|k><l|)|l>, trace term.
  const cr = new Float64Array(16);
  const ci = new Float64Array(16);
  let trace = 0;
  let leak = 0;
  for (let k = 0; k < 4; k++) {
    for (let l = 0; l < 4; l++) {
      const { p, conj } = pairIndex(k, l);
      // E(|k><l|) = E(|l><k|)^dag when k > l: <k|E(|k><l|)|l> = conj(<l|E(|l><k|)|k>)
      const [xr, xi0] = conj ? proj(p, l, k) : proj(p, k, l);
      const xi = conj ? -xi0 : xi0;
      const ph = 2 * Math.PI * (eLoc[k] - eLoc[l]) * T;
      cr[k * 4 + l] = Math.cos(ph) * xr - Math.sin(ph) * xi;
      ci[k * 4 + l] = Math.sin(ph) * xr + Math.cos(ph) * xi;
    }
    const { p } = pairIndex(k, k);
    let tp = 0;
    for (let c = 0; c < 4; c++) tp += proj(p, c, c)[0];
    trace += tp;
    leak += 1 - tp;
  }
  const vz = maximiseChannelOverlap(cr, ci, o.targetPhase, startVz);
  return { fidelity: (trace + vz.value) / 20, virtualZ: { a: vz.a, b: vz.b }, leakage: leak / 4 };
}

/**
 * rho += tau (sum_j r_j O_j rho O_j^T - (K rho + rho K)/2), O_j and K real, with the sector
 * structure used to skip zeros: rho is non-zero only where sector(a) xor sector(b) = cls, K keeps
 * sectors, O_j flips them when flips[j] = 1.
 */
function dissipateBlocks(
  rr: Float64Array,
  ri: Float64Array,
  ops: Float64Array[],
  flips: number[],
  rates: Float64Array,
  k: Float64Array,
  n: number,
  n0: number,
  cls: number,
  tau: number,
  w: { ar: Float64Array; ai: Float64Array; br: Float64Array; bi: Float64Array },
): void {
  if (tau === 0) return;
  const { ar, ai, br, bi } = w;
  const lo = (sec: number): number => (sec === 0 ? 0 : n0);
  const hi = (sec: number): number => (sec === 0 ? n0 : n);
  for (let a = 0; a < n; a++) {
    const sa = a < n0 ? 0 : 1;
    const sb = sa ^ cls;
    for (let b = lo(sb); b < hi(sb); b++) {
      let sr = 0;
      let si = 0;
      for (let c = lo(sa); c < hi(sa); c++) {
        const kac = k[a * n + c];
        sr -= 0.5 * kac * rr[c * n + b];
        si -= 0.5 * kac * ri[c * n + b];
      }
      for (let c = lo(sb); c < hi(sb); c++) {
        const kcb = k[c * n + b];
        sr -= 0.5 * rr[a * n + c] * kcb;
        si -= 0.5 * ri[a * n + c] * kcb;
      }
      ar[a * n + b] = sr;
      ai[a * n + b] = si;
    }
  }
  for (let j = 0; j < ops.length; j++) {
    const r = rates[j];
    if (r === 0) continue;
    const o = ops[j];
    const f = flips[j];
    // B = O rho: non-zero where sector(a) xor sector(b) = cls xor f
    for (let a = 0; a < n; a++) {
      const sa = a < n0 ? 0 : 1;
      const sc = sa ^ f;
      const sb = sc ^ cls;
      for (let b = lo(sb); b < hi(sb); b++) {
        let sr = 0;
        let si = 0;
        for (let c = lo(sc); c < hi(sc); c++) {
          const oac = o[a * n + c];
          sr += oac * rr[c * n + b];
          si += oac * ri[c * n + b];
        }
        br[a * n + b] = sr;
        bi[a * n + b] = si;
      }
    }
    // += r B O^T
    for (let a = 0; a < n; a++) {
      const sa = a < n0 ? 0 : 1;
      const sb = sa ^ cls;
      const sc = sb ^ f;
      for (let b = lo(sb); b < hi(sb); b++) {
        let sr = 0;
        let si = 0;
        for (let c = lo(sc); c < hi(sc); c++) {
          const obc = o[b * n + c];
          sr += br[a * n + c] * obc;
          si += bi[a * n + c] * obc;
        }
        ar[a * n + b] += r * sr;
        ai[a * n + b] += r * si;
      }
    }
  }
  for (let a = 0; a < n; a++) {
    const sb = (a < n0 ? 0 : 1) ^ cls;
    for (let b = lo(sb); b < hi(sb); b++) {
      rr[a * n + b] += tau * ar[a * n + b];
      ri[a * n + b] += tau * ai[a * n + b];
    }
  }
}

/** rho <- U rho U^dag for a U that keeps sectors (same zero structure as dissipateBlocks). */
function unitaryConjugateBlocks(rr: Float64Array, ri: Float64Array, ur: Float64Array, ui: Float64Array, n: number, n0: number, cls: number, w: { ar: Float64Array; ai: Float64Array }): void {
  const { ar, ai } = w;
  const lo = (sec: number): number => (sec === 0 ? 0 : n0);
  const hi = (sec: number): number => (sec === 0 ? n0 : n);
  for (let a = 0; a < n; a++) {
    const sa = a < n0 ? 0 : 1;
    const sb = sa ^ cls;
    for (let b = lo(sb); b < hi(sb); b++) {
      let sr = 0;
      let si = 0;
      for (let c = lo(sa); c < hi(sa); c++) {
        const xr = ur[a * n + c];
        const xi = ui[a * n + c];
        sr += xr * rr[c * n + b] - xi * ri[c * n + b];
        si += xr * ri[c * n + b] + xi * rr[c * n + b];
      }
      ar[a * n + b] = sr;
      ai[a * n + b] = si;
    }
  }
  for (let a = 0; a < n; a++) {
    const sa = a < n0 ? 0 : 1;
    const sb = sa ^ cls;
    for (let b = lo(sb); b < hi(sb); b++) {
      let sr = 0;
      let si = 0;
      for (let c = lo(sb); c < hi(sb); c++) {
        const xr = ur[b * n + c];
        const xi = -ui[b * n + c];
        sr += ar[a * n + c] * xr - ai[a * n + c] * xi;
        si += ar[a * n + c] * xi + ai[a * n + c] * xr;
      }
      rr[a * n + b] = sr;
      ri[a * n + b] = si;
    }
  }
}

/** max over (a, b) of v^dag C v, v = (1, e^{ib}, e^{ia}, e^{i(theta + a + b)}), by exact coordinate ascent. */
export function maximiseChannelOverlap(cr: Float64Array, ci: Float64Array, theta: number, start: { a: number; b: number }): { a: number; b: number; value: number } {
  let a = start.a;
  let b = start.b;
  const value = (aa: number, bb: number): number => {
    const ph = [0, bb, aa, theta + aa + bb];
    let s = 0;
    for (let k = 0; k < 4; k++)
      for (let l = 0; l < 4; l++) {
        const d = ph[l] - ph[k];
        s += cr[k * 4 + l] * Math.cos(d) - ci[k * 4 + l] * Math.sin(d);
      }
    return s;
  };
  // v^dag C v = const + 2 Re(e^{i x} w) for the phase x multiplying one group of entries.
  const best = (groupWith: number[], phases: (x: number) => number[]): number => {
    const ph0 = phases(0);
    let wr = 0;
    let wi = 0;
    for (let k = 0; k < 4; k++)
      for (let l = 0; l < 4; l++) {
        const inK = groupWith.includes(k);
        const inL = groupWith.includes(l);
        if (inK || !inL) continue;
        // term conj(v_k) C_kl v_l with v_l carrying e^{ix}: e^{ix} e^{i(ph0_l - ph0_k)} C_kl
        const d = ph0[l] - ph0[k];
        const zr = cr[k * 4 + l] * Math.cos(d) - ci[k * 4 + l] * Math.sin(d);
        const zi = cr[k * 4 + l] * Math.sin(d) + ci[k * 4 + l] * Math.cos(d);
        wr += zr;
        wi += zi;
      }
    return -Math.atan2(wi, wr);
  };
  let v = value(a, b);
  for (let it = 0; it < 100; it++) {
    a = best([2, 3], (x) => [0, b, x, theta + x + b]);
    b = best([1, 3], (x) => [0, x, a, theta + a + x]);
    const nv = value(a, b);
    if (nv - v <= 1e-15) {
      v = Math.max(v, nv);
      break;
    }
    v = nv;
  }
  return { a: wrapAngle(a), b: wrapAngle(b), value: v };
}

export { conditionalPhase };
