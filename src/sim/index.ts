/** The simulator stage: re-exports only. */
export * from './model.js';
export * from './trajectory.js';
export * from './gate-metrics.js';
export * from './manifold-frame.js';
export * from './propagate-frame.js';
export * from './dressed-states.js';
export * from './simulate-gate.js';
export * from './decoherence.js';
export * from './pair-model.js';
export { fixedBasisModel, fixedBasisBlock, propagateFixedBasis, type FixedBasisModel } from './fixed-basis.js';
export { MovingBasisModel, movingBasisBlock, propagateMovingBasis } from './moving-basis.js';
