/** The gate table for people (gates.txt and the `gates:` block of `fluxlane plan`): units printed. */
import type { ChipPlan } from '../plan/plan.js';
import { ghz, khz, ns } from '../plan/format.js';

/** The gate table for people (units printed). */
export function gateTableText(plan: ChipPlan): string {
  const { ctx } = plan;
  const id = ctx.ids;
  const head = ['edge', 'mover', 'crossing', 'interaction', 'layer', 'spectators parked', 'ZZ idle', 'ramp', 'duration', 'family', 'fidelity', 'noisy', 'ok'];
  const rows: string[][] = plan.edges.map((e, k) => {
    const gate = plan.gates?.[k] ?? null;
    const d = gate?.design;
    const dest = e.interactionGHz;
    const ok = (gate ? gate.findings : e.findings).length === 0;
    return [
      ctx.edges[e.edge].key,
      id[e.mover],
      e.crossing,
      Number.isFinite(dest) ? ghz(dest, 4) : '-',
      String(plan.layers.layerOf[k]),
      e.parked.length > 0 ? e.parked.map((p) => `${id[p.qubit]}@${ghz(p.fGHz)}`).join(' ') : '-',
      khz(plan.parking.idle.zzGHz[e.edge]),
      ns(d && Number.isFinite(d.rampNs) ? d.rampNs : e.rampNs),
      Number.isFinite(d ? d.durationNs : e.durationNs) ? ns(d ? d.durationNs : e.durationNs) : '-',
      d ? d.family : '-',
      d && Number.isFinite(d.fidelity) ? d.fidelity.toFixed(5) : '-',
      d && d.fidelityNoisy !== undefined && Number.isFinite(d.fidelityNoisy) ? d.fidelityNoisy.toFixed(5) : '-',
      ok ? 'yes' : 'NO',
    ];
  });
  const widths = head.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c].length)));
  const line = (r: string[]) => r.map((x, c) => x.padEnd(widths[c])).join('  ').trimEnd();
  return [line(head), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n') + '\n';
}
