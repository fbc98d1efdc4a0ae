import { describe, expect, it } from 'vitest';
import { heavyHexLattice, squareLattice } from '../../src/chip/lattice.js';
import { adjacencyLists, frequencyGroups } from '../../src/chip/colouring.js';

/** Number of independent cycles of a connected graph: |E| - |V| + 1 (cyclomatic number, Euler). */
const cycles = (v: number, e: number) => e - v + 1;

describe('squareLattice', () => {
  it('R x C qubits, R (C - 1) + C (R - 1) couplings, numbered in reading order', () => {
    const l = squareLattice(3, 4);
    expect(l.sites).toHaveLength(12);
    expect(l.edges).toHaveLength(3 * 3 + 4 * 2);
    expect(l.sites.slice(0, 5).map((s) => [s.id, s.pos])).toEqual([
      ['Q0', [0, 0]], ['Q1', [1, 0]], ['Q2', [2, 0]], ['Q3', [3, 0]], ['Q4', [0, 1]],
    ]);
    expect(l.edges.slice(0, 3)).toEqual([[0, 1], [0, 4], [1, 2]]);
  });
});

describe('heavyHexLattice', () => {
  it.each([
    [1, 1, 12, 12],
    [1, 2, 21, 22],
    [1, 3, 30, 32],
    [2, 2, 35, 38],
  ])('%i x %i cells: %i qubits, %i couplings', (rows, cols, qubits, couplings) => {
    const l = heavyHexLattice(rows, cols);
    expect(l.sites).toHaveLength(qubits);
    expect(l.edges).toHaveLength(couplings);
    // a honeycomb of rows x cols cells has rows x cols independent cycles; subdividing edges keeps them
    expect(cycles(qubits, couplings)).toBe(rows * cols);
  });

  it('every qubit has degree 2 or 3, degree-3 qubits only couple to degree-2 qubits (heavy edges)', () => {
    const l = heavyHexLattice(4, 5);
    const adj = adjacencyLists(l.sites.length, l.edges);
    for (const list of adj) expect([2, 3]).toContain(list.length);
    for (let i = 0; i < adj.length; i++) {
      if (adj[i].length === 3) for (const j of adj[i]) expect(adj[j].length).toBe(2);
    }
  });

  it('a single cell is a 12-cycle', () => {
    const l = heavyHexLattice(1, 1);
    const adj = adjacencyLists(12, l.edges);
    const seen = [0];
    let [prev, at] = [-1, 0];
    for (let k = 0; k < 12; k++) {
      const next = adj[at].find((n) => n !== prev)!;
      [prev, at] = [at, next];
      seen.push(at);
    }
    expect(at).toBe(0);
    expect(new Set(seen).size).toBe(12);
  });
});

describe('frequencyGroups', () => {
  it('gives coupled neighbours different groups on square and heavy-hex lattices', () => {
    for (const l of [squareLattice(9, 7), heavyHexLattice(5, 4)]) {
      const adj = adjacencyLists(l.sites.length, l.edges);
      const g = frequencyGroups(adj, 3);
      for (const [a, b] of l.edges) expect(g[a]).not.toBe(g[b]);
      expect(new Set(g)).toEqual(new Set([0, 1, 2]));
    }
  });

  it('with 3 groups on a square grid, most next-nearest pairs differ too', () => {
    const l = squareLattice(8, 8);
    const adj = adjacencyLists(l.sites.length, l.edges);
    const g = frequencyGroups(adj, 3);
    let same = 0;
    let total = 0;
    for (let i = 0; i < adj.length; i++) {
      for (const j of adj[i]) for (const k of adj[j]) {
        if (k > i) {
          total++;
          if (g[k] === g[i]) same++;
        }
      }
    }
    expect(same / total).toBeLessThan(0.5);
  });

  it('refuses a non-positive number of groups', () => {
    expect(() => frequencyGroups([[]], 0)).toThrow(RangeError);
  });
});
