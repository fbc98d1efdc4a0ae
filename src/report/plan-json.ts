/**
 * plan.json: the plan as data for the lab (SI units: Hz, s, rad; flux in Phi0; schema in
 * shared/plan.schema.json and the README's "Plan files"). Built from the ChipPlan in a fixed
 * order, so the same plan gives the same bytes. Read back by src/plan/plan-read.ts.
 */
import type { ChipPlan } from '../plan/plan.js';
import { idRecord } from '../util/own.js';
import { plain, toHz, toSeconds } from '../plan/format.js';
import { toFindingJson } from '../plan/rules/findings.js';
import { PLAN_FORMAT, PLAN_VERSION } from '../plan/plan-read.js';
import { gateJson } from './gate-json.js';
import { waveformPaths, writesWaveforms } from './waveform-files.js';
import { deviceJson, rulesJson } from './device-json.js';
import { slotNs } from '../plan/rules/cz-duration.js';
import { cycleJson, gateBudgetJson, idleBudgetJson } from './budget-json.js';
import { layerExplanationText } from '../plan/layers.js';

const nullable = (x: number, f: (v: number) => number) => (Number.isFinite(x) ? f(x) : null);

export function planJson(plan: ChipPlan, meta: { file: string; seed: number; pulses: boolean; replan?: Record<string, unknown> }): Record<string, unknown> {
  const { ctx } = plan;
  const id = ctx.ids;
  const qubits = idRecord<unknown>();
  ctx.ids.forEach((q, i) => {
    const s = plan.states[i];
    const c = plan.crowding.qubits[i];
    const d = ctx.domains[i];
    qubits[q] = {
      parkingFrequency: toHz(plan.parking.parkingGHz[i]),
      parkingFlux: plain(s.flux),
      f12: toHz(s.f12GHz),
      anharmonicity: toHz(s.anharmonicityGHz),
      margin: nullable(c.marginGHz, toHz),
      marginSpreads: nullable(c.marginSpreads, plain),
      idleMargin: nullable(c.idleMarginGHz, toHz),
      czMargin: nullable(c.czMarginGHz, toHz),
      nearest: c.nearest,
      fabricationSpread: toHz(s.sigmaGHz),
      usableFraction: plain(c.usableFraction),
      group: plan.parking.groups[i],
      fixed: ctx.fixed[i] !== undefined,
      window: d ? [toHz(d.lo), toHz(d.hi)] : null,
      range: [toHz(ctx.ranges[i].lo), toHz(ctx.ranges[i].hi)],
      t1: toSeconds(s.t1Ns),
      tphi: nullable(s.tphiNs, toSeconds),
      t2: nullable(s.t2Ns, toSeconds),
      fabricationMargin: c.fabrication ? { margin: toHz(c.fabrication.marginGHz), spreads: plain(c.fabrication.spreads), nearest: c.fabrication.nearest } : null,
      idle: idleBudgetJson(plan.budget.cycle.qubits[i]),
      device: deviceJson(ctx, i),
    };
  });
  const edges = plan.edges.map((e, k) => {
    const edge = ctx.edges[e.edge];
    const gate = plan.gates?.[k] ?? null;
    const designed = gate?.design;
    const spectatorParking = idRecord<number>();
    const spectatorParkingFlux = idRecord<number>();
    for (const p of e.parked) {
      spectatorParking[id[p.qubit]] = toHz(p.fGHz);
      spectatorParkingFlux[id[p.qubit]] = plain(p.flux);
    }
    return {
      qubits: [id[edge.a], id[edge.b]],
      mover: id[e.mover],
      partner: id[e.partner],
      crossing: e.crossing,
      interactionFrequency: nullable(e.interactionGHz, toHz),
      crossingFrequency: nullable(e.crossingGHz, toHz),
      moverInteractionFlux: nullable(e.moverInteractionFlux, plain),
      crossingCoupling: nullable(e.crossingCouplingGHz, toHz),
      g: nullable(e.gAtInteractionGHz, toHz),
      speedLimit: nullable(e.speedLimitNs, toSeconds),
      slotDuration: nullable(designed ? slotNs(designed.durationNs, e.parked.length > 0, e.rampNs, ctx.rules) : e.durationNs, toSeconds),
      rampTime: toSeconds(e.rampNs),
      gMax: toHz(edge.gGHz),
      spectatorParking,
      spectatorParkingFlux,
      layer: plan.layers.layerOf[k],
      zz: toHz(plan.parking.idle.zzGHz[e.edge]),
      feasible: (gate ? gate.findings : e.findings).length === 0,
      reason: e.reason,
      sweptCrossings: e.swept.map((c) => ({
        rule: c.rule,
        moving: id[c.moving],
        other: c.other >= 0 ? id[c.other] : null,
        at: toHz(c.atGHz),
        coupling: toHz(c.couplingGHz),
        rate: plain(c.rateGHzPerNs * 1e18),
        transfer: plain(c.transfer),
      })),
      options: e.options.map((o) => ({
        mover: id[o.mover],
        crossing: o.crossing,
        feasible: o.feasible,
        estimatedError: Number.isFinite(o.score) ? plain(o.score) : null,
        interactionFrequency: o.interactionGHz === null ? null : toHz(o.interactionGHz),
        note: o.note,
      })),
      budget: plan.budget.gates[k] ? gateBudgetJson(plan.budget.gates[k]!) : null,
      gate: designed ? gateJson([id[edge.a], id[edge.b]], designed, writesWaveforms(plan, k) ? waveformPaths(edge.key) : null, gate!.targetPhase, plan.budget.gates[k]) : null,
    };
  });
  const layers = plan.layers.layers.map((list, index) => ({ index, edges: list.map((k) => [id[ctx.edges[k].a], id[ctx.edges[k].b]]) }));
  return {
    format: PLAN_FORMAT,
    version: PLAN_VERSION,
    chip: ctx.layout.chip,
    layout: meta.file,
    seed: meta.seed,
    ok: plan.violations.length === 0,
    pulses: meta.pulses,
    note: 'Model estimates: verify every frequency, pulse and fidelity on the hardware and respect the flux-line current limits of your wiring.',
    rules: rulesJson(ctx.rules),
    qubits,
    edges,
    layers,
    layerSummary: {
      count: plan.layers.layers.length, lowerBound: plan.layers.lowerBound, conflicts: plan.layers.conflicts,
      explanation: { ...plan.layers.explanation, text: layerExplanationText(plan.layers.explanation, plan.layers.lowerBound) },
    },
    cycle: cycleJson(plan.budget.cycle),
    crowding: {
      bands: plan.crowding.bands.map((b) => ({ from: toHz(b.loGHz), to: toHz(b.hiGHz), qubits: b.qubits, flagged: b.flagged })),
    },
    violations: plan.violations.map(toFindingJson),
    flags: plan.flags.map(toFindingJson),
    explanations: plan.explanations,
    search: plan.parking.stats,
    ...(meta.replan ? { replan: meta.replan } : {}),
  };
}
