/**
 * Legends: a colour bar with its axis (d3-axis) for a sequential scale, swatches for categories,
 * each returned as an element to place on the page.
 */
import { axisBottom } from 'd3-axis';
import { scaleLinear, scaleLog } from 'd3-scale';
import { select } from 'd3-selection';
import { el } from './dom.js';

let gradients = 0;

/** A horizontal colour bar from `ramp` over [lo, hi], with a bottom axis. */
export function colourBar(title: string, ramp: (t: number) => string, lo: number, hi: number, options: { log?: boolean; ticks?: number; format?: (x: number) => string } = {}): HTMLElement {
  const width = 240;
  const box = el('div', { class: 'legend' }, el('div', { class: 'title' }, title));
  const svg = select(box).append('svg').attr('width', width + 24).attr('height', 40).attr('role', 'img').attr('aria-label', `${title}: colour scale from ${lo} to ${hi}`);
  const id = `fluxlane-gradient-${++gradients}`;
  const grad = svg.append('defs').append('linearGradient').attr('id', id);
  for (let k = 0; k <= 16; k++) grad.append('stop').attr('offset', `${(k / 16) * 100}%`).attr('stop-color', ramp(k / 16));
  svg.append('rect').attr('x', 12).attr('y', 4).attr('width', width).attr('height', 12).attr('rx', 2).attr('fill', `url(#${id})`);
  const axis = options.log
    ? axisBottom(scaleLog().domain([lo, hi]).range([12, 12 + width])).ticks(options.ticks ?? 4, options.format ? undefined : '.0e')
    : axisBottom(scaleLinear().domain([lo, hi]).range([12, 12 + width])).ticks(options.ticks ?? 5);
  if (options.format) axis.tickFormat((x) => options.format!(Number(x)));
  svg.append('g').attr('class', 'axis').attr('transform', 'translate(0,17)').call(axis);
  return box;
}

/** Category swatches, e.g. one per layer. */
export function swatches(title: string, items: { label: string; colour: string; dash?: string | null }[]): HTMLElement {
  const box = el('div', { class: 'legend' }, el('div', { class: 'title' }, title));
  const svg = select(box).append('svg').attr('role', 'img').attr('aria-label', `${title}: ${items.map((i) => i.label).join(', ')}`);
  const perRow = 8;
  const rows = Math.ceil(items.length / perRow);
  svg.attr('width', Math.min(items.length, perRow) * 44 + 4).attr('height', rows * 18 + 4);
  items.forEach((item, k) => {
    const x = (k % perRow) * 44 + 2;
    const y = Math.floor(k / perRow) * 18 + 9;
    svg.append('line').attr('x1', x).attr('x2', x + 16).attr('y1', y).attr('y2', y).attr('stroke', item.colour).attr('stroke-width', 4).attr('stroke-dasharray', item.dash ?? null);
    svg.append('text').attr('x', x + 19).attr('y', y + 4).attr('font-size', 11).attr('fill', '#1d2330').text(item.label);
  });
  return box;
}
