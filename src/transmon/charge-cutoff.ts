/**
 * Charge cutoff N (basis |n| <= N) that resolves a transmon's lowest levels to ~1e-12 E_C.
 *
 * The wave functions' width in charge grows as (E_J/E_C)^(1/4) (harmonic limit, Koch et al. 2007),
 * and N = 20 is converged to better than 1e-10 GHz up to E_J/E_C ~ 300 for the lowest 8 levels
 * (test/transmon/charge-cutoff.test.ts compares with N = 80). Beyond that we scale N with the width:
 *
 *     N(r) = max(20, ceil(20 (r / 300)^(1/4))),   r = E_JS / E_C.
 */
export const CHARGE_CUTOFF_DEFAULTS = Object.freeze({ base: 20, validUpTo: 300 });

export function chargeCutoffFor(ejOverEc: number): number {
  const { base, validUpTo } = CHARGE_CUTOFF_DEFAULTS;
  if (!(ejOverEc > validUpTo)) return base;
  return Math.max(base, Math.ceil(base * (ejOverEc / validUpTo) ** 0.25));
}
