/**
 * Reading a trajectory or waveform file (time_ns,flux CSV) from disk: the one place every command
 * reads one (`simulate --trajectory`, the waveforms a plan names for `verify`). A size limit, UTF-8
 * only (a byte-order mark is dropped; other bytes are refused with their line and column), then
 * the CSV form of ./trajectory.ts with file:line:column on every problem.
 */
import { readFileSync, statSync } from 'node:fs';
import { DiagnosticCollector } from '../layout/diagnostics.js';
import { decodeUtf8 } from '../layout/yaml-source.js';
import { InputError } from '../util/errors.js';
import { parseTrajectoryCsv, type Trajectory } from './trajectory.js';

/** Largest trajectory file accepted (about 1.5 million samples). */
export const TRAJECTORY_MAX_BYTES = 64 * 1024 * 1024;

/** Read and parse a trajectory file; `shown` names it in messages. Throws InputError only. */
export function readTrajectoryFile(fullPath: string, shown: string, what = 'trajectory'): Trajectory {
  let bytes: Uint8Array;
  try {
    const st = statSync(fullPath);
    if (st.isDirectory()) throw Object.assign(new Error('folder'), { code: 'EISDIR' });
    if (st.size > TRAJECTORY_MAX_BYTES) throw new InputError({ file: shown, message: `expected a ${what} file of at most ${TRAJECTORY_MAX_BYTES} bytes, found ${st.size} bytes` });
    bytes = readFileSync(fullPath);
  } catch (err) {
    if (err instanceof InputError) throw err;
    const code = (err as NodeJS.ErrnoException).code;
    const found = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'a folder' : code === 'EACCES' ? 'permission denied' : String(code ?? err);
    throw new InputError({ file: shown, message: `expected a readable ${what} file, found ${found}` });
  }
  const collector = new DiagnosticCollector(shown);
  const text = decodeUtf8(bytes, collector, { noun: `a ${what} file`, format: 'CSV', maxBytes: TRAJECTORY_MAX_BYTES });
  collector.throwIfAny();
  return parseTrajectoryCsv(text ?? '', shown);
}
