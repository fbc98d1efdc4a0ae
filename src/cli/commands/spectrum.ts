/**
 * `fluxlane spectrum LAYOUT --qubit Q [--flux F ...] [--points N] [--json]`: one qubit's
 * spectrum against flux (README physics conventions secs. 1 and 4): f01, f12, anharmonicity,
 * df01/dPhi and the coherence times T1, T_phi, T2 at each flux. Without --flux, a sweep of
 * N points (default 51) uniform in flux over the tunable branch 0 <= Phi <= 1/2.
 *
 * JSON (SI units; flux in Phi0): { qubit, ec, ejs, asymmetry, fMax, fMin, anharmonicityAtMax,
 * points: [ { flux, f01, f12, anharmonicity, df01dflux, t1, tphi, t2 } ] } with frequencies in
 * Hz, df01dflux in Hz per Phi0, times in s (tphi null when no dephasing source acts there).
 */
import { Argument, type Command } from 'commander';
import * as z from 'zod';
import type { ChipLayout, QubitLayout } from '../../layout/types.js';
import { roundSignificant } from '../../layout/units.js';
import { Transmon } from '../../transmon/transmon.js';
import { InputError } from '../../util/errors.js';
import { commandAction, type CommandContext } from '../handler.js';
import { FigureGuard } from '../figure-guard.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { FLUX_PHRASE, fluxOption, integerOption, parseFluxText, parseOptions, withCommonOptions } from '../options.js';

export const SPECTRUM_CLI_DEFAULTS = Object.freeze({ points: 51 });

/** Parse one flux value given on the command line (Phi0; optional "Phi0" suffix); see options.ts. */
export function parseFluxValue(text: string, flag: string): number {
  const value = parseFluxText(text);
  if (value === undefined) throw new InputError({ message: `option ${flag}: expected ${FLUX_PHRASE}, found ${JSON.stringify(text)}` });
  return value;
}

/** The layout qubit with this id, or an InputError listing the known ids. */
export function findQubit(layout: ChipLayout, id: string, flag: string): QubitLayout {
  const q = layout.qubits.find((x) => x.id === id);
  if (q) return q;
  const known = layout.qubits.map((x) => x.id);
  const shown = known.length > 12 ? `${known.slice(0, 12).join(', ')}, ...` : known.join(', ');
  throw new InputError({ file: layout.file, message: `option ${flag}: expected a qubit of ${layout.chip} (${shown}), found ${JSON.stringify(id)}` });
}

/** SI number for JSON: 12 significant digits (no float artefacts), null for non-finite. */
export function si(x: number): number | null {
  return Number.isFinite(x) ? roundSignificant(x, 12) : null;
}

const SpectrumOptions = z.object({
  qubit: z.string({ error: () => 'a qubit id' }),
  flux: z.array(fluxOption()).optional(),
  points: integerOption(2, 10_001).optional(),
});

export interface SpectrumRow {
  flux: number;
  f01GHz: number;
  f12GHz: number;
  anharmonicityGHz: number;
  df01dFluxGHz: number;
  t1Ns: number;
  tphiNs: number;
  t2Ns: number;
}

/** Spectrum and coherence of `q` at each flux. */
export function spectrumRows(q: Transmon, fluxes: readonly number[]): SpectrumRow[] {
  return fluxes.map((flux) => {
    const s = q.spectrum(flux);
    const c = q.coherence(flux, s.df01dFluxGHz);
    return {
      flux,
      f01GHz: s.f01GHz,
      f12GHz: s.f12GHz,
      anharmonicityGHz: s.anharmonicityGHz,
      df01dFluxGHz: s.df01dFluxGHz,
      t1Ns: c.t1Ns,
      tphiNs: c.tphiNs,
      t2Ns: c.t2Ns,
    };
  });
}

export function spectrumCommand(ctx: CommandContext, layoutPath: string, raw: Record<string, unknown>): CommandOutcome {
  const o = parseOptions(SpectrumOptions, raw);
  if (o.flux !== undefined && o.points !== undefined) throw new InputError({ message: 'options --flux and --points: expected one of them (fluxes to evaluate, or a sweep of N points), found both' });
  const fluxes = o.flux !== undefined ? o.flux : sweepFluxes(o.points ?? SPECTRUM_CLI_DEFAULTS.points);
  const layout = ctx.loadLayout(layoutPath);
  const qubit = findQubit(layout, o.qubit, '--qubit');
  const q = ctx.profiler.time('transmon', () => Transmon.fromLayout(qubit, { coherence: { averagingTimeNs: layout.rules.noiseAveragingTimeNs } }));
  const rows = ctx.profiler.time('spectrum', () => spectrumRows(q, fluxes));
  const guard = new FigureGuard(layout);
  for (const r of rows) {
    guard.finite(r.f01GHz, `f01 at flux ${r.flux}`, { qubit: q.id });
    guard.finite(r.f12GHz, `f12 at flux ${r.flux}`, { qubit: q.id });
    guard.range(r.t1Ns, 0, Infinity, `T1 at flux ${r.flux} (ns)`, { qubit: q.id }, 'the layout\'s t1');
  }
  guard.throwIfAny();
  const data = {
    qubit: q.id,
    ec: si(q.ecGHz * 1e9),
    ejs: si(q.ejsGHz * 1e9),
    asymmetry: si(q.asymmetry),
    fMax: si(q.fMaxGHz * 1e9),
    fMin: si(q.fMinGHz * 1e9),
    anharmonicityAtMax: si(q.anharmonicityMaxGHz * 1e9),
    points: rows.map((r) => ({
      flux: si(r.flux),
      f01: si(r.f01GHz * 1e9),
      f12: si(r.f12GHz * 1e9),
      anharmonicity: si(r.anharmonicityGHz * 1e9),
      df01dflux: si(r.df01dFluxGHz * 1e9),
      t1: si(r.t1Ns * 1e-9),
      tphi: si(r.tphiNs * 1e-9),
      t2: si(r.t2Ns * 1e-9),
    })),
  };
  return { data, text: spectrumText(q, rows), exitCode: 0 };
}

function sweepFluxes(n: number): number[] {
  return Array.from({ length: n }, (_, i) => (0.5 * i) / (n - 1));
}

function fixed(x: number, digits: number, width: number): string {
  return (Number.isFinite(x) ? x.toFixed(digits) : 'inf').padStart(width);
}

function spectrumText(q: Transmon, rows: readonly SpectrumRow[]): string {
  const lines = [
    `${q.id}: E_C = ${(q.ecGHz * 1e3).toFixed(3)} MHz, E_JS = ${q.ejsGHz.toFixed(4)} GHz, d = ${q.asymmetry.toFixed(4)}; ` +
      `f01 from ${q.fMinGHz.toFixed(4)} GHz (Phi = 1/2) to ${q.fMaxGHz.toFixed(4)} GHz (Phi = 0), alpha at max ${(q.anharmonicityMaxGHz * 1e3).toFixed(2)} MHz`,
    `${'flux [Phi0]'.padStart(11)} ${'f01 [GHz]'.padStart(10)} ${'f12 [GHz]'.padStart(10)} ${'alpha [MHz]'.padStart(11)} ${'df01/dPhi [GHz/Phi0]'.padStart(20)} ${'T_phi [us]'.padStart(10)} ${'T2 [us]'.padStart(9)}`,
  ];
  for (const r of rows) {
    lines.push(
      `${fixed(r.flux, 4, 11)} ${fixed(r.f01GHz, 6, 10)} ${fixed(r.f12GHz, 6, 10)} ${fixed(r.anharmonicityGHz * 1e3, 3, 11)} ${fixed(r.df01dFluxGHz, 4, 20)} ${fixed(r.tphiNs * 1e-3, 2, 10)} ${fixed(r.t2Ns * 1e-3, 2, 9)}`,
    );
  }
  lines.push(`T1 = ${(rows[0]?.t1Ns ?? NaN) * 1e-3} us. Model estimates (n_g = 0, 1/f flux noise to first order): verify on hardware.`);
  return lines.join('\n');
}

export function registerSpectrum(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('spectrum')
      .description('one qubit against flux: f01, f12, anharmonicity, df01/dPhi, T_phi and T2 (default: a sweep over 0 <= Phi <= 1/2)')
      .addArgument(new Argument('<layout>', 'layout YAML file'))
      .requiredOption('--qubit <id>', 'qubit id')
      .option('--flux <flux...>', 'fluxes to evaluate, in Phi0 (-0.5 to 0.5)')
      .option('--points <n>', `points of the default sweep (default ${SPECTRUM_CLI_DEFAULTS.points})`),
  ).action(commandAction<[string]>(io, (ctx, layout, options) => spectrumCommand(ctx, layout, options)));
}
