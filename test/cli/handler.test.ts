import { describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Command } from 'commander';
import { runFluxlane } from '../support/cli.js';
import { COMMANDS } from '../../src/cli/main.js';
import { commandAction, runCommand, writeOutputFiles } from '../../src/cli/handler.js';
import { memoryIo, type CliIo } from '../../src/cli/io.js';
import { withCommonOptions } from '../../src/cli/options.js';
import { InputError } from '../../src/util/errors.js';

/** A test command whose body is given by the test. */
function testCommand(body: () => unknown) {
  return (program: Command, io: CliIo) => {
    withCommonOptions(program.command('boom').description('test command')).action(
      commandAction<[]>(io, async () => body() as never),
    );
  };
}

describe('the top-level handler', () => {
  it('an internal error prints one line asking for a report and exits 70, no stack trace', async () => {
    const commands = [...COMMANDS, testCommand(() => { throw new TypeError('x is not a function'); })];
    const r = await runFluxlane(['boom'], { commands });
    expect(r.code).toBe(70);
    expect(r.err).toBe('internal error: x is not a function (please report; FLUXLANE_DEBUG=1 shows the stack)\n');
    expect(r.out).toBe('');
  });

  it('FLUXLANE_DEBUG=1 adds the stack', async () => {
    const commands = [...COMMANDS, testCommand(() => { throw new TypeError('x is not a function'); })];
    const r = await runFluxlane(['boom'], { commands, env: { FLUXLANE_DEBUG: '1' } });
    expect(r.code).toBe(70);
    expect(r.err).toMatch(/^internal error: x is not a function .*\nTypeError: x is not a function\n\s+at /);
  });

  it('an InputError prints its diagnostics, one per line, and exits 2', async () => {
    const commands = [...COMMANDS, testCommand(() => {
      throw new InputError([
        { file: 'a.yaml', line: 3, column: 7, path: 'qubits.Q1.t1', message: 'expected a time, found 5 GHz' },
        { message: 'option --x: expected a number, found "y"' },
      ]);
    })];
    const r = await runFluxlane(['boom'], { commands });
    expect(r.code).toBe(2);
    expect(r.err).toBe('a.yaml:3:7: qubits.Q1.t1: expected a time, found 5 GHz\noption --x: expected a number, found "y"\n');
  });

  it('files are written only after the body finished: a failing body leaves no file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-handler-'));
    const io = memoryIo({ cwd: dir });
    const code = await runCommand(io, {}, () => {
      throw new InputError({ message: 'bad' });
    });
    expect(code).toBe(2);
    expect(readdirSync(dir)).toEqual([]);
    const ok = await runCommand(io, {}, () => ({ data: {}, text: 'done', exitCode: 0, files: [{ path: 'x.txt', contents: 'hello' }] }));
    expect(ok).toBe(0);
    expect(readFileSync(join(dir, 'x.txt'), 'utf8')).toBe('hello');
  });

  it('writeOutputFiles replaces an existing file whole and leaves no temporary files when one target fails', () => {
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-handler-'));
    writeFileSync(join(dir, 'keep.txt'), 'old');
    writeFileSync(join(dir, 'afile'), 'not a folder');
    expect(() =>
      writeOutputFiles([{ path: 'keep.txt', contents: 'new' }, { path: 'afile/inside.txt', contents: 'x' }], dir),
    ).toThrow(InputError);
    expect(readFileSync(join(dir, 'keep.txt'), 'utf8')).toBe('old'); // nothing renamed: all or nothing
    expect(readdirSync(dir).sort()).toEqual(['afile', 'keep.txt']);
    writeOutputFiles([{ path: 'keep.txt', contents: 'new' }], dir);
    expect(readFileSync(join(dir, 'keep.txt'), 'utf8')).toBe('new');
  });

  it('exit code 1 from a command outcome passes through, and --json prints the data', async () => {
    const commands = [...COMMANDS, testCommand(() => ({ data: { ok: false, n: 3 }, text: 'failed', exitCode: 1 }))];
    const text = await runFluxlane(['boom'], { commands });
    expect([text.code, text.out]).toEqual([1, 'failed\n']);
    const json = await runFluxlane(['boom', '--json'], { commands });
    expect(json.code).toBe(1);
    expect(json.json()).toEqual({ ok: false, n: 3 });
  });
});

describe('usage', () => {
  it.each([['check'], ['generate']])('%s --help prints usage and exits 0', async (name) => {
    const r = await runFluxlane([name, '--help']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(new RegExp(`^Usage: fluxlane ${name} \\[options\\]`));
    expect(r.out).toMatch(/--json/);
    expect(r.out).toMatch(/--profile/);
  });

  it('every registered command has --help', async () => {
    const root = await runFluxlane(['--help']);
    expect(root.code).toBe(0);
    const names = [...root.out.matchAll(/^ {2}([a-z-]+) /gm)].map((m) => m[1]).filter((n) => n !== 'help');
    expect(names).toEqual(expect.arrayContaining(['check', 'generate']));
    for (const name of names) {
      const r = await runFluxlane([name, '--help']);
      expect(r.code, name).toBe(0);
      expect(r.out, name).toMatch(/--json/);
      expect(r.out, name).toMatch(/--profile/);
    }
  });

  it('an unknown option, a missing argument and an unknown command exit 2 with commander\'s message', async () => {
    const unknown = await runFluxlane(['check', 'layouts/bowline-5.yaml', '--bogus']);
    expect(unknown.code).toBe(2);
    expect(unknown.err).toMatch(/^error: unknown option '--bogus'/);
    const missing = await runFluxlane(['check']);
    expect(missing.code).toBe(2);
    expect(missing.err).toMatch(/^error: missing required argument 'layout'/);
    const command = await runFluxlane(['chek']);
    expect(command.code).toBe(2);
    expect(command.err).toMatch(/error: unknown command 'chek'/);
    expect(command.err).toMatch(/Did you mean check\?/);
  });

  it('--version prints the package version and exits 0', async () => {
    const r = await runFluxlane(['--version']);
    expect(r.code).toBe(0);
    const pkg = JSON.parse(readFileSync('package.json', 'utf8'));
    expect(r.out).toBe(`${pkg.version}\n`);
  });
});
