/**
 * `fluxlane simulate LAYOUT --edge A-B [--mover A] --trajectory FILE.csv [--static-flux F]
 * [--levels K] [--spectator ID ...] [--noise] [--json]`: simulate one CZ trajectory of an edge
 * (README physics conventions secs. 2-4 and 6) and report its gate metrics.
 *
 * The trajectory file is the mover's flux against time (header `time_ns,flux`, samples joined
 * piecewise-linearly, first flux = last flux = the parking point). The static qubit sits at
 * --static-flux, else at its layout `park` frequency, else at Phi = 0. Spectators (neighbours of
 * either edge qubit) can be added as third transmons at their park value (else Phi = 0); the
 * metrics are then those of the pair with the spectators in their ground state.
 *
 * JSON (SI: rad, s; flux in Phi0): { edge, mover, staticFlux, duration, levels, conditionalPhase,
 * leakage, fidelity, fidelityNoisy (with --noise), decoherenceEstimate (with --noise), virtualZ: {a, b},
 * M: 4 x 4 of [re, im] (order 00, 01, 10, 11 = |AB>, A the mover, lab frame), populations:
 * {"20", "02"}, steps }.
 */
import { Argument, type Command } from 'commander';
import { z } from 'zod';
import { Transmon } from '../../transmon/transmon.js';
import { buildManifoldFrame } from '../../sim/manifold-frame.js';
import { edgeSimModel, moverEjRange, type EdgeSpectator } from '../../sim/pair-model.js';
import { simulateGate } from '../../sim/simulate-gate.js';
import { trajectoryDuration } from '../../sim/trajectory.js';
import { readTrajectoryFile } from '../../sim/trajectory-file.js';
import { InputError } from '../../util/errors.js';
import { commandAction, type CommandContext } from '../handler.js';
import type { CliIo } from '../io.js';
import type { CommandOutcome } from '../outcome.js';
import { fluxOption, integerOption, MAX_SECONDS_HELP, maxSecondsOption, parseOptions, withCommonOptions } from '../options.js';
import { enforceWork, simulateWork } from '../work-limits.js';
import { FigureGuard } from '../figure-guard.js';
import { defaultFlux, edgeRoles } from './pair.js';
import { findQubit, si } from './spectrum.js';

export const SIMULATE_CLI_DEFAULTS = Object.freeze({ levels: 6 });

const SimulateOptions = z.object({
  edge: z.string({ error: () => 'an edge A-B' }),
  mover: z.string().optional(),
  trajectory: z.string({ error: () => 'a trajectory CSV file' }),
  staticFlux: fluxOption().optional(),
  levels: integerOption(4, 10).optional(),
  spectator: z.array(z.string()).optional(),
  noise: z.boolean().optional(),
  maxSeconds: maxSecondsOption().optional(),
});

export function simulateCommand(ctx: CommandContext, layoutPath: string, raw: Record<string, unknown>): CommandOutcome {
  const o = parseOptions(SimulateOptions, raw);
  const staticFluxOpt = o.staticFlux;
  const layout = ctx.loadLayout(layoutPath);
  const { edge: [la, lb], mover: lm, other: ls, gGHz } = edgeRoles(layout, o.edge, o.mover);
  const traj = ctx.profiler.time('trajectory', () => readTrajectoryFile(ctx.resolvePath(o.trajectory), o.trajectory));
  const levels = o.levels ?? SIMULATE_CLI_DEFAULTS.levels;
  {
    const moverT = Transmon.fromLayout(lm);
    enforceWork(simulateWork(traj.timeNs, traj.flux, (k) => moverT.ejGHz(traj.flux[k]), { levels, noise: !!o.noise, spectators: o.spectator?.length ?? 0, file: o.trajectory }), o.maxSeconds, 'simulate');
  }
  const { mover, partner, spectators } = ctx.profiler.time('transmon', () => {
    const mover = Transmon.fromLayout(lm);
    const partner = Transmon.fromLayout(ls);
    const spectators: EdgeSpectator[] = (o.spectator ?? []).map((id) => {
      const lq = findQubit(layout, id, '--spectator');
      if (id === lm.id || id === ls.id) throw new InputError({ message: `option --spectator: expected a qubit outside the edge, found ${id}` });
      const c = layout.couplings.find((x) => (x.a === id || x.b === id) && (x.a === lm.id || x.b === lm.id || x.a === ls.id || x.b === ls.id));
      if (!c) throw new InputError({ message: `option --spectator: expected a neighbour of ${lm.id} or ${ls.id}, found ${id}` });
      const t = Transmon.fromLayout(lq);
      return { transmon: t, coupledTo: c.a === lm.id || c.b === lm.id ? 'mover' : 'partner', gGHz: c.gGHz, flux: defaultFlux(t, lq) } as EdgeSpectator;
    });
    return { mover, partner, spectators };
  });
  const staticFlux = staticFluxOpt ?? defaultFlux(partner, ls);
  const model = edgeSimModel({
    mover,
    partner,
    gGHz,
    partnerFlux: staticFlux,
    moverLevels: levels,
    partnerLevels: Math.max(3, levels - 2),
    noise: !!o.noise,
    spectators,
  });
  const range = moverEjRange(mover, traj, o.trajectory);
  const frame = ctx.profiler.time('frame', () => buildManifoldFrame(model, { ...range, noiseOperators: !!o.noise }));
  const sim = ctx.profiler.time('simulate', () => simulateGate(frame, traj, { lindblad: !!o.noise }));
  const guard = new FigureGuard(layout);
  const edgeIds: [string, string] = [la.id, lb.id];
  guard.probability(sim.fidelity, 'the coherent fidelity', { edge: edgeIds }, 'the trajectory');
  guard.probability(sim.leakage, 'the leakage', { edge: edgeIds }, 'the trajectory');
  guard.finite(sim.conditionalPhase, 'the conditional phase', { edge: edgeIds });
  if (o.noise && sim.noisy) {
    guard.probability(sim.noisy.fidelity, 'the fidelity with decoherence', { edge: edgeIds }, 'the coherence times against the trajectory');
    guard.probability(sim.decoherenceEstimate, 'the decoherence error estimate', { edge: edgeIds }, 'the coherence times against the trajectory');
  }
  guard.throwIfAny();
  const m = Array.from({ length: 4 }, (_, r) => Array.from({ length: 4 }, (_, c) => [si(sim.m.re[r * 4 + c]), si(sim.m.im[r * 4 + c])]));
  const data: Record<string, unknown> = {
    edge: [la.id, lb.id],
    mover: lm.id,
    staticFlux: si(staticFlux),
    duration: si(trajectoryDuration(traj) * 1e-9),
    levels: { mover: levels, static: Math.max(3, levels - 2) },
    spectators: spectators.map((s) => s.transmon.id),
    conditionalPhase: si(sim.conditionalPhase),
    leakage: si(sim.leakage),
    fidelity: si(sim.fidelity),
    virtualZ: { a: si(sim.virtualZ.a), b: si(sim.virtualZ.b) },
    M: m,
    populations: { '20': si(sim.populations['20']), '02': si(sim.populations['02']) },
    steps: sim.steps,
  };
  if (o.noise && sim.noisy) {
    data.fidelityNoisy = si(sim.noisy.fidelity);
    data.decoherenceEstimate = si(sim.decoherenceEstimate);
  }
  const lines = [
    `${layout.chip}: edge ${la.id}-${lb.id}, mover ${lm.id}, ${ls.id} static at ${staticFlux.toFixed(4)} Phi0`,
    `trajectory ${o.trajectory}: ${traj.timeNs.length} samples, ${trajectoryDuration(traj).toFixed(3)} ns`,
    `conditional phase  ${sim.conditionalPhase.toFixed(6)} rad (${((sim.conditionalPhase * 180) / Math.PI).toFixed(4)} deg)`,
    `leakage            ${sim.leakage.toExponential(3)}   (populations from 11: 20 ${sim.populations['20'].toExponential(3)}, 02 ${sim.populations['02'].toExponential(3)})`,
    `fidelity           ${sim.fidelity.toFixed(8)} (coherent, to CZ after virtual Z)`,
  ];
  if (o.noise && sim.noisy) {
    lines.push(`fidelity (noisy)   ${sim.noisy.fidelity.toFixed(8)} (Lindblad; first-order estimate of the decoherence error ${sim.decoherenceEstimate.toExponential(3)})`);
  }
  lines.push(`virtual Z          a (on ${lm.id}) ${sim.virtualZ.a.toFixed(6)} rad, b (on ${ls.id}) ${sim.virtualZ.b.toFixed(6)} rad (undo with -a, -b)`);
  lines.push('Model estimates: verify on hardware, and respect the flux-line current limits of your wiring.');
  return { data, text: lines.join('\n') + '\n', exitCode: 0 };
}

export function registerSimulate(program: Command, io: CliIo): void {
  withCommonOptions(
    program
      .command('simulate')
      .description('simulate a CZ flux trajectory of an edge: conditional phase, leakage, fidelity (and with --noise the Lindblad fidelity)')
      .addArgument(new Argument('<layout>', 'layout YAML file'))
      .requiredOption('--edge <A-B>', 'the coupled pair, e.g. Q0-Q1 (A is the mover)')
      .option('--mover <id>', 'the qubit that moves (default: A)')
      .requiredOption('--trajectory <file>', 'CSV with header time_ns,flux (the mover flux in Phi0)')
      .option('--static-flux <flux>', 'flux of the static qubit in Phi0 (default: its park frequency, else 0)')
      .option('--levels <k>', `levels of the mover, 4 to 10 (default ${SIMULATE_CLI_DEFAULTS.levels}; the static qubit keeps k - 2)`)
      .option('--spectator <id...>', 'neighbours to simulate as third transmons')
      .option('--noise', 'add decoherence (T1, T_phi from the layout) and report fidelityNoisy')
      .option('--max-seconds <s>', MAX_SECONDS_HELP),
  ).action(commandAction<[string]>(io, (ctx, layout, options) => simulateCommand(ctx, layout, options)));
}
