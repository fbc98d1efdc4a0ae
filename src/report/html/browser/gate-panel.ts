/**
 * The gate close-up of one edge: its flux waveform and the mover's f01 along it (computed from
 * the mover's transmon when the report was built), with the partner's parking f01 and the
 * interaction frequency as reference lines, and the split of its predicted error as one bar: the
 * error budget's parts when the plan carries them, else the designed gate's coherent error
 * (1 - fidelity) and the decoherence it adds.
 */
import { axisBottom, axisLeft } from 'd3-axis';
import { scaleLinear } from 'd3-scale';
import { select } from 'd3-selection';
import { line } from 'd3-shape';
import { GATE_BUDGET_PARTS, type ReportEdge, type ReportWaveform } from '../document.js';
import { ACCENT, GATE_BUDGET_COLOURS, GATE_BUDGET_LABELS } from './colours.js';
import { ERROR_SOURCE_TEXT, selectButton } from './details.js';
import { clear, el } from './dom.js';
import { err, fixed, ghz, ns } from './format.js';
import type { ReportModel } from './model.js';
import type { Store } from './store.js';

const W = 520;
const H = 210;
const M = { top: 10, right: 16, bottom: 34, left: 62 };

interface Reference {
  value: number;
  label: string;
  colour: string;
}

function chart(title: string, w: ReportWaveform, values: number[], yLabel: string, refs: Reference[], format: (y: number) => string): HTMLElement {
  const box = el('div', { class: 'chart' }, el('div', { class: 'chart-title' }, title));
  const all = [...values, ...refs.map((r) => r.value)];
  let lo = Math.min(...all);
  let hi = Math.max(...all);
  if (!(hi > lo)) {
    lo -= 0.5;
    hi += 0.5;
  }
  const pad = 0.06 * (hi - lo);
  const x = scaleLinear().domain([w.timeNs[0], w.timeNs[w.timeNs.length - 1]]).range([M.left, W - M.right]);
  const y = scaleLinear().domain([lo - pad, hi + pad]).range([H - M.bottom, M.top]).nice();
  const svg = select(box).append('svg').attr('viewBox', `0 0 ${W} ${H}`).attr('width', '100%').attr('role', 'img').attr('aria-label', `${title} against time`);
  svg.append('g').attr('class', 'grid').selectAll('line').data(y.ticks(5)).join('line')
    .attr('x1', M.left).attr('x2', W - M.right).attr('y1', (t) => y(t)).attr('y2', (t) => y(t));
  svg.append('g').attr('class', 'axis').attr('transform', `translate(0,${H - M.bottom})`).call(axisBottom(x).ticks(8));
  svg.append('g').attr('class', 'axis').attr('transform', `translate(${M.left},0)`).call(axisLeft(y).ticks(5).tickFormat((v) => format(Number(v))));
  svg.append('text').attr('x', (M.left + W - M.right) / 2).attr('y', H - 4).attr('text-anchor', 'middle').attr('font-size', 11).attr('fill', '#5a6172').text('time (ns)');
  svg.append('text').attr('transform', `translate(12,${(H - M.bottom + M.top) / 2}) rotate(-90)`).attr('text-anchor', 'middle').attr('font-size', 11).attr('fill', '#5a6172').text(yLabel);
  for (const r of refs) {
    svg.append('line').attr('x1', M.left).attr('x2', W - M.right).attr('y1', y(r.value)).attr('y2', y(r.value)).attr('stroke', r.colour).attr('stroke-dasharray', '5 3').attr('stroke-width', 1.2);
    svg.append('text').attr('x', W - M.right - 4).attr('y', y(r.value) - 4).attr('text-anchor', 'end').attr('font-size', 10.5).attr('fill', r.colour).text(r.label);
  }
  const points = values.map((v, k) => [w.timeNs[k], v] as [number, number]);
  svg.append('path').attr('d', line<[number, number]>().x((p) => x(p[0])).y((p) => y(p[1]))(points) ?? '').attr('fill', 'none').attr('stroke', ACCENT).attr('stroke-width', 2);
  return box;
}

interface Part {
  key: string;
  label: string;
  value: number;
  colour: string;
}

/** The parts of the error split bar, and what they stand for. */
export function errorParts(e: ReportEdge): { parts: Part[]; total: number; caption: string } | null {
  const g = e.gate;
  if (g?.budget) {
    const parts = GATE_BUDGET_PARTS.map((k) => ({ key: k, label: GATE_BUDGET_LABELS[k], value: g.budget![k] ?? 0, colour: GATE_BUDGET_COLOURS[k] })).filter((p) => p.value > 0);
    return { parts, total: g.budget.total, caption: 'error budget of the gate (average infidelities by cause)' };
  }
  if (g && g.fidelity !== null) {
    const coherent = Math.max(0, 1 - g.fidelity);
    const deco = g.decoherenceEstimate ?? (g.fidelityNoisy !== null ? Math.max(0, g.fidelity - g.fidelityNoisy) : null);
    const parts: Part[] = [{ key: 'coherent', label: 'coherent (leakage, phase)', value: coherent, colour: GATE_BUDGET_COLOURS.coherent }];
    if (deco !== null) parts.push({ key: 'decoherence', label: 'decoherence (T1, dephasing)', value: deco, colour: GATE_BUDGET_COLOURS.t1 });
    return { parts, total: parts.reduce((s, p) => s + p.value, 0), caption: 'split from the designed gate: its coherent error and the decoherence it adds (no error budget in this plan)' };
  }
  return null;
}

function splitBar(e: ReportEdge): HTMLElement {
  const split = errorParts(e);
  if (!split) {
    return el('p', { class: 'hint' }, e.error ? `No pulse designed: the ${ERROR_SOURCE_TEXT[e.error.source]} is ${err(e.error.value)}.` : 'No pulse designed and no error estimate for this edge.');
  }
  const box = el('div', { class: 'budget-bar', 'data-total': String(split.total) }, el('div', { class: 'chart-title' }, `Error split: total ${err(split.total)}`), el('div', { class: 'hint' }, split.caption));
  const width = 720;
  const svg = select(box).append('svg').attr('viewBox', `0 0 ${width} 26`).attr('width', '100%').attr('role', 'img')
    .attr('aria-label', `error split: ${split.parts.map((p) => `${p.label} ${err(p.value)}`).join(', ')}`);
  const sum = split.parts.reduce((s, p) => s + p.value, 0) || 1;
  let x0 = 0;
  for (const p of split.parts) {
    const w = (p.value / sum) * width;
    svg.append('rect').attr('class', 'budget-part').attr('data-part', p.key).attr('x', x0).attr('y', 2).attr('width', Math.max(0, w)).attr('height', 22).attr('fill', p.colour)
      .append('title').text(`${p.label}: ${err(p.value)} (${((100 * p.value) / sum).toFixed(0)} %)`);
    x0 += w;
  }
  const keys = el('div', { class: 'budget-keys' });
  for (const p of split.parts) {
    const s = el('span', { style: `--swatch: ${p.colour}` }, `${p.label} ${err(p.value)}`);
    keys.append(s);
  }
  box.append(keys);
  return box;
}

export function drawGatePanel(node: HTMLElement, model: ReportModel, store: Store, e: ReportEdge | null): void {
  clear(node);
  if (!e) {
    node.append(el('p', { class: 'hint' }, 'This chip has no couplings.'));
    return;
  }
  node.setAttribute('data-edge', e.key);
  const g = e.gate;
  node.append(
    el('p', {}, el('b', {}, `Edge ${e.key}`), ': ', e.mover ? selectButton(store, { kind: 'qubit', id: e.mover }, e.mover) : '-', ` moves to ${ghz(e.interactionGHz)}`,
      e.crossing ? ` (${e.crossing} crossing with ${e.partner ?? '-'})` : '', `, ${ns(e.durationNs)}`, g?.family ? `, ${g.family} ramps of ${ns(g.rampNs)}, hold ${ns(g.holdNs)}` : '',
      g ? `, fidelity ${fixed(g.fidelity, 6)}${g.fidelityNoisy !== null ? ` (${fixed(g.fidelityNoisy, 6)} with decoherence)` : ''}, leakage ${err(g.leakage)}.` : '.',
      ' ', el('span', { class: 'hint' }, 'Select another edge in the map, the timeline or the table below.')),
  );
  const w = e.waveform;
  if (w && w.timeNs.length >= 2) {
    const partner = e.partner ? model.qubit.get(e.partner) : undefined;
    const refs: Reference[] = [];
    if (partner?.parkingGHz != null) refs.push({ value: partner.parkingGHz, label: `${partner.id} parks`, colour: '#6a4c93' });
    if (e.interactionGHz !== null) refs.push({ value: e.interactionGHz, label: 'interaction', colour: '#c2362b' });
    const charts = el('div', { class: 'charts' });
    charts.append(
      chart(`Flux of ${e.mover} (\u03a60)`, w, w.flux, 'flux (\u03a60)', [], (v) => v.toFixed(3)),
      chart(`f01 of ${e.mover} (GHz)`, w, w.f01GHz, 'f01 (GHz)', refs, (v) => v.toFixed(2)),
    );
    node.append(charts);
    if (w.timeNs.length < w.originalSamples) node.append(el('p', { class: 'hint' }, `Drawn from ${w.timeNs.length} of the waveform's ${w.originalSamples} samples.`));
  } else {
    const why = e.waveformNote ?? (g ? 'The designed gate has no waveform in this plan.' : model.doc.pulses ? 'No pulse was designed for this edge.' : 'The plan was made without pulse design (--no-pulses): no waveform.');
    node.append(el('p', { class: 'hint' }, why));
  }
  node.append(splitBar(e));
}
