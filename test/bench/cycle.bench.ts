/**
 * The planner before and after the error budget (issue 10 "done when"): for each demo, the time of
 * its whole plan with pulse design (the budget of every designed gate included) and of its plan
 * without pulse design, and the reference cycle's predicted error of today's plan beside that of
 * the plan fluxlane made before the error budget, recomputed with today's model.
 *
 * The earlier plans are the choices (parking, movers, crossings, interaction points, spectator
 * moves, ramps, layers) of `plan --no-pulses --seed 1` at commit 37204ff on the current demo
 * layouts (test/bench/earlier-plans/*.json); `verifyPlan` recomputes their budget exactly as
 * `fluxlane verify` does, with each gate's estimate (no pulses), so both cycle errors below are
 * of plans without pulses and comparable; the designed plan's own cycle error is printed too.
 * Times of the earlier planner on this machine are in DEVELOPERS.md ("Performance log").
 */
import { readFileSync } from 'node:fs';
import type { Benchmark } from './run.js';
import { loadLayoutFile } from '../../src/layout/load.js';
import { planChip } from '../../src/plan/plan.js';
import { readPlan } from '../../src/plan/plan-read.js';
import { verifyPlan } from '../../src/plan/verify.js';
import { loadGateDesigner } from '../../src/plan/gate-seam.js';
import { designPulses } from '../../src/plan/pulses.js';

const designer = await loadGateDesigner();
const DEMOS = ['bowline-5', 'clove-17', 'hitch-30', 'reef-49'] as const;
const layoutOf = (d: string) => loadLayoutFile(new URL(`../../layouts/${d}.yaml`, import.meta.url).pathname, `layouts/${d}.yaml`);
const fmt = (x: number) => (x < 0.01 ? x.toExponential(2) : x.toFixed(3));

function earlierCycle(demo: string): { error: number; gates: number; idles: number; layers: number; violations: number } {
  const layout = layoutOf(demo);
  const url = new URL(`./earlier-plans/${demo}.json`, import.meta.url);
  const plan = readPlan(readFileSync(url, 'utf8'), `test/bench/earlier-plans/${demo}.json`, layout);
  const r = verifyPlan(layout, plan, { dir: new URL('./earlier-plans/', import.meta.url).pathname });
  // its own rule breaks (claims of a plan without them are not counted)
  const violations = r.violations.filter((v) => v.rule !== 'plan-claim').length;
  return { ...r.cycle, layers: plan.layers?.length ?? NaN, violations };
}

function bench(demo: (typeof DEMOS)[number]): Benchmark[] {
  const layout = layoutOf(demo);
  let noPulses: ReturnType<typeof planChip> | undefined;
  let designed: ReturnType<typeof planChip> | undefined;
  const out: Benchmark[] = [
    {
      name: `${demo}: plan without pulse design, and its cycle error beside the earlier plan's (recomputed)`,
      runs: 3,
      run: () => (noPulses = planChip(layout)),
      report: () => {
        const c = noPulses!.budget.cycle;
        const e = earlierCycle(demo);
        return `cycle error ${fmt(c.error)} (gates ${fmt(c.gates)} + idles ${fmt(c.idles)}; ${noPulses!.layers.layers.length} layers, ${noPulses!.violations.length} violations) against the earlier plan's ${fmt(e.error)} (gates ${fmt(e.gates)} + idles ${fmt(e.idles)}; ${e.layers} layers, ${e.violations} violations under today's rules)`;
      },
    },
  ];
  if (designer)
    out.push({
      name: `${demo}: whole plan with CZ pulse design, one thread (noise on: every gate's budget)`,
      runs: 1,
      warmup: 0,
      run: () => {
        const plan = planChip(layout);
        designPulses(plan, designer, { noise: true });
        designed = plan;
      },
      report: () => `cycle error of the designed plan ${fmt(designed!.budget.cycle.error)} (gates ${fmt(designed!.budget.cycle.gates)} + idles ${fmt(designed!.budget.cycle.idles)})`,
    });
  return out;
}

export const [bowlineNoPulses, bowlineDesigned] = bench('bowline-5');
export const [cloveNoPulses, cloveDesigned] = bench('clove-17');
export const [hitchNoPulses, hitchDesigned] = bench('hitch-30');
export const [reefNoPulses, reefDesigned] = bench('reef-49');
