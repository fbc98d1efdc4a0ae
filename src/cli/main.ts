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

import { readFileSync, realpathSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Command, CommanderError } from 'commander';
import { processIo, type CliIo } from './io.js';
import { EXIT, reportError } from './handler.js';
import { registerCheck } from './commands/check.js';
import { registerGenerate } from './commands/generate.js';
import { registerPair } from './commands/pair.js';
import { registerSimulate } from './commands/simulate.js';
import { registerGate } from './commands/gate.js';
import { registerSpectrum } from './commands/spectrum.js';
import { registerPlan } from './commands/plan.js';
import { registerVerify } from './commands/verify.js';
import { registerReport } from './commands/report.js';
import { registerDiff } from './commands/diff.js';

/** Adds one command to the program; commands print through `io` only. */
export type CommandRegistration = (program: Command, io: CliIo) => void;

/** Every command of fluxlane, in the order `--help` lists them. Add new commands here. */
export const COMMANDS: readonly CommandRegistration[] = [registerCheck, registerGenerate, registerSpectrum, registerPair, registerSimulate, registerGate, registerPlan, registerVerify, registerDiff,
  registerReport,
];

function packageVersion(): string {
  try {
    const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version?: string };
    return pkg.version ?? '0.0.0';
  } catch {
    return '0.0.0';
  }
}

/**
 * The program, writing to `io`. Commands set `io.exitCode`; commander's own exits (help,
 * version, usage errors) are turned into a thrown CommanderError (exitOverride) that runCli maps.
 */
export function buildProgram(io: CliIo = processIo(), commands: readonly CommandRegistration[] = COMMANDS): Command {
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
export async function runCli(argv: readonly string[], io: CliIo = processIo(), commands: readonly CommandRegistration[] = COMMANDS): Promise<number> {
  io.exitCode = EXIT.ok;
  try {
    await buildProgram(io, commands).parseAsync([...argv], { from: 'user' });
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
  process.stdout.on('error', (err: NodeJS.ErrnoException) => {
    if (err.code === 'EPIPE') process.exit(0); // reader went away (e.g. `| head`): stop quietly
  });
  const io = processIo();
  runCli(process.argv.slice(2), io).then((code) => {
    process.exitCode = code;
  });
}
