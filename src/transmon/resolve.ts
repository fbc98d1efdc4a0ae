/**
 * Convert every way a layout gives a transmon (src/layout/types.ts TransmonSpec) into circuit
 * parameters (E_C, E_JS, d) (README physics conventions sec. 1).
 *
 * - `energies`: (E_C, E_JS = ejMax, d) directly.
 * - `frequencies`: (f_max, alpha at f_max, d or f_min), solved on the EXACT charge-basis spectrum.
 *   The levels are homogeneous of degree one in (E_C, E_J) (H scales with them), so
 *   f01 = E_C F(r) and alpha = E_C A(r) with r = E_J / E_C, and the 2-D problem
 *   {f01(E_C, E_JS) = f_max, alpha(E_C, E_JS) = alpha} reduces exactly to the 1-D root
 *   A(r) / F(r) = alpha / f_max (monotone in r, checked for 0.5 <= r <= 2000), solved by
 *   safeguarded Newton with Hellmann-Feynman slopes from the asymptotic start
 *   r0 from alpha ~ -E_C, f ~ sqrt(8 E_J E_C) - E_C (Koch et al. 2007); then E_C = f_max / F(r).
 *   The round trip reproduces (f_max, alpha) to ~1e-12 GHz (far inside the required 1 kHz).
 *   f_min fixes d: E_J(1/2) = d E_JS is the E_J at which f01 = f_min.
 * - `resistance`: Ambegaokar-Baratoff (src/transmon/ambegaokar-baratoff.ts). A single R_n is the
 *   SQUID's total normal-state resistance (junctions in parallel, so E_JS = E_J(R_n)) with the
 *   given asymmetry; a pair [R1, R2] gives E_J1, E_J2, so E_JS = E_J1 + E_J2 and
 *   d = |E_J1 - E_J2| / E_JS.
 *
 * Physical limits (InputError naming the qubit and its place in the layout file):
 * E_JS / E_C must lie in [20, 2000]. Below 20 the device is not a transmon (Koch 2007: the charge
 * dispersion of f01 grows past ~1% of E_C and results at n_g = 0 stop representing the device);
 * above 2000 it is outside the range our charge cutoff is validated for. Asymmetry in [0, 1);
 * f_min below f_max and reachable (f01 >= 4 E_C at E_J = 0, the lowest any asymmetry gives);
 * anharmonicity negative; resistances positive.
 */
import type { SourceRef, TransmonSpec } from '../layout/types.js';
import { InputError } from '../util/errors.js';
import { bracketedNewton } from '../linalg/bracketed-root.js';
import { AMBEGAOKAR_BARATOFF_DEFAULTS, josephsonEnergyFromResistance } from './ambegaokar-baratoff.js';
import { josephsonEnergyForFrequency } from './flux-for-frequency.js';
import { chargeCutoffFor } from './charge-cutoff.js';
import { lowestLevels } from './level-memo.js';
import type { TransmonParams } from './spectrum.js';

export interface ResolveOptions {
  /** Superconducting gap for Ambegaokar-Baratoff (micro-eV). */
  gapUeV?: number;
  /** Smallest E_JS / E_C accepted. */
  minEjOverEc?: number;
  /** Largest E_JS / E_C accepted. */
  maxEjOverEc?: number;
}

export const RESOLVE_DEFAULTS = Object.freeze({
  gapUeV: AMBEGAOKAR_BARATOFF_DEFAULTS.gapUeV,
  minEjOverEc: 20,
  maxEjOverEc: 2000,
});

/** Search range of r = E_J / E_C for the (f_max, alpha) inversion (wider than the accepted range, for messages). */
const SEARCH_R: readonly [number, number] = [0.5, 2000];

export function resolveTransmon(spec: TransmonSpec, qubitId: string, source?: SourceRef, options: ResolveOptions = {}): TransmonParams {
  const o: Required<ResolveOptions> = { ...RESOLVE_DEFAULTS, ...options };
  const fail = (message: string): never => {
    throw new InputError({
      ...(source ? { file: source.file, line: source.line, column: source.column, path: source.path } : {}),
      message: `qubit ${qubitId}: ${message}`,
    });
  };
  const checkAsymmetry = (d: number | undefined): number => {
    const x = d ?? 0;
    if (!(x >= 0 && x < 1)) fail(`expected a SQUID asymmetry d in [0, 1), found ${x}`);
    return x;
  };
  const checkRatio = (ec: number, ejs: number, what: string): void => {
    const r = ejs / ec;
    if (r < o.minEjOverEc) fail(`${what} gives E_JS/E_C = ${fmt(r)}, below the transmon limit ${o.minEjOverEc} (E_C = ${fmt(ec)} GHz, E_JS = ${fmt(ejs)} GHz)`);
    if (r > o.maxEjOverEc) fail(`${what} gives E_JS/E_C = ${fmt(r)}, above the supported ${o.maxEjOverEc} (E_C = ${fmt(ec)} GHz, E_JS = ${fmt(ejs)} GHz)`);
  };

  switch (spec.kind) {
    case 'energies': {
      if (!(spec.ecGHz > 0)) fail(`expected a positive charging energy ec, found ${spec.ecGHz} GHz`);
      if (!(spec.ejMaxGHz > 0)) fail(`expected a positive ejMax, found ${spec.ejMaxGHz} GHz`);
      const d = checkAsymmetry(spec.asymmetry);
      checkRatio(spec.ecGHz, spec.ejMaxGHz, 'ec and ejMax');
      return { ecGHz: spec.ecGHz, ejsGHz: spec.ejMaxGHz, asymmetry: d };
    }
    case 'resistance': {
      if (!(spec.ecGHz > 0)) fail(`expected a positive charging energy ec, found ${spec.ecGHz} GHz`);
      let ejs: number;
      let d: number;
      if (Array.isArray(spec.rnKOhm)) {
        const [r1, r2] = spec.rnKOhm;
        if (!(r1 > 0) || !(r2 > 0)) fail(`expected positive junction resistances rn, found [${r1}, ${r2}] kOhm`);
        if (spec.asymmetry !== undefined) fail('expected no asymmetry with two junction resistances (it follows from them)');
        const ej1 = josephsonEnergyFromResistance(r1, o.gapUeV);
        const ej2 = josephsonEnergyFromResistance(r2, o.gapUeV);
        ejs = ej1 + ej2;
        d = Math.abs(ej1 - ej2) / ejs;
      } else {
        const rn = spec.rnKOhm;
        if (!(rn > 0)) fail(`expected a positive normal-state resistance rn, found ${rn} kOhm`);
        ejs = josephsonEnergyFromResistance(rn, o.gapUeV);
        d = checkAsymmetry(spec.asymmetry);
      }
      checkRatio(spec.ecGHz, ejs, 'ec and rn (Ambegaokar-Baratoff)');
      return { ecGHz: spec.ecGHz, ejsGHz: ejs, asymmetry: d };
    }
    case 'frequencies': {
      const fMax = spec.fMaxGHz;
      const alpha = spec.anharmonicityGHz;
      if (!(fMax > 0)) fail(`expected a positive fMax, found ${fMax} GHz`);
      if (!(alpha < 0)) fail(`expected a negative anharmonicity (a transmon's f12 lies below f01), found ${alpha} GHz`);
      if (spec.asymmetry !== undefined && spec.fMinGHz !== undefined) fail('expected asymmetry or fMin, found both');
      const { ecGHz, ejsGHz, r } = solveFromFrequencies(fMax, alpha, fail, o);
      if (r < o.minEjOverEc || r > o.maxEjOverEc) checkRatio(ecGHz, ejsGHz, `fMax = ${fmt(fMax)} GHz with anharmonicity ${fmt(alpha)} GHz`);
      let d: number;
      if (spec.fMinGHz !== undefined) {
        const fMin = spec.fMinGHz;
        if (!(fMin > 0 && fMin < fMax)) fail(`expected 0 < fMin < fMax = ${fmt(fMax)} GHz, found fMin = ${fmt(fMin)} GHz`);
        const floor = 4 * ecGHz;
        if (fMin < floor) fail(`fMin = ${fmt(fMin)} GHz is unreachable: with E_C = ${fmt(ecGHz)} GHz f01 never falls below 4 E_C = ${fmt(floor)} GHz, whatever the asymmetry`);
        const ejMin = josephsonEnergyForFrequency({ ecGHz, ejsGHz, asymmetry: 0 }, fMin, { chargeCutoff: chargeCutoffFor(r) });
        if (!Number.isFinite(ejMin)) fail(`fMin = ${fmt(fMin)} GHz cannot be reached by tuning`);
        d = ejMin / ejsGHz;
      } else {
        d = checkAsymmetry(spec.asymmetry);
      }
      return { ecGHz, ejsGHz, asymmetry: d };
    }
  }
}

/** Solve f01(E_C, E_J) = fMax, alpha(E_C, E_J) = alpha on the exact spectrum (see banner). */
function solveFromFrequencies(
  fMax: number,
  alpha: number,
  fail: (m: string) => never,
  o: Required<ResolveOptions>,
): { ecGHz: number; ejsGHz: number; r: number } {
  const target = alpha / fMax;
  const nCut = chargeCutoffFor(SEARCH_R[1]);
  const ratio = (r: number, slope?: { value: number }): number => {
    const L = lowestLevels(1, r, nCut, 3, slope !== undefined);
    const f = L.e1 - L.e0;
    const a = L.e2 - 2 * L.e1 + L.e0;
    if (slope) {
      const c0 = L.c0;
      const c1 = L.c1;
      const c2 = L.c2;
      const df = c0 - c1;
      const da = -(c2 - 2 * c1 + c0);
      slope.value = (da * f - a * df) / (f * f);
    }
    return a / f;
  };
  const lowest = ratio(SEARCH_R[0]);
  const highest = ratio(SEARCH_R[1]);
  if (target <= lowest) {
    fail(`anharmonicity ${fmt(alpha)} GHz is too large for fMax = ${fmt(fMax)} GHz: no transmon (E_J/E_C >= ${o.minEjOverEc}) has |alpha|/f01 above ${fmt(-ratio(o.minEjOverEc))}`);
  }
  if (target >= highest) {
    fail(`anharmonicity ${fmt(alpha)} GHz is too small for fMax = ${fmt(fMax)} GHz: it needs E_J/E_C above the supported ${o.maxEjOverEc}`);
  }
  // Asymptotic start: alpha ~ -E_C, fMax ~ sqrt(8 r) E_C - E_C  =>  r0 = (fMax/|alpha| + 1)^2 / 8.
  const r0 = (fMax / -alpha + 1) ** 2 / 8;
  const r = bracketedNewton((x, slope) => ratio(x, slope) - target, SEARCH_R[0], SEARCH_R[1], {
    guess: Math.min(Math.max(r0, SEARCH_R[0] * 1.01), SEARCH_R[1] * 0.99),
    xTol: 1e-13 * SEARCH_R[1],
    fTol: 1e-15,
  });
  const L = lowestLevels(1, r, nCut, 2, false);
  const ec = fMax / (L.e1 - L.e0);
  return { ecGHz: ec, ejsGHz: r * ec, r };
}

function fmt(x: number): string {
  return String(+x.toPrecision(6));
}
