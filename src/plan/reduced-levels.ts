/**
 * The planner's QubitTables filled from the reduced spectrum (src/transmon/reduced-spectrum.ts)
 * instead of an eigen solve per grid point: E_k - E_0 = E_C e_k(E_J / E_C), slopes e_k'(r) and
 * the matrix elements, all from the one table (built once per process, ~40 ms). A chip's tables
 * then cost ~10 us per qubit instead of ~0.5 ms (the spectra stage of a 1,024-qubit check: 0.5 s
 * -> 0.05 s; each re-planned chip of a yield study); the grid values agree with the exact eigen
 * solves to ~1e-10 relative, far inside the tables' own interpolation error of ~1e-7 GHz
 * (test/plan/reduced-levels.test.ts).
 */
import { QUBIT_TABLE_DEFAULTS, QubitTable, type LevelPoint, type LevelSource, type QubitTableOptions } from './qubit-table.js';
import { emptyReducedState, type ReducedSpectrum } from '../transmon/reduced-spectrum.js';
import type { Transmon } from '../transmon/transmon.js';

export function reducedLevelSource(table: ReducedSpectrum): LevelSource {
  const st = emptyReducedState();
  return (ecGHz: number, ejGHz: number, _nCut: number, out: LevelPoint) => {
    const r = ejGHz / ecGHz;
    table.at(r, st);
    out.levels[0] = ecGHz * st.e1;
    out.levels[1] = ecGHz * st.e2;
    out.levels[2] = ecGHz * st.e3;
    out.levels[3] = ecGHz * st.e4;
    out.levels[4] = ecGHz * st.e5;
    table.levelSlopes(r, out.slopes);
    out.n01 = st.n01;
    out.n03 = st.n03;
    out.n12 = st.n12;
    out.n23 = st.n23;
    out.n05 = st.n05;
    out.n14 = st.n14;
  };
}

/**
 * A QubitTable of `transmon` from the reduced spectrum; from exact eigen solves when the
 * transmon's planning range leaves the table (E_J/E_C beyond its ends: far outside the accepted
 * transmons, reachable only by extreme draws).
 */
export function reducedQubitTable(transmon: Transmon, table: ReducedSpectrum, options: Partial<QubitTableOptions> = {}): QubitTable {
  const o = { ...QUBIT_TABLE_DEFAULTS, ...options };
  const rTop = transmon.ejsGHz / transmon.ecGHz;
  const rLow = Math.min(1, Math.max(transmon.asymmetry, o.minEjOverEc / rTop)) * rTop;
  if (!table.covers(rTop) || !table.covers(rLow)) return new QubitTable(transmon, options);
  return new QubitTable(transmon, options, reducedLevelSource(table));
}

