/**
 * The page header's status and numbers, and the table of the weakest gates (largest predicted
 * error first).
 */
import type { ReportEdge } from '../document.js';
import { ERROR_SOURCE_TEXT, selectButton } from './details.js';
import { append, el } from './dom.js';
import { err, fixed, ghz, ns, plural } from './format.js';
import type { ReportModel } from './model.js';
import type { Store } from './store.js';

export function drawHeader(status: HTMLElement, subtitle: HTMLElement, stats: HTMLElement, model: ReportModel): void {
  const d = model.doc;
  status.append(el('span', { class: `badge ${d.ok ? 'ok' : 'bad'}`, 'data-ok': String(d.ok) }, d.ok ? 'every rule holds' : plural(d.violations.length, 'violation')));
  subtitle.textContent = `${d.description ? `${d.description} ` : ''}Layout ${d.layoutFile}${d.seed !== null ? `, seed ${d.seed}` : ''}; ${d.pulses ? 'CZ pulses designed' : 'planned without pulse design'}.`;
  const errors = d.edges.map((e) => e.error?.value).filter((x): x is number => x !== undefined).sort((a, b) => a - b);
  const median = errors.length > 0 ? errors[errors.length >> 1] : null;
  const items: [string, string][] = [
    ['qubits', String(d.qubits.length)],
    ['couplings', String(d.edges.length)],
    ['layers', `${d.layers.length}${d.layerLowerBound !== null ? ` (lower bound ${d.layerLowerBound})` : ''}`],
    ['layers in sequence', ns(d.layeredNs)],
    ['median gate error', err(median)],
    ['worst gate error', err(errors.length > 0 ? errors[errors.length - 1] : null)],
    ['violations', String(d.violations.length)],
    ['flags', String(d.flags.length)],
  ];
  if (d.cycle) {
    if (d.cycle.durationNs !== null) items.push(['cycle', ns(d.cycle.durationNs)]);
    if (d.cycle.error !== null) items.push(['cycle error', err(d.cycle.error)]);
  }
  for (const [label, value] of items) append(stats, el('span', { 'data-stat': label }, `${label} `, el('b', {}, value)));
}

export function weakestEdges(edges: ReportEdge[], count: number): ReportEdge[] {
  return edges.filter((e) => e.error !== null).sort((a, b) => b.error!.value - a.error!.value || a.key.localeCompare(b.key)).slice(0, count);
}

export function drawWeakest(node: HTMLElement, model: ReportModel, store: Store): void {
  const rows = weakestEdges(model.doc.edges, 12);
  if (rows.length === 0) {
    node.append(el('p', { class: 'hint' }, 'No gate has an error estimate in this plan.'));
    return;
  }
  const sources = new Set(rows.map((e) => e.error!.source));
  node.append(el('p', { class: 'hint' }, `The ${plural(rows.length, 'gate')} with the largest predicted error (${[...sources].map((s) => ERROR_SOURCE_TEXT[s]).join('; ')}).`));
  const head = el('tr', {}, ...['edge', 'layer', 'mover', 'crossing', 'interaction', 'duration', 'fidelity (with decoherence)', 'leakage', 'predicted error'].map((h) => el('th', { scope: 'col' }, h)));
  const body = rows.map((e) =>
    el('tr', { 'data-edge-row': e.key },
      el('td', {}, selectButton(store, { kind: 'edge', key: e.key }, e.key)),
      el('td', {}, e.layer === null ? '-' : String(e.layer)),
      el('td', {}, e.mover ?? '-'),
      el('td', {}, e.crossing ?? '-'),
      el('td', {}, ghz(e.interactionGHz)),
      el('td', {}, ns(e.durationNs)),
      el('td', {}, fixed(e.gate?.fidelityNoisy ?? e.gate?.fidelity ?? null, 6)),
      el('td', {}, err(e.gate?.leakage ?? null)),
      el('td', {}, err(e.error!.value)),
    ),
  );
  node.append(el('table', { class: 'gates' }, el('thead', {}, head), el('tbody', {}, ...body)));
}
