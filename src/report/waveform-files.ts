/**
 * The per-edge waveform files of a plan, for every edge whose gate was designed (none for an edge
 * without a design; a design that breaks a rule says so in its AWG file's first line):
 *
 *   waveforms/A-B.awg.csv    the AWG program of the gate's slot on the AWG's uniform grid: what
 *                            the generators play, before the line; one column per flux line that
 *                            moves (the mover, then each spectator moved out of the way), on one
 *                            time base. Columns `sample,time_ns,<id>_flux_phi0,...`.
 *   waveforms/A-B.qubit.csv  the flux the mover sees during the gate, after the line model
 *                            (Gaussian filter, rule fluxBandwidth), on its uniform fine grid:
 *                            `time_ns,flux_phi0`, the CSV `fluxlane simulate` reads; the plan's
 *                            gate metrics are computed on exactly these samples (README physics
 *                            conventions sec. 6).
 *
 * The slot (src/plan/rules/cz-duration.ts): d = the line model's settling (lineDelayNs, whole
 * AWG intervals), N_s = the plan's ramp on the AWG grid. Slot time 0 to d: everything parked;
 * d to d + N_s: spectators move out, linearly in frequency from parking to their temporary point
 * (the sweep rate the plan's rules assume); then the mover's program; then the spectators move
 * back in N_s; then d parked. The slot lasts gate duration + 2 N_s (the plan's slot duration).
 * The line model is a centred Gaussian (src/gate/pulse.ts): the qubit file's sample at t is its
 * output for the slot program at slot time t + N_s / f_s (the mover's program starts d later,
 * where the filtered ramp begins to move; a real line adds its own delay). The spectators'
 * filtered moves overlap the first and last d of the mover's, where each is within the
 * Gaussian's tails of its end points.
 */
import type { ChipPlan } from '../plan/plan.js';
import { formatTrajectoryCsv } from '../sim/trajectory.js';
import { waveformGridRateGHz } from '../gate/pulse.js';
import { spectatorMoveNs } from '../plan/rules/cz-duration.js';
import type { ReportFile } from './report-file.js';
import { onUniformGrid } from './uniform-grid.js';

/** The two waveform files of an edge, relative to the plan's folder. */
export function waveformPaths(edgeKey: string): { qubit: string; awg: string } {
  return { qubit: `waveforms/${edgeKey}.qubit.csv`, awg: `waveforms/${edgeKey}.awg.csv` };
}

/**
 * True when edge k (by plan order) gets waveform files: a feasible design (the gate stage found a
 * CZ). A design that breaks a rule gets them too, so what the plan's findings were computed on can
 * be read, re-simulated and verified; its AWG file says in its first line that it breaks a rule.
 */
export function writesWaveforms(plan: ChipPlan, k: number): boolean {
  const g = plan.gates?.[k];
  return !!g && g.design.feasible && g.design.waveform.timeNs.length > 0 && (g.design.awg?.flux.length ?? 0) > 0;
}

/** The slot program of edge k: AWG samples per moving qubit on one time base. */
export interface SlotProgram {
  sampleRateGHz: number;
  lineDelayNs: number;
  /** First sample of the mover's program in the slot. */
  moverStart: number;
  /** Slot time (ns) that the qubit file's t = 0 stands for. */
  qubitFileOffsetNs: number;
  columns: { qubit: string; flux: Float64Array }[];
}

export function slotProgram(plan: ChipPlan, k: number): SlotProgram {
  const { ctx } = plan;
  const e = plan.edges[k];
  const d = plan.gates![k]!.design;
  const awg = d.awg!;
  const fs = awg.sampleRateGHz;
  const pad = Math.round(awg.lineDelayNs * fs);
  const ns = e.parked.length > 0 ? Math.round(spectatorMoveNs(e.rampNs, { sampleRateGHz: fs }) * fs) : 0;
  const nm = awg.flux.length - 1;
  const total = 2 * pad + 2 * ns + nm;
  const moverStart = pad + ns;
  const mover = new Float64Array(total + 1).fill(plan.states[e.mover].flux);
  mover.set(awg.flux, moverStart);
  const columns = [{ qubit: ctx.ids[e.mover], flux: mover }];
  for (const p of e.parked) {
    const t = ctx.transmons[p.qubit];
    const from = plan.states[p.qubit];
    const x = new Float64Array(total + 1).fill(from.flux);
    for (let j = 0; j <= ns; j++) {
      const f = from.f01GHz + ((p.fGHz - from.f01GHz) * j) / ns;
      const v = j === 0 ? from.flux : j === ns ? p.flux : t.fluxForF01(f);
      x[pad + j] = v; // out
      x[pad + ns + nm + (ns - j)] = v; // back
    }
    for (let j = pad + ns; j <= pad + ns + nm; j++) x[j] = p.flux;
    columns.push({ qubit: ctx.ids[p.qubit], flux: x });
  }
  return { sampleRateGHz: fs, lineDelayNs: awg.lineDelayNs, moverStart, qubitFileOffsetNs: ns / fs, columns };
}

function number(x: number): string {
  return Object.is(x, -0) ? '0' : String(x);
}

/** The AWG program file of edge k. */
export function awgProgramCsv(plan: ChipPlan, k: number): string {
  const { ctx } = plan;
  const e = plan.edges[k];
  const key = ctx.edges[e.edge].key;
  const s = slotProgram(plan, k);
  const fs = s.sampleRateGHz;
  const n = s.columns[0].flux.length;
  const moved = s.columns.slice(1).map((c) => c.qubit);
  const broken = [...new Set((plan.gates?.[k]?.findings ?? []).map((f) => f.rule))];
  const rows = [
    ...(broken.length > 0 ? [`# WARNING: this gate breaks ${broken.join(', ')} (see plan.json); do not play it as it is`] : []),
    `# fluxlane: AWG program of the CZ on ${key} (mover ${s.columns[0].qubit}${moved.length > 0 ? `; spectators ${moved.join(', ')} moved out and back` : ''}), before the flux line`,
    `# ${n} samples at ${number(fs)} GS/s (${number((n - 1) / fs)} ns, the gate's slot); flux in Phi0; ${s.columns[0].qubit}'s program starts at sample ${s.moverStart}`,
    '# model estimate: verify on hardware, pre-distort for your line, and respect your flux-line current limits',
    ['sample', 'time_ns', ...s.columns.map((c) => `${c.qubit}_flux_phi0`)].join(','),
  ];
  for (let j = 0; j < n; j++) rows.push([String(j), number(j / fs), ...s.columns.map((c) => number(c.flux[j]))].join(','));
  return rows.join('\n') + '\n';
}

/** The file of the flux the mover sees (edge k). */
export function qubitFluxCsv(plan: ChipPlan, k: number): string {
  const { ctx } = plan;
  const e = plan.edges[k];
  const key = ctx.edges[e.edge].key;
  const d = plan.gates![k]!.design;
  const r = ctx.rules;
  const rate = waveformGridRateGHz(r.sampleRateGHz, r.fluxBandwidthGHz);
  const w = onUniformGrid(d.waveform, rate);
  const offset = slotProgram(plan, k).qubitFileOffsetNs;
  const line = r.fluxBandwidthGHz ? `after the line model (Gaussian filter, -3 dB at ${number(r.fluxBandwidthGHz)} GHz)` : 'the AWG samples joined linearly (no line model)';
  const head = [
    `# fluxlane: flux ${ctx.ids[e.mover]} sees during the CZ on ${key}, ${line}`,
    `# uniform grid ${number(rate)} GS/s, ${w.timeNs.length} samples, flux in Phi0; the sample at t is the line model (a centred Gaussian) applied to ${waveformPaths(key).awg} at its time t + ${number(offset)} ns`,
    '# the plan\'s gate metrics are those of these samples joined piecewise-linearly (fluxlane simulate --plan reads this file)',
  ];
  return head.join('\n') + '\n' + formatTrajectoryCsv(w, 'flux_phi0');
}

/** Waveform files of the edges that get them (writesWaveforms), in edge order. */
export function waveformFiles(plan: ChipPlan, dir: string): ReportFile[] {
  const out: ReportFile[] = [];
  plan.edges.forEach((e, k) => {
    if (!writesWaveforms(plan, k)) return;
    const paths = waveformPaths(plan.ctx.edges[e.edge].key);
    out.push({ path: `${dir}/${paths.awg}`, contents: awgProgramCsv(plan, k) });
    out.push({ path: `${dir}/${paths.qubit}`, contents: qubitFluxCsv(plan, k) });
  });
  return out;
}
