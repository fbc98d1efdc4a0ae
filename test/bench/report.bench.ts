/**
 * Benchmarks of the chip report (issue 12 targets) on a generated 1,024-qubit chip (square
 * 32 x 32, seed 1, src/chip/generate.ts), planned once without pulse design:
 *
 * - building the report page from the plan (document, waveform reduction, HTML), with its size
 *   (target < 10 MB), and the size again with a designed waveform given to every one of its
 *   1,984 edges (a Bowline-5 waveform reused: the size bound of a chip planned with pulses);
 * - Debian's chromium (playwright-core, the browser test's launch options) opening the page from
 *   a file URL until the page says it has drawn (`data-drawn` on <html>, set after its last
 *   render); the time per call is the whole load, and the note gives `drawnMs`, the page's own
 *   time from navigation start to that flag (target < 5 s).
 *
 * `npm run bench report`. The plan takes 8-15 s on this 2-core machine; it is made once.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import type { Benchmark } from './run.js';
import { generateLayout } from '../../src/chip/generate.js';
import { layoutToYaml } from '../../src/layout/write.js';
import { loadLayoutFile, parseLayoutText } from '../../src/layout/load.js';
import type { ChipLayout } from '../../src/layout/types.js';
import { planChip } from '../../src/plan/plan.js';
import { planJson } from '../../src/report/plan-json.js';
import { designPulses } from '../../src/plan/pulses.js';
import { loadGateDesigner } from '../../src/plan/gate-seam.js';
import { chipReportHtml } from '../../src/report/html/chip-report.js';
import { waveformsOfPlan } from '../../src/report/html/plan-waveforms.js';
import type { GateWaveform } from '../../src/report/html/build-document.js';

const MB = 1024 * 1024;

let chip: { layout: ChipLayout; plan: Record<string, unknown> } | undefined;
let html = '';
let file = '';
let browser: Browser | undefined;
const drawnMs: number[] = [];

function plannedChip(): { layout: ChipLayout; plan: Record<string, unknown> } {
  if (!chip) {
    const layout = parseLayoutText(layoutToYaml(generateLayout({ kind: 'square', rows: 32, cols: 32, seed: 1 })), 'square-32x32.yaml');
    const plan = JSON.parse(JSON.stringify(planJson(planChip(layout, { seed: 1 }), { file: layout.file, seed: 1, pulses: false }))) as Record<string, unknown>;
    chip = { layout, plan };
  }
  return chip;
}

export const reportBuild: Benchmark = {
  name: 'report page of a 1,024-qubit plan (no pulses): document and HTML',
  runs: 3,
  setup: () => void plannedChip(),
  run: async () => {
    const { layout, plan } = plannedChip();
    html = (await chipReportHtml({ plan, layout, waveforms: new Map() })).html;
    return html.length;
  },
  report: async () => {
    const { layout, plan } = plannedChip();
    const size = Buffer.byteLength(html, 'utf8');
    // Every edge with a designed waveform (one Bowline-5 design, reused), for the size bound.
    const bowline = loadLayoutFile(new URL('../../layouts/bowline-5.yaml', import.meta.url).pathname, 'layouts/bowline-5.yaml');
    const small = planChip(bowline, { seed: 1 });
    designPulses(small, (await loadGateDesigner())!, { noise: true });
    const one = [...waveformsOfPlan(small).values()][0];
    const all = new Map<string, GateWaveform>((plan.edges as { qubits: string[] }[]).map((e) => [e.qubits.join('-'), one]));
    const full = Buffer.byteLength((await chipReportHtml({ plan, layout, waveforms: all })).html, 'utf8');
    return `file ${(size / MB).toFixed(2)} MB (target < 10 MB: ${size < 10 * MB ? 'met' : 'MISSED'}); with a ${one.timeNs.length}-sample waveform on each of its ${all.size} edges ${(full / MB).toFixed(2)} MB (${full < 10 * MB ? 'met' : 'MISSED'})`;
  },
};

export const reportDraw: Benchmark = {
  name: 'chromium opens the 1,024-qubit report from a file URL until it has drawn',
  target: 5e6,
  runs: 3,
  warmup: 1,
  setup: async () => {
    const { layout, plan } = plannedChip();
    html ||= (await chipReportHtml({ plan, layout, waveforms: new Map() })).html;
    const dir = mkdtempSync(join(tmpdir(), 'fluxlane-report-bench-'));
    file = join(dir, 'report.html');
    writeFileSync(file, html);
    browser = await chromium.launch({
      executablePath: '/usr/bin/chromium',
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    });
  },
  run: async () => {
    const page = await browser!.newPage({ viewport: { width: 1400, height: 1000 } });
    await page.goto(pathToFileURL(file).href);
    await page.waitForSelector('html[data-drawn="true"]', { timeout: 60_000 });
    drawnMs.push(await page.evaluate<number>('window.fluxlaneReport.drawnMs'));
    await page.close();
  },
  report: async () => {
    await browser?.close();
    rmSync(join(file, '..'), { recursive: true, force: true });
    const timed = drawnMs.slice(1).sort((a, b) => a - b);
    const median = timed[timed.length >> 1];
    return `drawn flag set ${timed.map((t) => (t / 1000).toFixed(2)).join(', ')} s after navigation start (median ${(median / 1000).toFixed(2)} s; target < 5 s: ${median < 5000 ? 'met' : 'MISSED'})`;
  },
};
