/**
 * The findings in words: violations and flags grouped by rule (with what the rule means), the
 * planner's explanations of what cannot be planned and why, and the crowded frequency bands.
 * Qubit and edge names are buttons that select them.
 */
import type { ReportFinding } from '../document.js';
import { selectButton } from './details.js';
import { append, el } from './dom.js';
import { ghz, plural } from './format.js';
import type { ReportModel } from './model.js';
import type { Store } from './store.js';

function groupByRule(items: ReportFinding[]): Map<string, ReportFinding[]> {
  const m = new Map<string, ReportFinding[]>();
  for (const f of items) m.set(f.rule, [...(m.get(f.rule) ?? []), f]);
  return m;
}

function findingItem(model: ReportModel, store: Store, f: ReportFinding, cls: 'bad' | 'warn'): HTMLLIElement {
  const li = el('li', { class: cls });
  const targets: HTMLElement[] = [];
  if (f.edge && model.edge.has(f.edge)) targets.push(selectButton(store, { kind: 'edge', key: f.edge }, f.edge));
  for (const q of f.qubits) if (model.qubit.has(q)) targets.push(selectButton(store, { kind: 'qubit', id: q }, q));
  targets.forEach((t, k) => append(li, k > 0 ? ' ' : '', t));
  append(li, targets.length > 0 ? ': ' : '', f.message);
  return li;
}

function ruleGroups(model: ReportModel, store: Store, items: ReportFinding[], cls: 'bad' | 'warn', noun: string): HTMLElement {
  const box = el('div', {});
  const docs = new Map(model.doc.rules.map((r) => [r.name, r]));
  for (const [rule, list] of groupByRule(items)) {
    const details = el('details', { 'data-rule': rule });
    if (list.length <= 12) details.setAttribute('open', '');
    const doc = docs.get(rule);
    append(
      details,
      el('summary', {}, el('span', { class: `tag ${cls}` }, rule), plural(list.length, noun)),
      doc ? el('div', { class: 'doc' }, doc.doc, doc.source ? ` (${doc.source})` : '') : null,
      el('ul', {}, ...list.map((f) => findingItem(model, store, f, cls))),
    );
    box.append(details);
  }
  return box;
}

export function drawFindings(node: HTMLElement, model: ReportModel, store: Store): void {
  const { violations, flags, explanations, crowdedBands } = model.doc;
  node.append(
    el('h3', {}, `Violations (${violations.length})`),
    violations.length === 0 ? el('p', { 'data-empty': 'violations' }, 'Every rule holds at this plan.') : ruleGroups(model, store, violations, 'bad', 'violation'),
    el('h3', {}, `Flags (${flags.length})`),
    flags.length === 0 ? el('p', { 'data-empty': 'flags' }, 'Nothing flagged.') : ruleGroups(model, store, flags, 'warn', 'flag'),
  );
  if (explanations.length > 0) {
    node.append(el('h3', {}, `What cannot be planned, and why (${explanations.length})`));
    // Many explanations (a large chip) stay folded until asked for.
    const holder = explanations.length <= 12 ? node : el('details', { 'data-explanations': String(explanations.length) }, el('summary', {}, `Show all ${explanations.length} explanations`));
    if (holder !== node) node.append(holder);
    for (const x of explanations) {
      const box = el('div', { class: 'explanation' });
      append(
        box,
        el('p', {}, el('span', { class: 'tag bad' }, x.kind === 'parking' ? 'cannot park' : 'cannot plan the CZ'), ...x.qubits.flatMap((q) => (model.qubit.has(q) ? [selectButton(store, { kind: 'qubit', id: q }, q), ' '] : [`${q} `])), ': ', x.message),
        x.lines.length > 0 ? el('pre', {}, x.lines.join('\n')) : null,
      );
      holder.append(box);
    }
  }
  if (crowdedBands.length > 0) {
    node.append(el('h3', {}, `Crowded bands (${crowdedBands.length})`));
    node.append(el('ul', {}, ...crowdedBands.map((b) => el('li', { class: 'warn' }, `${ghz(b.fromGHz, 2)} to ${ghz(b.toGHz, 2)}: ${b.flagged.length} of ${b.qubits.length} qubits flagged (${b.flagged.join(', ')})`))));
  }
}
