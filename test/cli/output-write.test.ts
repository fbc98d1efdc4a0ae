/**
 * Writing outputs (src/cli/output-write.ts): folders made one level at a time (a recursive mkdir
 * never returned for /proc/x/y), what may be replaced, the folder swap, and the clean-up of what
 * a killed run left (the interrupts themselves: test/cli/interrupt.test.ts).
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { checkOutputFolder, cleanStaleSiblings, folderState, makeDirs, OUTPUT_MARKER, writeOutputFolder } from '../../src/cli/output-write.js';
import { InputError } from '../../src/util/errors.js';

const tmp = () => mkdtempSync(join(tmpdir(), 'fluxlane-write-'));

/** A process id that is surely not running (a child that has exited). */
function deadPid(): number {
  return spawnSync(process.execPath, ['-e', '0']).pid!;
}

describe('output writing', () => {
  it('makeDirs makes missing folders one level at a time and refuses /proc/x/y at once', () => {
    const dir = tmp();
    makeDirs(join(dir, 'a/b/c'), 'a/b/c');
    expect(existsSync(join(dir, 'a/b/c'))).toBe(true);
    const started = Date.now();
    expect(() => makeDirs('/proc/x/y', '/proc/x/y')).toThrow(InputError);
    expect(Date.now() - started).toBeLessThan(1000);
    writeFileSync(join(dir, 'f'), 'x');
    expect(() => makeDirs(join(dir, 'f/g'), 'f/g')).toThrow(/a file where a folder should be/);
  });

  it('folderState tells missing, empty, fluxlane (marker, or an earlier plan.json), foreign and file apart', () => {
    const dir = tmp();
    expect(folderState(join(dir, 'none'))).toBe('absent');
    mkdirSync(join(dir, 'empty'));
    expect(folderState(join(dir, 'empty'))).toBe('empty');
    mkdirSync(join(dir, 'marked'));
    writeFileSync(join(dir, 'marked', OUTPUT_MARKER), '{}');
    expect(folderState(join(dir, 'marked'))).toBe('fluxlane');
    mkdirSync(join(dir, 'old'));
    writeFileSync(join(dir, 'old/plan.json'), '{\n  "format": "fluxlane-plan",\n  "version": 1\n}\n');
    expect(folderState(join(dir, 'old'))).toBe('fluxlane');
    mkdirSync(join(dir, 'foreign'));
    writeFileSync(join(dir, 'foreign/plan.json'), '{"format": "other"}');
    expect(folderState(join(dir, 'foreign'))).toBe('foreign');
    expect(folderState(join(dir, 'old/plan.json'))).toBe('file');
    expect(() => checkOutputFolder('foreign', dir, false)).toThrow(/add --force to replace it/);
    expect(() => checkOutputFolder('foreign', dir, true)).not.toThrow();
    expect(() => checkOutputFolder('old/plan.json', dir, true)).toThrow(/expected a folder, found a file/);
    // never the current folder, one above it, or one holding an input, even with --force
    expect(() => checkOutputFolder('.', join(dir, 'foreign'), true)).toThrow(/found the current folder or one above it/);
    expect(() => checkOutputFolder('..', join(dir, 'foreign'), true)).toThrow(/found the current folder or one above it/);
    expect(() => checkOutputFolder('foreign', dir, true, '--output-dir', ['foreign/chip.yaml'])).toThrow(/found foreign\/chip\.yaml inside it/);
  });

  it('writeOutputFolder replaces a fluxlane folder whole (files of the old one gone) and leaves nothing beside it', () => {
    const dir = tmp();
    writeOutputFolder({ path: 'out', command: 'plan', files: [{ path: 'plan.json', contents: 'old' }, { path: 'waveforms/A-B.csv', contents: 'w' }] }, dir);
    writeOutputFolder({ path: 'out', command: 'plan', files: [{ path: 'plan.json', contents: 'new' }] }, dir);
    expect(readdirSync(join(dir, 'out')).sort()).toEqual([OUTPUT_MARKER, 'plan.json']);
    expect(readFileSync(join(dir, 'out/plan.json'), 'utf8')).toBe('new');
    expect(JSON.parse(readFileSync(join(dir, 'out', OUTPUT_MARKER), 'utf8')).command).toBe('plan');
    expect(readdirSync(dir)).toEqual(['out']);
  });

  it('a failure while writing leaves the old folder as it was and no temporary folder', () => {
    const dir = tmp();
    writeOutputFolder({ path: 'out', command: 'plan', files: [{ path: 'plan.json', contents: 'old' }] }, dir);
    // a file path that cannot be made: "plan.json/x" below a file
    expect(() => writeOutputFolder({ path: 'out', command: 'plan', files: [{ path: 'plan.json', contents: 'new' }, { path: 'plan.json/x', contents: 'x' }] }, dir)).toThrow(InputError);
    expect(readFileSync(join(dir, 'out/plan.json'), 'utf8')).toBe('old');
    expect(readdirSync(dir)).toEqual(['out']);
  });

  it('cleanStaleSiblings removes what a dead process left and puts a renamed-away folder back', () => {
    const dir = tmp();
    const dead = deadPid();
    mkdirSync(join(dir, `.out.fluxlane-old-${dead}-0123abcd`));
    writeFileSync(join(dir, `.out.fluxlane-old-${dead}-0123abcd/plan.json`), 'old');
    mkdirSync(join(dir, `.out.fluxlane-new-${dead}-89abcdef`));
    writeFileSync(join(dir, `.x.csv.fluxlane-${dead}-00000000.tmp`), 'half');
    writeFileSync(join(dir, `.out.fluxlane-new-${process.pid}-11111111`), 'a live run of this process: kept');
    cleanStaleSiblings(join(dir, 'out'));
    cleanStaleSiblings(join(dir, 'x.csv'));
    expect(readdirSync(dir).sort()).toEqual([`.out.fluxlane-new-${process.pid}-11111111`, 'out']);
    expect(readFileSync(join(dir, 'out/plan.json'), 'utf8')).toBe('old');
  });
});
