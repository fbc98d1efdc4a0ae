/**
 * The layers in time: the parallel layers one after another along a time axis, each as long as
 * its longest gate; inside a layer, its gates as bars of their own durations (longest first), in
 * the layer's colour. Gate bars carry `data-edge` (click: the edge); a layer's header carries
 * `data-layer` (click: its gates light up in the map). Layers of many gates draw their bars as one
 * shape (a profile of the durations) and are selected as a whole.
 */
import { axisBottom } from 'd3-axis';
import { scaleLinear } from 'd3-scale';
import { select } from 'd3-selection';
import { layerColour } from './colours.js';
import { ns, plural } from './format.js';
import type { ReportModel } from './model.js';
import type { Store, StoreState } from './store.js';
import type { Tooltip } from './tooltip.js';

const BAR_ROWS = 60;

export interface TimelineView {
  update(state: StoreState): void;
}

export function drawTimeline(wrap: HTMLElement, hint: HTMLElement, model: ReportModel, store: Store, tooltip: Tooltip): TimelineView {
  const layers = model.doc.layers;
  const known = layers.every((l) => l.durationNs !== null);
  const durations = layers.map((l) => (known ? (l.durationNs as number) : 1));
  const total = durations.reduce((s, d) => s + d, 0);
  const cycle = model.doc.cycle;
  hint.textContent = layers.length === 0
    ? 'No layers in this plan.'
    : `${plural(layers.length, 'layer')} (lower bound ${model.doc.layerLowerBound ?? '-'}, the largest degree)` +
      (known ? `, ${ns(total)} when run one after another` : ', durations not known: drawn with equal widths') +
      (cycle?.durationNs != null ? `; cycle ${ns(cycle.durationNs)}` : '') +
      (cycle?.error != null ? `, cycle error ${cycle.error.toExponential(2)}` : '') +
      '. Click a layer header for its gates, a bar for one gate.';
  const maxGates = Math.max(1, ...layers.map((l) => l.edges.length));
  const barH = maxGates <= 12 ? 14 : maxGates <= BAR_ROWS ? Math.max(4, Math.floor(170 / maxGates)) : 0;
  const bodyH = barH > 0 ? maxGates * barH + 6 : 120;
  const width = Math.max(900, layers.length * 70);
  const top = 34;
  const height = top + bodyH + 34;
  const x = scaleLinear().domain([0, Math.max(total, 1e-9)]).range([10, width - 10]);
  const svg = select(wrap).append('svg').attr('id', 'timeline').attr('viewBox', `0 0 ${width} ${height}`).attr('width', width > 1400 ? width : '100%')
    .attr('role', 'group').attr('aria-label', `timeline of ${layers.length} layers`);
  let t = 0;
  const blocks = layers.map((layer, k) => {
    const x0 = x(t);
    t += durations[k];
    const x1 = x(t);
    const colour = layerColour(layer.index);
    const g = svg.append('g').attr('class', 'layer').attr('data-layer-index', layer.index);
    g.append('rect').attr('class', 'layer-block').attr('data-layer', layer.index).attr('tabindex', 0).attr('role', 'button')
      .attr('aria-label', `layer ${layer.index}: ${plural(layer.edges.length, 'gate')}, ${ns(layer.durationNs)}`)
      .attr('x', x0 + 1).attr('y', 4).attr('width', Math.max(2, x1 - x0 - 2)).attr('height', top - 8).attr('rx', 3).attr('fill', colour);
    g.append('text').attr('x', x0 + 6).attr('y', top - 12).attr('font-size', 11).attr('fill', '#fff').attr('pointer-events', 'none')
      .text(x1 - x0 > 150 ? `L${layer.index} \u00b7 ${plural(layer.edges.length, 'gate')} \u00b7 ${ns(layer.durationNs)}` : x1 - x0 > 95 ? `L${layer.index} \u00b7 ${ns(layer.durationNs)}` : `L${layer.index}`);
    const edges = layer.edges.map((key) => model.edge.get(key)).filter((e) => e !== undefined).sort((a, b) => (b!.durationNs ?? 0) - (a!.durationNs ?? 0) || a!.key.localeCompare(b!.key));
    const span = (d: number | null) => (known && d !== null ? x(d) - x(0) : x1 - x0 - 2);
    if (barH > 0) {
      edges.forEach((e, row) => {
        g.append('rect').attr('class', 'gate-bar').attr('data-edge', e!.key)
          .attr('x', x0 + 1).attr('y', top + row * barH).attr('width', Math.max(1, span(e!.durationNs) - 1)).attr('height', Math.max(1, barH - 2))
          .attr('fill', colour).attr('fill-opacity', 0.55).attr('stroke', colour);
      });
    } else if (edges.length > 0) {
      // A profile: the sorted durations as one shape.
      const h = bodyH / edges.length;
      let d = `M${x0 + 1} ${top}`;
      edges.forEach((e, row) => {
        const w = Math.max(1, span(e!.durationNs) - 1);
        d += `H${(x0 + 1 + w).toFixed(1)}V${(top + (row + 1) * h).toFixed(1)}`;
      });
      d += `H${x0 + 1}Z`;
      g.append('path').attr('class', 'layer-profile').attr('data-layer', layer.index).attr('d', d).attr('fill', colour).attr('fill-opacity', 0.5).attr('stroke', colour);
    }
    return g;
  });
  if (known) svg.append('g').attr('class', 'axis').attr('transform', `translate(0,${top + bodyH + 4})`).call(axisBottom(x).ticks(10));
  svg.append('text').attr('x', width - 10).attr('y', height - 2).attr('text-anchor', 'end').attr('font-size', 11).attr('fill', '#5a6172').text(known ? 'time (ns)' : '');

  const root = svg.node()!;
  const hit = (ev: Event) => {
    const node = (ev.target as Element).closest?.('[data-edge],[data-layer]');
    if (!node) return null;
    const edge = node.getAttribute('data-edge');
    const layer = node.getAttribute('data-layer');
    return edge ? { edge } : layer !== null ? { layer: Number(layer) } : null;
  };
  root.addEventListener('click', (ev) => {
    const h = hit(ev);
    if (h?.edge) store.select({ kind: 'edge', key: h.edge });
    else if (h?.layer !== undefined) store.select({ kind: 'layer', index: h.layer });
  });
  root.addEventListener('keydown', (ev) => {
    if (ev.key !== 'Enter' && ev.key !== ' ') return;
    const h = hit(ev);
    if (h?.layer === undefined) return;
    ev.preventDefault();
    store.select({ kind: 'layer', index: h.layer });
  });
  root.addEventListener('mousemove', (ev) => {
    const h = hit(ev);
    if (!h) return tooltip.hide();
    if (h.edge) {
      const e = model.edge.get(h.edge);
      tooltip.show(`${h.edge}: ${ns(e?.durationNs ?? null)}`, ev.clientX, ev.clientY);
    } else {
      const l = layers.find((y) => y.index === h.layer);
      tooltip.show(`layer ${h.layer}: ${plural(l?.edges.length ?? 0, 'gate')}, ${ns(l?.durationNs ?? null)}`, ev.clientX, ev.clientY);
    }
  });
  root.addEventListener('mouseleave', () => tooltip.hide());

  return {
    update(state) {
      const sel = state.selected;
      const layerOfEdge = sel?.kind === 'edge' ? model.edge.get(sel.key)?.layer ?? null : null;
      blocks.forEach((g, k) => {
        const index = layers[k].index;
        const active = sel === null || sel.kind === 'qubit' || (sel.kind === 'layer' && sel.index === index) || (sel.kind === 'edge' && layerOfEdge === index);
        g.classed('dim', !active);
        g.selectAll<SVGRectElement, unknown>('rect.gate-bar').attr('stroke-width', function () {
          return sel?.kind === 'edge' && this.getAttribute('data-edge') === sel.key ? 3 : 1;
        });
      });
    },
  };
}
