import { describe, expect, it } from 'vitest';
import { parseLayoutText, loadLayoutFile } from '../../src/layout/load.js';
import { buildChipGraph, couplingBetween, edgeKey, qubitOf } from '../../src/chip/graph.js';
import { neighbours, nextNearestPairs } from '../../src/chip/neighbourhood.js';
import { connectedComponents, degreeStats } from '../../src/chip/stats.js';

/** A layout from a list of couplings (ids in order of first appearance, or `ids`). */
function chip(couplings: [string, string][], ids?: string[]) {
  const names = ids ?? [...new Set(couplings.flat())];
  const qubits = names.map((id, i) => `  ${id}: { pos: [${i}, 0], fMax: 6 GHz, anharmonicity: -200 MHz, t1: 50 us, tphi: 50 us }`);
  const text = `chip: T\nqubits:\n${qubits.join('\n')}\ncouplings:\n${couplings.map(([a, b]) => `  - [${a}, ${b}, 10 MHz]`).join('\n')}\n`;
  return buildChipGraph(parseLayoutText(text, 't.yaml'));
}

describe('buildChipGraph', () => {
  it('has one node per qubit (with its QubitLayout) and one edge per coupling (with g), in layout order', () => {
    const layout = loadLayoutFile('layouts/bowline-5.yaml');
    const g = buildChipGraph(layout);
    expect(g.type).toBe('undirected');
    expect(g.nodes()).toEqual(['Q0', 'Q1', 'Q2', 'Q3', 'Q4']);
    expect(g.edges()).toEqual(['Q0-Q1', 'Q0-Q2', 'Q0-Q3', 'Q0-Q4']);
    expect(qubitOf(g, 'Q2')).toBe(layout.qubits[2]);
    expect(g.getNodeAttribute('Q3', 'index')).toBe(3);
    expect(g.getEdgeAttribute(edgeKey('Q0', 'Q3'), 'gGHz')).toBe(0.0112);
    expect(couplingBetween(g, 'Q3', 'Q0')?.coupling).toBe(layout.couplings[2]);
    expect(couplingBetween(g, 'Q1', 'Q2')).toBeUndefined();
    expect(couplingBetween(g, 'Q1', 'nope')).toBeUndefined();
    expect(g.getAttribute('chip')).toBe('Bowline-5');
    expect(g.getAttribute('rules').maxGateNs).toBe(80);
  });
});

describe('neighbourhoods', () => {
  it('neighbours(graph, id) lists coupled qubits in layout order', () => {
    const g = chip([['C', 'B'], ['A', 'C'], ['C', 'D']], ['A', 'B', 'C', 'D']);
    expect(neighbours(g, 'C')).toEqual(['A', 'B', 'D']);
    expect(neighbours(g, 'A')).toEqual(['C']);
  });

  it('nextNearestPairs on a line A-B-C-D: (A, C) via B and (B, D) via C', () => {
    const g = chip([['A', 'B'], ['B', 'C'], ['C', 'D']]);
    expect(nextNearestPairs(g)).toEqual([
      { a: 'A', b: 'C', via: ['B'], coupled: false },
      { a: 'B', b: 'D', via: ['C'], coupled: false },
    ]);
  });

  it('nextNearestPairs on a square plaquette lists each diagonal once with both shared qubits', () => {
    const g = chip([['A', 'B'], ['B', 'C'], ['C', 'D'], ['D', 'A']]);
    expect(nextNearestPairs(g)).toEqual([
      { a: 'A', b: 'C', via: ['B', 'D'], coupled: false },
      { a: 'B', b: 'D', via: ['A', 'C'], coupled: false },
    ]);
  });

  it('a triangle: coupled pairs are left out unless includeCoupled', () => {
    const g = chip([['A', 'B'], ['B', 'C'], ['C', 'A']]);
    expect(nextNearestPairs(g)).toEqual([]);
    expect(nextNearestPairs(g, { includeCoupled: true })).toEqual([
      { a: 'A', b: 'B', via: ['C'], coupled: true },
      { a: 'A', b: 'C', via: ['B'], coupled: true },
      { a: 'B', b: 'C', via: ['A'], coupled: true },
    ]);
  });

  it('a star of n leaves has C(n, 2) next-nearest pairs', () => {
    const leaves = ['L1', 'L2', 'L3', 'L4', 'L5', 'L6'];
    const g = chip(leaves.map((l) => ['H', l] as [string, string]));
    expect(nextNearestPairs(g)).toHaveLength(15);
    expect(new Set(nextNearestPairs(g).map((p) => p.via.join()))).toEqual(new Set(['H']));
  });
});

describe('counts', () => {
  it('degreeStats: min, mean, max and histogram', () => {
    const g = chip([['A', 'B'], ['B', 'C'], ['B', 'D']]);
    expect(degreeStats(g)).toEqual({ min: 1, mean: 1.5, max: 3, histogram: [0, 3, 0, 1] });
  });

  it('connectedComponents in layout order, and .assign writes the component onto each node', () => {
    const g = chip([['A', 'B'], ['C', 'D'], ['D', 'E']], ['A', 'C', 'B', 'D', 'E', 'F']);
    expect(connectedComponents(g)).toEqual([['A', 'B'], ['C', 'D', 'E'], ['F']]);
    connectedComponents.assign(g);
    expect(['A', 'B', 'C', 'D', 'E', 'F'].map((id) => g.getNodeAttribute(id, 'component'))).toEqual([0, 0, 1, 1, 1, 2]);
  });
});
