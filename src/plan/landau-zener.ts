/**
 * Landau-Zener transfer through a swept avoided crossing (Landau, Phys. Z. Sowjetunion 2, 46
 * (1932); Zener, Proc. R. Soc. A 137, 696 (1932); README physics conventions sec. 5).
 *
 * Two diabatic states whose frequency difference changes at the constant rate v (GHz/ns, i.e.
 * 1e18 Hz/s) and which are coupled by g (GHz; the gap at the crossing is 2g) end up swapped with
 * probability
 *
 *     P = 1 - exp(-4 pi^2 g^2 / v)
 *
 * (the adiabatic passage; exp(-4 pi^2 g^2 / v) = exp(-2 pi (2 pi g)^2 / (2 pi v)) is the
 * diabatic probability of H/h = [[v t / 2, g], [g, -v t / 2]]). A CZ passes each crossing on its
 * way to the interaction point and again on the way back; the planner reports the transfer of one
 * passage. Test: against a direct two-level integration with SciPy (test/plan/landau-zener.test.ts).
 */

/** Population transferred by one passage (0 when g = 0; 1 when v = 0 and g > 0). */
export function landauZenerTransfer(gGHz: number, rateGHzPerNs: number): number {
  const g2 = gGHz * gGHz;
  if (g2 === 0) return 0;
  const v = Math.abs(rateGHzPerNs);
  if (v === 0) return 1;
  return -Math.expm1((-4 * Math.PI * Math.PI * g2) / v);
}

/** The slowest sweep rate (GHz/ns) that keeps one passage's transfer at or below `limit`. */
export function landauZenerMinimumRate(gGHz: number, limit: number): number {
  if (!(limit > 0 && limit < 1)) throw new RangeError(`landauZenerMinimumRate: limit must be in (0, 1), got ${limit}`);
  return (4 * Math.PI * Math.PI * gGHz * gGHz) / -Math.log1p(-limit);
}
