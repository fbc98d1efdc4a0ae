/**
 * The waveform files of a designed gate with spectators moved (src/report/waveform-files.ts), on
 * Clove-17 D6-X1 (Z2 and Z4 move out of the way): the AWG program holds the mover's program and
 * each spectator's move on one time base over the slot; the flux the qubit sees is that program
 * through the line model, checked against an independent convolution (NumPy/SciPy,
 * test/reference/gaussian_line.py); an edge that breaks a rule gets no files.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { planChip, type ChipPlan } from '../../src/plan/plan.js';
import { checkDesign, gateRequest } from '../../src/plan/pulses.js';
import { loadGateDesigner } from '../../src/plan/gate-seam.js';
import { loadLayoutFile } from '../../src/layout/load.js';
import { lineSigmaNs } from '../../src/gate/pulse.js';
import { awgProgramCsv, qubitFluxCsv, slotProgram, waveformFiles, writesWaveforms } from '../../src/report/waveform-files.js';
import { parseTrajectoryCsv } from '../../src/sim/trajectory.js';
import { spectatorMoveNs } from '../../src/plan/rules/cz-duration.js';
import { runPython } from '../support/python.js';

let plan: ChipPlan;
let k: number;
beforeAll(async () => {
  const designer = (await loadGateDesigner())!;
  plan = planChip(loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'));
  k = plan.edges.findIndex((e) => plan.ctx.edges[e.edge].key === 'D6-X1');
  const e = plan.edges[k];
  expect(e.parked.map((p) => plan.ctx.ids[p.qubit])).toEqual(['Z2', 'Z4']);
  const design = designer(gateRequest(plan, e, {}));
  const { findings, edge } = checkDesign(plan, e, design);
  plan.edges[k] = edge;
  plan.gates = plan.edges.map((_, j) => (j === k ? { design, findings } : null));
}, 60_000);

describe('waveform files of Clove-17 D6-X1', () => {
  it('the AWG program: the slot on the AWG grid, the mover\'s program inside it, the spectators out and back linearly in frequency', () => {
    const s = slotProgram(plan, k);
    const fs = plan.ctx.rules.sampleRateGHz;
    const d = plan.gates![k]!.design;
    expect(s.columns.map((c) => c.qubit)).toEqual(['D6', 'Z2', 'Z4']);
    const n = s.columns[0].flux.length - 1;
    const moves = 2 * spectatorMoveNs(plan.edges[k].rampNs, plan.ctx.rules);
    expect(Math.abs(n / fs - (d.durationNs + moves))).toBeLessThan(1e-9); // the slot duration
    expect(Array.from(s.columns[0].flux.subarray(s.moverStart, s.moverStart + d.awg!.flux.length))).toEqual(Array.from(d.awg!.flux));
    const ns = Math.round(spectatorMoveNs(plan.edges[k].rampNs, plan.ctx.rules) * fs);
    const pad = s.moverStart - ns;
    for (const [c, p] of plan.edges[k].parked.map((p, j) => [s.columns[j + 1], p] as const)) {
      const t = plan.ctx.transmons[p.qubit];
      const park = plan.states[p.qubit];
      expect(c.flux[0]).toBe(park.flux);
      expect(c.flux[n]).toBe(park.flux);
      for (let j = s.moverStart; j <= s.moverStart + d.awg!.flux.length - 1; j++) expect(c.flux[j]).toBe(p.flux);
      // out: f01 steps by (f_moved - f_park) / N_s per sample
      for (let j = 0; j <= ns; j++) expect(Math.abs(t.f01(c.flux[pad + j]) - (park.f01GHz + ((p.fGHz - park.f01GHz) * j) / ns))).toBeLessThan(1e-9);
      // back: the mirror
      for (let j = 0; j <= ns; j++) expect(c.flux[n - pad - j]).toBe(c.flux[pad + j]);
    }
    const csv = awgProgramCsv(plan, k).split('\n').filter((l) => l && !l.startsWith('#'));
    expect(csv[0]).toBe('sample,time_ns,D6_flux_phi0,Z2_flux_phi0,Z4_flux_phi0');
    expect(csv.length - 1).toBe(n + 1);
  });

  it('the flux the qubit sees is the mover\'s AWG program through the Gaussian line, as NumPy/SciPy convolve it (to 1e-7 Phi0), and the file re-reads to the design\'s samples', () => {
    const s = slotProgram(plan, k);
    const text = qubitFluxCsv(plan, k);
    expect(text).toMatch(/\ntime_ns,flux_phi0\n/);
    const w = parseTrajectoryCsv(text, 'D6-X1.qubit.csv');
    const r = plan.ctx.rules;
    const times = Array.from(w.timeNs, (t) => t + s.qubitFileOffsetNs);
    const ref = runPython<{ flux: number[] }>('gaussian_line.py', { samples: Array.from(s.columns[0].flux), fs: r.sampleRateGHz, sigma: lineSigmaNs(r.fluxBandwidthGHz!), park: s.columns[0].flux[0], times, h: 2e-4 });
    let worst = 0;
    w.flux.forEach((x, j) => (worst = Math.max(worst, Math.abs(x - ref.flux[j]))));
    expect(worst).toBeLessThan(1e-7);
    const d = plan.gates![k]!.design.waveform;
    const at = new Map(Array.from(w.timeNs, (t, j) => [t, w.flux[j]]));
    d.timeNs.forEach((t, j) => expect(at.get(t)).toBe(d.flux[j]));
  });

  it('two files for a designed gate; one that breaks a rule says so in its AWG file; none without a design', () => {
    expect(writesWaveforms(plan, k)).toBe(true);
    expect(waveformFiles(plan, 'out').map((f) => f.path)).toEqual(['out/waveforms/D6-X1.awg.csv', 'out/waveforms/D6-X1.qubit.csv']);
    const g = plan.gates![k]!;
    g.findings = [{ rule: 'cz-duration', qubits: ['D6', 'X1'], value: 101, threshold: 100, message: 'too long' }];
    expect(writesWaveforms(plan, k)).toBe(true);
    expect(awgProgramCsv(plan, k).split('\n')[0]).toBe('# WARNING: this gate breaks cz-duration (see plan.json); do not play it as it is');
    const feasible = g.design.feasible;
    g.design.feasible = false;
    expect(writesWaveforms(plan, k)).toBe(false);
    expect(waveformFiles(plan, 'out')).toEqual([]);
    g.design.feasible = feasible;
    g.findings = [];
  });
});
