/**
 * The details panel: everything the report knows about the selected qubit (parking, f12, T1, T2,
 * margins, idle budget, defects, readout, its gates and findings) or edge (mover, crossing,
 * interaction frequency, duration, fidelity, budget, spectator moves, swept crossings), or the
 * gates of the selected layer. Every value sits in a `<dd data-field="...">`.
 */
import { GATE_BUDGET_PARTS, IDLE_BUDGET_PARTS, type ReportEdge, type ReportFinding, type ReportQubit } from '../document.js';
import { GATE_BUDGET_LABELS, IDLE_BUDGET_LABELS } from './colours.js';
import { append, clear, el, fields } from './dom.js';
import { err, fixed, ghz, khz, mhz, ns, plural, range, UNKNOWN, us } from './format.js';
import type { ReportModel } from './model.js';
import type { Selected, Store } from './store.js';

export const ERROR_SOURCE_TEXT: Record<string, string> = {
  budget: 'error budget total',
  noisy: '1 - fidelity with decoherence',
  coherent: '1 - coherent fidelity',
  planner: "planner's estimate (no pulse designed)",
};

/** A button that selects a qubit or an edge. */
export function selectButton(store: Store, sel: NonNullable<Selected>, label: string): HTMLButtonElement {
  const b = el('button', { class: 'linkish', type: 'button' }, label);
  b.addEventListener('click', () => store.select(sel));
  return b;
}

function findingList(items: ReportFinding[], cls: 'bad' | 'warn'): HTMLElement | null {
  if (items.length === 0) return null;
  return el('ul', { class: 'plain' }, ...items.map((f) => el('li', {}, el('span', { class: `tag ${cls}` }, f.rule), f.message)));
}

function qubitDetails(model: ReportModel, store: Store, q: ReportQubit): HTMLElement {
  const box = el('div', { 'data-kind': 'qubit', 'data-id': q.id });
  const idle = q.idle;
  append(
    box,
    el('div', { class: 'title' }, `Qubit ${q.id}`),
    el('div', { class: 'where' }, `position (${q.pos[0]}, ${q.pos[1]})${q.group !== null ? `, frequency group ${q.group}` : ''}${q.fixed ? ', parking fixed by the layout' : ''}`),
    q.note ? el('p', { class: 'hint' }, q.note) : null,
    fields([
      ['parking', 'parking f01', ghz(q.parkingGHz)],
      ['parkingFlux', 'parking flux', q.parkingFlux === null ? UNKNOWN : `${q.parkingFlux.toFixed(4)} \u03a60`],
      ['f12', 'f12 at parking', ghz(q.f12GHz)],
      ['anharmonicity', 'anharmonicity', mhz(q.anharmonicityMHz)],
      ['tunable', 'tunable range', range(q.tunableGHz)],
      ['planning', 'planning range', range(q.planningGHz)],
      ['window', 'window', range(q.windowGHz)],
      ['t1', 'T1', us(q.t1Us)],
      ['t2', 'T2 at parking', us(q.t2Us)],
      ['tphi', 'white T\u03c6', us(q.tphiUs)],
      ['margin', 'margin', q.marginMHz === null ? UNKNOWN : `${mhz(q.marginMHz)} (${fixed(q.marginSpreads, 2)} spreads)`],
      ['idleMargin', 'idle margin', mhz(q.idleMarginMHz)],
      ['czMargin', 'gate margin', mhz(q.czMarginMHz)],
      ['nearest', 'nearest condition', q.nearest ? `${q.nearest.rule}${q.nearest.other ? ` with ${q.nearest.other}` : ''}` : UNKNOWN],
      ['spread', 'fabrication spread', mhz(q.fabricationSpreadMHz)],
      ['usable', 'usable window', q.usableFraction === null ? UNKNOWN : `${(100 * q.usableFraction).toFixed(0)} %`],
      ['readout', 'readout resonator', ghz(q.readoutGHz, 3)],
      ['defects', 'defects', q.defects.length === 0 ? 'none listed' : q.defects.map((d) => `${d.atGHz.toFixed(3)} GHz \u00b1 ${(d.widthGHz * 1e3).toFixed(1)} MHz`).join('; ')],
      ['idleBudget', 'idle error', idle ? err(idle.total) : 'not in this plan'],
    ]),
  );
  if (idle) {
    box.append(
      el('h3', {}, 'Idle error by cause'),
      fields(IDLE_BUDGET_PARTS.map((k) => [`idle-${k}`, IDLE_BUDGET_LABELS[k], err(idle[k])] as [string, string, string])),
    );
  }
  const gates = model.edgesOf.get(q.id) ?? [];
  if (gates.length > 0) {
    box.append(el('h3', {}, `Gates (${gates.length})`));
    box.append(
      el('ul', { class: 'plain' }, ...gates.map((e) =>
        el('li', {}, selectButton(store, { kind: 'edge', key: e.key }, e.key), ` ${e.mover === q.id ? 'moves' : 'waits'}${e.layer !== null ? `, layer ${e.layer}` : ''}${e.error ? `, error ${err(e.error.value)}` : ''}`),
      )),
    );
  }
  const moved = model.movedIn.get(q.id) ?? [];
  if (moved.length > 0) {
    box.append(el('h3', {}, `Moved out of the way (${moved.length})`));
    box.append(
      el('ul', { class: 'plain' }, ...moved.map((e) => {
        const m = e.spectatorMoves.find((s) => s.qubit === q.id)!;
        return el('li', {}, 'to ', ghz(m.toGHz), ' during ', selectButton(store, { kind: 'edge', key: e.key }, e.key));
      })),
    );
  }
  const v = model.doc.violations.filter((f) => f.qubits.includes(q.id));
  const f = model.doc.flags.filter((x) => x.qubits.includes(q.id));
  if (v.length + f.length > 0) box.append(el('h3', {}, 'Findings'), findingList(v, 'bad') ?? '', findingList(f, 'warn') ?? '');
  return box;
}

function edgeDetails(model: ReportModel, store: Store, e: ReportEdge): HTMLElement {
  const box = el('div', { 'data-kind': 'edge', 'data-id': e.key });
  const g = e.gate;
  const worstSwept = e.swept.reduce<number | null>((w, c) => (c.transfer !== null && (w === null || c.transfer > w) ? c.transfer : w), null);
  append(
    box,
    el('div', { class: 'title' }, `Edge ${e.key}`),
    el('div', { class: 'where' }, e.feasible ? 'plannable: no rule broken' : 'breaks a rule (see below)'),
    fields([
      ['mover', 'mover', e.mover ? selectButton(store, { kind: 'qubit', id: e.mover }, e.mover) : UNKNOWN],
      ['partner', 'partner', e.partner ? selectButton(store, { kind: 'qubit', id: e.partner }, e.partner) : UNKNOWN],
      ['crossing', 'crossing', e.crossing ?? UNKNOWN],
      ['interaction', 'interaction f01', ghz(e.interactionGHz)],
      ['crossingFrequency', 'crossing (bare)', ghz(e.crossingGHz)],
      ['g', 'coupling there', mhz(e.gMHz, 2)],
      ['layer', 'layer', e.layer === null ? UNKNOWN : String(e.layer)],
      ['duration', 'duration', ns(e.durationNs)],
      ['ramp', 'ramp', ns(g?.rampNs ?? e.rampNs)],
      ['zz', 'ZZ at idle', khz(e.zzKHz)],
      ['family', 'pulse family', g?.family ?? 'no pulse designed'],
      ['hold', 'hold', ns(g?.holdNs ?? null)],
      ['fidelity', 'fidelity (coherent)', fixed(g?.fidelity ?? null, 6)],
      ['fidelityNoisy', 'fidelity with decoherence', fixed(g?.fidelityNoisy ?? null, 6)],
      ['leakage', 'leakage', err(g?.leakage ?? null)],
      ['phase', 'conditional phase', fixed(g?.conditionalPhase ?? null, 5, 'rad')],
      ['error', 'predicted error', e.error ? `${err(e.error.value)} (${ERROR_SOURCE_TEXT[e.error.source]})` : UNKNOWN],
      ['spectators', 'spectators moved', e.spectatorMoves.length === 0 ? 'none' : e.spectatorMoves.map((m) => `${m.qubit} to ${ghz(m.toGHz, 3)}`).join('; ')],
      ['swept', 'crossings swept', e.swept.length === 0 ? 'none' : `${plural(e.swept.length, 'crossing')}, worst transfer ${err(worstSwept)}`],
    ]),
  );
  if (g?.budget) {
    const b = g.budget;
    box.append(
      el('h3', {}, 'Error budget'),
      fields([...GATE_BUDGET_PARTS.map((k) => [`budget-${k}`, GATE_BUDGET_LABELS[k], err(b[k])] as [string, string, string]), ['budget-total', 'total', err(b.total)]]),
    );
  }
  if (e.reason) box.append(el('h3', {}, 'Why this option'), el('p', { class: 'hint' }, e.reason));
  if (g?.reason) box.append(el('p', { class: 'hint' }, `Pulse design: ${g.reason}`));
  const v = model.doc.violations.filter((f) => f.edge === e.key);
  if (v.length > 0) box.append(el('h3', {}, 'Violations'), findingList(v, 'bad') ?? '');
  return box;
}

function layerDetails(model: ReportModel, store: Store, index: number): HTMLElement {
  const layer = model.doc.layers.find((l) => l.index === index);
  const box = el('div', { 'data-kind': 'layer', 'data-id': String(index) });
  if (!layer) return box;
  append(
    box,
    el('div', { class: 'title' }, `Layer ${index}`),
    fields([
      ['gates', 'gates', String(layer.edges.length)],
      ['duration', 'duration (longest gate)', ns(layer.durationNs)],
    ]),
    el('ul', { class: 'plain' }, ...layer.edges.map((k) => el('li', {}, selectButton(store, { kind: 'edge', key: k }, k), ` ${ns(model.edge.get(k)?.durationNs ?? null)}`))),
  );
  return box;
}

export function drawDetails(node: HTMLElement, model: ReportModel, store: Store, selected: Selected): void {
  clear(node);
  if (!selected) {
    node.append(el('p', { class: 'hint' }, 'Select a qubit or an edge in the chip map, a row of the frequency landscape, or a gate in the timeline.'));
    return;
  }
  if (selected.kind === 'qubit') {
    const q = model.qubit.get(selected.id);
    if (q) node.append(qubitDetails(model, store, q));
  } else if (selected.kind === 'edge') {
    const e = model.edge.get(selected.key);
    if (e) node.append(edgeDetails(model, store, e));
  } else node.append(layerDetails(model, store, selected.index));
}
