/**
 * `fluxlane gate LAYOUT --edge A-B [--mover A] [--family F] [--ramp T] [--phase THETA]
 * [--crossing 11-20|11-02] [--static-flux F] [--noise] [--waveform FILE.csv] [--json]`:
 * design one edge's CZ pulse (src/gate/design.ts) and print the design.
 *
 * With --plan PLAN.json the mover, the crossing, both parking fluxes, the family, ramp and target
 * phase come from the plan's entry for the edge (options override; the time budget is maxGate less
 * the plan's spectator moves, as in the plan). Without it the mover parks at its layout `park`
 * frequency (else its upper sweet spot, Phi = 0, which the output says was assumed); the static
 * qubit at --static-flux, else its `park`, else its maximum frequency (README physics conventions sec. 6).
 * --waveform writes the designed waveform in the CSV form `fluxlane simulate` reads, so the
 * design can be re-simulated independently (same metrics).
 *
 * JSON (SI: s, Hz, rad; flux in Phi0): { edge, mover, family, rampTime, holdTime, duration,
 * interactionFrequency, crossingOffset, conditionalPhase, leakage, fidelity, fidelityNoisy and
 * budget (with --noise: coherent, t1, whiteDephasing, fluxNoise, fluxNoiseSplit, spectators (with
 * --plan, the plan's spectators where it puts them; else null), spectatorLeakage, spectatorShares,
 * total; src/report/budget-json.ts), virtualZ: {a, b}, speedLimit, untuned: {conditionalPhase, leakage, fidelity},
 * feasible, reason?, crossing, crossingFrequency, gap, populations: {"20", "02"} }.
 */
import { Argument, type Command } from 'commander';
import * as z from 'zod';
import { Transmon } from '../../transmon/transmon.js';
import { designCzGate, DEFAULT_FAMILY, FALLBACK_FAMILY } from '../../gate/design.js';
import { RAMP_FAMILIES } from '../../gate/families/index.js';
import { formatTrajectoryCsv } from '../../sim/trajectory.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { edgeRoles, parseEdge } from './pair.js';
import { si } from './spectrum.js';
import { assumedLine, chooseFlux, fluxSourcesJson, fluxText, planEdge, readPlanOption, spectatorRequest } from '../plan-option.js';
import { spectatorMovesNs } from '../../plan/rules/cz-duration.js';
import { checkOutputFile } from '../output-write.js';
import { FigureGuard, guardDesign } from '../figure-guard.js';
import { designSeconds, enforceWork } from '../work-limits.js';
import { familyOption, fluxOption, MAX_SECONDS_HELP, maxSecondsOption, parseOptions, phaseOption, rampOption, withCommonOptions } from '../options.js';
import { budgetSpectatorList } from '../../plan/budget-spectators.js';
import { designBudgetJson } from '../../report/budget-json.js';
import { budgetLines } from '../budget-lines.js';

const GateOptions = z.object({
  edge: z.string({ error: () => 'an edge A-B' }),
  plan: z.string().optional(),
  spectator: z.array(z.string()).optional(),
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
  const rampOpt = o.ramp;
  const phaseOpt = o.phase;
  const staticFluxOpt = o.staticFlux;
  if (o.waveform !== undefined) checkOutputFile(o.waveform, ctx.io.cwd, '--waveform');
  const layout = ctx.loadLayout(layoutPath);
  const [ea, eb] = parseEdge(layout, o.edge);
  const planOpt = o.plan !== undefined ? ctx.profiler.time('plan', () => readPlanOption(ctx, o.plan!, layout)) : null;
  const fromPlan = planEdge(planOpt, layout, ea.id, eb.id);
  const { edge: [la, lb], mover: lm, other: ls, gGHz } = edgeRoles(layout, o.edge, o.mover ?? fromPlan?.mover);
  // the plan's crossing, family, ramp and phase describe its gate, with its mover
  const samePlanGate = fromPlan !== null && fromPlan.mover === lm.id;
  // a design the plan marks infeasible (the gate stage failed there) names no family or ramp to reuse
  const planDesign = samePlanGate && fromPlan.design?.feasible !== false ? fromPlan.design : null;
  const rampNs = rampOpt ?? planDesign?.rampNs;
  const theta = phaseOpt ?? (samePlanGate ? fromPlan.design?.targetPhase : undefined) ?? Math.PI;
  const crossing = o.crossing ?? (samePlanGate ? fromPlan.crossing : '11-20');
  const family = o.family ?? planDesign?.family;
  // a design without a named family may design the fallback family too
  const seconds = designSeconds(layout.rules, gGHz, { lindblad: !!o.noise }) * (family === undefined ? 2 : 1);
  enforceWork({ seconds, what: `a CZ design of ${la.id}-${lb.id}${o.noise ? ' with Lindblad noise' : ''}` }, o.maxSeconds, 'gate');
  const mover = Transmon.fromLayout(lm, { coherence: { averagingTimeNs: layout.rules.noiseAveragingTimeNs } });
  const partner = Transmon.fromLayout(ls, { coherence: { averagingTimeNs: layout.rules.noiseAveragingTimeNs } });
  const moverChoice = chooseFlux(mover, lm, undefined, fromPlan?.parkingFlux.get(lm.id));
  const partnerChoice = chooseFlux(partner, ls, staticFluxOpt, fromPlan?.parkingFlux.get(ls.id));
  const moverPark = moverChoice.flux;
  const partnerFlux = partnerChoice.flux;
  const spectators = (o.spectator ?? []).map((id) => spectatorRequest(layout, id, lm, ls, fromPlan));
  // a plan that moves spectators for this gate gives the designer its time budget minus their moves
  const moves = samePlanGate ? spectatorMovesNs(fromPlan.moved.length > 0, fromPlan.planRampNs, layout.rules) : 0;
  const rules = moves > 0 ? { ...layout.rules, maxGateNs: layout.rules.maxGateNs - moves } : layout.rules;
  const design = ctx.profiler.time('gate', () =>
    designCzGate({
      mover,
      partner,
      gGHz,
      moverParkFlux: moverPark,
      partnerFlux,
      crossing,
      family, // none: the designer's default family, with its fallback
      rampNs,
      targetPhase: theta,
      rules,
      noise: !!o.noise,
      spectators: spectators.length > 0 ? spectators.map((x) => x.request) : undefined,
      // with the plan's gate: the spectators its budget counts, where the plan puts them
      budgetSpectators: o.noise && samePlanGate
        ? budgetSpectatorList((q: string) => layout.couplings.filter((c) => c.a === q || c.b === q).map((c) => (c.a === q ? c.b : c.a)), lm.id, ls.id, crossing)
            .map((b) => spectatorRequest(layout, b.qubit, lm, ls, fromPlan).request)
        : undefined,
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
    crossing,
    crossingFrequency: si(design.crossingFrequencyGHz * 1e9),
    gap: si(design.gapGHz * 1e9),
    targetPhase: si(theta),
    moverParkFlux: si(moverPark),
    staticFlux: si(partnerFlux),
    populations: { '20': si(design.populations['20']), '02': si(design.populations['02']) },
    fluxes: fluxSourcesJson([moverChoice, partnerChoice, ...spectators.map((x) => x.choice)], si),
    spectators: spectators.map((x) => x.choice.id),
    maxGate: si(rules.maxGateNs * 1e-9),
  };
  if (planOpt) data.plan = planOpt.file;
  if (design.reason) data.reason = design.reason;
  if (design.notes?.length) data.notes = design.notes;
  if (o.noise) {
    data.fidelityNoisy = si(design.fidelityNoisy ?? NaN);
    data.decoherenceEstimate = si(design.decoherenceEstimate ?? NaN);
    data.budget = design.budget ? designBudgetJson(design.budget) : null;
    if (data.budget && !samePlanGate) (data.budget as Record<string, unknown>).spectators = null;
  }
  const files = o.waveform !== undefined && design.feasible ? [{ path: ctx.resolvePath(o.waveform), contents: formatTrajectoryCsv(design.waveform) }] : undefined;
  if (o.waveform !== undefined && !design.feasible) data.waveform = null;
  const f = (x: number, d = 4): string => (Number.isFinite(x) ? x.toFixed(d) : 'n/a');
  const lines = [
    `${layout.chip}: CZ on ${la.id}-${lb.id}, mover ${mover.id}, ${crossing} crossing${planOpt ? ` (plan ${planOpt.file}${samePlanGate ? '' : `, whose mover is ${fromPlan!.mover}: only its parking is used`})` : ''}`,
    `  ${fluxText(moverChoice, mover)}; ${partner.id} static: ${fluxText(partnerChoice, partner)}`,
    ...spectators.map((x) => `  spectator ${fluxText(x.choice, x.request.transmon)}`),
    ...(moves > 0 ? [`  time budget ${f(rules.maxGateNs, 1)} ns: maxGate less ${f(moves, 1)} ns of the plan's spectator moves`] : []),
    ...assumedLine([moverChoice, partnerChoice, ...spectators.map((x) => x.choice)], planOpt !== null).map((l) => `  ${l}`),
    ...(design.notes ?? []).map((n) => `  note: ${n}`),
  ];
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
    if (o.noise && design.budget) lines.push(...budgetLines(design.budget, samePlanGate ? design.budget : null, mover.id, partner.id));
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
      .option('--plan <file>', 'plan.json of fluxlane plan: mover, crossing, both parking fluxes, family, ramp and phase from it (options override)')
      .option('--mover <id>', 'the qubit that moves (default: the plan\'s, else A)')
      .option('--family <name>', `ramp family: ${RAMP_FAMILIES.map((f) => f.name).join(', ')} (default: the plan's, else ${DEFAULT_FAMILY}, with ${FALLBACK_FAMILY} when it leaks above 1e-4)`)
      .option('--ramp <time>', 'ramp time, e.g. "10 ns" (default: the plan\'s design, else per family)')
      .option('--phase <theta>', 'target conditional phase (default: the plan\'s, else pi), e.g. pi/2 or 90 deg')
      .option('--crossing <name>', 'avoided crossing to use: 11-20 (mover to |2>) or 11-02 (default: the plan\'s, else 11-20)')
      .option('--static-flux <flux>', 'flux of the static qubit in Phi0 (default: its plan parking, else its park frequency, else 0)')
      .option('--spectator <id...>', 'neighbours to simulate as third transmons (at their flux during the plan\'s gate)')
      .option('--noise', 'add decoherence and report fidelityNoisy and the error budget (T1, white dephasing, quasi-static flux noise; with --plan the plan\'s spectators)')
      .option('--waveform <file>', 'write the waveform CSV (time_ns,flux_phi0: the flux the mover sees) for fluxlane simulate')
      .option('--max-seconds <s>', MAX_SECONDS_HELP),
  ).action(commandAction<[string]>(io, (ctx, layout, options) => gateCommand(ctx, layout, options)));
}
