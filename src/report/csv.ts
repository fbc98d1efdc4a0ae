/** One CSV cell (RFC 4180): null and undefined are empty; a cell with a quote, comma or newline is quoted. */
export function csvCell(v: unknown): string {
  const s = v === null || v === undefined ? '' : String(v);
  return /[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}
