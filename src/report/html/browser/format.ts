/** Number formatting for the report page (units printed; "-" for unknown values). */

export const UNKNOWN = '-';

const known = (x: number | null | undefined): x is number => typeof x === 'number' && Number.isFinite(x);

export function ghz(x: number | null | undefined, digits = 4): string {
  return known(x) ? `${x.toFixed(digits)} GHz` : UNKNOWN;
}

export function mhz(x: number | null | undefined, digits = 1): string {
  return known(x) ? `${x.toFixed(digits)} MHz` : UNKNOWN;
}

export function khz(x: number | null | undefined, digits = 1): string {
  return known(x) ? `${x.toFixed(digits)} kHz` : UNKNOWN;
}

export function ns(x: number | null | undefined, digits = 1): string {
  return known(x) ? `${x.toFixed(digits)} ns` : UNKNOWN;
}

/** Microseconds with three significant digits. */
export function us(x: number | null | undefined): string {
  return known(x) ? `${x >= 100 ? x.toFixed(0) : x.toPrecision(3)} \u00b5s` : UNKNOWN;
}

/** An error or probability: 2.35e-3 style, or 0. */
export function err(x: number | null | undefined, digits = 3): string {
  if (!known(x)) return UNKNOWN;
  if (x === 0) return '0';
  return x.toExponential(digits - 1);
}

export function fixed(x: number | null | undefined, digits: number, unit = ''): string {
  return known(x) ? `${x.toFixed(digits)}${unit ? ` ${unit}` : ''}` : UNKNOWN;
}

export function range(r: [number, number] | null | undefined, digits = 3): string {
  return r ? `${r[0].toFixed(digits)} - ${r[1].toFixed(digits)} GHz` : UNKNOWN;
}

export function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}
