/**
 * Flux trajectories of the mover: samples (t_k, Phi_k) joined piecewise-linearly
 * (README physics conventions sec. 6: the metrics of a design are those of its samples, joined
 * piecewise-linearly, so anyone can re-simulate the file).
 *
 * CSV form: a header `time_ns,flux_phi0` (or `time_ns,flux`) and one sample per line (time in
 * ns, flux of the mover in Phi0); any spacing; the first and last flux are the parking point and
 * must be equal. Lines starting with `#` are comments.
 */
import { InputError, type Diagnostic } from '../util/errors.js';

export interface Trajectory {
  /** Strictly increasing sample times, ns; timeNs[0] is the start (usually 0). */
  timeNs: Float64Array;
  /** Mover flux at each sample, Phi0, in [-0.5, 0.5]. */
  flux: Float64Array;
}

/** Duration in ns. */
export function trajectoryDuration(t: Trajectory): number {
  return t.timeNs[t.timeNs.length - 1] - t.timeNs[0];
}

/** Smallest and largest flux visited (the samples bound the piecewise-linear path). */
export function trajectoryFluxRange(t: Trajectory): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const x of t.flux) {
    if (x < lo) lo = x;
    if (x > hi) hi = x;
  }
  return [lo, hi];
}

/** Flux at time `tNs` by linear interpolation (clamped to the ends). */
export function fluxAt(t: Trajectory, tNs: number): number {
  const ts = t.timeNs;
  const n = ts.length;
  if (tNs <= ts[0]) return t.flux[0];
  if (tNs >= ts[n - 1]) return t.flux[n - 1];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (ts[mid] <= tNs) lo = mid;
    else hi = mid;
  }
  const f = (tNs - ts[lo]) / (ts[hi] - ts[lo]);
  return t.flux[lo] + f * (t.flux[hi] - t.flux[lo]);
}

/**
 * The same piecewise-linear trajectory with each run of equal samples reduced to its two ends
 * (a plateau is one constant segment: the simulator then takes it as one exact hold instead of
 * many short ones; the flux at every time is unchanged).
 */
export function mergePlateaus(t: Trajectory): Trajectory {
  const n = t.timeNs.length;
  const keep: number[] = [];
  for (let j = 0; j < n; j++) if (j === 0 || j === n - 1 || t.flux[j] !== t.flux[j - 1] || t.flux[j] !== t.flux[j + 1]) keep.push(j);
  if (keep.length === n) return t;
  return { timeNs: Float64Array.from(keep, (j) => t.timeNs[j]), flux: Float64Array.from(keep, (j) => t.flux[j]) };
}

/** Tolerance for "starts and ends at the same flux". */
export const SAME_FLUX_TOLERANCE = 1e-12;

/**
 * Check a trajectory: at least two samples, finite numbers, time strictly increasing, flux in
 * [-0.5, 0.5], first flux = last flux. Returns the problems found (empty when fine); `where`
 * names the file for messages, `lineOf(k)` gives the 1-based line of sample k when known.
 */
export function trajectoryProblems(t: Trajectory, where: { file?: string; lineOf?: (k: number) => number } = {}): Diagnostic[] {
  const out: Diagnostic[] = [];
  const n = t.timeNs.length;
  const at = (k: number): Pick<Diagnostic, 'file' | 'line' | 'column'> =>
    where.lineOf ? { file: where.file, line: where.lineOf(k), column: 1 } : { file: where.file };
  if (n !== t.flux.length) {
    out.push({ file: where.file, message: `expected as many flux samples as times, found ${t.flux.length} and ${n}` });
    return out;
  }
  if (n < 2) {
    out.push({ ...at(Math.max(0, n - 1)), message: `expected at least two samples, found ${n}` });
    return out;
  }
  for (let k = 0; k < n; k++) {
    if (!Number.isFinite(t.timeNs[k])) out.push({ ...at(k), message: `expected a finite time, found ${t.timeNs[k]}` });
    if (!Number.isFinite(t.flux[k])) out.push({ ...at(k), message: `expected a finite flux, found ${t.flux[k]}` });
    else if (Math.abs(t.flux[k]) > 0.5) out.push({ ...at(k), message: `expected a flux in [-0.5, 0.5] Phi0, found ${t.flux[k]}` });
    if (k > 0 && Number.isFinite(t.timeNs[k]) && Number.isFinite(t.timeNs[k - 1]) && !(t.timeNs[k] > t.timeNs[k - 1])) {
      out.push({ ...at(k), message: `expected time to increase strictly, found ${t.timeNs[k]} ns after ${t.timeNs[k - 1]} ns` });
    }
    if (out.length >= 20) break;
  }
  if (out.length === 0 && Math.abs(t.flux[n - 1] - t.flux[0]) > SAME_FLUX_TOLERANCE) {
    out.push({
      ...at(n - 1),
      message: `expected the trajectory to end at its starting (parking) flux ${t.flux[0]}, found ${t.flux[n - 1]}`,
    });
  }
  return out;
}

/** Throw an InputError if the trajectory is not usable. */
export function assertTrajectory(t: Trajectory, where: { file?: string; lineOf?: (k: number) => number } = {}): void {
  const problems = trajectoryProblems(t, where);
  if (problems.length > 0) throw new InputError(problems);
}

/** Names of the flux column the parser accepts (the unit-labelled one first). */
export const TRAJECTORY_FLUX_COLUMNS: readonly string[] = ['flux_phi0', 'flux'];

/** Parse the CSV form. Throws InputError naming file:line:column on any problem. */
export function parseTrajectoryCsv(text: string, file = '<trajectory>'): Trajectory {
  const lines = text.split(/\r\n|\r|\n/);
  const problems: Diagnostic[] = [];
  let headerLine = -1;
  for (let i = 0; i < lines.length; i++) {
    if (lines[i].trim() === '' || lines[i].trimStart().startsWith('#')) continue;
    headerLine = i;
    break;
  }
  if (headerLine < 0) throw new InputError({ file, line: 1, column: 1, message: 'expected a header `time_ns,flux_phi0`, found an empty file' });
  const header = lines[headerLine].split(',').map((s) => s.trim());
  if (header.length !== 2 || header[0] !== 'time_ns' || !TRAJECTORY_FLUX_COLUMNS.includes(header[1])) {
    const awg = header[0] === 'sample' ? ' (this is an AWG program, before the flux line; simulate reads the flux the qubit sees, waveforms/A-B.qubit.csv of a plan)' : '';
    throw new InputError({ file, line: headerLine + 1, column: 1, message: `expected the header \`time_ns,flux_phi0\`, found \`${lines[headerLine].trim().slice(0, 60)}\`${awg}` });
  }
  const times: number[] = [];
  const fluxes: number[] = [];
  const lineNo: number[] = [];
  for (let i = headerLine + 1; i < lines.length; i++) {
    const raw = lines[i];
    if (raw.trim() === '' || raw.trimStart().startsWith('#')) continue;
    const cells = raw.split(',');
    if (cells.length !== 2) {
      problems.push({ file, line: i + 1, column: 1, message: `expected two comma-separated numbers, found ${cells.length} fields` });
      continue;
    }
    const t = parseNumberCell(cells[0]);
    const f = parseNumberCell(cells[1]);
    if (t === undefined) problems.push({ file, line: i + 1, column: 1, message: `expected a time in ns, found \`${cells[0].trim().slice(0, 30)}\`` });
    if (f === undefined) problems.push({ file, line: i + 1, column: cells[0].length + 2, message: `expected a flux in Phi0, found \`${cells[1].trim().slice(0, 30)}\`` });
    if (t !== undefined && f !== undefined) {
      times.push(t);
      fluxes.push(f);
      lineNo.push(i + 1);
    }
    if (problems.length >= 20) break;
  }
  if (problems.length > 0) throw new InputError(problems);
  const traj: Trajectory = { timeNs: Float64Array.from(times), flux: Float64Array.from(fluxes) };
  assertTrajectory(traj, { file, lineOf: (k) => lineNo[k] ?? headerLine + 1 });
  return traj;
}

function parseNumberCell(cell: string): number | undefined {
  const s = cell.trim();
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(s)) return undefined;
  const v = Number(s);
  return Number.isFinite(v) ? v : undefined;
}

/**
 * The CSV form. Numbers are written with 17 significant digits trimmed of trailing zeros
 * (shortest round-trip form), so parsing the file gives back the same samples bit for bit.
 */
export function formatTrajectoryCsv(t: Trajectory, fluxColumn = 'flux_phi0'): string {
  const rows = [`time_ns,${fluxColumn}`];
  for (let k = 0; k < t.timeNs.length; k++) rows.push(`${formatNumber(t.timeNs[k])},${formatNumber(t.flux[k])}`);
  return rows.join('\n') + '\n';
}

function formatNumber(x: number): string {
  // JavaScript's Number -> string is the shortest representation that round-trips.
  return Object.is(x, -0) ? '0' : String(x);
}
