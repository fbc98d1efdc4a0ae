/**
 * The frequency landscape: one row per qubit on one shared frequency axis. Each row shows the
 * transmon's tunable range (thin line) and the planner's range (wide pale bar), the window
 * (framed band), the parking f01 (dot, filled as in the map), f12 at parking (tick), each gate
 * the qubit moves in (a sweep from parking to its interaction point, a triangle there), each
 * move out of the way during another gate (dashed, to an open circle), its listed defects (red
 * bands) and its readout resonator (square). The many marks of one kind are drawn as one path, so
 * a 1,000-qubit chip stays light; each row has a hit area carrying `data-qubit`.
 */
import { axisTop } from 'd3-axis';
import { scaleLinear } from 'd3-scale';
import { select } from 'd3-selection';
import type { ReportEdge } from '../document.js';
import { ACCENT, parkingScale, UNKNOWN_COLOUR, VIOLATION_COLOUR } from './colours.js';
import { el } from './dom.js';
import { ghz, plural } from './format.js';
import type { ReportModel } from './model.js';
import type { Store, StoreState } from './store.js';
import type { Tooltip } from './tooltip.js';

const WIDTH = 1100;
const LABEL = 64;
const MOVE_COLOUR = '#6a4c93';

export interface LandscapeView {
  update(state: StoreState): void;
}

const f = (x: number) => x.toFixed(1);

export function drawLandscape(wrap: HTMLElement, legend: HTMLElement, hint: HTMLElement, model: ReportModel, store: Store, tooltip: Tooltip): LandscapeView {
  const qubits = model.doc.qubits;
  const n = qubits.length;
  const rowH = n <= 40 ? 22 : n <= 200 ? 16 : 12;
  const height = n * rowH + 8;
  const x = scaleLinear().domain(model.frequencySpan).range([LABEL, WIDTH - 12]);
  const fill = parkingScale(model.parkingSpan[0], model.parkingSpan[1]);
  const rowOf = new Map(qubits.map((q, i) => [q.id, i]));
  const yOf = (i: number) => 4 + i * rowH + rowH / 2;
  hint.textContent = `One row per qubit (${n}), all on one frequency axis (GHz). Click a row for the qubit's details.`;

  // The axis stays above the scrolling rows.
  const axisSvg = select(wrap.parentElement!).insert('svg', () => wrap).attr('viewBox', `0 0 ${WIDTH} 26`).attr('width', '100%').attr('aria-hidden', 'true');
  axisSvg.append('g').attr('class', 'axis').attr('transform', 'translate(0,24)').call(axisTop(x).ticks(12));
  axisSvg.append('text').attr('x', 4).attr('y', 20).attr('font-size', 11).attr('fill', '#5a6172').text('GHz');

  const svg = select(wrap)
    .append('svg')
    .attr('id', 'landscape')
    .attr('viewBox', `0 0 ${WIDTH} ${height}`)
    .attr('width', '100%')
    .attr('role', 'group')
    .attr('aria-label', `frequency landscape: ${n} qubits on one frequency axis`);

  // Grid lines at the axis ticks.
  svg.append('g').attr('class', 'grid').selectAll('line').data(x.ticks(12)).join('line')
    .attr('x1', (t) => f(x(t))).attr('x2', (t) => f(x(t))).attr('y1', 0).attr('y2', height);

  let stripes = '';
  for (let i = 1; i < n; i += 2) stripes += `M${LABEL} ${f(yOf(i) - rowH / 2)}H${WIDTH}v${rowH}H${LABEL}Z`;
  svg.append('path').attr('d', stripes).attr('fill', '#f6f3ec');
  const highlight = svg.append('g').attr('class', 'row-highlight');

  let tunable = '';
  let planning = '';
  let windows = '';
  let f12 = '';
  let defects = '';
  let readout = '';
  const band = rowH * 0.56;
  qubits.forEach((q, i) => {
    const y = yOf(i);
    tunable += `M${f(x(q.tunableGHz[0]))} ${f(y)}H${f(x(q.tunableGHz[1]))}`;
    if (q.planningGHz) planning += `M${f(x(q.planningGHz[0]))} ${f(y)}H${f(x(q.planningGHz[1]))}`;
    if (q.windowGHz) {
      const a = x(q.windowGHz[0]);
      const b = Math.max(x(q.windowGHz[1]), a + 1);
      windows += `M${f(a)} ${f(y - band / 2)}H${f(b)}V${f(y + band / 2)}H${f(a)}Z`;
    }
    if (q.f12GHz !== null) f12 += `M${f(x(q.f12GHz))} ${f(y - band / 2)}v${f(band)}`;
    for (const d of q.defects) {
      const a = x(d.atGHz - d.widthGHz);
      const b = Math.max(x(d.atGHz + d.widthGHz), a + 2);
      defects += `M${f(a)} ${f(y - rowH / 2 + 1)}H${f(b)}V${f(y + rowH / 2 - 1)}H${f(a)}Z`;
    }
    if (q.readoutGHz !== null) {
      const s = Math.min(7, rowH * 0.42);
      readout += `M${f(x(q.readoutGHz) - s / 2)} ${f(y - s / 2)}h${f(s)}v${f(s)}h${f(-s)}Z`;
    }
  });
  svg.append('path').attr('class', 'planning').attr('d', planning).attr('stroke', '#ddd6c6').attr('stroke-width', Math.max(4, rowH * 0.36)).attr('fill', 'none');
  svg.append('path').attr('class', 'tunable').attr('d', tunable).attr('stroke', '#8f897b').attr('stroke-width', 1).attr('fill', 'none');
  svg.append('path').attr('class', 'windows').attr('d', windows).attr('fill', 'rgba(31,111,120,0.16)').attr('stroke', ACCENT).attr('stroke-width', 0.8);
  svg.append('path').attr('class', 'defects').attr('d', defects).attr('fill', 'rgba(194,54,43,0.45)');
  svg.append('path').attr('class', 'readout').attr('d', readout).attr('fill', '#1d2330');

  // Gate sweeps (mover rows) and moves out of the way (spectator rows).
  let sweeps = '';
  let triangles = '';
  let moves = '';
  let moveEnds = '';
  const tri = Math.min(5, rowH * 0.3);
  for (const e of model.doc.edges) {
    const i = e.mover === null ? undefined : rowOf.get(e.mover);
    const from = i === undefined ? null : qubits[i].parkingGHz;
    if (i !== undefined && from !== null && e.interactionGHz !== null) {
      const y = yOf(i);
      const xi = x(e.interactionGHz);
      sweeps += `M${f(x(from))} ${f(y)}H${f(xi)}`;
      triangles += `M${f(xi)} ${f(y - tri)}l${f(tri)} ${f(2 * tri)}h${f(-2 * tri)}Z`;
    }
    for (const m of e.spectatorMoves) {
      const j = rowOf.get(m.qubit);
      const p = j === undefined ? null : qubits[j].parkingGHz;
      if (j === undefined || p === null) continue;
      const y = yOf(j) + rowH * 0.22;
      const xm = x(m.toGHz);
      moves += `M${f(x(p))} ${f(y)}H${f(xm)}`;
      const r = Math.min(3, rowH * 0.18);
      moveEnds += `M${f(xm - r)} ${f(y)}a${r} ${r} 0 1 0 ${f(2 * r)} 0a${r} ${r} 0 1 0 ${f(-2 * r)} 0`;
    }
  }
  svg.append('path').attr('class', 'sweeps').attr('d', sweeps).attr('stroke', ACCENT).attr('stroke-width', 1.2).attr('stroke-opacity', 0.7).attr('fill', 'none');
  svg.append('path').attr('class', 'interactions').attr('d', triangles).attr('fill', ACCENT);
  svg.append('path').attr('class', 'moves').attr('d', moves).attr('stroke', MOVE_COLOUR).attr('stroke-width', 1.2).attr('stroke-dasharray', '3 2').attr('fill', 'none');
  svg.append('path').attr('class', 'move-ends').attr('d', moveEnds).attr('stroke', MOVE_COLOUR).attr('stroke-width', 1.2).attr('fill', '#fff');
  svg.append('path').attr('class', 'f12').attr('d', f12).attr('stroke', '#3a3f4d').attr('stroke-width', 1.6).attr('fill', 'none');

  const dotR = Math.max(2.5, Math.min(5.5, rowH * 0.3));
  svg.append('g').attr('class', 'parking').selectAll('circle').data(qubits).join('circle')
    .attr('cx', (q) => (q.parkingGHz === null ? -10 : f(x(q.parkingGHz))))
    .attr('cy', (_, i) => f(yOf(i)))
    .attr('r', dotR)
    .attr('fill', (q) => (q.parkingGHz === null ? UNKNOWN_COLOUR : fill(q.parkingGHz)))
    .attr('stroke', (q) => (q.violations > 0 ? VIOLATION_COLOUR : '#1d2330'))
    .attr('stroke-width', (q) => (q.violations > 0 ? 2 : 0.8));

  svg.append('g').attr('class', 'labels').selectAll('text').data(qubits).join('text')
    .attr('class', 'rowlabel')
    .attr('x', LABEL - 6)
    .attr('y', (_, i) => f(yOf(i) + 4))
    .attr('text-anchor', 'end')
    .style('font-size', `${Math.min(11, rowH - 2)}px`)
    .text((q) => q.id);

  const selectedMarks = svg.append('g').attr('class', 'selected-edge');
  svg.append('g').attr('class', 'hits').selectAll('rect').data(qubits).join('rect')
    .attr('class', 'row-hit')
    .attr('data-qubit', (q) => q.id)
    .attr('x', 0)
    .attr('y', (_, i) => f(yOf(i) - rowH / 2))
    .attr('width', WIDTH)
    .attr('height', rowH)
    .attr('fill', 'transparent');

  const root = svg.node()!;
  const rowAt = (ev: Event) => (ev.target as Element).getAttribute?.('data-qubit');
  root.addEventListener('mousemove', (ev) => {
    const id = rowAt(ev);
    const q = id ? model.qubit.get(id) : undefined;
    if (!q) return tooltip.hide();
    const gates = (model.edgesOf.get(q.id) ?? []).filter((e) => e.mover === q.id).length;
    const moved = model.movedIn.get(q.id)?.length ?? 0;
    tooltip.show(`${q.id}: parks at ${ghz(q.parkingGHz)}, moves in ${plural(gates, 'gate')}, moved aside in ${moved}`, ev.clientX, ev.clientY);
  });
  root.addEventListener('mouseleave', () => tooltip.hide());
  root.addEventListener('click', (ev) => {
    const id = rowAt(ev);
    if (id) store.select({ kind: 'qubit', id });
  });

  legend.append(landscapeKey());

  const mark = (e: ReportEdge) => {
    const i = e.mover === null ? undefined : rowOf.get(e.mover);
    const from = i === undefined ? null : qubits[i].parkingGHz;
    if (i === undefined || from === null || e.interactionGHz === null) return;
    const y = yOf(i);
    selectedMarks.append('line').attr('x1', f(x(from))).attr('x2', f(x(e.interactionGHz))).attr('y1', f(y)).attr('y2', f(y)).attr('stroke', ACCENT).attr('stroke-width', 3.5);
    selectedMarks.append('text').attr('x', f(x(e.interactionGHz) + 8)).attr('y', f(y - rowH / 2 + 2)).attr('font-size', 11).attr('fill', ACCENT)
      .text(`${e.key}: ${e.mover} to ${ghz(e.interactionGHz, 3)}${e.crossing ? ` (${e.crossing})` : ''}`);
  };

  return {
    update(state) {
      highlight.selectAll('*').remove();
      selectedMarks.selectAll('*').remove();
      const sel = state.selected;
      const rows = new Map<string, string>();
      if (sel?.kind === 'qubit') rows.set(sel.id, 'rgba(31,111,120,0.20)');
      if (sel?.kind === 'edge') {
        const e = model.edge.get(sel.key);
        if (e) {
          e.qubits.forEach((q) => rows.set(q, 'rgba(31,111,120,0.16)'));
          e.spectatorMoves.forEach((m) => rows.set(m.qubit, 'rgba(106,76,147,0.16)'));
          mark(e);
        }
      }
      for (const [id, colour] of rows) {
        const i = rowOf.get(id);
        if (i === undefined) continue;
        highlight.append('rect').attr('x', 0).attr('y', f(yOf(i) - rowH / 2)).attr('width', WIDTH).attr('height', rowH).attr('fill', colour);
      }
    },
  };
}

/** The landscape's symbol key, as one small SVG. */
function landscapeKey(): HTMLElement {
  const box = el('div', { class: 'legend' });
  const items: [string, (g: ReturnType<typeof select<SVGGElement, unknown>>) => void][] = [
    ['tunable range', (g) => void g.append('path').attr('d', 'M-9 0H9').attr('stroke', '#8f897b')],
    ['planning range', (g) => void g.append('path').attr('d', 'M-9 0H9').attr('stroke', '#ddd6c6').attr('stroke-width', 6)],
    ['window', (g) => void g.append('rect').attr('x', -9).attr('y', -5).attr('width', 18).attr('height', 10).attr('fill', 'rgba(31,111,120,0.16)').attr('stroke', ACCENT)],
    ['parking', (g) => void g.append('circle').attr('r', 5).attr('fill', '#3fa68b').attr('stroke', '#1d2330').attr('stroke-width', 0.8)],
    ['f12', (g) => void g.append('path').attr('d', 'M0 -6V6').attr('stroke', '#3a3f4d').attr('stroke-width', 1.6)],
    ['sweep to interaction point', (g) => void g.append('path').attr('d', 'M-9 0H4M4 -5l5 10h-10Z').attr('stroke', ACCENT).attr('fill', ACCENT)],
    ['moved aside during a gate', (g) => void g.append('path').attr('d', 'M-9 0H5M5 0a3 3 0 1 0 6 0a3 3 0 1 0 -6 0').attr('stroke', MOVE_COLOUR).attr('stroke-dasharray', '3 2').attr('fill', '#fff')],
    ['defect (band kept clear)', (g) => void g.append('rect').attr('x', -4).attr('y', -7).attr('width', 8).attr('height', 14).attr('fill', 'rgba(194,54,43,0.45)')],
    ['readout resonator', (g) => void g.append('rect').attr('x', -4).attr('y', -4).attr('width', 8).attr('height', 8).attr('fill', '#1d2330')],
  ];
  const svg = select(box).append('svg').attr('width', 940).attr('height', 44).attr('role', 'img').attr('aria-label', `key: ${items.map((i) => i[0]).join(', ')}`);
  items.forEach(([label, draw], k) => {
    const gx = (k % 5) * 188 + 12;
    const gy = Math.floor(k / 5) * 22 + 11;
    const g = svg.append('g').attr('transform', `translate(${gx},${gy})`);
    draw(g as never);
    svg.append('text').attr('x', gx + 16).attr('y', gy + 4).attr('font-size', 11.5).attr('fill', '#1d2330').text(label);
  });
  return box;
}
