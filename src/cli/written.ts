/**
 * The `wrote ...` line of a command that writes files: every path when there are a few; for many,
 * each folder once with its file names, and a count for the files of a subfolder.
 */
import type { OutputFile } from './outcome.js';

const LIST_ALL = 4;

export function writtenLine(files: readonly OutputFile[]): string {
  if (files.length === 0) return '';
  if (files.length <= LIST_ALL) return `wrote ${files.map((f) => f.path).join(', ')}`;
  // group by the first folder: DIR/name and DIR/sub/name
  const root = commonFolder(files.map((f) => f.path));
  const top: string[] = [];
  const sub = new Map<string, number>();
  for (const f of files) {
    const rest = f.path.slice(root.length);
    const slash = rest.indexOf('/');
    if (slash < 0) top.push(rest);
    else sub.set(rest.slice(0, slash + 1), (sub.get(rest.slice(0, slash + 1)) ?? 0) + 1);
  }
  const parts = [...top, ...[...sub].map(([folder, n]) => `${n} file(s) in ${folder}`)];
  return `wrote ${files.length} files to ${root || './'}: ${parts.join(', ')}`;
}

function commonFolder(paths: string[]): string {
  let prefix = paths[0].slice(0, paths[0].lastIndexOf('/') + 1);
  for (const p of paths) while (prefix !== '' && !p.startsWith(prefix)) prefix = prefix.slice(0, prefix.slice(0, -1).lastIndexOf('/') + 1);
  return prefix;
}
