/**
 * The hook between a plan and the yield's success test for a cycle-error ceiling.
 *
 * When the planner's plan states its error per error-correction cycle (a top-level
 * `cycle: { duration, error, gates, idles }` on ChipPlan, from the error budget), a re-planned
 * chip counts as working only if that error is at most the ceiling given with
 * `fluxlane yield --max-cycle-error`, and the yield report gives the distribution of the cycle
 * error over the chips. Plans that state no cycle error give null here: then only the rules
 * decide (a ceiling rule among the planner's own rules is counted like any other rule).
 */

/** The plan's error per cycle, when it states one. */
export function cycleErrorOf(plan: object): number | null {
  const cycle = (plan as { cycle?: { error?: unknown } | null }).cycle;
  const e = cycle?.error;
  return typeof e === 'number' && Number.isFinite(e) ? e : null;
}

/** A failure to add to a chip's findings when its cycle error is over the ceiling, else null. */
export function cycleErrorFailure(cycleError: number | null, ceiling: number | null): { rule: string; message: string } | null {
  if (ceiling === null || cycleError === null || cycleError <= ceiling) return null;
  return { rule: 'cycle-error', message: `the plan's error per cycle ${cycleError.toPrecision(3)} is above the ceiling ${ceiling.toPrecision(3)}` };
}
