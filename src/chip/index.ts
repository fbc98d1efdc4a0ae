/** The chip stage: the chip graph, its neighbourhoods and counts, synthetic chips (re-exports only). */
export { buildChipGraph, couplingBetween, edgeKey, qubitOf, type ChipAttributes, type ChipGraph, type CouplingEdge, type QubitNode } from './graph.js';
export { NEXT_NEAREST_DEFAULTS, neighbours, nextNearestPairs, type NextNearestOptions, type NextNearestPair } from './neighbourhood.js';
export { connectedComponents, degreeStats, type DegreeStats } from './stats.js';
export { heavyHexLattice, lattice, squareLattice, type Lattice, type LatticeKind, type LatticeSite } from './lattice.js';
export { adjacencyLists, frequencyGroups } from './colouring.js';
export { GENERATE_DEFAULTS, GENERATE_LIMITS, generateLayout, type GenerateOptions } from './generate.js';
