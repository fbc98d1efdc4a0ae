/**
 * Every edge plan and option report a plan keeps has one object shape (V8's hidden class), however
 * it was made: planned, or derived by the layer fitting with other spectator points
 * (src/plan/interaction/plan-edge.ts edgePlanOf, optionReportOf). The conflict tests of the layers
 * read fields of every candidate pair of plans; plans of several shapes there cost the engine
 * slower property loads and recompilations (a performance property, never a result: the values are
 * tested in plan-caches.test.ts). The reference is V8's own %HaveSameMap, in a child process with
 * --allow-natives-syntax. Clove-17's plan keeps derived plans (before edgePlanOf its 24 plans had
 * two shapes, Reef-49's 84 had two, the generated 10 x 10's 180 had seven).
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { pathToFileURL } from 'node:url';
import { resolve } from 'node:path';

const url = (p: string) => pathToFileURL(resolve(p)).href;

const SCRIPT = `
const { loadLayoutFile } = await import(${JSON.stringify(url('src/layout/load.ts'))});
const { planChip } = await import(${JSON.stringify(url('src/plan/plan.ts'))});
const same = new Function('a', 'b', 'return %HaveSameMap(a, b)');
const shapes = (list) => {
  const reps = [];
  for (const o of list) if (!reps.some((r) => same(r, o))) reps.push(o);
  return reps.length;
};
const file = process.argv[1];
const plan = planChip(loadLayoutFile(file, file));
console.log(JSON.stringify({ edges: plan.edges.length, fitting: plan.parking.stats.layerFitting?.kept ?? null, plans: shapes(plan.edges), options: shapes(plan.edges.flatMap((e) => e.options)) }));
`;

function shapesOf(layout: string): { edges: number; fitting: string | null; plans: number; options: number } {
  const run = spawnSync(process.execPath, ['--allow-natives-syntax', '--import', 'tsx', '--input-type=module', '-e', SCRIPT, layout], { encoding: 'utf8' });
  expect(run.stderr).toBe('');
  expect(run.status).toBe(0);
  return JSON.parse(run.stdout);
}

describe('the shapes of the plan objects a plan keeps', () => {
  it('Clove-17: one shape of edge plan and one of option report, with the layer fitting\'s derived plans kept', () => {
    const r = shapesOf('layouts/clove-17.yaml');
    expect(r.edges).toBe(24);
    // (the fitting ran and kept a candidate built from derived plans)
    expect(r.fitting).not.toBeNull();
    expect(r.plans).toBe(1);
    expect(r.options).toBe(1);
  });
});
