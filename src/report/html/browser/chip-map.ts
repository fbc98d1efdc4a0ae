/**
 * The chip map: every qubit at its layout `pos` (equal x and y scales; y grows downwards), filled
 * by its parking frequency; every coupling as a line coloured by its parallel layer or by its
 * gate's predicted error (a toggle). A red ring marks a qubit a violation names, a dashed amber
 * ring a flagged one; a red dashed halo marks an edge that breaks a rule. Qubits and edges are
 * focusable buttons (Tab, Enter or Space) carrying `data-qubit` / `data-edge`; hover shows a
 * summary, click selects (the details panel and the other views follow).
 */
import { select } from 'd3-selection';
import type { ReportEdge, ReportQubit } from '../document.js';
import { errorScale, FLAG_COLOUR, layerColour, layerDash, parkingScale, UNKNOWN_COLOUR, VIOLATION_COLOUR } from './colours.js';
import { err, ghz, ns } from './format.js';
import { highlightedEdges, type ReportModel } from './model.js';
import type { Store, StoreState } from './store.js';
import type { Tooltip } from './tooltip.js';

const WIDTH = 900;

interface Geometry {
  x: (q: ReportQubit) => number;
  y: (q: ReportQubit) => number;
  height: number;
  radius: number;
  lineWidth: number;
  labels: boolean;
  fontPx: number;
}

function median(values: number[]): number {
  if (values.length === 0) return NaN;
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
}

/** Scales that fit the chip into the map with equal x and y units. */
export function mapGeometry(model: ReportModel): Geometry {
  const qs = model.doc.qubits;
  const xs = qs.map((q) => q.pos[0]);
  const ys = qs.map((q) => q.pos[1]);
  const x0 = Math.min(...xs);
  const x1 = Math.max(...xs);
  const y0 = Math.min(...ys);
  const y1 = Math.max(...ys);
  const lengths = model.doc.edges
    .map((e) => {
      const a = model.qubit.get(e.qubits[0]);
      const b = model.qubit.get(e.qubits[1]);
      if (!a || !b) return NaN;
      const dx = a.pos[0] - b.pos[0];
      const dy = a.pos[1] - b.pos[1];
      return Math.sqrt(dx * dx + dy * dy);
    })
    .filter((d) => d > 0);
  let spacing = median(lengths);
  if (!(spacing > 0)) spacing = Math.max(x1 - x0, y1 - y0, 1) / Math.max(1, Math.sqrt(qs.length));
  const spanX = Math.max(x1 - x0, spacing);
  const spanY = Math.max(y1 - y0, spacing * 0.5);
  const fit = (margin: number) => Math.min((WIDTH - 2 * margin) / spanX, (0.7 * WIDTH - 2 * margin) / spanY);
  const radius = Math.max(3.5, Math.min(20, 0.26 * spacing * fit(34)));
  const margin = Math.max(24, radius + 18);
  const scale = fit(margin);
  const height = Math.max(200, spanY * scale + 2 * margin);
  const cx = (x0 + x1) / 2;
  const cy = (y0 + y1) / 2;
  return {
    x: (q) => WIDTH / 2 + (q.pos[0] - cx) * scale,
    y: (q) => height / 2 + (q.pos[1] - cy) * scale,
    height,
    radius,
    lineWidth: Math.max(1.6, Math.min(6, 0.1 * spacing * scale)),
    labels: spacing * scale >= 26,
    fontPx: Math.max(9, Math.min(13, 0.6 * radius + 4)),
  };
}

export function qubitSummary(q: ReportQubit): string {
  const parts = [`${q.id}`, `parks at ${ghz(q.parkingGHz)}`];
  if (q.t1Us !== null) parts.push(`T1 ${q.t1Us.toPrecision(3)} \u00b5s`);
  if (q.marginSpreads !== null) parts.push(`margin ${q.marginSpreads.toFixed(1)} spreads`);
  if (q.violations > 0) parts.push(`${q.violations} violation(s)`);
  if (q.flags > 0) parts.push(`${q.flags} flag(s)`);
  return parts.join(', ');
}

export function edgeSummary(e: ReportEdge): string {
  const parts = [`edge ${e.key}`];
  if (e.layer !== null) parts.push(`layer ${e.layer}`);
  if (e.mover) parts.push(`mover ${e.mover}`);
  if (e.durationNs !== null) parts.push(ns(e.durationNs));
  if (e.error) parts.push(`predicted error ${err(e.error.value)}`);
  if (e.violations > 0 || !e.feasible) parts.push(`breaks ${Math.max(1, e.violations)} rule condition(s)`);
  return parts.join(', ');
}

export interface ChipMapView {
  update(state: StoreState, changed: 'selected' | 'colouring'): void;
}

export function drawChipMap(container: HTMLElement, model: ReportModel, store: Store, tooltip: Tooltip): ChipMapView {
  const g = mapGeometry(model);
  const fill = parkingScale(model.parkingSpan[0], model.parkingSpan[1]);
  const errors = errorScale();
  const svg = select(container)
    .append('svg')
    .attr('id', 'chip-map')
    .attr('viewBox', `0 0 ${WIDTH} ${g.height.toFixed(1)}`)
    .attr('role', 'group')
    .attr('aria-label', `chip map of ${model.doc.chip}: ${model.doc.qubits.length} qubits, ${model.doc.edges.length} couplings`);

  const edgeLayer = svg.append('g').attr('class', 'edges');
  const edges = edgeLayer
    .selectAll('g.edge')
    .data(model.doc.edges.filter((e) => model.qubit.has(e.qubits[0]) && model.qubit.has(e.qubits[1])))
    .join('g')
    .attr('class', 'edge')
    .attr('data-edge', (e) => e.key)
    .attr('tabindex', 0)
    .attr('role', 'button')
    .attr('aria-label', edgeSummary);
  const ends = (e: ReportEdge) => {
    const a = model.qubit.get(e.qubits[0])!;
    const b = model.qubit.get(e.qubits[1])!;
    return { x1: g.x(a), y1: g.y(a), x2: g.x(b), y2: g.y(b) };
  };
  const line = (cls: string, width: number) =>
    edges
      .append('line')
      .attr('class', cls)
      .each(function (e) {
        const p = ends(e);
        this.setAttribute('x1', p.x1.toFixed(1));
        this.setAttribute('y1', p.y1.toFixed(1));
        this.setAttribute('x2', p.x2.toFixed(1));
        this.setAttribute('y2', p.y2.toFixed(1));
      })
      .attr('stroke-width', width)
      .attr('stroke-linecap', 'round');
  // The hit area: a filled band around the line (a band, unlike a stroke, has an area even for a
  // horizontal or vertical edge, so pointer and automation tools find it).
  const half = Math.max(6, g.radius * 0.6);
  edges
    .append('path')
    .attr('class', 'edge-hit')
    .attr('fill', 'transparent')
    .attr('d', (e) => {
      const p = ends(e);
      const dx = p.x2 - p.x1;
      const dy = p.y2 - p.y1;
      const len = Math.sqrt(dx * dx + dy * dy) || 1;
      const nx = (-dy / len) * half;
      const ny = (dx / len) * half;
      const pt = (x: number, y: number) => `${x.toFixed(1)} ${y.toFixed(1)}`;
      return `M${pt(p.x1 + nx, p.y1 + ny)}L${pt(p.x2 + nx, p.y2 + ny)}L${pt(p.x2 - nx, p.y2 - ny)}L${pt(p.x1 - nx, p.y1 - ny)}Z`;
    });
  // Marks scale with the drawing (a 1,000-qubit map has small dots).
  const ring = Math.max(1.2, Math.min(3, 0.3 * g.radius));
  const gap = Math.max(1.2, Math.min(3, 0.25 * g.radius));
  line('edge-halo', g.lineWidth + 2 * ring)
    .attr('stroke', VIOLATION_COLOUR)
    .attr('stroke-dasharray', `${2 * ring} ${1.5 * ring}`)
    .attr('visibility', (e) => (e.violations > 0 || !e.feasible ? 'visible' : 'hidden'));
  const edgeLines = line('edge-line', g.lineWidth);
  line('edge-focus', g.lineWidth + 6);

  const qubitLayer = svg.append('g').attr('class', 'qubits');
  const qubits = qubitLayer
    .selectAll('g.qubit')
    .data(model.doc.qubits)
    .join('g')
    .attr('class', 'qubit')
    .attr('data-qubit', (q) => q.id)
    .attr('tabindex', 0)
    .attr('role', 'button')
    .attr('aria-label', qubitSummary)
    .attr('transform', (q) => `translate(${g.x(q).toFixed(1)},${g.y(q).toFixed(1)})`);
  const r = g.radius;
  qubits
    .append('circle')
    .attr('class', 'moved-ring')
    .attr('r', r + gap + ring)
    .attr('fill', 'none')
    .attr('stroke', '#1f6f78')
    .attr('stroke-width', 2)
    .attr('stroke-dasharray', '3 2')
    .attr('visibility', 'hidden');
  qubits
    .filter((q) => q.flags > 0)
    .append('circle')
    .attr('class', 'flag-ring')
    .attr('r', (q) => r + gap + (q.violations > 0 ? 2 * ring + 0.5 : 0.5 * ring))
    .attr('fill', 'none')
    .attr('stroke', FLAG_COLOUR)
    .attr('stroke-width', 0.8 * ring)
    .attr('stroke-dasharray', `${1.2 * ring} ${ring}`);
  qubits
    .filter((q) => q.violations > 0)
    .append('circle')
    .attr('class', 'violation-ring')
    .attr('r', r + gap + 0.5 * ring)
    .attr('fill', 'none')
    .attr('stroke', VIOLATION_COLOUR)
    .attr('stroke-width', ring);
  qubits.append('circle').attr('class', 'backing').attr('r', r).attr('fill', '#fbfaf7');
  qubits
    .append('circle')
    .attr('class', 'core')
    .attr('r', r)
    .attr('fill', (q) => (q.parkingGHz === null ? UNKNOWN_COLOUR : fill(q.parkingGHz)))
    .attr('stroke', '#ffffff')
    .attr('stroke-width', 1.5);
  qubits.append('circle').attr('class', 'focus-ring').attr('r', r + 8);
  if (g.labels) {
    qubits
      .append('text')
      .attr('class', 'qlabel')
      .attr('text-anchor', 'middle')
      .attr('dy', -(r + 5))
      .style('font-size', `${g.fontPx}px`)
      .text((q) => q.id);
  }

  // One set of listeners for the whole map (delegation): hover, click, keyboard.
  const target = (ev: Event): { qubit?: string; edge?: string } | null => {
    const node = (ev.target as Element | null)?.closest?.('[data-qubit],[data-edge]');
    if (!node || !container.contains(node)) return null;
    const qubit = node.getAttribute('data-qubit');
    const edge = node.getAttribute('data-edge');
    return qubit ? { qubit } : edge ? { edge } : null;
  };
  const root = svg.node()!;
  root.addEventListener('mousemove', (ev) => {
    const t = target(ev);
    if (!t) return tooltip.hide();
    const textOf = t.qubit ? qubitSummary(model.qubit.get(t.qubit)!) : edgeSummary(model.edge.get(t.edge!)!);
    tooltip.show(textOf, ev.clientX, ev.clientY);
  });
  root.addEventListener('mouseleave', () => tooltip.hide());
  root.addEventListener('click', (ev) => {
    const t = target(ev);
    if (!t) return store.select(null);
    store.select(t.qubit ? { kind: 'qubit', id: t.qubit } : { kind: 'edge', key: t.edge! });
  });
  root.addEventListener('keydown', (ev) => {
    if (ev.key !== 'Enter' && ev.key !== ' ') return;
    const t = target(ev);
    if (!t) return;
    ev.preventDefault();
    store.select(t.qubit ? { kind: 'qubit', id: t.qubit } : { kind: 'edge', key: t.edge! });
  });

  const colourEdges = (colouring: 'layer' | 'error') => {
    edgeLines
      .attr('stroke', (e) => (colouring === 'layer' ? layerColour(e.layer) : e.error ? errors(Math.max(e.error.value, 1e-12)) : UNKNOWN_COLOUR))
      .attr('stroke-dasharray', (e) => (colouring === 'layer' ? layerDash(e.layer) : null));
  };
  colourEdges(store.state.colouring);

  return {
    update(state, changed) {
      if (changed === 'colouring') return colourEdges(state.colouring);
      const sel = state.selected;
      const lit = highlightedEdges(model, sel);
      const litQubits = new Set<string>();
      const moved = new Set<string>();
      if (sel?.kind === 'qubit') litQubits.add(sel.id);
      if (sel?.kind === 'edge') {
        const e = model.edge.get(sel.key);
        e?.qubits.forEach((q) => litQubits.add(q));
        e?.spectatorMoves.forEach((m) => moved.add(m.qubit));
      }
      if (sel?.kind === 'layer' && lit) for (const k of lit) model.edge.get(k)?.qubits.forEach((q) => litQubits.add(q));
      edges.classed('selected', (e) => sel?.kind === 'edge' && e.key === sel.key).classed('dim', (e) => lit !== null && !lit.has(e.key));
      qubits
        .classed('selected', (q) => sel?.kind === 'qubit' && q.id === sel.id)
        .classed('dim', (q) => sel !== null && sel.kind !== 'qubit' && !litQubits.has(q.id) && !moved.has(q.id));
      qubits.select('circle.moved-ring').attr('visibility', (q) => (moved.has(q.id) ? 'visible' : 'hidden'));
    },
  };
}
