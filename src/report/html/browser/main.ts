/**
 * The chip report page's script (bundled with its d3 modules into the page at build time; see
 * ../page-script.ts). Reads the report document from the page, draws every view, keeps them in
 * step with one selection, and when the last view is drawn sets `data-drawn="true"` on <html>
 * and `window.fluxlaneReport.drawnMs` (ms since navigation start), which the browser test and
 * the benchmark wait for. A failure shows its message on the page and in the console.
 */
import { REPORT_DATA_ELEMENT_ID, type ReportDocument, type ReportEdge } from '../document.js';
import { drawChipMap } from './chip-map.js';
import { ERROR_DOMAIN, ERROR_RAMP, FLAG_COLOUR, layerColour, layerDash, PARKING_RAMP, VIOLATION_COLOUR } from './colours.js';
import { drawDetails, ERROR_SOURCE_TEXT } from './details.js';
import { byId, el } from './dom.js';
import { drawFindings } from './findings.js';
import { drawGatePanel } from './gate-panel.js';
import { drawLandscape } from './landscape.js';
import { colourBar, swatches } from './legend.js';
import { buildModel, type ReportModel } from './model.js';
import { Store, type EdgeColouring } from './store.js';
import { drawHeader, drawWeakest, weakestEdges } from './summary.js';
import { drawTimeline } from './timeline.js';
import { tooltipIn } from './tooltip.js';

declare global {
  interface Window {
    fluxlaneReport?: { drawnMs: number; qubits: number; edges: number };
  }
}

function readDocument(): ReportDocument {
  const node = document.getElementById(REPORT_DATA_ELEMENT_ID);
  if (!node || !node.textContent) throw new Error('the report data is missing from the page');
  const doc = JSON.parse(node.textContent) as ReportDocument;
  if (doc.format !== 'fluxlane-report') throw new Error(`unknown report data format ${String(doc.format)}`);
  return doc;
}

function errorSourceTitle(model: ReportModel): string {
  const sources = new Set(model.doc.edges.map((e) => e.error?.source).filter((s) => s !== undefined));
  if (sources.size === 0) return 'predicted gate error (none known)';
  if (sources.size === 1) return `predicted gate error: ${ERROR_SOURCE_TEXT[[...sources][0]!]}`;
  return 'predicted gate error (sources differ by edge: see details)';
}

function mapLegends(node: HTMLElement, model: ReportModel, colouring: EdgeColouring): void {
  node.replaceChildren();
  const [lo, hi] = model.parkingSpan;
  node.append(colourBar('parking frequency (GHz)', PARKING_RAMP, lo, hi > lo ? hi : lo + 1, { ticks: 5 }));
  if (colouring === 'layer') {
    const layers = model.doc.layers.slice(0, 24).map((l) => ({ label: `L${l.index}`, colour: layerColour(l.index), dash: layerDash(l.index) }));
    if (model.doc.layers.length > 24) layers.push({ label: '...', colour: '#ffffff', dash: null });
    node.append(swatches('edges by parallel layer', layers));
  } else {
    node.append(colourBar(errorSourceTitle(model), ERROR_RAMP, ERROR_DOMAIN[0], ERROR_DOMAIN[1], { log: true, format: (x) => x.toExponential(0) }));
  }
  const marks = el('div', { class: 'legend' }, el('div', { class: 'title' }, 'marks'));
  marks.innerHTML += `<div><svg width="22" height="16" style="vertical-align:middle"><circle cx="11" cy="8" r="6" fill="none" stroke="${VIOLATION_COLOUR}" stroke-width="2.5"/></svg> named by a violation</div>` +
    `<div><svg width="22" height="16" style="vertical-align:middle"><circle cx="11" cy="8" r="6" fill="none" stroke="${FLAG_COLOUR}" stroke-width="2" stroke-dasharray="3 2.5"/></svg> flagged (small margin)</div>` +
    `<div><svg width="22" height="16" style="vertical-align:middle"><line x1="2" y1="8" x2="20" y2="8" stroke="${VIOLATION_COLOUR}" stroke-width="5" stroke-dasharray="4 3"/></svg> edge breaks a rule</div>` +
    `<div><svg width="22" height="16" style="vertical-align:middle"><circle cx="11" cy="8" r="6" fill="none" stroke="#1f6f78" stroke-width="2" stroke-dasharray="3 2"/></svg> moved aside during the selected gate</div>`;
  node.append(marks);
}

function toolbar(node: HTMLElement, store: Store, onChange: (c: EdgeColouring) => void): void {
  const group = el('div', { class: 'toggle', role: 'group', 'aria-label': 'colour edges by' });
  const buttons: [EdgeColouring, string][] = [['layer', 'Edges by layer'], ['error', 'Edges by predicted error']];
  const made = buttons.map(([value, label]) => {
    const b = el('button', { type: 'button', 'data-colouring': value, 'aria-pressed': String(store.state.colouring === value) }, label);
    b.addEventListener('click', () => {
      store.colourBy(value);
      for (const m of made) m.setAttribute('aria-pressed', String(m.getAttribute('data-colouring') === value));
      onChange(value);
    });
    group.append(b);
    return b;
  });
  node.append(group);
}

function firstGateToShow(model: ReportModel): ReportEdge | null {
  const withWave = weakestEdges(model.doc.edges.filter((e) => e.waveform !== null), 1);
  return withWave[0] ?? weakestEdges(model.doc.edges, 1)[0] ?? model.doc.edges[0] ?? null;
}

function render(): void {
  const doc = readDocument();
  const model = buildModel(doc);
  const store = new Store({ selected: null, colouring: 'layer' });
  const tooltip = tooltipIn(byId('tooltip'));

  drawHeader(byId('status'), byId('subtitle'), byId('stats'), model);
  const legends = byId('map-legends');
  toolbar(byId('map-toolbar'), store, (c) => mapLegends(legends, model, c));
  const map = drawChipMap(byId('chip-map-wrap'), model, store, tooltip);
  mapLegends(legends, model, store.state.colouring);
  const landscape = drawLandscape(byId('landscape-wrap'), byId('landscape-legend'), byId('landscape-hint'), model, store, tooltip);
  const timeline = drawTimeline(byId('timeline-wrap'), byId('timeline-hint'), model, store, tooltip);
  const gateBody = byId('gate-body');
  drawGatePanel(gateBody, model, store, firstGateToShow(model));
  drawWeakest(byId('weakest-body'), model, store);
  drawFindings(byId('findings-body'), model, store);
  if (doc.waveformNote) byId('footer').append(el('p', {}, doc.waveformNote));
  if (doc.note) byId('footer').append(el('p', {}, `Plan note: ${doc.note}`));
  byId('footer').append(el('p', {}, 'Made by fluxlane from the plan and its layout. Everything here is a model estimate.'));

  const details = byId('details-body');
  store.subscribe((state, changed) => {
    map.update(state, changed);
    if (changed !== 'selected') return;
    drawDetails(details, model, store, state.selected);
    landscape.update(state);
    timeline.update(state);
    if (state.selected?.kind === 'edge') drawGatePanel(gateBody, model, store, model.edge.get(state.selected.key) ?? null);
  });
  drawDetails(details, model, store, null);

  requestAnimationFrame(() =>
    requestAnimationFrame(() => {
      window.fluxlaneReport = { drawnMs: performance.now(), qubits: doc.qubits.length, edges: doc.edges.length };
      document.documentElement.setAttribute('data-drawn', 'true');
    }),
  );
}

try {
  render();
} catch (error) {
  const message = error instanceof Error ? error.message : String(error);
  console.error(`fluxlane report: ${message}`);
  document.body.prepend(el('p', { role: 'alert', style: 'padding:1em 24px;color:#c2362b;font-weight:600' }, `The report could not be drawn: ${message}`));
  document.documentElement.setAttribute('data-drawn', 'failed');
}
