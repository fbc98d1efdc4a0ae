/**
 * `fluxlane pair LAYOUT --edge A-B [--mover A|B] [--flux-a F] [--flux-b F] [--sweep] [--points N]
 * [--levels K] [--json]`: a coupled pair's dressed levels, static ZZ, exchange coupling and the
 * mover's resonances (README physics conventions secs. 2 and 6).
 *
 * Conventions (README physics conventions sec. 6): A is the mover unless --mover names B (with
 * --plan PLAN.json: the plan's mover); the partner is static. Fluxes default to each qubit's
 * parking in the plan (--plan), else its fixed parking frequency from the layout (`park`), else
 * its upper sweet spot Phi = 0 (the output says which were assumed). `g` is the exchange coupling at the fluxes evaluated.
 * Levels are labelled in edge order |AB> (as written in --edge). Resonance names are
 * (mover, partner) ordered ("11-20": the mover goes to |2>), each the mover's f01 at the bare
 * crossing, null when outside the mover's tunable range. --sweep adds ZZ against the mover's
 * frequency across its range (N points, default 201), partner at its flux.
 *
 * JSON (SI; flux in Phi0): { edge: [A, B], mover, partner, flux: {A, B}, f01: {A, B}, levelCutoff,
 * g, zz, levels: {"00": 0, "01", "10", "11", "20", "02"} (dressed, Hz, relative to dressed 00),
 * resonances: {"01-10", "11-20", "11-02"} (Hz or null), resonanceFlux: {...} (mover flux or null),
 * resonanceCoupling: {...} (Hz or null), sweep?: [ { moverFlux, moverF01, zz, g } ] }.
 */
import { Argument, type Command } from 'commander';
import * as z from 'zod';
import type { ChipLayout, QubitLayout } from '../../layout/types.js';
import { Transmon } from '../../transmon/transmon.js';
import { CoupledPair } from '../../pair/pair.js';
import { pairResonances, RESONANCE_NAMES, type PairResonances } from '../../pair/resonances.js';
import { zzSweep, type ZzSweepPoint } from '../../pair/zz-sweep.js';
import { InputError } from '../../util/errors.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { fluxOption, integerOption, parseOptions, withCommonOptions } from '../options.js';
import { findQubit, si } from './spectrum.js';
import { FigureGuard } from '../figure-guard.js';
import { freq } from '../../plan/format.js';
import { assumedLine, chooseFlux, fluxSourcesJson, fluxText, planEdge, readPlanOption } from '../plan-option.js';

export const PAIR_CLI_DEFAULTS = Object.freeze({ points: 201, levels: 6 });

const PairOptions = z.object({
  edge: z.string({ error: () => 'an edge A-B' }),
  mover: z.string().optional(),
  plan: z.string().optional(),
  fluxA: fluxOption().optional(),
  fluxB: fluxOption().optional(),
  sweep: z.boolean().optional(),
  points: integerOption(2, 10_001).optional(),
  levels: integerOption(4, 12).optional(),
});

/** Split "A-B" into two qubit ids of a coupled pair of the layout (ids may contain '-'). */
export function parseEdge(layout: ChipLayout, text: string): [QubitLayout, QubitLayout, number] {
  const ids = new Set(layout.qubits.map((q) => q.id));
  const splits: [string, string][] = [];
  for (let i = text.indexOf('-'); i >= 0; i = text.indexOf('-', i + 1)) {
    const a = text.slice(0, i);
    const b = text.slice(i + 1);
    if (ids.has(a) && ids.has(b)) splits.push([a, b]);
  }
  const edges = layout.couplings.map((c) => `${c.a}-${c.b}`);
  const shown = edges.length > 12 ? `${edges.slice(0, 12).join(', ')}, ...` : edges.join(', ');
  if (splits.length !== 1) {
    const why = splits.length === 0 ? 'two qubit ids joined by "-"' : 'an unambiguous A-B';
    throw new InputError({ file: layout.file, message: `option --edge: expected ${why}, a coupled pair of ${layout.chip} (${shown}), found ${JSON.stringify(text)}` });
  }
  const [a, b] = splits[0];
  const coupling = layout.couplings.find((c) => (c.a === a && c.b === b) || (c.a === b && c.b === a));
  if (!coupling) {
    throw new InputError({ file: layout.file, message: `option --edge: expected a coupled pair of ${layout.chip} (${shown}), found ${a}-${b}, which are not coupled` });
  }
  return [findQubit(layout, a, '--edge'), findQubit(layout, b, '--edge'), coupling.gGHz];
}

/**
 * The edge's mover and static qubit: `--mover` if given (a qubit of the edge), else the edge's
 * first qubit; with the coupling's g (GHz).
 */
export function edgeRoles(layout: ChipLayout, edgeText: string, moverId: string | undefined): { edge: [QubitLayout, QubitLayout]; mover: QubitLayout; other: QubitLayout; gGHz: number } {
  const [la, lb, gGHz] = parseEdge(layout, edgeText);
  if (moverId !== undefined && moverId !== la.id && moverId !== lb.id) {
    throw new InputError({ message: `option --mover: expected ${la.id} or ${lb.id} (a qubit of the edge), found ${JSON.stringify(moverId)}` });
  }
  const [mover, other] = moverId === undefined || moverId === la.id ? [la, lb] : [lb, la];
  return { edge: [la, lb], mover, other, gGHz };
}

export function pairCommand(ctx: CommandContext, layoutPath: string, raw: Record<string, unknown>): CommandOutcome {
  const o = parseOptions(PairOptions, raw);
  const fluxAOpt = o.fluxA;
  const fluxBOpt = o.fluxB;
  if (o.points !== undefined && !o.sweep) throw new InputError({ message: 'option --points: expected together with --sweep, found it alone' });
  const layout = ctx.loadLayout(layoutPath);
  const [la, lb, gGHz] = parseEdge(layout, o.edge);
  if (o.mover !== undefined && o.mover !== la.id && o.mover !== lb.id) {
    throw new InputError({ message: `option --mover: expected ${la.id} or ${lb.id} (a qubit of the edge), found ${JSON.stringify(o.mover)}` });
  }
  const planOpt = o.plan !== undefined ? ctx.profiler.time('plan', () => readPlanOption(ctx, o.plan!, layout)) : null;
  const fromPlan = planEdge(planOpt, layout, la.id, lb.id);
  const moverId = o.mover ?? fromPlan?.mover;
  const moverIsA = moverId === undefined || moverId === la.id;
  const levels = o.levels ?? PAIR_CLI_DEFAULTS.levels;
  const { qa, qb, pair } = ctx.profiler.time('transmon', () => {
    const qa = Transmon.fromLayout(la, { coherence: { averagingTimeNs: layout.rules.noiseAveragingTimeNs } });
    const qb = Transmon.fromLayout(lb, { coherence: { averagingTimeNs: layout.rules.noiseAveragingTimeNs } });
    return { qa, qb, pair: new CoupledPair(qa, qb, gGHz, { levels }) };
  });
  const choiceA = chooseFlux(qa, la, fluxAOpt, fromPlan?.parkingFlux.get(la.id));
  const choiceB = chooseFlux(qb, lb, fluxBOpt, fromPlan?.parkingFlux.get(lb.id));
  const fluxA = choiceA.flux;
  const fluxB = choiceB.flux;
  const spectrum = ctx.profiler.time('pair', () => pair.spectrum(fluxA, fluxB));
  const [mover, partner, partnerFlux] = moverIsA ? [qa, qb, fluxB] : [qb, qa, fluxA];
  const resonances = ctx.profiler.time('resonances', () => pairResonances(mover, partner, partnerFlux, pair.gChargeGHz));
  const sweep = o.sweep ? ctx.profiler.time('sweep', () => zzSweep(pair, moverIsA ? 'a' : 'b', partnerFlux, { points: o.points ?? PAIR_CLI_DEFAULTS.points })) : undefined;

  const guard = new FigureGuard(layout);
  const edgeIds: [string, string] = [qa.id, qb.id];
  guard.finite(spectrum.zzGHz, 'the static ZZ', { edge: edgeIds });
  for (const [i, j] of [[0, 0], [0, 1], [1, 0], [1, 1], [2, 0], [0, 2]] as const) guard.finite(spectrum.energy(i, j), `the dressed level ${i}${j}`, { edge: edgeIds });
  for (const p of sweep ?? []) guard.finite(p.zzGHz, `the static ZZ at mover flux ${p.moverFlux}`, { edge: edgeIds });
  guard.throwIfAny();
  const e00 = spectrum.energy(0, 0);
  const rel = (i: number, j: number) => si((spectrum.energy(i, j) - e00) * 1e9);
  const f01A = qa.f01(fluxA);
  const f01B = qb.f01(fluxB);
  const data: Record<string, unknown> = {
    edge: [qa.id, qb.id],
    mover: mover.id,
    partner: partner.id,
    flux: { [qa.id]: si(fluxA), [qb.id]: si(fluxB) },
    f01: { [qa.id]: si(f01A * 1e9), [qb.id]: si(f01B * 1e9) },
    levelCutoff: levels,
    g: si(spectrum.gGHz * 1e9),
    zz: si(spectrum.zzGHz * 1e9),
    levels: { '00': 0, '01': rel(0, 1), '10': rel(1, 0), '11': rel(1, 1), '20': rel(2, 0), '02': rel(0, 2) },
    resonances: mapResonances(resonances, (r) => si(r.moverF01GHz * 1e9)),
    resonanceFlux: mapResonances(resonances, (r) => si(r.moverFlux)),
    resonanceCoupling: mapResonances(resonances, (r) => si(r.couplingGHz * 1e9)),
    fluxes: fluxSourcesJson([choiceA, choiceB], si),
  };
  if (planOpt) data.plan = planOpt.file;
  if (sweep) data.sweep = sweep.map((p) => ({ moverFlux: si(p.moverFlux), moverF01: si(p.moverF01GHz * 1e9), zz: si(p.zzGHz * 1e9), g: si(p.gGHz * 1e9) }));
  const sources = [`  fluxes: ${fluxText(choiceA, qa)}; ${fluxText(choiceB, qb)}${planOpt ? ` (plan ${planOpt.file})` : ''}`, ...assumedLine([choiceA, choiceB], planOpt !== null).map((l) => `  ${l}`)];
  const text = pairText(qa, qb, mover, fluxA, fluxB, f01A, f01B, spectrum.gGHz, spectrum.zzGHz, (i, j) => spectrum.energy(i, j) - e00, resonances, sweep).split('\n');
  return { data, text: [text[0], ...sources, ...text.slice(1)].join('\n'), exitCode: 0 };
}

function mapResonances<T>(r: PairResonances, f: (x: NonNullable<PairResonances['01-10']>) => T): Record<string, T | null> {
  const out: Record<string, T | null> = {};
  for (const name of RESONANCE_NAMES) {
    const x = r[name];
    out[name] = x ? f(x) : null;
  }
  return out;
}


function pairText(
  qa: Transmon,
  qb: Transmon,
  mover: Transmon,
  fluxA: number,
  fluxB: number,
  f01A: number,
  f01B: number,
  gGHz: number,
  zzGHz: number,
  level: (i: number, j: number) => number,
  resonances: PairResonances,
  sweep: ZzSweepPoint[] | undefined,
): string {
  const lines = [
    `${qa.id}-${qb.id} (mover ${mover.id}): ${qa.id} at ${fluxA.toFixed(4)} Phi0 (f01 ${f01A.toFixed(6)} GHz), ${qb.id} at ${fluxB.toFixed(4)} Phi0 (f01 ${f01B.toFixed(6)} GHz)`,
    `  g = ${(gGHz * 1e3).toFixed(4)} MHz at these fluxes, static ZZ = ${freq(zzGHz, 4)}`,
    `  dressed levels |${qa.id} ${qb.id}> relative to |00>:`,
  ];
  for (const [i, j] of [[0, 1], [1, 0], [1, 1], [2, 0], [0, 2]] as const) lines.push(`    |${i}${j}>  ${level(i, j).toFixed(6)} GHz`);
  lines.push(`  resonances of the mover ${mover.id} (its f01 at each; names mover-first):`);
  for (const name of RESONANCE_NAMES) {
    const r = resonances[name];
    lines.push(r ? `    ${name}  ${r.moverF01GHz.toFixed(6)} GHz at ${r.moverFlux.toFixed(4)} Phi0, coupling ${(r.couplingGHz * 1e3).toFixed(3)} MHz` : `    ${name}  outside the tunable range (${mover.fMinGHz.toFixed(4)} to ${mover.fMaxGHz.toFixed(4)} GHz)`);
  }
  if (sweep) {
    lines.push(`  ZZ sweep of ${mover.id} (${sweep.length} points):`, `    ${'f01 [GHz]'.padStart(10)} ${'flux [Phi0]'.padStart(11)} ${'ZZ [kHz]'.padStart(14)} ${'g [MHz]'.padStart(9)}`);
    for (const p of sweep) lines.push(`    ${p.moverF01GHz.toFixed(6).padStart(10)} ${p.moverFlux.toFixed(5).padStart(11)} ${(p.zzGHz * 1e6).toFixed(3).padStart(14)} ${(p.gGHz * 1e3).toFixed(4).padStart(9)}`);
  }
  lines.push('Model estimates (n_g = 0, K levels per transmon): verify on hardware.');
  return lines.join('\n');
}

export function registerPair(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('pair')
      .description('a coupled pair: dressed levels, static ZZ, g and the mover resonances (01-10, 11-20, 11-02); --sweep for ZZ across the mover range')
      .addArgument(new Argument('<layout>', 'layout YAML file'))
      .requiredOption('--edge <A-B>', 'the coupled pair, e.g. Q0-Q1 (A is the mover)')
      .option('--plan <file>', 'plan.json of fluxlane plan: mover and both parking fluxes from it (options override)')
      .option('--mover <id>', "the qubit that moves (default: the plan's, else A)")
      .option('--flux-a <flux>', "A's flux in Phi0 (default: its plan parking, else its park frequency, else 0)")
      .option('--flux-b <flux>', "B's flux in Phi0 (default: its plan parking, else its park frequency, else 0)")
      .option('--sweep', "add ZZ against the mover's frequency across its tunable range")
      .option('--points <n>', `points of the sweep (default ${PAIR_CLI_DEFAULTS.points})`)
      .option('--levels <k>', `levels per transmon, 4 to 12 (default ${PAIR_CLI_DEFAULTS.levels})`),
  ).action(commandAction<[string]>(io, (ctx, layout, options) => pairCommand(ctx, layout, options)));
}
