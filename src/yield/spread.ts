/**
 * The fabrication spread a yield study draws chips from (relative, 1 sigma, Gaussian):
 *
 *   rn  each junction's normal-state resistance R_n. E_J = h Delta / (8 e^2 R_n) by
 *       Ambegaokar-Baratoff (src/transmon/ambegaokar-baratoff.ts), so E_J,k = E_J,k0 / (1 + s_rn z_k)
 *       for the two junctions k = 1, 2 of each SQUID, drawn apart: E_JS and the asymmetry d both
 *       move. Common practice: 2-4 % before any post-fabrication trimming, below 1 % after (from
 *       memory); the layout rule `resistanceSpread` (default 2 %) is the default.
 *   ec  the shunt capacitance C, E_C = e^2 / 2C: E_C = E_C0 / (1 + s_ec z).
 *   g   the coupling capacitance C_g: the charge coupling G of G n_A n_B is proportional to
 *       C_g E_C,A E_C,B, so G = G0 (1 + s_g z) (E_C,A / E_C,A0) (E_C,B / E_C,B0); g at any flux
 *       follows from G and the drawn transmons' charge matrix elements (README physics conventions sec. 2).
 *
 * A qubit's `spread: { rn, ec }` in the layout (measured on that qubit's test structures)
 * replaces the command's values for that qubit.
 */
import type { ChipLayout } from '../layout/types.js';
import { InputError } from '../util/errors.js';

export interface FabricationSpread {
  /** Relative 1-sigma spread of each junction's R_n. */
  rn: number;
  /** Relative 1-sigma spread of each qubit's shunt capacitance (E_C). */
  ec: number;
  /** Relative 1-sigma spread of each coupling capacitance. */
  g: number;
}

/** Largest spread a command accepts (the draws stay positive: |z| <= 6 keeps 1 + s z >= 0.4). */
export const MAX_SPREAD = 0.1;

export const SPREAD_DEFAULTS: Readonly<Omit<FabricationSpread, 'rn'>> = Object.freeze({ ec: 0.01, g: 0.03 });

/** Per-qubit spreads: the layout's measured values where given, else the command's. */
export interface QubitSpreads {
  rn: Float64Array;
  ec: Float64Array;
  /** Qubits whose rn / ec came from the layout. */
  measured: { rn: string[]; ec: string[] };
}

export function qubitSpreads(layout: ChipLayout, spread: FabricationSpread, options: { ignoreMeasuredRn?: boolean } = {}): QubitSpreads {
  const n = layout.qubits.length;
  const rn = new Float64Array(n);
  const ec = new Float64Array(n);
  const measured = { rn: [] as string[], ec: [] as string[] };
  layout.qubits.forEach((q, i) => {
    const own = q.spread;
    if (own?.rn !== undefined && !options.ignoreMeasuredRn) {
      rn[i] = own.rn;
      measured.rn.push(q.id);
    } else rn[i] = spread.rn;
    if (own?.ec !== undefined) {
      ec[i] = own.ec;
      measured.ec.push(q.id);
    } else ec[i] = spread.ec;
  });
  return { rn, ec, measured };
}

/**
 * A relative spread from the command line: "2%", "2 %", "0.5%" or a plain fraction "0.02";
 * at most MAX_SPREAD. InputError naming the option otherwise.
 */
export function parseSpread(text: string, flag: string): number {
  const m = /^\s*(\d+(?:\.\d*)?|\.\d+)\s*(%?)\s*$/.exec(text);
  const value = m ? Number(m[1]) / (m[2] === '%' ? 100 : 1) : NaN;
  if (!(value >= 0 && value <= MAX_SPREAD)) {
    throw new InputError({ message: `option ${flag}: expected a relative spread from 0 to ${MAX_SPREAD * 100}% (e.g. "2%" or 0.02), found ${JSON.stringify(text)}` });
  }
  return roundFraction(value);
}

/** A comma-separated list of spreads (--sweep-spread 0.5%,1%,2%,4%), each distinct, 1 to 16 values. */
export function parseSpreadList(text: string, flag: string): number[] {
  const parts = text.split(',').map((s) => s.trim()).filter((s) => s !== '');
  if (parts.length === 0 || parts.length > 16) {
    throw new InputError({ message: `option ${flag}: expected 1 to 16 spreads separated by commas (e.g. 0.5%,1%,2%,4%), found ${JSON.stringify(text)}` });
  }
  const values = parts.map((p) => parseSpread(p, flag));
  if (new Set(values).size !== values.length) throw new InputError({ message: `option ${flag}: expected distinct spreads, found ${JSON.stringify(text)}` });
  return values;
}

/** 0.5 / 100 is 0.005000000000000001 in floating point; keep 12 significant digits. */
function roundFraction(x: number): number {
  return x === 0 ? 0 : Number(x.toPrecision(12));
}
