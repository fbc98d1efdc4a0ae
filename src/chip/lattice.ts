/**
 * Coupling lattices for synthetic chips.
 *
 * - square: rows x cols qubits, each coupled to its horizontal and vertical neighbours.
 * - heavy-hex: a honeycomb of rows x cols hexagonal cells in brick-wall form, with one extra qubit
 *   on every edge ("heavy" edges). Vertex qubits have degree <= 3, edge qubits degree 2; this is
 *   the lattice of heavy-hexagon chips described in the literature (Chamberland et al.,
 *   Phys. Rev. X 10, 011022 (2020)).
 *
 * Qubits are numbered Q0, Q1, ... in reading order of their positions (y, then x); y grows
 * downwards on a drawing, x to the right.
 */

export type LatticeKind = 'square' | 'heavy-hex';

export interface LatticeSite {
  id: string;
  pos: [number, number];
}

export interface Lattice {
  sites: LatticeSite[];
  /** Pairs of indices into `sites`, each once, sorted. */
  edges: [number, number][];
}

function finish(points: [number, number][], links: [[number, number], [number, number]][]): Lattice {
  const order = points
    .map((p, i) => ({ p, i }))
    .sort((u, v) => u.p[1] - v.p[1] || u.p[0] - v.p[0]);
  const rank = new Map<string, number>();
  order.forEach(({ p }, r) => rank.set(`${p[0]},${p[1]}`, r));
  const sites = order.map(({ p }, r) => ({ id: `Q${r}`, pos: [p[0], p[1]] as [number, number] }));
  const edges = links
    .map(([p, q]) => {
      const a = rank.get(`${p[0]},${p[1]}`)!;
      const b = rank.get(`${q[0]},${q[1]}`)!;
      return (a < b ? [a, b] : [b, a]) as [number, number];
    })
    .sort((e, f) => e[0] - f[0] || e[1] - f[1]);
  return { sites, edges };
}

export function squareLattice(rows: number, cols: number): Lattice {
  const points: [number, number][] = [];
  const links: [[number, number], [number, number]][] = [];
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      points.push([c, r]);
      if (c + 1 < cols) links.push([[c, r], [c + 1, r]]);
      if (r + 1 < rows) links.push([[c, r], [c, r + 1]]);
    }
  }
  return finish(points, links);
}

/**
 * Heavy-hexagon lattice of rows x cols hexagonal cells. Cell (r, k) of the brick wall spans
 * columns 2k + (r mod 2) .. 2k + (r mod 2) + 2 of vertex rows r and r + 1. Vertices sit at
 * (2 column, 2 row) and edge qubits at the midpoints, so all positions are integers.
 * Sizes: 1 x 1 -> 12 qubits (a 12-cycle), 1 x 2 -> 21, 1 x 3 -> 30, 2 x 2 -> 35, 14 x 14 -> 1091.
 */
export function heavyHexLattice(rows: number, cols: number): Lattice {
  const vertices = new Set<string>();
  const honeycomb = new Set<string>();
  const addEdge = (c1: number, r1: number, c2: number, r2: number) => {
    vertices.add(`${c1},${r1}`);
    vertices.add(`${c2},${r2}`);
    honeycomb.add(`${c1},${r1},${c2},${r2}`);
  };
  for (let r = 0; r < rows; r++) {
    const offset = r % 2;
    for (let k = 0; k < cols; k++) {
      const c0 = 2 * k + offset;
      for (const row of [r, r + 1]) {
        addEdge(c0, row, c0 + 1, row);
        addEdge(c0 + 1, row, c0 + 2, row);
      }
      addEdge(c0, r, c0, r + 1);
      addEdge(c0 + 2, r, c0 + 2, r + 1);
    }
  }
  const points: [number, number][] = [...vertices].map((v) => {
    const [c, r] = v.split(',').map(Number);
    return [2 * c, 2 * r];
  });
  const links: [[number, number], [number, number]][] = [];
  for (const e of honeycomb) {
    const [c1, r1, c2, r2] = e.split(',').map(Number);
    const mid: [number, number] = [c1 + c2, r1 + r2]; // midpoint of (2c1, 2r1) and (2c2, 2r2)
    points.push(mid);
    links.push([[2 * c1, 2 * r1], mid], [mid, [2 * c2, 2 * r2]]);
  }
  return finish(points, links);
}

export function lattice(kind: LatticeKind, rows: number, cols: number): Lattice {
  return kind === 'square' ? squareLattice(rows, cols) : heavyHexLattice(rows, cols);
}
