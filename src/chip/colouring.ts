/**
 * Frequency groups for synthetic chips: a greedy graph colouring (Welsh and Powell, Comput. J.
 * 10, 85 (1967), in a fixed order instead of by degree) with a fixed number of groups. Each
 * qubit, in index order, takes the group that (1) no coupled neighbour has and (2) the fewest
 * next-nearest neighbours have; ties go to the lower group. With >= 2 groups this always gives
 * coupled neighbours different groups on bipartite lattices (square, heavy-hex), which is what a
 * planner needs: neighbours' maximum frequencies several hundred MHz apart.
 */

/** adjacency[i] lists the neighbours of site i. Returns group[i] in [0, groups). */
export function frequencyGroups(adjacency: readonly (readonly number[])[], groups: number): number[] {
  if (!Number.isInteger(groups) || groups < 1) throw new RangeError(`frequencyGroups: groups must be a positive integer, got ${groups}`);
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

/** Adjacency lists of `n` sites from an edge list. */
export function adjacencyLists(n: number, edges: readonly (readonly [number, number])[]): number[][] {
  const adjacency = Array.from({ length: n }, () => [] as number[]);
  for (const [a, b] of edges) {
    adjacency[a].push(b);
    adjacency[b].push(a);
  }
  return adjacency;
}
