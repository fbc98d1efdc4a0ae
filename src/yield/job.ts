/**
 * A yield run as plain data (it crosses to worker threads and into the slices of a sharded run)
 * and the evaluation of one sample of it.
 *
 * Rows: row 0 draws with the run's spreads; with a spread sweep, each further row draws the same
 * deviates (the same stream per sample index, src/yield/draw.ts) with another resistance spread
 * for every qubit, so the rows differ only by the spread (common random numbers: the yield
 * against spread is smooth, and falls as the spread grows wherever failures grow with it).
 *
 * Modes (README "fluxlane yield"):
 *   fixed   the plan is kept; each drawn chip is checked against it (./fixed-evaluate.ts);
 *   replan  each drawn chip is planned anew with the planner (planChip, no pulse design) from
 *           the same planner seed; it works when its plan breaks no rule and, when the plan
 *           states a cycle error and a ceiling is given, when that error is under the ceiling
 *           (./cycle-error.ts).
 */
import type { ChipLayout } from '../layout/types.js';
import { planChip } from '../plan/plan.js';
import type { PlanInput } from '../plan/plan-read.js';
import type { Finding } from '../plan/rules/findings.js';
import { sharedReducedSpectrum, type ReducedSpectrum } from '../transmon/reduced-spectrum.js';
import { nominalChip, withResistanceSpread, type NominalChip } from './chip-model.js';
import { cycleErrorFailure, cycleErrorOf } from './cycle-error.js';
import { chipFromDeviates, sampleDeviates, type DrawnChip } from './draw.js';
import { evaluateFixed, fixedPlan, type FixedPlan } from './fixed-evaluate.js';
import { outcomeOf, type SampleOutcome } from './outcome.js';
import { drawnTransmons, sampledLayout } from './sampled-context.js';
import type { SampledSpectrum } from './sampled-spectrum.js';
import { reducedQubitTable } from '../plan/reduced-levels.js';
import { planForDrawnChip } from './nominal-plan.js';
import type { FabricationSpread } from './spread.js';

export type YieldMode = 'fixed' | 'replan';

export interface YieldJob {
  layout: ChipLayout;
  mode: YieldMode;
  /** Seed of the fabrication draws. */
  seed: number;
  samples: number;
  spread: FabricationSpread;
  /** Resistance spreads of a sweep (null: no sweep). */
  sweep: number[] | null;
  /** The plan kept in fixed mode (as plan.json reads back); null in replan mode. */
  plan: PlanInput | null;
  /** Seed of the planner (the nominal plan, and every re-plan). */
  planSeed: number;
  /** Largest error per cycle a re-planned chip may have (when its plan states one); null: none. */
  cycleErrorCeiling: number | null;
}

/** Resistance spread of each row: the run's own first, then the sweep's values not equal to it. */
export function rowSpreads(job: Pick<YieldJob, 'spread' | 'sweep'>): number[] {
  return [job.spread.rn, ...(job.sweep ?? []).filter((x) => x !== job.spread.rn)];
}

/** Row of a sweep value. */
export function rowOfSpread(job: Pick<YieldJob, 'spread' | 'sweep'>, rn: number): number {
  return rowSpreads(job).indexOf(rn);
}

/** The nominal chip of each row (row 0 with the run's spreads, each further row with its resistance spread); they do not depend on the plan. */
export function nominalChips(job: Pick<YieldJob, 'layout' | 'spread' | 'sweep'>): NominalChip[] {
  const base = nominalChip(job.layout, job.spread);
  return rowSpreads(job).map((rn, k) => (k === 0 ? base : withResistanceSpread(base, rn)));
}

export class SampleEvaluator {
  readonly rows: number[];
  private readonly chips: NominalChip[];
  private readonly fixed: FixedPlan | null;
  private readonly table: ReducedSpectrum;
  /** Spectrum objects reused from one fixed-mode sample to the next (one per qubit). */
  private readonly spectra: (SampledSpectrum | undefined)[] = [];

  /**
   * `chips`: the run's nominal chips as nominalChips(job) builds them (a worker started before the
   * plan is known builds them meanwhile, src/yield/yield-worker.ts); they do not read the plan.
   */
  constructor(readonly job: YieldJob, table: ReducedSpectrum = sharedReducedSpectrum(), chips: NominalChip[] = nominalChips(job)) {
    this.table = table;
    this.rows = rowSpreads(job);
    if (chips.length !== this.rows.length) throw new RangeError(`SampleEvaluator: ${chips.length} nominal chips for ${this.rows.length} rows`);
    this.chips = chips;
    const base = chips[0];
    if (job.mode === 'fixed') {
      if (!job.plan) throw new RangeError('SampleEvaluator: fixed mode needs the plan to keep');
      this.fixed = fixedPlan(base, planForDrawnChip(job.plan));
    } else this.fixed = null;
  }

  /** The outcome of sample `index` in row `row`. */
  evaluate(row: number, index: number): SampleOutcome {
    if (!this.fixed) return this.inDetail(row, index).outcome;
    // (fixed mode without messages: the outcome's reason is written for its one finding)
    const chip = this.chips[row];
    const drawn = chipFromDeviates(chip, index, sampleDeviates(this.job.seed, index, chip.n, chip.ctx.edges.length));
    const ev = evaluateFixed(chip, this.fixed, drawn, this.table, { messages: false }, this.spectra);
    return outcomeOf(chip.ctx, index, ev.violations, null, null, ev.messageOf);
  }

  /** The outcome of sample `index` in row `row`, with the drawn chip and every finding. */
  inDetail(row: number, index: number): { outcome: SampleOutcome; findings: Finding[]; drawn: DrawnChip; ids: string[]; edgeKeys: string[] } {
    const chip = this.chips[row];
    const z = sampleDeviates(this.job.seed, index, chip.n, chip.ctx.edges.length);
    const drawn = chipFromDeviates(chip, index, z);
    const names = { ids: chip.ctx.ids, edgeKeys: chip.ctx.edges.map((e) => e.key) };
    if (this.fixed) {
      const ev = evaluateFixed(chip, this.fixed, drawn, this.table, {}, this.spectra);
      return { outcome: outcomeOf(chip.ctx, index, ev.violations, null), findings: ev.violations, drawn, ...names };
    }
    const transmons = drawnTransmons(chip, drawn, this.table);
    const layout = sampledLayout(chip, drawn, transmons);
    const table = this.table;
    const plan = planChip(layout, { seed: this.job.planSeed }, { context: { transmons, tableFor: (t) => reducedQubitTable(t, table) } }, chip.ctx.graph);
    const cycleError = cycleErrorOf(plan);
    const outcome = outcomeOf(chip.ctx, index, plan.violations, cycleError, cycleErrorFailure(cycleError, this.job.cycleErrorCeiling));
    return { outcome, findings: plan.violations, drawn, ...names };
  }
}
