/**
 * The "one plan for every command" acceptance of a demo (test/cli/one-plan-*.test.ts): plan it
 * once with pulse design into a temporary folder, then hold every per-edge command and file to
 * the plan's numbers.
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { unit } from 'mathjs';
import { expect } from 'vitest';
import { runFluxlane } from './cli.js';
import { runPython } from './python.js';

export interface PlannedDemo {
  layout: string;
  dir: string;
  planPath: string;
  plan: Record<string, any>;
  code: number;
}

export async function planDemo(layout: string): Promise<PlannedDemo> {
  const dir = mkdtempSync(join(tmpdir(), 'fluxlane-one-plan-'));
  const r = await runFluxlane(['plan', resolve(layout), '-o', 'out'], { cwd: dir });
  if (r.code !== 0 && r.code !== 1) throw new Error(`plan ${layout} exited ${r.code}: ${r.err}`);
  const planPath = join(dir, 'out/plan.json');
  return { layout, dir, planPath, plan: JSON.parse(readFileSync(planPath, 'utf8')), code: r.code };
}

const close = (a: number, b: number, tol: number, what: string) => {
  expect(Math.abs(a - b), `${what}: ${a} against ${b}`).toBeLessThanOrEqual(tol);
};

/**
 * Re-simulate every edge's own waveform with `simulate --plan --noise` and compare with the
 * plan's metrics; returns the largest difference seen and the number of edges simulated.
 */
export async function resimulateEveryEdge(d: PlannedDemo, tol: number): Promise<{ worst: number; simulated: number; withoutWaveform: string[] }> {
  let worst = 0;
  let simulated = 0;
  const withoutWaveform: string[] = [];
  for (const e of d.plan.edges) {
    const key = e.qubits.join('-');
    if (!e.gate?.waveform) {
      withoutWaveform.push(key);
      continue;
    }
    const r = await runFluxlane(['simulate', d.layout, '--edge', key, '--plan', d.planPath, '--noise', '--json']);
    expect(r.code, r.err).toBe(0);
    const s = r.json();
    expect(s.mover).toBe(e.mover);
    expect(s.fidelityNoisyMethod).toBe(e.gate.fidelityNoisyMethod);
    const g = e.gate;
    for (const [name, a, b] of [
      ['conditionalPhase', s.conditionalPhase, g.conditionalPhase],
      ['leakage', s.leakage, g.leakage],
      ['fidelity', s.fidelity, g.fidelity],
      ['fidelityNoisy', s.fidelityNoisy, g.fidelityNoisy],
      ['decoherenceEstimate', s.decoherenceEstimate, g.decoherenceEstimate],
      ['virtualZ.a', s.virtualZ.a, g.virtualZ.a],
      ['virtualZ.b', s.virtualZ.b, g.virtualZ.b],
    ] as const) {
      // phases are compared modulo 2 pi
      const periodic = name === 'conditionalPhase' || name.startsWith('virtualZ');
      const diff = periodic ? Math.abs(a - b - 2 * Math.PI * Math.round((a - b) / (2 * Math.PI))) : Math.abs(a - b);
      close(diff, 0, tol, `${key} ${name} (${a} against ${b})`);
      worst = Math.max(worst, diff);
    }
    simulated++;
  }
  return { worst, simulated, withoutWaveform };
}

/** A text-table cell read back into SI with mathjs (the outside reference for units), and its rounding step. */
export function readTextCell(cell: string): { value: number; step: number } | null {
  const m = /^(-?\d+(?:\.(\d+))?)(?:e([-+]?\d+))?(?:\s+(\S+))?$/.exec(cell.trim());
  if (!m) return null;
  const decimals = m[2]?.length ?? 0;
  const exp = m[3] ? Number(m[3]) : 0;
  const u = m[4];
  const number = Number(m[1]) * 10 ** exp;
  const lsd = 10 ** (exp - decimals);
  if (!u || u === 'rad') return { value: number, step: lsd };
  const si = u.endsWith('Hz') ? 'Hz' : 's';
  return { value: unit(number, u).toNumber(si), step: unit(lsd, u).toNumber(si) };
}

/** The rows of gates.txt as cells, cut at the columns its dashed line marks. */
export function readTextTable(text: string): { head: string[]; rows: string[][] } {
  const lines = text.split('\n');
  const dashes = lines[1];
  const spans: [number, number][] = [];
  for (const m of dashes.matchAll(/-+/g)) spans.push([m.index!, m.index! + m[0].length]);
  const cut = (line: string) => spans.map(([a], c) => line.slice(a, c + 1 < spans.length ? spans[c + 1][0] : undefined).trim());
  const rows: string[][] = [];
  for (const line of lines.slice(2)) {
    if (line.trim() === '') break;
    rows.push(cut(line));
  }
  return { head: cut(lines[0]), rows };
}

/** gates.csv parsed with Python's csv module (outside reference). */
export function readCsv(text: string): string[][] {
  return runPython<{ rows: string[][] }>('csv_read.py', { text }).rows;
}

/**
 * gates.csv, gates.txt and plan.json of a plan folder agree field by field: every CSV cell is the
 * JSON value itself, every text cell the JSON value rounded as printed (read back with mathjs).
 * Returns the number of cells compared.
 */
export function compareTables(d: PlannedDemo, columns: readonly { csv: string; title: string | null; json: string; kind: string }[]): number {
  const field = (e: any, path: string) => path.split('.').reduce((v, p) => (v === null || v === undefined ? undefined : v[p]), e) ?? undefined;
  const csv = readCsv(readFileSync(join(d.dir, 'out/gates.csv'), 'utf8'));
  const txt = readTextTable(readFileSync(join(d.dir, 'out/gates.txt'), 'utf8'));
  expect(csv[0]).toEqual(columns.map((c) => c.csv));
  expect(txt.head).toEqual(columns.filter((c) => c.title !== null).map((c) => c.title));
  const edges = d.plan.edges as any[];
  expect(csv.length - 1).toBe(edges.length);
  expect(txt.rows.length).toBe(edges.length);
  let cells = 0;
  edges.forEach((e, k) => {
    const key = e.qubits.join('-');
    let t = 0;
    columns.forEach((c, ci) => {
      const v = field(e, c.json);
      const cell = csv[k + 1][ci];
      const what = `${key} ${c.csv}`;
      // CSV: the JSON value itself
      if (v === undefined) expect(cell, what).toBe('');
      else if (c.kind === 'edge') expect(cell, what).toBe(v.join('-'));
      else if (c.kind === 'frequency-map') expect(Object.fromEntries(cell === '' ? [] : cell.split(' ').map((x) => [x.split('@')[0], Number(x.split('@')[1])])), what).toEqual(v);
      else if (typeof v === 'number') expect(Number(cell), what).toBe(v);
      else expect(cell, what).toBe(String(v));
      cells++;
      if (c.title === null) return;
      // text: the JSON value as printed
      const tc = txt.rows[k][t++];
      const twhat = `${key} ${c.title}: "${tc}"`;
      cells++;
      if (v === undefined || (c.kind === 'frequency-map' && Object.keys(v).length === 0)) return expect(tc, twhat).toBe('-');
      switch (c.kind) {
        case 'edge':
          return expect(tc, twhat).toBe(v.join('-'));
        case 'yes-no':
          return expect(tc, twhat).toBe(v ? 'yes' : 'NO');
        case 'frequency-map': {
          const parts = [...tc.matchAll(/(\S+)@(\S+ \S+)/g)];
          expect(parts.map((p) => p[1]), twhat).toEqual(Object.keys(v));
          for (const p of parts) {
            const r = readTextCell(p[2])!;
            expect(Math.abs(r.value - v[p[1]]), twhat).toBeLessThanOrEqual(r.step / 2 + 1e-9 * Math.abs(v[p[1]]));
          }
          return;
        }
        case 'frequency':
        case 'time':
        case 'phase':
        case 'fidelity':
        case 'probability': {
          const r = readTextCell(tc);
          expect(r, twhat).not.toBeNull();
          return expect(Math.abs(r!.value - v), twhat).toBeLessThanOrEqual(r!.step / 2 + 1e-9 * Math.abs(v));
        }
        default:
          return expect(tc, twhat).toBe(String(v));
      }
    });
  });
  return cells;
}

/**
 * The error-budget rules: check judges them on the estimated budget (no pulse), the plan on the
 * designed and simulated one, so they may differ edge by edge (README "Error budget").
 */
const BUDGET_RULES = new Set(['gate-error', 'spectator-leakage', 'idle-error']);

/**
 * Rules only a pulse design can break (the gate stage found no CZ within maxGate): `check` designs
 * no pulse, so it never reports them; compareCheck leaves them out on the plan's side.
 */
const DESIGN_ONLY_RULES = new Set(['cz-design']);

/**
 * `fluxlane check` finds, edge by edge, the same feasibility and the same broken rules as the
 * plan, apart from the budget rules (BUDGET_RULES) and the rules only a pulse design can break
 * (DESIGN_ONLY_RULES).
 */
export async function compareCheck(d: PlannedDemo): Promise<number> {
  const r = await runFluxlane(['check', d.layout, '--json']);
  const c = r.json();
  // a designed gate's mover sweeps at its waveform's rates, check's at the planning ramp's: the
  // mover's own swept-crossing rules may differ where the plan has a waveform
  const designed = new Map<string, string>(d.plan.edges.filter((e: any) => e.gate?.waveform).map((e: any) => [e.qubits.join('-'), e.mover]));
  const rules = (list: any[]) => {
    const m = new Map<string, string[]>();
    for (const v of list) {
      if (!v.edge || BUDGET_RULES.has(v.rule) || DESIGN_ONLY_RULES.has(v.rule)) continue;
      if (v.rule.startsWith('cz-swept-') && designed.get(v.edge) === v.qubits[0]) continue;
      m.set(v.edge, [...new Set([...(m.get(v.edge) ?? []), v.rule])].sort());
    }
    return m;
  };
  const cr = rules(c.violations);
  const pr = rules(d.plan.violations);
  expect(c.edges.length).toBe(d.plan.edges.length);
  c.edges.forEach((ce: any, k: number) => {
    const pe = d.plan.edges[k];
    const key = pe.qubits.join('-');
    expect(ce.qubits, key).toEqual(pe.qubits);
    expect(cr.get(key) ?? [], key).toEqual(pr.get(key) ?? []);
    // feasible: the same, or different only through the mover's own sweeps of a designed gate
    if (ce.feasible !== pe.feasible) {
      expect(designed.has(key), `${key}: check ${ce.feasible}, plan ${pe.feasible}`).toBe(true);
      expect(cr.get(key) ?? [], `${key}: check ${ce.feasible}, plan ${pe.feasible}`).toEqual([]);
    }
  });
  // the exit codes agree when both judge the same rules: exit 1 on either side from a rule the
  // comparison above holds equal appears on the other side too
  const compared = (list: any[]) => list.some((v) => !BUDGET_RULES.has(v.rule) && !DESIGN_ONLY_RULES.has(v.rule) && !(v.rule.startsWith('cz-swept-') && designed.get(v.edge) === v.qubits[0]));
  if (compared(c.violations) || compared(d.plan.violations)) expect(r.code).toBe(d.code);
  return c.edges.length;
}
