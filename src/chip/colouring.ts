/**
 * Frequency groups for synthetic chips, and levels inside each group.
 *
 * Groups: coupled neighbours must get different groups, several hundred MHz apart (the idle
 * 01-01, 01-12 and ZZ rules; README "The planner"). With two groups on a bipartite lattice
 * (square and heavy-hex both are), the groups are the two sides of the graph, found by a
 * breadth-first search from the lowest index of each component. Otherwise a greedy colouring
 * (Welsh and Powell, Comput. J. 10, 85 (1967), in index order instead of by degree): each qubit
 * takes the group that no coupled neighbour has and that the fewest next-nearest neighbours
 * have; ties go to the lower group.
 *
 * Levels: qubits of one group that share a neighbour are next-nearest neighbours (rule
 * next-01-01: detuningNext0101 apart at idle, and during a CZ the mover's other neighbours must
 * stay clear of its interaction point). Inside each group a greedy colouring of that
 * "shares a neighbour" graph, in index order (each qubit takes the lowest level none of its
 * same-group next-nearest neighbours has), gives each qubit a level; the generator steps the
 * maximum frequency down by a fixed detuning per level. A square lattice needs 4 levels per
 * group (its same-group next-nearest graph is a king's graph), heavy-hex 2 (vertex qubits) and
 * 3 (edge qubits).
 */

/** adjacency[i] lists the neighbours of site i. Returns group[i] in [0, groups). */
export function frequencyGroups(adjacency: readonly (readonly number[])[], groups: number): number[] {
  if (!Number.isInteger(groups) || groups < 1) throw new RangeError(`frequencyGroups: groups must be a positive integer, got ${groups}`);
  if (groups === 2) {
    const sides = bipartition(adjacency);
    if (sides) return sides;
  }
  const n = adjacency.length;
  const group = new Array<number>(n).fill(-1);
  const cost = new Array<number>(groups);
  for (let i = 0; i < n; i++) {
    cost.fill(0);
    for (const j of adjacency[i]) {
      if (group[j] >= 0) cost[group[j]] += n + 1; // a clash with a neighbour outweighs every NNN clash
      for (const k of adjacency[j]) {
        if (k !== i && group[k] >= 0) cost[group[k]] += 1;
      }
    }
    let best = 0;
    for (let c = 1; c < groups; c++) if (cost[c] < cost[best]) best = c;
    group[i] = best;
  }
  return group;
}

/**
 * The two sides of a bipartite graph (side 0 holds the lowest index of each component), or null
 * when the graph has an odd cycle.
 */
export function bipartition(adjacency: readonly (readonly number[])[]): number[] | null {
  const n = adjacency.length;
  const side = new Array<number>(n).fill(-1);
  for (let start = 0; start < n; start++) {
    if (side[start] >= 0) continue;
    side[start] = 0;
    const queue = [start];
    for (let head = 0; head < queue.length; head++) {
      const i = queue[head];
      for (const j of adjacency[i]) {
        if (side[j] < 0) {
          side[j] = 1 - side[i];
          queue.push(j);
        } else if (side[j] === side[i]) return null;
      }
    }
  }
  return side;
}

/**
 * Level of each site inside its group: a DSATUR colouring (Brelaz, Commun. ACM 22, 251 (1979))
 * of the graph that joins two sites of the same group when they share a neighbour: repeatedly
 * the uncoloured site whose coloured neighbours use the most distinct levels (ties: more
 * neighbours, then the lower index) takes the lowest level none of them uses. A heap with lazy
 * entries keeps it O((n + m) log n) for the largest chips.
 */
export function levelsInGroups(adjacency: readonly (readonly number[])[], group: readonly number[]): number[] {
  const n = adjacency.length;
  const near: number[][] = Array.from({ length: n }, (_, i) => {
    const set = new Set<number>();
    for (const j of adjacency[i]) for (const k of adjacency[j]) if (k !== i && group[k] === group[i]) set.add(k);
    return [...set].sort((a, b) => a - b);
  });
  const level = new Array<number>(n).fill(-1);
  const seen: Set<number>[] = Array.from({ length: n }, () => new Set<number>());
  // max-heap of [saturation, degree, -index]
  const heap: [number, number, number][] = [];
  const before = (x: [number, number, number], y: [number, number, number]) => x[0] > y[0] || (x[0] === y[0] && (x[1] > y[1] || (x[1] === y[1] && x[2] > y[2])));
  const push = (e: [number, number, number]) => {
    heap.push(e);
    let k = heap.length - 1;
    while (k > 0) {
      const p = (k - 1) >> 1;
      if (!before(heap[k], heap[p])) break;
      [heap[k], heap[p]] = [heap[p], heap[k]];
      k = p;
    }
  };
  const pop = (): [number, number, number] => {
    const top = heap[0];
    const last = heap.pop()!;
    if (heap.length > 0) {
      heap[0] = last;
      let k = 0;
      for (;;) {
        const l = 2 * k + 1;
        const r = l + 1;
        let m = k;
        if (l < heap.length && before(heap[l], heap[m])) m = l;
        if (r < heap.length && before(heap[r], heap[m])) m = r;
        if (m === k) break;
        [heap[k], heap[m]] = [heap[m], heap[k]];
        k = m;
      }
    }
    return top;
  };
  for (let i = 0; i < n; i++) push([0, near[i].length, -i]);
  while (heap.length > 0) {
    const [sat, , negI] = pop();
    const i = -negI;
    if (level[i] >= 0 || sat !== seen[i].size) continue; // stale entry
    let l = 0;
    while (seen[i].has(l)) l++;
    level[i] = l;
    for (const k of near[i]) {
      if (level[k] >= 0 || seen[k].has(l)) continue;
      seen[k].add(l);
      push([seen[k].size, near[k].length, -k]);
    }
  }
  return level;
}

/** Adjacency lists of `n` sites from an edge list. */
export function adjacencyLists(n: number, edges: readonly (readonly [number, number])[]): number[][] {
  const adjacency = Array.from({ length: n }, () => [] as number[]);
  for (const [a, b] of edges) {
    adjacency[a].push(b);
    adjacency[b].push(a);
  }
  return adjacency;
}
