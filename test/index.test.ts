/** The package entry (src/index.ts, dist/index.js when built) exports each stage's main API. */
import { describe, expect, it } from 'vitest';
import * as fluxlane from '../src/index.js';

describe('package entry', () => {
  it('exports every stage: layout, transmon, chip, pair, simulator, gate designer, planner, report, CLI', () => {
    for (const name of ['loadLayoutFile', 'Transmon', 'buildChipGraph', 'CoupledPair', 'simulateGate', 'buildManifoldFrame', 'designCzGate', 'designInWorkers', 'RAMP_FAMILIES', 'planChip', 'designPulses', 'designPulsesInParallel', 'verifyPlan', 'buildReportDocument', 'chipReportHtml', 'runCli']) {
      expect(fluxlane, name).toHaveProperty(name);
    }
  });
});
