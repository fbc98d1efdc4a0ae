/**
 * zod issues -> located layout diagnostics.
 *
 * Every schema in schema.ts names what it expects as a short phrase (its `error`); this file
 * turns an issue into "expected <phrase>, found <what is there>", or "missing key ..." when the
 * value is absent, or "unknown key ... (did you mean ...?)" for keys a strict map does not know.
 */

import type { z } from 'zod';
import { describeFound, type DiagnosticCollector, type Path } from './diagnostics.js';
import { didYouMean } from './suggest.js';

/** Phrases for issues of schemas that carry none of their own. */
export function defaultPhrase(issue: { code: string; expected?: string }): string {
  switch (issue.expected) {
    case 'string':
      return 'text';
    case 'number':
      return 'a finite number';
    case 'object':
      return 'a map';
    case 'array':
      return 'a list';
    case 'boolean':
      return 'true or false';
    default:
      return 'a different value';
  }
}

/** The raw value at `path` below `root` (undefined when absent). */
export function valueAt(root: unknown, path: Path): unknown {
  let v: unknown = root;
  for (const segment of path) {
    if (v === null || typeof v !== 'object') return undefined;
    if (!Object.prototype.hasOwnProperty.call(v, segment)) return undefined;
    v = (v as Record<string | number, unknown>)[segment];
  }
  return v;
}

/** An unknown key message: `unknown key "ejmax" (did you mean "ejMax"?)`. */
export function unknownKeyMessage(key: string, known: readonly string[]): string {
  const hint = didYouMean(key, known);
  return hint
    ? `unknown key ${JSON.stringify(key)} (did you mean ${JSON.stringify(hint)}?)`
    : `unknown key ${JSON.stringify(key)}; expected one of: ${known.join(', ')}`;
}

/**
 * Report the issues of `schema.safeParse(raw)` for a value at `base`. `knownKeys(path)` lists
 * the keys of the strict map at a path (relative to `base`), for "did you mean".
 */
export function reportZodIssues(
  issues: readonly z.core.$ZodIssue[],
  raw: unknown,
  base: Path,
  collector: DiagnosticCollector,
  knownKeys: (relativePath: Path) => readonly string[],
): void {
  for (const issue of issues) {
    const rel = issue.path.filter((s): s is string | number => typeof s !== 'symbol');
    const path = [...base, ...rel];
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) {
        collector.add([...path, key], unknownKeyMessage(key, knownKeys(rel)), 'key');
      }
      continue;
    }
    const value = valueAt(raw, rel);
    const parent = rel.length > 0 ? valueAt(raw, rel.slice(0, -1)) : undefined;
    const isMissingKey =
      value === undefined && rel.length > 0 && typeof rel[rel.length - 1] === 'string' &&
      parent !== null && typeof parent === 'object' && !Array.isArray(parent);
    if (isMissingKey) {
      // A misspelling of the missing key is already reported as an unknown key with "did you mean".
      const missing = String(rel[rel.length - 1]);
      const parentKnown = knownKeys(rel.slice(0, -1));
      const misspelt = Object.keys(parent as object).some(
        (k) => !parentKnown.includes(k) && didYouMean(k, parentKnown) === missing,
      );
      if (misspelt) continue;
      collector.add(path.slice(0, -1), `missing key ${JSON.stringify(rel[rel.length - 1])}: expected ${issue.message}`, 'key');
    } else {
      collector.add(path, `expected ${issue.message}, found ${describeFound(value)}`);
    }
  }
}
