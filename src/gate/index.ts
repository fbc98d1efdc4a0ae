/** The gate stage: per-edge CZ pulse design (re-exports only). */
export {
  designCzGate,
  meetsGoals,
  DEFAULT_FAMILY,
  DEFAULT_RAMP_NS,
  DESIGN_DEFAULTS,
  FALLBACK_FAMILY,
  LEAKAGE_GOAL,
  COHERENT_SHARE_GOAL,
  RAMP_RETRY_FACTORS,
  type GateDesign,
  type GateDesignRequest,
  type GateSpectatorRequest,
} from './design.js';
export { designInWorkers, defaultDesignThreads, type PooledDesign } from './design-pool.js';
export { requestToWire, requestFromWire, type WireRequest } from './design-wire.js';
export { RAMP_FAMILIES, rampFamily, RampInfeasible, type Ramp, type RampFamily, type RampInput } from './families/index.js';
export { sampleWaveform, rampTrajectory, pulseFlux, lineDelayNs, lineSigmaNs, pulseDuration, FILTERED_GRID_MIN_RATE_GHZ, type PulseShape, type WaveformOptions } from './pulse.js';
export { bestHold, phaseMiss, searchOffset, HOLD_SCAN_DEFAULTS, type HoldSolution, type OffsetEvaluation } from './tune.js';
