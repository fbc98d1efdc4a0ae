/**
 * `fluxlane simulate LAYOUT --edge A-B [--plan PLAN.json] [--mover A] [--trajectory FILE.csv]
 * [--static-flux F] [--levels K] [--spectator ID ...] [--noise [lindblad|estimate]] [--json]`:
 * simulate one CZ trajectory of an edge (README physics conventions secs. 2-4 and 6) and report
 * its gate metrics.
 *
 * The trajectory file is the mover's flux against time (header `time_ns,flux_phi0` or
 * `time_ns,flux`, samples joined piecewise-linearly, first flux = last flux = the parking point;
 * runs of equal samples are simulated as one exact hold). With --plan the mover, the static
 * qubit's parking, the spectators' fluxes during the gate (their temporary point when the plan
 * moves them), the target phase and, without --trajectory, the plan's own waveform of the gate
 * (waveforms/A-B.qubit.csv) come from the plan; options override. Without a plan the static qubit
 * sits at --static-flux, else at its layout `park` frequency, else at Phi = 0 (said to be
 * assumed). Spectators (neighbours of either edge qubit) are third transmons in their ground
 * state.
 *
 * JSON (SI: rad, s; flux in Phi0): { edge, mover, trajectory, staticFlux, fluxes, targetPhase,
 * duration, levels, conditionalPhase, leakage, fidelity, fidelityNoisy, fidelityNoisyMethod and
 * decoherenceEstimate (with --noise; fidelityNoisy is the Markovian fidelity less the quasi-static
 * flux noise), budget (with --noise: coherent, t1, whiteDephasing, fluxNoise, fluxNoiseSplit,
 * spectators, spectatorLeakage, spectatorShares, total; spectators only with --plan, else null),
 * virtualZ: {a, b}, M: 4 x 4 of [re, im] (order 00, 01, 10,
 * 11 = |AB>, A the mover, lab frame), populations: {"20", "02"}, steps, plan? }.
 */
import { resolve } from 'node:path';
import { Argument, type Command } from 'commander';
import * as z from 'zod';
import { Transmon } from '../../transmon/transmon.js';
import { buildManifoldFrame } from '../../sim/manifold-frame.js';
import { edgeSimModel, moverEjRange, type EdgeSpectator } from '../../sim/pair-model.js';
import { simulateGate } from '../../sim/simulate-gate.js';
import { mergePlateaus, trajectoryDuration } from '../../sim/trajectory.js';
import { readTrajectoryFile } from '../../sim/trajectory-file.js';
import { InputError } from '../../util/errors.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { fluxOption, integerOption, MAX_SECONDS_HELP, maxSecondsOption, parseOptions, withCommonOptions } from '../options.js';
import { enforceWork, simulateWork } from '../work-limits.js';
import { FigureGuard } from '../figure-guard.js';
import { spectatorBudget, waveformNoiseBudget } from '../../budget/waveform-budget.js';
import { budgetLines } from '../budget-lines.js';
import { budgetSpectatorList } from '../../plan/budget-spectators.js';
import { edgeRoles, parseEdge } from './pair.js';
import { si } from './spectrum.js';
import { assumedLine, chooseFlux, fluxSourcesJson, fluxText, planEdge, readPlanOption, spectatorRequest } from '../plan-option.js';

export const SIMULATE_CLI_DEFAULTS = Object.freeze({ levels: 6 });

const SimulateOptions = z.object({
  edge: z.string({ error: () => 'an edge A-B' }),
  mover: z.string().optional(),
  plan: z.string().optional(),
  trajectory: z.string({ error: () => 'a trajectory CSV file' }).optional(),
  staticFlux: fluxOption().optional(),
  levels: integerOption(4, 10).optional(),
  spectator: z.array(z.string()).optional(),
  noise: z.union([z.boolean(), z.enum(['lindblad', 'estimate'])], { error: () => 'lindblad or estimate (or nothing: lindblad)' }).optional(),
  maxSeconds: maxSecondsOption().optional(),
});

export function simulateCommand(ctx: CommandContext, layoutPath: string, raw: Record<string, unknown>): CommandOutcome {
  const o = parseOptions(SimulateOptions, raw);
  const staticFluxOpt = o.staticFlux;
  const layout = ctx.loadLayout(layoutPath);
  const [ea, eb] = parseEdge(layout, o.edge);
  const planOpt = o.plan !== undefined ? ctx.profiler.time('plan', () => readPlanOption(ctx, o.plan!, layout)) : null;
  const fromPlan = planEdge(planOpt, layout, ea.id, eb.id);
  const { edge: [la, lb], mover: lm, other: ls, gGHz } = edgeRoles(layout, o.edge, o.mover ?? fromPlan?.mover);
  const planDesign = fromPlan !== null && fromPlan.mover === lm.id ? fromPlan.design : null;
  // the trajectory: the option's file, else the plan's waveform of this gate
  let trajectoryFile = o.trajectory;
  let trajectoryPath = trajectoryFile !== undefined ? ctx.resolvePath(trajectoryFile) : undefined;
  if (trajectoryFile === undefined) {
    if (!planOpt) throw new InputError({ message: 'option --trajectory: expected a trajectory CSV file (or --plan PLAN.json to simulate the plan\'s own waveform), found nothing' });
    if (!planDesign?.waveform) {
      throw new InputError({ file: planOpt.file, message: `option --trajectory: expected a waveform of ${la.id}-${lb.id} with mover ${lm.id} in the plan, found none (an infeasible edge, a plan made with --no-pulses, or another mover); give --trajectory` });
    }
    trajectoryFile = planDesign.waveform;
    trajectoryPath = resolve(planOpt.dir, planDesign.waveform);
  }
  const file = ctx.profiler.time('trajectory', () => readTrajectoryFile(trajectoryPath!, trajectoryFile!));
  const traj = mergePlateaus(file);
  const levels = o.levels ?? SIMULATE_CLI_DEFAULTS.levels;
  const targetPhase = planDesign?.targetPhase ?? Math.PI;
  const method: 'lindblad' | 'estimate' | null = o.noise === undefined || o.noise === false ? null : o.noise === true ? (planOpt ? (planDesign?.noiseMethod ?? 'lindblad') : 'lindblad') : o.noise;
  {
    const moverT = Transmon.fromLayout(lm);
    enforceWork(simulateWork(traj.timeNs, traj.flux, (k) => moverT.ejGHz(traj.flux[k]), { levels, noise: method !== null, spectators: o.spectator?.length ?? 0, file: trajectoryFile }), o.maxSeconds, 'simulate');
  }
  const { mover, partner, spectators } = ctx.profiler.time('transmon', () => {
    const mover = Transmon.fromLayout(lm, { coherence: { averagingTimeNs: layout.rules.noiseAveragingTimeNs } });
    const partner = Transmon.fromLayout(ls, { coherence: { averagingTimeNs: layout.rules.noiseAveragingTimeNs } });
    const spectators = (o.spectator ?? []).map((id) => spectatorRequest(layout, id, lm, ls, fromPlan));
    return { mover, partner, spectators };
  });
  const staticChoice = chooseFlux(partner, ls, staticFluxOpt, fromPlan?.parkingFlux.get(ls.id));
  const staticFlux = staticChoice.flux;
  const model = edgeSimModel({
    mover,
    partner,
    gGHz,
    partnerFlux: staticFlux,
    moverLevels: levels,
    partnerLevels: Math.max(3, levels - 2),
    noise: method !== null,
    spectators: spectators.map((x) => x.request as EdgeSpectator),
  });
  const range = moverEjRange(mover, traj, trajectoryFile);
  const frame = ctx.profiler.time('frame', () => buildManifoldFrame(model, { ...range, noiseOperators: method !== null }));
  const sim = ctx.profiler.time('simulate', () => simulateGate(frame, traj, { lindblad: method === 'lindblad', targetPhase }));
  const guard = new FigureGuard(layout);
  const edgeIds: [string, string] = [la.id, lb.id];
  guard.probability(sim.fidelity, 'the coherent fidelity', { edge: edgeIds }, 'the trajectory');
  guard.probability(sim.leakage, 'the leakage', { edge: edgeIds }, 'the trajectory');
  guard.finite(sim.conditionalPhase, 'the conditional phase', { edge: edgeIds });
  if (method === 'lindblad' && sim.noisy) guard.probability(sim.noisy.fidelity, 'the fidelity with decoherence', { edge: edgeIds }, 'the coherence times against the trajectory');
  if (method !== null) guard.probability(sim.decoherenceEstimate, 'the decoherence error estimate', { edge: edgeIds }, 'the coherence times against the trajectory');
  guard.throwIfAny();
  const m = Array.from({ length: 4 }, (_, r) => Array.from({ length: 4 }, (_, c) => [si(sim.m.re[r * 4 + c]), si(sim.m.im[r * 4 + c])]));
  const data: Record<string, unknown> = {
    edge: [la.id, lb.id],
    mover: lm.id,
    trajectory: trajectoryFile,
    staticFlux: si(staticFlux),
    fluxes: fluxSourcesJson([staticChoice, ...spectators.map((x) => x.choice)], si),
    targetPhase: si(targetPhase),
    duration: si(trajectoryDuration(traj) * 1e-9),
    levels: { mover: levels, static: Math.max(3, levels - 2) },
    spectators: spectators.map((x) => x.choice.id),
    conditionalPhase: si(sim.conditionalPhase),
    leakage: si(sim.leakage),
    fidelity: si(sim.fidelity),
    virtualZ: { a: si(sim.virtualZ.a), b: si(sim.virtualZ.b) },
    M: m,
    populations: { '20': si(sim.populations['20']), '02': si(sim.populations['02']) },
    steps: sim.steps,
  };
  if (planOpt) data.plan = planOpt.file;
  // the error budget: the gate stage's terms on this waveform, and with --plan the spectators the
  // plan's budget counts (src/plan/budget-spectators.ts) where the plan puts them
  const noise = method !== null
    ? ctx.profiler.time('budget', () => {
        const pair = { mover, partner, gGHz, partnerFlux: staticFlux, traj, targetPhase };
        const nb = waveformNoiseBudget({ ...pair, frame, modelSpectators: spectators.map((x) => x.request as EdgeSpectator), simulation: sim, method });
        if (!fromPlan || fromPlan.mover !== lm.id) return { nb, sb: null };
        const listed = budgetSpectatorList((q: string) => layout.couplings.filter((c) => c.a === q || c.b === q).map((c) => (c.a === q ? c.b : c.a)), lm.id, ls.id, fromPlan.crossing)
          .map((b) => spectatorRequest(layout, b.qubit, lm, ls, fromPlan).request as EdgeSpectator);
        return { nb, sb: spectatorBudget(pair, listed) };
      })
    : null;
  if (method !== null && noise) {
    const { nb, sb } = noise;
    data.fidelityNoisy = si(nb.fidelityNoisy);
    data.fidelityNoisyMethod = method;
    data.decoherenceEstimate = si(sim.decoherenceEstimate);
    const total = nb.coherent + nb.t1 + nb.whiteDephasing + nb.fluxNoise + (sb?.spectators ?? 0);
    data.budget = {
      coherent: si(nb.coherent), t1: si(nb.t1), whiteDephasing: si(nb.whiteDephasing), fluxNoise: si(nb.fluxNoise),
      fluxNoiseSplit: { mover: si(nb.fluxNoiseSplit.mover), partner: si(nb.fluxNoiseSplit.partner), moverSigma: si(nb.fluxNoiseSplit.moverSigma), partnerSigma: si(nb.fluxNoiseSplit.partnerSigma) },
      spectators: sb ? si(sb.spectators) : null,
      spectatorLeakage: sb ? si(sb.spectatorLeakage) : null,
      spectatorShares: sb ? sb.spectatorShares.map((x) => ({ qubit: x.qubit, error: si(x.error), leakage: si(x.leakage), reducedModel: x.reduced === 'none' ? null : x.reduced })) : [],
      total: si(total),
    };
  }
  const lines = [
    `${layout.chip}: edge ${la.id}-${lb.id}, mover ${lm.id} (parks at the trajectory's first sample, ${traj.flux[0].toFixed(4)} Phi0)${planOpt ? `, plan ${planOpt.file}` : ''}`,
    `  ${ls.id} static: ${fluxText(staticChoice, partner)}`,
    ...spectators.map((x) => `  spectator ${fluxText(x.choice, x.request.transmon)}`),
    ...assumedLine([staticChoice, ...spectators.map((x) => x.choice)], planOpt !== null).map((l) => `  ${l}`),
    `trajectory ${trajectoryFile}: ${file.timeNs.length} samples, ${trajectoryDuration(traj).toFixed(3)} ns`,
    `conditional phase  ${sim.conditionalPhase.toFixed(6)} rad (${((sim.conditionalPhase * 180) / Math.PI).toFixed(4)} deg)`,
    `leakage            ${sim.leakage.toExponential(3)}   (populations from 11: 20 ${sim.populations['20'].toExponential(3)}, 02 ${sim.populations['02'].toExponential(3)})`,
    `fidelity           ${sim.fidelity.toFixed(8)} (coherent, to ${Math.abs(targetPhase - Math.PI) < 1e-12 ? 'CZ' : `CPhase(${targetPhase.toFixed(4)})`} after virtual Z)`,
  ];
  if (noise) {
    const { nb, sb } = noise;
    const how = method === 'lindblad' ? 'Lindblad (T1, white dephasing)' : 'coherent fidelity less the first-order T1 and white-dephasing estimate';
    lines.push(`fidelity (noisy)   ${nb.fidelityNoisy.toFixed(8)} (${how}, less the quasi-static flux noise)`);
    lines.push(...budgetLines(nb, sb, lm.id, ls.id));
  }
  lines.push(`virtual Z          a (on ${lm.id}) ${sim.virtualZ.a.toFixed(6)} rad, b (on ${ls.id}) ${sim.virtualZ.b.toFixed(6)} rad (undo with -a, -b)`);
  lines.push('Model estimates: verify on hardware, and respect the flux-line current limits of your wiring.');
  return { data, text: lines.join('\n') + '\n', exitCode: 0 };
}

export function registerSimulate(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('simulate')
      .description('simulate a CZ flux trajectory of an edge: conditional phase, leakage, fidelity (and with --noise the fidelity with decoherence and the error budget)')
      .addArgument(new Argument('<layout>', 'layout YAML file'))
      .requiredOption('--edge <A-B>', 'the coupled pair, e.g. Q0-Q1 (A is the mover)')
      .option('--plan <file>', 'plan.json of fluxlane plan: mover, parking, spectators\' fluxes during the gate, target phase and (without --trajectory) the gate\'s waveform from it')
      .option('--mover <id>', 'the qubit that moves (default: the plan\'s, else A)')
      .option('--trajectory <file>', 'CSV with header time_ns,flux_phi0 (the flux the mover sees; default with --plan: the plan\'s waveforms/A-B.qubit.csv)')
      .option('--static-flux <flux>', 'flux of the static qubit in Phi0 (default: its plan parking, else its park frequency, else 0)')
      .option('--levels <k>', `levels of the mover, 4 to 10 (default ${SIMULATE_CLI_DEFAULTS.levels}; the static qubit keeps k - 2)`)
      .option('--spectator <id...>', 'neighbours to simulate as third transmons (at their flux during the plan\'s gate)')
      .option('--noise [method]', 'add decoherence and the error budget (T1 and white T_phi: lindblad, the default without --plan, or estimate, the first-order estimate; with --plan the plan\'s method; quasi-static 1/f flux noise averaged over offsets; with --plan the plan\'s spectators)')
      .option('--max-seconds <s>', MAX_SECONDS_HELP),
  ).action(commandAction<[string]>(io, (ctx, layout, options) => simulateCommand(ctx, layout, options)));
}
