/**
 * Reading a written plan back for the report: plan.json (checked against its layout by the plan
 * stage's reader, src/plan/plan-read.ts: file:line:column on any problem), the layout it names,
 * and the waveform files of its designed gates (time_ns,flux, src/sim/trajectory.ts).
 *
 * The layout is the `--layout` given, else the plan's `layout` field, looked up first beside the
 * plan file and then from the current folder (`fluxlane plan` records the path as it was typed).
 * A waveform file that is missing is not an error: the report says so for that gate.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { loadLayoutFile } from '../../layout/load.js';
import type { ChipLayout } from '../../layout/types.js';
import { jsonErrorPosition, PLAN_FORMAT, readPlan } from '../../plan/plan-read.js';
import { parseTrajectoryCsv } from '../../sim/trajectory.js';
import { InputError } from '../../util/errors.js';
import type { GateWaveform, ReportInputs } from './build-document.js';

export interface PlanFileReport {
  inputs: ReportInputs;
  /** The layout file as shown to the user. */
  layoutShown: string;
  /** Waveform files the plan names that were not found (as shown to the user). */
  missingWaveforms: string[];
}

export interface PlanFilePaths {
  /** The plan file, absolute, and as the user gave it. */
  plan: string;
  planShown: string;
  /** `--layout`, absolute and as given, when given. */
  layout?: string;
  layoutShown?: string;
  /** The current folder (for a layout path recorded relative to it). */
  cwd: string;
}

function readText(path: string, shown: string, what: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new InputError({ file: shown, message: `expected a readable ${what}, found ${code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'a folder' : String(code ?? err)}` });
  }
}

/** A plan file's report inputs; InputError on anything that is not a plan of its layout. */
export function readPlanForReport(paths: PlanFilePaths): PlanFileReport {
  const text = readText(paths.plan, paths.planShown, 'plan file');
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    const { line, column } = jsonErrorPosition(text, message);
    throw new InputError({ file: paths.planShown, line, column, message: `expected JSON (a plan.json written by fluxlane plan), found a syntax error: ${message.replace(/ in JSON at position \d+.*$/, '')}` });
  }
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw) || (raw as Record<string, unknown>).format !== PLAN_FORMAT) {
    const found = typeof raw !== 'object' || raw === null || Array.isArray(raw) ? (Array.isArray(raw) ? 'a list' : String(raw)) : `format ${JSON.stringify((raw as Record<string, unknown>).format ?? null)}`;
    throw new InputError({ file: paths.planShown, line: 1, column: 1, message: `expected a plan written by fluxlane plan (an object with "format": "${PLAN_FORMAT}"), found ${found}` });
  }
  const plan = raw as Record<string, unknown>;

  let layoutPath: string;
  let layoutShown: string;
  if (paths.layout !== undefined) {
    layoutPath = paths.layout;
    layoutShown = paths.layoutShown ?? paths.layout;
  } else {
    if (typeof plan.layout !== 'string' || plan.layout === '') {
      throw new InputError({ file: paths.planShown, path: 'layout', message: 'expected the layout file this plan was made from, found none named; give it with --layout' });
    }
    const besidePlan = resolve(dirname(paths.plan), plan.layout);
    const fromCwd = resolve(paths.cwd, plan.layout);
    const found = [besidePlan, fromCwd].find((p) => existsSync(p));
    if (!found) {
      throw new InputError({ file: paths.planShown, path: 'layout', message: `expected the layout file ${JSON.stringify(plan.layout)} beside the plan or in the current folder, found no such file; give it with --layout` });
    }
    layoutPath = found;
    layoutShown = found === besidePlan ? join(dirname(paths.planShown), plan.layout) : plan.layout;
  }
  const layout: ChipLayout = loadLayoutFile(layoutPath, layoutShown);
  readPlan(text, paths.planShown, layout);

  const waveforms = new Map<string, GateWaveform>();
  const missing = new Map<string, string>();
  const missingWaveforms: string[] = [];
  const edges = Array.isArray(plan.edges) ? plan.edges : [];
  for (const e of edges as Record<string, unknown>[]) {
    const gate = e.gate as Record<string, unknown> | null | undefined;
    if (!gate || typeof gate.waveform !== 'string') continue;
    const key = (e.qubits as string[]).join('-');
    const full = resolve(dirname(paths.plan), gate.waveform);
    const shown = join(dirname(paths.planShown), gate.waveform);
    if (!existsSync(full)) {
      missing.set(key, `The waveform file ${shown} was not found, so this gate's waveform is not drawn.`);
      missingWaveforms.push(shown);
      continue;
    }
    waveforms.set(key, parseTrajectoryCsv(readText(full, shown, 'waveform file'), shown));
  }
  return { inputs: { plan, layout, waveforms, missingWaveforms: missing }, layoutShown, missingWaveforms };
}
