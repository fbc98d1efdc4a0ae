/**
 * planFiles (src/report/plan-files.ts): the complete list of files of a plan folder, in a fixed
 * order, each built by its own writer from the one plan; a waveform file per designed gate only.
 */
import { describe, expect, it } from 'vitest';
import { planChip } from '../../src/plan/plan.js';
import { loadLayoutFile } from '../../src/layout/load.js';
import { planFiles } from '../../src/report/plan-files.js';
import { planJson } from '../../src/report/plan-json.js';
import { gateTableCsv } from '../../src/report/gate-table-csv.js';
import { gateTableFile } from '../../src/report/gate-table-text.js';

describe('planFiles', () => {
  it('lists plan.json, gates.csv and gates.txt (no waveforms without pulse design) built from the same plan', () => {
    const plan = planChip(loadLayoutFile('layouts/bowline-5.yaml', 'layouts/bowline-5.yaml'));
    const json = planJson(plan, { file: 'layouts/bowline-5.yaml', seed: 1, pulses: false });
    const files = planFiles(plan, json, 'out');
    expect(files.map((f) => f.path)).toEqual(['out/plan.json', 'out/gates.csv', 'out/gates.txt']);
    expect(JSON.parse(files[0].contents)).toEqual(JSON.parse(JSON.stringify(json)));
    expect(files[0].contents.endsWith('}\n')).toBe(true);
    expect(files[1].contents).toBe(gateTableCsv(json));
    expect(files[2].contents).toBe(gateTableFile(json));
  });
});
