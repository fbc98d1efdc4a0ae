/**
 * Wrap one line of text output at spaces to at most `width` characters (a word longer than the
 * width stays whole); continuation lines start with `indent`. Used for explanations and reasons
 * a person reads in a terminal.
 */
export const WRAP_WIDTH = 100;

export function wrapLine(line: string, indent = '    ', width = WRAP_WIDTH): string {
  if (line.length <= width) return line;
  const lead = /^\s*/.exec(line)![0];
  const words = line.slice(lead.length).split(' ');
  const out: string[] = [];
  let current = lead;
  let fresh = true;
  for (const w of words) {
    if (!fresh && current.length + 1 + w.length > width) {
      out.push(current);
      current = indent + w;
    } else current = fresh ? current + w : `${current} ${w}`;
    fresh = false;
  }
  out.push(current);
  return out.join('\n');
}
