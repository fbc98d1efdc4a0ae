/**
 * Run fluxlane commands in-process for tests:
 *
 *   const r = await runFluxlane(['check', 'layouts/bowline-5.yaml', '--json']);
 *   expect(r.code).toBe(0); expect(r.json().ok).toBe(true);
 */
import { memoryIo } from '../../src/cli/io.js';
import { runCli, COMMANDS, type CommandEntry } from '../../src/cli/main.js';

export interface CliRun {
  code: number;
  out: string;
  err: string;
  json(): Record<string, any>;
}

export async function runFluxlane(
  argv: string[],
  options: { cwd?: string; env?: Record<string, string>; stderrIsTTY?: boolean; commands?: readonly CommandEntry[] } = {},
): Promise<CliRun> {
  const io = memoryIo({ cwd: options.cwd, env: options.env, stderrIsTTY: options.stderrIsTTY });
  const code = await runCli(argv, io, options.commands ?? COMMANDS);
  return { code, out: io.out, err: io.err, json: () => JSON.parse(io.out) };
}
