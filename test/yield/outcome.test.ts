/**
 * outcomeOf (src/yield/outcome.ts): the qubits and edges a drawn chip's findings name, ascending
 * and each once, and the first finding in catalogue order, against the same worked out anew from
 * the findings (sets, sorted; the catalogue's ranks), on findings drawn at random over Clove-17's
 * qubits and edges (names the chip does not have included, which name nothing).
 */
import { describe, expect, it } from 'vitest';
import { loadLayoutFile } from '../../src/layout/load.js';
import { buildPlanContext } from '../../src/plan/context.js';
import { COLLISION_RULES } from '../../src/plan/rules/catalogue.js';
import type { Finding } from '../../src/plan/rules/findings.js';
import { Random } from '../../src/util/random.js';
import { outcomeOf, ruleRank } from '../../src/yield/outcome.js';

const ctx = buildPlanContext(loadLayoutFile('layouts/clove-17.yaml', 'layouts/clove-17.yaml'));

describe('outcomeOf', () => {
  it('names each qubit and edge of the findings once, ascending, and reports the first finding of the lowest rule', () => {
    const rng = new Random(17);
    const rules = [...COLLISION_RULES.map((r) => r.name), 'not-a-rule'];
    for (let round = 0; round < 200; round++) {
      const findings: Finding[] = Array.from({ length: rng.int(40) }, (_, k) => {
        const qs = Array.from({ length: 1 + rng.int(3) }, () => (rng.uniform() < 0.1 ? 'QX' : ctx.ids[rng.int(ctx.n)]));
        const edge = rng.uniform() < 0.3 ? undefined : rng.uniform() < 0.1 ? 'QX-QY' : ctx.edges[rng.int(ctx.edges.length)].key;
        return { rule: rules[rng.int(rules.length)] as Finding['rule'], qubits: qs, value: null, threshold: null, edge, message: `finding ${k}` };
      });
      const o = outcomeOf(ctx, round, findings, null);
      const qubits = new Set<number>();
      const edges = new Set<number>();
      let first: Finding | undefined;
      for (const f of findings) {
        for (const q of f.qubits) if (ctx.index.has(q)) qubits.add(ctx.index.get(q)!);
        const e = ctx.edges.find((x) => x.key === f.edge);
        if (e) edges.add(e.index);
        if (!first || ruleRank(f.rule) < ruleRank(first.rule)) first = f;
      }
      expect(o.qubits).toEqual([...qubits].sort((a, b) => a - b));
      expect(o.edges).toEqual([...edges].sort((a, b) => a - b));
      expect(o.reason).toBe(first ? first.message : null);
      expect(o.ok).toBe(findings.length === 0);
    }
  });
});
