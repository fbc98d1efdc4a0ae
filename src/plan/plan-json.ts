/**
 * The plan as data for the lab: plan.json (SI units: Hz, s, rad; flux in Phi0; schema in
 * shared/plan.schema.json and the README), the gate table (CSV, one row per edge, and the same
 * rows as a text table), and the per-edge waveform files (time_ns,flux: the CSV the simulator
 * reads, src/sim/trajectory.ts). Everything is built from the ChipPlan in a fixed order, so the
 * same plan gives the same bytes.
 */
import { formatTrajectoryCsv } from '../sim/trajectory.js';
import type { ChipPlan } from './plan.js';
import { ghz, mhz, khz, ns, plain, toHz, toSeconds } from './format.js';
import { toFindingJson } from './rules/findings.js';
import type { GateDesign } from './gate-seam.js';
import { bandText } from './crowding.js';
import { idRecord } from '../util/own.js';

export const PLAN_FORMAT = 'fluxlane-plan';
export const PLAN_VERSION = 1;

const nullable = (x: number, f: (v: number) => number) => (Number.isFinite(x) ? f(x) : null);

/** Waveform file of an edge, relative to the plan's folder. */
export function waveformPath(edgeKey: string): string {
  return `waveforms/${edgeKey}.csv`;
}

/** NaN and infinite numbers become null (JSON has no NaN; a design that failed has none). */
function nanToNull(x: unknown): unknown {
  if (typeof x === 'number') return Number.isFinite(x) ? x : null;
  if (Array.isArray(x)) return x.map(nanToNull);
  if (x && typeof x === 'object' && !(x instanceof Float64Array)) return Object.fromEntries(Object.entries(x).map(([k, v]) => [k, nanToNull(v)]));
  return x;
}

/** `fluxlane gate`'s JSON fields (SI) for a design. */
export function gateJson(edge: [string, string], d: GateDesign, waveform: string | null): Record<string, unknown> {
  const out: Record<string, unknown> = nanToNull({
    edge,
    mover: d.mover,
    family: d.family,
    rampTime: toSeconds(d.rampNs),
    holdTime: toSeconds(d.holdNs),
    duration: toSeconds(d.durationNs),
    interactionFrequency: toHz(d.interactionFrequencyGHz),
    crossingOffset: toHz(d.crossingOffsetGHz),
    conditionalPhase: plain(d.conditionalPhase),
    leakage: plain(d.leakage),
    fidelity: plain(d.fidelity),
    fidelityNoisy: d.fidelityNoisy === undefined ? null : plain(d.fidelityNoisy),
    fidelityNoisyMethod: d.fidelityNoisyMethod ?? null,
    virtualZ: { a: plain(d.virtualZ.a), b: plain(d.virtualZ.b) },
    speedLimit: toSeconds(d.speedLimitNs),
    untuned: { conditionalPhase: plain(d.untuned.conditionalPhase), leakage: plain(d.untuned.leakage), fidelity: plain(d.untuned.fidelity) },
    feasible: d.feasible,
  }) as Record<string, unknown>;
  if (d.decoherenceEstimate !== undefined) out.decoherenceEstimate = plain(d.decoherenceEstimate);
  if (Number.isFinite(d.crossingFrequencyGHz)) out.exactCrossingFrequency = toHz(d.crossingFrequencyGHz);
  if (Number.isFinite(d.gapGHz)) out.gap = toHz(d.gapGHz);
  if (d.reason !== undefined) out.reason = d.reason;
  if (waveform !== null) out.waveform = waveform;
  if (d.targetPhase !== undefined) out.targetPhase = plain(d.targetPhase);
  if (d.simulatedSpectators && d.simulatedSpectators.length > 0) out.simulatedSpectators = d.simulatedSpectators.map((s) => ({ qubit: s.qubit, flux: s.flux }));
  return out;
}

export function planJson(plan: ChipPlan, meta: { file: string; seed: number; pulses: boolean }): Record<string, unknown> {
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
      duration: nullable(designed ? designed.durationNs + (e.parked.length > 0 ? 2 * e.rampNs : 0) : e.durationNs, toSeconds),
      rampTime: toSeconds(e.rampNs),
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
      gate: designed ? gateJson([id[edge.a], id[edge.b]], designed, designed.waveform.timeNs.length > 0 ? waveformPath(edge.key) : null) : null,
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
    qubits,
    edges,
    layers,
    layerSummary: { count: plan.layers.layers.length, lowerBound: plan.layers.lowerBound, conflicts: plan.layers.conflicts },
    crowding: {
      bands: plan.crowding.bands.map((b) => ({ from: toHz(b.loGHz), to: toHz(b.hiGHz), qubits: b.qubits, flagged: b.flagged })),
    },
    violations: plan.violations.map(toFindingJson),
    flags: plan.flags.map(toFindingJson),
    explanations: plan.explanations,
    search: plan.parking.stats,
  };
}

const CSV_HEADER = [
  'edge', 'mover', 'partner', 'crossing', 'interaction_frequency_hz', 'layer', 'spectator_parking', 'zz_hz', 'ramp_time_s', 'duration_s',
  'family', 'hold_time_s', 'conditional_phase_rad', 'leakage', 'fidelity', 'fidelity_noisy', 'virtual_z_a_rad', 'virtual_z_b_rad', 'feasible',
];

/** The gate table: one CSV row per edge. */
export function gateTableCsv(json: Record<string, unknown>): string {
  const edges = json.edges as Record<string, any>[];
  const rows = [CSV_HEADER.join(',')];
  for (const e of edges) {
    const g = e.gate as Record<string, any> | null;
    const parking = Object.entries(e.spectatorParking as Record<string, number>).map(([q, f]) => `${q}@${f}`).join(' ');
    const cells = [
      (e.qubits as string[]).join('-'), e.mover, e.partner, e.crossing, e.interactionFrequency ?? '', e.layer, parking, e.zz, e.rampTime, e.duration ?? '',
      g?.family ?? '', g?.holdTime ?? '', g?.conditionalPhase ?? '', g?.leakage ?? '', g?.fidelity ?? '', g?.fidelityNoisy ?? '', g?.virtualZ?.a ?? '', g?.virtualZ?.b ?? '', e.feasible,
    ];
    rows.push(cells.map(csvCell).join(','));
  }
  return rows.join('\n') + '\n';
}

function csvCell(v: unknown): string {
  const s = v === null || v === undefined ? '' : String(v);
  return /[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** The gate table for people (units printed). */
export function gateTableText(plan: ChipPlan): string {
  const { ctx } = plan;
  const id = ctx.ids;
  const head = ['edge', 'mover', 'crossing', 'interaction', 'layer', 'spectators parked', 'ZZ idle', 'ramp', 'duration', 'family', 'fidelity', 'noisy', 'ok'];
  const rows: string[][] = plan.edges.map((e, k) => {
    const gate = plan.gates?.[k] ?? null;
    const d = gate?.design;
    const dest = e.interactionGHz;
    const ok = (gate ? gate.findings : e.findings).length === 0;
    return [
      ctx.edges[e.edge].key,
      id[e.mover],
      e.crossing,
      Number.isFinite(dest) ? ghz(dest, 4) : '-',
      String(plan.layers.layerOf[k]),
      e.parked.length > 0 ? e.parked.map((p) => `${id[p.qubit]}@${ghz(p.fGHz)}`).join(' ') : '-',
      khz(plan.parking.idle.zzGHz[e.edge]),
      ns(d && Number.isFinite(d.rampNs) ? d.rampNs : e.rampNs),
      Number.isFinite(d ? d.durationNs : e.durationNs) ? ns(d ? d.durationNs : e.durationNs) : '-',
      d ? d.family : '-',
      d && Number.isFinite(d.fidelity) ? d.fidelity.toFixed(5) : '-',
      d && d.fidelityNoisy !== undefined && Number.isFinite(d.fidelityNoisy) ? d.fidelityNoisy.toFixed(5) : '-',
      ok ? 'yes' : 'NO',
    ];
  });
  const widths = head.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c].length)));
  const line = (r: string[]) => r.map((x, c) => x.padEnd(widths[c])).join('  ').trimEnd();
  return [line(head), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n') + '\n';
}

/** The human summary of a plan. */
export function planText(plan: ChipPlan, file: string): string {
  const { ctx } = plan;
  const lines: string[] = [];
  lines.push(`${ctx.layout.chip} (${file}): ${ctx.n} qubits, ${ctx.edges.length} couplings`);
  lines.push('parking:');
  ctx.ids.forEach((q, i) => {
    const s = plan.states[i];
    const c = plan.crowding.qubits[i];
    const margin = Number.isFinite(c.marginGHz) ? `margin ${mhz(c.marginGHz)} (${c.marginSpreads.toFixed(1)} spreads)` : 'margin -';
    lines.push(`  ${q.padEnd(6)} ${ghz(plan.parking.parkingGHz[i], 4)}  flux ${s.flux.toFixed(4)}  f12 ${ghz(s.f12GHz)}  ${margin}${ctx.fixed[i] !== undefined ? '  (fixed)' : ''}`);
  });
  lines.push('gates:');
  for (const row of gateTableText(plan).trimEnd().split('\n')) lines.push(`  ${row}`);
  lines.push(`layers: ${plan.layers.layers.length} (lower bound ${plan.layers.lowerBound}, the largest degree)`);
  plan.layers.layers.forEach((list, k) => lines.push(`  ${k}: ${list.map((e) => ctx.edges[e].key).join(' ')}`));
  for (const b of plan.crowding.bands) lines.push(`crowded band ${bandText(b)}`);
  for (const x of plan.explanations) lines.push(`${x.kind === 'parking' ? 'cannot park' : 'cannot plan CZ'}: ${x.message}`);
  for (const v of plan.violations) lines.push(`violation [${v.rule}] ${v.qubits.join(', ')}: ${v.message}`);
  for (const f of plan.flags) lines.push(`flag [${f.rule}] ${f.qubits.join(', ')}: ${f.message}`);
  lines.push(
    plan.violations.length === 0
      ? `ok: every rule holds; ${plan.flags.length} flag(s). Model estimates: verify on hardware, respect flux-line current limits.`
      : `FAILED: ${plan.violations.length} violation(s), ${plan.flags.length} flag(s). Model estimates: verify on hardware.`,
  );
  return lines.join('\n');
}

/** Waveform files of the designed gates. */
export function waveformFiles(plan: ChipPlan, dir: string): { path: string; contents: string }[] {
  const out: { path: string; contents: string }[] = [];
  plan.gates?.forEach((g, k) => {
    if (!g || g.design.waveform.timeNs.length === 0) return;
    const key = plan.ctx.edges[plan.edges[k].edge].key;
    out.push({ path: `${dir}/${waveformPath(key)}`, contents: formatTrajectoryCsv({ timeNs: g.design.waveform.timeNs, flux: g.design.waveform.flux }) });
  });
  return out;
}
