/**
 * Entry points of the layout stage: a layout file (or its text) -> validated ChipLayout.
 * Any problem -> one InputError listing every diagnostic of the file; nothing else is thrown.
 */

import { readFileSync } from 'node:fs';
import type { ChipLayout } from './types.js';
import { DiagnosticCollector } from './diagnostics.js';
import { decodeUtf8, readYamlSource } from './yaml-source.js';
import { convertLayout } from './convert.js';
import { InputError } from '../util/errors.js';

/**
 * Parse layout text. `file` is the name used in messages and in `ChipLayout.file`.
 * Throws InputError (only) when the text is not a valid layout.
 */
export function parseLayoutText(text: string, file: string): ChipLayout {
  const bootstrap = new DiagnosticCollector(file);
  const tree = readYamlSource(text, bootstrap);
  bootstrap.throwIfAny();
  if (!tree) throw new InputError({ file, message: 'expected a YAML layout, found unreadable text' });
  const collector = new DiagnosticCollector(file, tree.locate);
  const warnings = new DiagnosticCollector(file, tree.locate);
  const layout = convertLayout(tree, file, collector, warnings);
  collector.throwIfAny();
  if (!layout) throw new InputError({ file, message: 'expected a layout, found none' });
  if (warnings.count > 0) layout.warnings = [...warnings.diagnostics].sort((a, b) => (a.line ?? 0) - (b.line ?? 0) || (a.column ?? 0) - (b.column ?? 0));
  return layout;
}

/** Parse layout bytes (checked as UTF-8 first). */
export function parseLayoutBytes(bytes: Uint8Array, file: string): ChipLayout {
  const collector = new DiagnosticCollector(file);
  const text = decodeUtf8(bytes, collector);
  collector.throwIfAny();
  return parseLayoutText(text ?? '', file);
}

/** Read and parse a layout file. `displayName` (default: the path as given) appears in messages. */
export function loadLayoutFile(path: string, displayName = path): ChipLayout {
  let bytes: Uint8Array;
  try {
    bytes = readFileSync(path);
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const reason =
      code === 'ENOENT' ? 'no such file' :
      code === 'EISDIR' ? 'a folder, not a file' :
      code === 'EACCES' ? 'permission denied' :
      (err as Error).message;
    throw new InputError({ file: displayName, message: `expected a readable layout file, found ${reason}` });
  }
  return parseLayoutBytes(bytes, displayName);
}
