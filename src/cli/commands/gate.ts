/**
 * `fluxlane gate LAYOUT --edge A-B [--mover A] [--family F] [--ramp T] [--phase THETA]
 * [--crossing 11-20|11-02] [--static-flux F] [--noise] [--waveform FILE.csv] [--json]`:
 * design one edge's CZ pulse (src/gate/design.ts) and print the design.
 *
 * The mover parks at its layout `park` frequency (else its upper sweet spot, Phi = 0); the static
 * qubit at --static-flux, else its `park`, else its maximum frequency (README physics conventions sec. 6).
 * --waveform writes the designed waveform in the CSV form `fluxlane simulate` reads, so the
 * design can be re-simulated independently (same metrics).
 *
 * JSON (SI: s, Hz, rad; flux in Phi0): { edge, mover, family, rampTime, holdTime, duration,
 * interactionFrequency, crossingOffset, conditionalPhase, leakage, fidelity, fidelityNoisy
 * (with --noise), virtualZ: {a, b}, speedLimit, untuned: {conditionalPhase, leakage, fidelity},
 * feasible, reason?, crossing, crossingFrequency, gap, populations: {"20", "02"} }.
 */
import { Argument, type Command } from 'commander';
import { z } from 'zod';
import { Transmon } from '../../transmon/transmon.js';
import { designCzGate, DEFAULT_FAMILY, FALLBACK_FAMILY } from '../../gate/design.js';
import { RAMP_FAMILIES } from '../../gate/families/index.js';
import { formatTrajectoryCsv } from '../../sim/trajectory.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { checkOutputFile } from '../output-write.js';
import { FigureGuard, guardDesign } from '../figure-guard.js';
import { designSeconds, enforceWork } from '../work-limits.js';
import { familyOption, fluxOption, MAX_SECONDS_HELP, maxSecondsOption, parseOptions, phaseOption, rampOption, withCommonOptions } from '../options.js';
import { defaultFlux, edgeRoles } from './pair.js';
import { si } from './spectrum.js';

const GateOptions = z.object({
  edge: z.string({ error: () => 'an edge A-B' }),
  mover: z.string().optional(),
  family: familyOption(RAMP_FAMILIES.map((f) => f.name)).optional(),
  ramp: rampOption().optional(),
  phase: phaseOption().optional(),
  crossing: z.enum(['11-20', '11-02'], { error: () => '11-20 or 11-02' }).optional(),
  staticFlux: fluxOption().optional(),
  noise: z.boolean().optional(),
  waveform: z.string().min(1, { error: () => 'a file name' }).optional(),
  maxSeconds: maxSecondsOption().optional(),
});

export function gateCommand(ctx: CommandContext, layoutPath: string, raw: Record<string, unknown>): CommandOutcome {
  const o = parseOptions(GateOptions, raw);
  const rampNs = o.ramp;
  const theta = o.phase ?? Math.PI;
  const staticFluxOpt = o.staticFlux;
  if (o.waveform !== undefined) checkOutputFile(o.waveform, ctx.io.cwd, '--waveform');
  const layout = ctx.loadLayout(layoutPath);
  const { edge: [la, lb], mover: lm, other: ls, gGHz } = edgeRoles(layout, o.edge, o.mover);
  // a design without a named family may design the fallback family too
  const seconds = designSeconds(layout.rules, gGHz, { lindblad: !!o.noise }) * (o.family === undefined ? 2 : 1);
  enforceWork({ seconds, what: `a CZ design of ${la.id}-${lb.id}${o.noise ? ' with Lindblad noise' : ''}` }, o.maxSeconds, 'gate');
  const mover = Transmon.fromLayout(lm);
  const partner = Transmon.fromLayout(ls);
  const moverPark = defaultFlux(mover, lm);
  const partnerFlux = staticFluxOpt ?? defaultFlux(partner, ls);
  const design = ctx.profiler.time('gate', () =>
    designCzGate({
      mover,
      partner,
      gGHz,
      moverParkFlux: moverPark,
      partnerFlux,
      crossing: o.crossing ?? '11-20',
      family: o.family, // none: the designer's default family, with its fallback
      rampNs,
      targetPhase: theta,
      rules: layout.rules,
      noise: !!o.noise,
    }),
  );
  const guard = new FigureGuard(layout);
  guardDesign(guard, design, [la.id, lb.id]);
  guard.throwIfAny();
  const data: Record<string, unknown> = {
    edge: [la.id, lb.id],
    mover: design.mover,
    family: design.family,
    rampTime: si(design.rampNs * 1e-9),
    holdTime: si(design.holdNs * 1e-9),
    duration: si(design.durationNs * 1e-9),
    interactionFrequency: si(design.interactionFrequencyGHz * 1e9),
    crossingOffset: si(design.crossingOffsetGHz * 1e9),
    conditionalPhase: si(design.conditionalPhase),
    leakage: si(design.leakage),
    fidelity: si(design.fidelity),
    virtualZ: { a: si(design.virtualZ.a), b: si(design.virtualZ.b) },
    speedLimit: si(design.speedLimitNs * 1e-9),
    untuned: { conditionalPhase: si(design.untuned.conditionalPhase), leakage: si(design.untuned.leakage), fidelity: si(design.untuned.fidelity) },
    feasible: design.feasible,
    crossing: o.crossing ?? '11-20',
    crossingFrequency: si(design.crossingFrequencyGHz * 1e9),
    gap: si(design.gapGHz * 1e9),
    targetPhase: si(theta),
    moverParkFlux: si(moverPark),
    staticFlux: si(partnerFlux),
    populations: { '20': si(design.populations['20']), '02': si(design.populations['02']) },
  };
  if (design.reason) data.reason = design.reason;
  if (o.noise) {
    data.fidelityNoisy = si(design.fidelityNoisy ?? NaN);
    data.decoherenceEstimate = si(design.decoherenceEstimate ?? NaN);
  }
  const files = o.waveform !== undefined && design.feasible ? [{ path: ctx.resolvePath(o.waveform), contents: formatTrajectoryCsv(design.waveform) }] : undefined;
  if (o.waveform !== undefined && !design.feasible) data.waveform = null;
  const f = (x: number, d = 4): string => (Number.isFinite(x) ? x.toFixed(d) : 'n/a');
  const lines = [`${layout.chip}: CZ on ${la.id}-${lb.id}, mover ${mover.id} (park ${f(mover.f01(moverPark), 4)} GHz), ${partner.id} static at ${f(partner.f01(partnerFlux), 4)} GHz, ${o.crossing ?? '11-20'} crossing`];
  if (!design.feasible) {
    lines.push(`no design: ${design.reason}`);
  } else {
    lines.push(
      `family ${design.family}: ramp ${f(design.rampNs, 2)} ns, hold ${f(design.holdNs, 3)} ns, duration ${f(design.durationNs, 3)} ns (speed limit 1/(2 sqrt2 g) = ${f(design.speedLimitNs, 2)} ns)`,
      `destination ${f(design.interactionFrequencyGHz, 5)} GHz, ${f(design.crossingOffsetGHz * 1e3, 3)} MHz from the exact crossing at ${f(design.crossingFrequencyGHz, 5)} GHz (gap ${f(design.gapGHz * 1e3, 2)} MHz)`,
      `conditional phase ${f(design.conditionalPhase, 6)} rad (target ${f(theta, 6)}), leakage ${design.leakage.toExponential(2)}, fidelity ${f(design.fidelity, 6)}` +
        (o.noise ? `, with decoherence ${f(design.fidelityNoisy ?? NaN, 6)}` : ''),
      `virtual Z: a (on ${mover.id}) ${f(design.virtualZ.a, 5)} rad, b (on ${partner.id}) ${f(design.virtualZ.b, 5)} rad (undo with -a, -b)`,
      `untuned (destination at the crossing, hold 1/gap - ramp): phase ${f(design.untuned.conditionalPhase, 4)} rad, leakage ${design.untuned.leakage.toExponential(2)}, fidelity ${f(design.untuned.fidelity, 6)}`,
    );
    if (o.waveform !== undefined) lines.push(`waveform: ${o.waveform} (${design.waveform.timeNs.length} samples at ${layout.rules.sampleRateGHz} GS/s; re-simulate with fluxlane simulate --trajectory)`);
  }
  lines.push('Model estimates: verify on hardware, and respect the flux-line current limits of your wiring.');
  return { data, text: lines.join('\n') + '\n', exitCode: design.feasible ? 0 : 1, files };
}

export function registerGate(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('gate')
      .description('design the CZ pulse of an edge: ramp family, tuned hold and destination, metrics, waveform')
      .addArgument(new Argument('<layout>', 'layout YAML file'))
      .requiredOption('--edge <A-B>', 'the coupled pair, e.g. Q0-Q1 (A is the mover)')
      .option('--mover <id>', 'the qubit that moves (default: A)')
      .option('--family <name>', `ramp family: ${RAMP_FAMILIES.map((f) => f.name).join(', ')} (default ${DEFAULT_FAMILY}, with ${FALLBACK_FAMILY} when it leaks above 1e-4)`)
      .option('--ramp <time>', 'ramp time, e.g. "10 ns" (default per family)')
      .option('--phase <theta>', 'target conditional phase (default pi), e.g. pi/2 or 90 deg')
      .option('--crossing <name>', 'avoided crossing to use: 11-20 (mover to |2>) or 11-02 (default 11-20)')
      .option('--static-flux <flux>', 'flux of the static qubit in Phi0 (default: its park frequency, else 0)')
      .option('--noise', 'add decoherence and report fidelityNoisy')
      .option('--waveform <file>', 'write the waveform CSV (time_ns,flux) for fluxlane simulate')
      .option('--max-seconds <s>', MAX_SECONDS_HELP),
  ).action(commandAction<[string]>(io, (ctx, layout, options) => gateCommand(ctx, layout, options)));
}
