#!/usr/bin/env node
/**
 * The fluxlane command line: builds the commander program and adds one command per file of
 * src/cli/commands/. Run as the `fluxlane` bin (dist/cli/main.js) or in-process:
 *
 *   const io = memoryIo();
 *   const code = await runCli(['check', 'layouts/bowline-5.yaml', '--json'], io);  // io.out, io.err
 *
 * Exit codes: 0 fine, 1 a check found violations, 2 bad input or usage, 70 internal error.
 */

import { realpathSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Command, CommanderError } from 'commander';
import { processIo, type CliIo } from './io.js';
import { EXIT, reportError } from './handler.js';
import { packageVersion } from './version.js';
import { tuneV8 } from './v8-tuning.js';
import { exitWhenFlushed } from './exit-when-flushed.js';
import { afterHeldSignals } from './output-write.js';

/** Adds one command to the program; commands print through `io` only. */
export type CommandRegistration = (program: Command, io: CliIo) => void;

/**
 * A command loaded only when it runs: `fluxlane --help` lists its name and summary, and only the
 * command named on the command line imports its module (and with it its stages), so start-up
 * stays short for every command. See DEVELOPERS.md, "How to add a command".
 */
export interface LazyCommand {
  name: string;
  summary: string;
  load: () => Promise<CommandRegistration>;
}

export type CommandEntry = CommandRegistration | LazyCommand;

/** Every command of fluxlane, in the order `--help` lists them. Add new commands here. */
export const COMMANDS: readonly CommandEntry[] = [
  { name: 'check', summary: 'validate a layout and check every collision rule at the best parking (no pulse design)', load: async () => (await import('./commands/check.js')).registerCheck },
  { name: 'generate', summary: 'make a synthetic square or heavy-hex chip layout', load: async () => (await import('./commands/generate.js')).registerGenerate },
  { name: 'spectrum', summary: 'one qubit against flux: f01, f12, anharmonicity, slope, coherence', load: async () => (await import('./commands/spectrum.js')).registerSpectrum },
  { name: 'pair', summary: 'dressed levels, static ZZ and crossings of a coupled pair', load: async () => (await import('./commands/pair.js')).registerPair },
  { name: 'simulate', summary: 'simulate a flux trajectory of an edge and report its gate metrics', load: async () => (await import('./commands/simulate.js')).registerSimulate },
  { name: 'gate', summary: 'design the CZ pulse of one edge', load: async () => (await import('./commands/gate.js')).registerGate },
  { name: 'plan', summary: 'plan parking, interactions, spectator moves, CZ pulses and layers for a chip', load: async () => (await import('./commands/plan.js')).registerPlan },
  { name: 'verify', summary: 'recompute every rule and claim of a plan.json and say whether it holds', load: async () => (await import('./commands/verify.js')).registerVerify },
  { name: 'diff', summary: 'what changed between two plans, and why', load: async () => (await import('./commands/diff.js')).registerDiff },
  { name: 'report', summary: 'draw a plan as one HTML page that opens offline', load: async () => (await import('./commands/report.js')).registerReport },
  { name: 'yield', summary: 'Monte Carlo over fabrication spread: the fraction of chips that work and why the others fail', load: async () => (await import('./commands/yield.js')).registerYield },
  { name: 'yield-merge', summary: 'join the parts of a sharded yield run into one result', load: async () => (await import('./commands/yield-merge.js')).registerYieldMerge },
];

const isLazy = (c: CommandEntry): c is LazyCommand => typeof c !== 'function';

/** The command `argv` runs (its first word; `help NAME` asks about NAME), or undefined. */
export function commandNameOf(argv: readonly string[]): string | undefined {
  const first = argv.find((a) => !a.startsWith('-'));
  if (first === 'help') return argv.slice(argv.indexOf('help') + 1).find((a) => !a.startsWith('-'));
  return first;
}

/**
 * Registrations for one run: the lazy command `argv` names is loaded; every other one is a stub
 * with its name and summary (all `fluxlane --help` shows).
 */
export async function loadCommands(commands: readonly CommandEntry[], argv: readonly string[]): Promise<CommandRegistration[]> {
  const name = commandNameOf(argv);
  return Promise.all(
    commands.map(async (c): Promise<CommandRegistration> => {
      if (!isLazy(c)) return c;
      if (c.name === name) return c.load();
      return (program) => {
        program.command(c.name).description(c.summary);
      };
    }),
  );
}

/**
 * The program, writing to `io`, with the given registrations (`loadCommands(COMMANDS, argv)`
 * gives those of one run). Commands set `io.exitCode`; commander's own exits (help, version,
 * usage errors) are turned into a thrown CommanderError (exitOverride) that runCli maps.
 */
export function buildProgram(io: CliIo = processIo(), commands: readonly CommandRegistration[] = []): Command {
  const program = new Command();
  program
    .name('fluxlane')
    .description('Plan frequencies and CZ gates across a chip of flux-tunable transmons (model estimates: verify on hardware).')
    .version(packageVersion(), '-V, --version')
    .exitOverride()
    .configureOutput({
      writeOut: (text) => io.stdout(text),
      writeErr: (text) => io.stderr(text),
    })
    .showHelpAfterError('(add --help for usage)');
  for (const register of commands) register(program, io);
  return program;
}

/** Parse and run `argv` (without node and script); returns the exit code. Never throws. */
export async function runCli(argv: readonly string[], io: CliIo = processIo(), commands: readonly CommandEntry[] = COMMANDS): Promise<number> {
  io.exitCode = EXIT.ok;
  try {
    await buildProgram(io, await loadCommands(commands, argv)).parseAsync([...argv], { from: 'user' });
  } catch (err) {
    if (err instanceof CommanderError) {
      const fine = err.code === 'commander.helpDisplayed' || err.code === 'commander.version';
      io.exitCode = fine ? EXIT.ok : EXIT.input;
    } else {
      io.exitCode = reportError(io, err, argv.includes('--json'));
    }
  }
  return io.exitCode;
}

function isMainModule(): boolean {
  if (!process.argv[1]) return false;
  try {
    return realpathSync(process.argv[1]) === realpathSync(fileURLToPath(import.meta.url));
  } catch {
    return false;
  }
}

if (isMainModule()) {
  tuneV8();
  process.stdout.on('error', (err: NodeJS.ErrnoException) => {
    if (err.code === 'EPIPE') process.exit(0); // reader went away (e.g. `| head`): stop quietly
  });
  const io = processIo();
  runCli(process.argv.slice(2), io).then((code) => {
    process.exitCode = code;
    // (ends the process once the output is out, without Node's heap teardown
    // (./exit-when-flushed.ts), and after a signal held during the write phase has been acted on)
    afterHeldSignals(() => exitWhenFlushed(code));
  });
}
