/**
 * Coherent propagation in the dressed-manifold frame (src/sim/manifold-frame.ts):
 *
 *     i da/dt = H(t) a,   H(t) = 2 pi E(u(t)) - i B(t),   B = (du/dt) A(u),
 *
 * u = E_J of the mover along a piecewise-linear flux trajectory. E is block diagonal (one block
 * per excitation manifold), A real antisymmetric. A segment at fixed flux is exact: a <- exp(-i 2 pi E dt) a
 * through the eigen-decomposition of E's blocks. Otherwise each sub-step of length h uses the
 * fourth-order Magnus integrator with two Gauss-Legendre nodes (Blanes, Casas, Oteo and Ros,
 * Phys. Rep. 470, 151 (2009), Eq. 253):
 *
 *     Omega = -i (h/2)(H1 + H2) - (sqrt3 h^2/12) [H2, H1],    a <- exp(Omega) a,
 *
 * with exp taken exactly through the eigen-decomposition of the Hermitian M = i Omega (complex
 * Jacobi, warm-started from the previous step). With c = sqrt3 h^2 / 12:
 *
 *     Re M = pi h (E1 + E2) - 2 pi c ([E2, B1] + [B2, E1])
 *     Im M = -(h/2)(B1 + B2) - 4 pi^2 c [E2, E1] + c [B2, B1].
 *
 * Step size: h <= maxStepNs, |du/dt| h max|A| <= maxAngle (the rotation a step makes between
 * frame states) and |du/dt| h <= maxEjStepGHz (E_J change per step). Defaults 0.2 ns, 0.1 rad,
 * 0.25 GHz: on a linear-ramp CZ the E_J limit dominates the error (3.7e-7 at these defaults,
 * 2.5e-6 at 0.2 ns with 0.5 GHz). Error O(h^4)
 * (test/sim/propagate-frame.test.ts measures the order). The default scheme handles each
 * manifold block this way and the inter-manifold coupling by src/sim/block-stepper.ts.
 */
import { InputError } from '../util/errors.js';
import { applyEigenExponential } from '../linalg/complex.js';
import { hermitianEigen, type HermitianEigen } from '../linalg/hermitian-eigen.js';
import { symmetricEigen } from '../linalg/symmetric-eigen.js';
import { josephsonEnergy, josephsonEnergySlope } from '../transmon/josephson.js';
import { BlockStepper } from './block-stepper.js';
import { evaluateFrame, evaluateFrameInBlocks, maxCouplingBetween, type FrameSector, type ManifoldFrame } from './manifold-frame.js';
import type { Trajectory } from './trajectory.js';

export interface FramePropagationOptions {
  maxStepNs?: number;
  maxAngle?: number;
  maxEjStepGHz?: number;
  /**
   * 'blocks' (default): Magnus per manifold block plus the exact-oscillation treatment of the
   * inter-manifold coupling (src/sim/block-stepper.ts); 'full': one Magnus exponential of the
   * whole generator (simple, needs steps short against the inter-manifold periods; a reference);
   * 'in-block': the block Magnus alone, dropping the inter-manifold coupling (fast scans only).
   */
  scheme?: 'blocks' | 'full' | 'in-block';
  /**
   * Join consecutive ramp segments shorter than maxStepNs into one Magnus step (up to maxStepNs,
   * maxAngle and JOIN_MAX_EJ_GHZ of E_J over the joined segments), its nodes placed on the
   * piecewise-linear path (a designed waveform's ramps are ~0.06 ns segments: ~1.6x fewer steps,
   * amplitudes within ~4e-4 of one step per segment). For the error budget's runs, whose terms
   * are differences of such runs (test/sim/hold-merge.test.ts, test/sim/spectator-states.test.ts).
   * Coherent runs only (ignored when holds are limited, i.e. with the first-order estimate).
   */
  joinRamps?: boolean;
}

export const FRAME_PROPAGATION_DEFAULTS = Object.freeze({ maxStepNs: 0.2, maxAngle: 0.1, maxEjStepGHz: 0.25, scheme: 'blocks' as 'blocks' | 'full' | 'in-block' });

/** Final amplitudes of each initial frame vector (in its sector's frame basis). */
export interface FrameColumns {
  re: Float64Array[];
  im: Float64Array[];
  steps: number;
}

export interface FrameInitial {
  sector: number;
  /** Initial amplitudes in the sector's frame basis. */
  re: Float64Array;
  im: Float64Array;
}

const TWO_PI = 2 * Math.PI;
const GL1 = 0.5 - Math.sqrt(3) / 6;
const GL2 = 0.5 + Math.sqrt(3) / 6;

/** Scratch for one sector. */
export class SectorStepper {
  readonly d: number;
  readonly e1: Float64Array;
  readonly e2: Float64Array;
  readonly a1: Float64Array;
  readonly a2: Float64Array;
  readonly em: Float64Array;
  readonly am: Float64Array;
  readonly mr: Float64Array;
  readonly mi: Float64Array;
  readonly tr: Float64Array;
  readonly ti: Float64Array;
  readonly eig: HermitianEigen;
  hasStart = false;
  private readonly blocks: BlockStepper | undefined;
  /** In-block scheme: the blocks that carry amplitude (restrictToColumns), or all. */
  private active: Uint8Array | undefined;

  constructor(readonly frame: ManifoldFrame, readonly sector: FrameSector, private readonly scheme: 'blocks' | 'full' | 'in-block' = 'blocks') {
    const d = sector.size;
    this.blocks = scheme === 'full' ? undefined : new BlockStepper(sector.blocks, d, scheme === 'in-block');
    this.d = d;
    this.e1 = new Float64Array(d * d);
    this.e2 = new Float64Array(d * d);
    this.a1 = new Float64Array(d * d);
    this.a2 = new Float64Array(d * d);
    this.em = new Float64Array(d * d);
    this.am = new Float64Array(d * d);
    this.mr = new Float64Array(d * d);
    this.mi = new Float64Array(d * d);
    this.tr = new Float64Array(d);
    this.ti = new Float64Array(d);
    this.eig = { values: new Float64Array(d), vectorsRe: new Float64Array(d * d), vectorsIm: new Float64Array(d * d) };
  }

  /** Set up the step's propagator (hold or Magnus step). */
  prepare(step: FrameStep): void {
    const mover = this.frame.model.transmons[0];
    if (step.hold) {
      this.holdPropagator(josephsonEnergy(mover.ejsGHz, mover.asymmetry, step.x0), step.h);
      return;
    }
    const { h, v, x0 } = step;
    const nd = step.nodes;
    const d = this.d;
    const xa = nd ? nd.xa : x0 + v * GL1 * h;
    const xb = nd ? nd.xb : x0 + v * GL2 * h;
    const ra = (nd ? nd.va : v) * josephsonEnergySlope(mover.ejsGHz, mover.asymmetry, xa);
    const rb = (nd ? nd.vb : v) * josephsonEnergySlope(mover.ejsGHz, mover.asymmetry, xb);
    if (this.blocks && this.scheme === 'in-block') {
      // the in-block step reads only the (active) blocks' entries: evaluate and scale just those
      evaluateFrameInBlocks(this.frame, this.sector, josephsonEnergy(mover.ejsGHz, mover.asymmetry, xa), this.e1, this.a1, this.active);
      evaluateFrameInBlocks(this.frame, this.sector, josephsonEnergy(mover.ejsGHz, mover.asymmetry, xb), this.e2, this.a2, this.active);
      const blocks = this.sector.blocks;
      for (let bi = 0; bi < blocks.length; bi++) {
        if (this.active && this.active[bi] === 0) continue;
        const lo = blocks[bi].start;
        const hi = lo + blocks[bi].size;
        for (let r = lo; r < hi; r++)
          for (let q = r * d + lo; q < r * d + hi; q++) {
            this.a1[q] *= ra;
            this.a2[q] *= rb;
          }
      }
      this.blocks.setStep(this.e1, this.e2, this.a1, this.a2, h);
      return;
    }
    evaluateFrame(this.frame, this.sector, josephsonEnergy(mover.ejsGHz, mover.asymmetry, xa), this.e1, this.a1);
    evaluateFrame(this.frame, this.sector, josephsonEnergy(mover.ejsGHz, mover.asymmetry, xb), this.e2, this.a2);
    for (let q = 0; q < d * d; q++) {
      this.a1[q] *= ra;
      this.a2[q] *= rb;
    }
    if (this.blocks) {
      const xm = nd ? nd.xm : x0 + 0.5 * v * h;
      evaluateFrame(this.frame, this.sector, josephsonEnergy(mover.ejsGHz, mover.asymmetry, xm), this.em, this.am);
      const rm = (nd ? nd.vm : v) * josephsonEnergySlope(mover.ejsGHz, mover.asymmetry, xm);
      for (let q = 0; q < d * d; q++) this.am[q] *= rm;
      this.blocks.setStep(this.e1, this.e2, this.a1, this.a2, h, this.am);
      return;
    }
    this.magnusMatrix(h);
  }

  /** Unitary of a hold of length dt at E_J = u: U = exp(-i 2 pi E dt), stored as eigen-decomposition in eig (real vectors). */
  holdPropagator(u: number, dt: number): void {
    const d = this.d;
    if (this.blocks) {
      // a hold reads only the in-block energies (of the active blocks, in the in-block scheme)
      evaluateFrameInBlocks(this.frame, this.sector, u, this.e1, this.a1, this.scheme === 'in-block' ? this.active : undefined);
      this.blocks.setHold(this.e1, dt);
      return;
    }
    evaluateFrame(this.frame, this.sector, u, this.e1, this.a1);
    const vr = this.eig.vectorsRe;
    const vi = this.eig.vectorsIm;
    vr.fill(0);
    vi.fill(0);
    for (const blk of this.sector.blocks) {
      const m = blk.size;
      const sub = new Float64Array(m * m);
      for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) sub[i * m + j] = this.e1[(blk.start + i) * d + blk.start + j];
      const ev = symmetricEigen(sub, m);
      for (let i = 0; i < m; i++) {
        this.eig.values[blk.start + i] = TWO_PI * ev.values[i] * dt;
        for (let j = 0; j < m; j++) vr[(blk.start + j) * d + blk.start + i] = ev.vectors[j * m + i];
      }
    }
    this.hasStart = false;
  }

  /** Build M for one Magnus step from (e1, a1), (e2, a2) already holding E and B at the nodes. */
  magnusMatrix(h: number): void {
    if (this.blocks) {
      this.blocks.setStep(this.e1, this.e2, this.a1, this.a2, h);
      return;
    }
    const d = this.d;
    const { e1, e2, a1, a2, mr, mi } = this;
    const c = (Math.sqrt(3) * h * h) / 12;
    for (let n = 0; n < d; n++) {
      for (let m = n; m < d; m++) {
        // [E2, B1] + [B2, E1] (symmetric), [E2, E1] (antisymmetric), [B2, B1] (antisymmetric)
        let s1 = 0;
        let s2 = 0;
        let s3 = 0;
        for (let k = 0; k < d; k++) {
          const e2nk = e2[n * d + k];
          const e1nk = e1[n * d + k];
          const b1nk = a1[n * d + k];
          const b2nk = a2[n * d + k];
          const e2km = e2[k * d + m];
          const e1km = e1[k * d + m];
          const b1km = a1[k * d + m];
          const b2km = a2[k * d + m];
          s1 += e2nk * b1km - b1nk * e2km + b2nk * e1km - e1nk * b2km;
          s2 += e2nk * e1km - e1nk * e2km;
          s3 += b2nk * b1km - b1nk * b2km;
        }
        const re = Math.PI * h * (e1[n * d + m] + e2[n * d + m]) - TWO_PI * c * s1;
        const im = -0.5 * h * (a1[n * d + m] + a2[n * d + m]) - 4 * Math.PI * Math.PI * c * s2 + c * s3;
        mr[n * d + m] = re;
        mr[m * d + n] = re;
        if (m === n) mi[n * d + n] = 0;
        else {
          mi[n * d + m] = im;
          mi[m * d + n] = -im;
        }
      }
    }
    hermitianEigen(mr, mi, d, { out: this.eig, start: this.hasStart ? { re: this.eig.vectorsRe, im: this.eig.vectorsIm } : undefined, sort: false });
    this.hasStart = true;
  }

  /**
   * In-block scheme only: propagate just the manifold blocks where some of `columns` is non-zero
   * (they never leave their blocks, so the others stay exactly zero and need no exponential).
   */
  restrictToColumns(columns: readonly { re: Float64Array; im: Float64Array }[]): void {
    if (!this.blocks || this.scheme !== 'in-block') return;
    const active = new Uint8Array(this.sector.blocks.length);
    this.sector.blocks.forEach((blk, bi) => {
      for (const c of columns) for (let k = blk.start; k < blk.start + blk.size; k++) if (c.re[k] !== 0 || c.im[k] !== 0) active[bi] = 1;
    });
    this.blocks.setActiveBlocks(active);
    this.active = active;
  }

  /** x <- V exp(-i w) V^H x with the decomposition in eig. */
  apply(re: Float64Array, im: Float64Array): void {
    if (this.blocks) {
      this.blocks.apply(re, im);
      return;
    }
    applyEigenExponential(this.eig.vectorsRe, this.eig.vectorsIm, this.eig.values, this.d, re, im, this.tr, this.ti);
  }

}

/** One step of a schedule: a hold (exact) or a Magnus step on a ramp segment. */
export interface FrameStep {
  hold: boolean;
  /** Start time and length (ns). */
  t0: number;
  h: number;
  /** Mover flux at the start of the step and its rate dPhi/dt (0 for a hold; the mean rate of a joined step). */
  x0: number;
  v: number;
  /** A step over several ramp segments (joinRamps): flux and rate at its two Gauss-Legendre nodes and its midpoint. */
  nodes?: { xa: number; va: number; xb: number; vb: number; xm: number; vm: number };
}

/**
 * The step schedule of a trajectory, shared by all sectors (so per-step observers see the same
 * times): holds are split into pieces of at most maxHoldStepNs (without that limit, consecutive
 * hold segments at one flux are one step); ramp segments into equal steps
 * obeying maxStepNs, maxAngle (largest |A| of any sector) and maxEjStepGHz.
 */
/**
 * Most steps a schedule may hold (each step is kept in memory: about 100 bytes, so 4e6 steps are
 * about 400 MB, and 4 minutes of propagation here). A longer schedule is refused before it is
 * built (InputError): the trajectory is too long for the simulator (e.g. 2e9 ns of ramps).
 */
export const MAX_SCHEDULE_STEPS = 4_000_000;

/** The InputError of a schedule over MAX_SCHEDULE_STEPS. */
export function scheduleTooLong(steps: number, durationNs: number, file?: string): InputError {
  return new InputError({
    file,
    message: `expected a trajectory the simulator can step through in at most ${MAX_SCHEDULE_STEPS} steps (0.2 ns each on ramps), found one of ${durationNs.toPrecision(4)} ns that needs at least ${steps.toPrecision(3)} steps`,
  });
}

/**
 * Largest E_J change (GHz) of a step that joins ramp segments (see joinRamps): the Gauss-Legendre
 * nodes of a joined step miss the kinks of the piecewise-linear path, an error that grows with the
 * change over the step (on a Bowline-5 CZ: amplitudes within 1.3e-4, 3.6e-4 and 1.6e-3 of one step
 * per segment at 0.02, 0.05 and 0.25 GHz, for 271, 250 and 224 steps against 409).
 */
export const JOIN_MAX_EJ_GHZ = 0.05;

export function stepSchedule(frame: ManifoldFrame, traj: Trajectory, options: FramePropagationOptions & { maxHoldStepNs?: number } = {}): FrameStep[] {
  const o = { ...FRAME_PROPAGATION_DEFAULTS, maxHoldStepNs: Infinity, ...options };
  const mover = frame.model.transmons[0];
  const ej = (x: number): number => josephsonEnergy(mover.ejsGHz, mover.asymmetry, x);
  const ejSlope = (x: number): number => josephsonEnergySlope(mover.ejsGHz, mover.asymmetry, x);
  const ts = traj.timeNs;
  const xs = traj.flux;
  const out: FrameStep[] = [];
  /** Index of the last trajectory segment that ended in a hold step (the last step), else -2. */
  let heldThrough = -2;
  /** E_J change of segment i bounded as the one-segment rule bounds it (|v| dt times 1.25 the largest slope), and its u range. */
  const segmentSpan = (i: number): { du: number; lo: number; hi: number } => {
    const a = xs[i];
    const b = xs[i + 1];
    const m = 0.5 * (a + b);
    const slopeMax = Math.max(Math.abs(ejSlope(a)), Math.abs(ejSlope(b)), Math.abs(ejSlope(m))) * 1.25;
    const ua = ej(a);
    const ub = ej(b);
    const um = ej(m);
    return { du: Math.abs(b - a) * slopeMax, lo: Math.min(ua, ub, um), hi: Math.max(ua, ub, um) };
  };
  /** Last segment j >= k such that ramp segments k..j make one step within maxStepNs, maxEjStepGHz and maxAngle. */
  const joinedRampEnd = (k: number): number => {
    let du = 0;
    let lo = Infinity;
    let hi = -Infinity;
    let j = k - 1;
    while (j + 2 < ts.length && xs[j + 2] !== xs[j + 1] && ts[j + 2] - ts[k] <= o.maxStepNs) {
      const sp = segmentSpan(j + 1);
      const nLo = Math.min(lo, sp.lo);
      const nHi = Math.max(hi, sp.hi);
      let aMax = 0;
      for (const sector of frame.sectors) aMax = Math.max(aMax, maxCouplingBetween(frame, sector, nLo, nHi));
      if (j >= k && (du + sp.du > Math.min(o.maxEjStepGHz, JOIN_MAX_EJ_GHZ) || (du + sp.du) * aMax > o.maxAngle)) break;
      du += sp.du;
      lo = nLo;
      hi = nHi;
      j++;
    }
    return j;
  };
  /** One Magnus step over ramp segments k..j: its nodes' flux and rate read off the piecewise-linear path. */
  const joinedStep = (k: number, j: number): FrameStep => {
    const t0 = ts[k];
    const h = ts[j + 1] - t0;
    const at = (t: number): [number, number] => {
      let i = k;
      while (i < j && ts[i + 1] <= t) i++;
      const v = (xs[i + 1] - xs[i]) / (ts[i + 1] - ts[i]);
      return [xs[i] + v * (t - ts[i]), v];
    };
    const [xa, va] = at(t0 + GL1 * h);
    const [xb, vb] = at(t0 + GL2 * h);
    const [xm, vm] = at(t0 + 0.5 * h);
    return { hold: false, t0, h, x0: xs[k], v: (xs[j + 1] - xs[k]) / h, nodes: { xa, va, xb, vb, xm, vm } };
  };
  for (let k = 0; k + 1 < ts.length; k++) {
    const dt = ts[k + 1] - ts[k];
    const x0 = xs[k];
    const x1 = xs[k + 1];
    if (x1 === x0) {
      // without a hold limit, a run of constant-flux segments is one exact step (the same
      // Hamiltonian throughout: exp(-i H h1) exp(-i H h2) = exp(-i H (h1 + h2))); a sampled
      // waveform's plateau is hundreds of equal samples
      if (!Number.isFinite(o.maxHoldStepNs) && heldThrough === k - 1 && out[out.length - 1].x0 === x0) {
        const last = out[out.length - 1];
        last.h = ts[k + 1] - last.t0;
        heldThrough = k;
        continue;
      }
      heldThrough = k;
      const n = Number.isFinite(o.maxHoldStepNs) ? Math.max(1, Math.ceil(dt / o.maxHoldStepNs - 1e-9)) : 1;
      if (!(out.length + n <= MAX_SCHEDULE_STEPS)) throw scheduleTooLong(out.length + n, ts[ts.length - 1] - ts[0]);
      for (let q = 0; q < n; q++) out.push({ hold: true, t0: ts[k] + (q * dt) / n, h: dt / n, x0, v: 0 });
      continue;
    }
    if (o.joinRamps && !Number.isFinite(o.maxHoldStepNs) && dt < o.maxStepNs) {
      const j = joinedRampEnd(k);
      if (j > k) {
        if (!(out.length + 1 <= MAX_SCHEDULE_STEPS)) throw scheduleTooLong(out.length + 1, ts[ts.length - 1] - ts[0]);
        out.push(joinedStep(k, j));
        k = j;
        continue;
      }
    }
    const v = (x1 - x0) / dt;
    const xm = 0.5 * (x0 + x1);
    const slopeMax = Math.max(Math.abs(ejSlope(x0)), Math.abs(ejSlope(x1)), Math.abs(ejSlope(xm))) * 1.25;
    const u0 = ej(x0);
    const u1 = ej(x1);
    const um = ej(xm);
    let aMax = 0;
    for (const sector of frame.sectors) aMax = Math.max(aMax, maxCouplingBetween(frame, sector, Math.min(u0, u1, um), Math.max(u0, u1, um)));
    const rate = Math.abs(v) * slopeMax;
    let n = Math.ceil(dt / o.maxStepNs - 1e-9);
    n = Math.max(n, 1, Math.ceil((rate * dt * aMax) / o.maxAngle - 1e-9), Math.ceil((rate * dt) / o.maxEjStepGHz - 1e-9));
    if (!(out.length + n <= MAX_SCHEDULE_STEPS)) throw scheduleTooLong(out.length + n, ts[ts.length - 1] - ts[0]);
    const h = dt / n;
    for (let q = 0; q < n; q++) out.push({ hold: false, t0: ts[k] + q * h, h, x0: x0 + v * q * h, v });
  }
  return out;
}

/** Called before the first step (index -1) and after every step with the sector's columns. */
export type FrameObserver = (stepIndex: number, sector: number, re: Float64Array[], im: Float64Array[], columns: number[]) => void;

/** Propagate the initial vectors through the trajectory (coherent). */
export function propagateInFrame(
  frame: ManifoldFrame,
  traj: Trajectory,
  initial: FrameInitial[],
  options: FramePropagationOptions & { maxHoldStepNs?: number } = {},
  observer?: FrameObserver,
): FrameColumns {
  const o = { ...FRAME_PROPAGATION_DEFAULTS, ...options };
  const schedule = stepSchedule(frame, traj, options);
  const re = initial.map((x) => Float64Array.from(x.re));
  const im = initial.map((x) => Float64Array.from(x.im));
  for (let s = 0; s < frame.sectors.length; s++) {
    const cols = initial.map((x, i) => (x.sector === s ? i : -1)).filter((i) => i >= 0);
    if (cols.length === 0) continue;
    const stepper = new SectorStepper(frame, frame.sectors[s], o.scheme);
    stepper.restrictToColumns(cols.map((c) => ({ re: re[c], im: im[c] })));
    observer?.(-1, s, re, im, cols);
    schedule.forEach((step, i) => {
      // a hold split into equal pieces (maxHoldStepNs) has the same propagator for each piece:
      // prepared once (the same numbers: preparing a hold does not depend on earlier steps)
      const prev = i > 0 ? schedule[i - 1] : undefined;
      if (!(step.hold && prev?.hold && prev.x0 === step.x0 && prev.h === step.h)) stepper.prepare(step);
      for (const c of cols) stepper.apply(re[c], im[c]);
      observer?.(i, s, re, im, cols);
    });
  }
  return { re, im, steps: schedule.length };
}
