/**
 * The chip report in a real browser: Debian's chromium (/usr/bin/chromium, never a downloaded
 * one) driven by playwright-core opens DIR/report.html of every demo plan from a file URL, with
 * every non-file request aborted (and none made), and checks that every qubit and coupling of
 * the layout is in the chip map and can be hit at its place, that clicking a qubit and an edge
 * shows their numbers as the plan has them, that the other views are drawn, that no console or
 * page error occurs, and that the screenshot is not blank (PNG decoded with pngjs). Bowline-5 and
 * Clove-17 are planned with CZ pulse design (waveforms and gate details), Hitch-30 and Reef-49
 * without (Reef-49 breaks rules: its findings are shown). The Clove-17 screenshot is the one the
 * README shows: test/report/screenshots/clove-17.png, written here.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import { PNG } from 'pngjs';
import { runFluxlane } from '../support/cli.js';
import { loadLayoutFile } from '../../src/layout/load.js';

const CHROMIUM = {
  executablePath: '/usr/bin/chromium',
  headless: true,
  args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
};

const DEMOS = [
  { name: 'bowline-5', pulses: true },
  { name: 'clove-17', pulses: true },
  { name: 'hitch-30', pulses: false },
  { name: 'reef-49', pulses: false },
];

const SCREENSHOTS = join(fileURLToPath(new URL('.', import.meta.url)), 'screenshots');

interface Planned {
  html: string;
  plan: Record<string, any>;
  code: number;
}

let browser: Browser;
const planned = new Map<string, Planned>();
const dirs = new Map<string, string>();
const work = mkdtempSync(join(tmpdir(), 'fluxlane-browser-'));

beforeAll(async () => {
  browser = await chromium.launch(CHROMIUM);
  for (const demo of DEMOS) {
    const out = join(work, demo.name);
    // The layout path as a user types it from the repository root (the page shows it).
    const r = await runFluxlane(['plan', `layouts/${demo.name}.yaml`, ...(demo.pulses ? [] : ['--no-pulses']), '-o', out]);
    expect(r.code, r.err).toBeLessThanOrEqual(1);
    dirs.set(demo.name, out);
    planned.set(demo.name, { html: join(out, 'report.html'), plan: JSON.parse(readFileSync(join(out, 'plan.json'), 'utf8')), code: r.code });
  }
}, 90_000);

afterAll(async () => {
  await browser?.close();
});

/** The first number in a text such as "6.3200 GHz" or "88.0 µs". */
function numberIn(text: string | null): number {
  const m = /-?\d+(\.\d+)?(e[-+]?\d+)?/i.exec(text ?? '');
  if (!m) throw new Error(`no number in ${JSON.stringify(text)}`);
  return Number(m[0]);
}

/** Distinct colours and luminance spread of a PNG (is it a picture, not a blank page?). */
function pixelStats(png: Buffer): { width: number; height: number; colours: number; lumaStd: number; nonBackground: number } {
  const img = PNG.sync.read(png);
  const colours = new Set<number>();
  let sum = 0;
  let sum2 = 0;
  let nonBackground = 0;
  const n = img.width * img.height;
  const [r0, g0, b0] = [img.data[0], img.data[1], img.data[2]];
  for (let i = 0; i < n; i++) {
    const r = img.data[4 * i];
    const g = img.data[4 * i + 1];
    const b = img.data[4 * i + 2];
    colours.add((r << 16) | (g << 8) | b);
    const y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
    sum += y;
    sum2 += y * y;
    if (Math.abs(r - r0) + Math.abs(g - g0) + Math.abs(b - b0) > 24) nonBackground++;
  }
  const mean = sum / n;
  return { width: img.width, height: img.height, colours: colours.size, lumaStd: Math.sqrt(Math.max(0, sum2 / n - mean * mean)), nonBackground: nonBackground / n };
}

/** A page opened offline; its console and page errors collected. */
async function openOffline(html: string): Promise<{ page: import('playwright-core').Page; problems: string[]; close: () => Promise<void> }> {
  const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
  await context.route('**/*', (route) => (route.request().url().startsWith('file:') ? route.continue() : route.abort()));
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error' || m.type() === 'warning') problems.push(`console ${m.type()}: ${m.text()}`);
  });
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  await page.goto(pathToFileURL(html).href);
  await page.waitForSelector('html[data-drawn="true"]', { timeout: 30_000 });
  return { page, problems, close: () => context.close() };
}

describe('the chip report in chromium (offline, from a file URL)', () => {
  it.each(DEMOS)('$name: every qubit and edge is in the map and clickable, details read back, no errors, a real picture', async ({ name, pulses }) => {
    const { html, plan, code } = planned.get(name)!;
    const layout = loadLayoutFile(resolve(`layouts/${name}.yaml`), `layouts/${name}.yaml`);
    const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
    const aborted: string[] = [];
    const requested: string[] = [];
    await context.route('**/*', (route) => {
      const url = route.request().url();
      if (url.startsWith('file:')) return route.continue();
      aborted.push(url);
      return route.abort();
    });
    const page = await context.newPage();
    const problems: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error' || m.type() === 'warning') problems.push(`console ${m.type()}: ${m.text()}`);
    });
    page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
    page.on('request', (r) => requested.push(r.url()));

    await page.goto(pathToFileURL(html).href);
    await page.waitForSelector('html[data-drawn="true"]', { timeout: 30_000 });

    // Every qubit and every coupling of the layout, once each, in the chip map.
    const qubitIds = await page.evaluate<string[]>(`[...document.querySelectorAll('#chip-map [data-qubit]')].map((e) => e.getAttribute('data-qubit'))`);
    expect([...qubitIds].sort()).toEqual(layout.qubits.map((q) => q.id).sort());
    const edgeKeys = await page.evaluate<string[]>(`[...document.querySelectorAll('#chip-map [data-edge]')].map((e) => e.getAttribute('data-edge'))`);
    expect(edgeKeys).toHaveLength(layout.couplings.length);
    const pairs = new Set(edgeKeys.map((k) => k.split('-').sort().join('|')));
    for (const c of layout.couplings) expect(pairs.has([c.a, c.b].sort().join('|')), `${c.a}-${c.b}`).toBe(true);
    // ... and each can be hit where it is drawn: the element at its centre (a qubit's dot, an
    // edge's midpoint) is that qubit or edge.
    const misses = await page.evaluate<string[]>(`(() => {
      document.getElementById('chip-map').scrollIntoView({ block: 'start' });
      const missed = [];
      const hit = (el, attr, x, y) => {
        const top = document.elementFromPoint(x, y);
        const owner = top && top.closest('[' + attr + ']');
        if (owner !== el) missed.push(el.getAttribute(attr) + ' -> ' + (owner ? owner.getAttribute(attr) : top && top.tagName));
      };
      for (const el of document.querySelectorAll('#chip-map [data-qubit]')) {
        const r = el.querySelector('circle.core').getBoundingClientRect();
        hit(el, 'data-qubit', r.left + r.width / 2, r.top + r.height / 2);
      }
      for (const el of document.querySelectorAll('#chip-map [data-edge]')) {
        const r = el.querySelector('path.edge-hit').getBoundingClientRect();
        hit(el, 'data-edge', r.left + r.width / 2, r.top + r.height / 2);
      }
      return missed;
    })()`);
    expect(misses).toEqual([]);
    expect(await page.locator('#landscape [data-qubit]').count()).toBe(layout.qubits.length);
    expect(await page.locator('#timeline rect.layer-block').count()).toBe(plan.layers.length);

    // Click the qubit with the most couplings: its details are the plan's and the layout's numbers.
    const degree = new Map<string, number>();
    for (const c of layout.couplings) for (const q of [c.a, c.b]) degree.set(q, (degree.get(q) ?? 0) + 1);
    const qubit = layout.qubits.map((q) => q.id).reduce((best, q) => ((degree.get(q) ?? 0) > (degree.get(best) ?? 0) ? q : best));
    await page.locator(`#chip-map [data-qubit="${qubit}"] circle.core`).click();
    const qd = page.locator(`#details-body [data-kind="qubit"][data-id="${qubit}"]`);
    await qd.waitFor();
    const field = async (box: typeof qd, f: string) => box.locator(`[data-field="${f}"]`).textContent();
    expect(Math.abs(numberIn(await field(qd, 'parking')) - plan.qubits[qubit].parkingFrequency * 1e-9)).toBeLessThanOrEqual(5.1e-5);
    expect(Math.abs(numberIn(await field(qd, 'f12')) - plan.qubits[qubit].f12 * 1e-9)).toBeLessThanOrEqual(5.1e-5);
    const t1Us = layout.qubits.find((q) => q.id === qubit)!.t1Ns * 1e-3;
    expect(Math.abs(numberIn(await field(qd, 't1')) - t1Us) / t1Us).toBeLessThan(6e-3);
    if (plan.qubits[qubit].t2 !== null) expect(Math.abs(numberIn(await field(qd, 't2')) - plan.qubits[qubit].t2 * 1e6) / (plan.qubits[qubit].t2 * 1e6)).toBeLessThan(6e-3);
    expect(await field(qd, 'margin')).toMatch(/MHz \(-?\d+\.\d\d spreads\)|^-$/);
    expect(await page.locator('#chip-map [data-qubit].selected').count()).toBe(1);
    // Hover shows a one-line summary.
    await page.locator(`#chip-map [data-qubit="${qubit}"] circle.core`).hover();
    expect(await page.locator('#tooltip').textContent()).toMatch(new RegExp(`^${qubit}, parks at \\d\\.\\d{4} GHz`));

    // Click an edge (the first of the plan): mover, crossing, layer and interaction as planned.
    const edge = plan.edges[0];
    const key = edge.qubits.join('-');
    await page.locator(`#chip-map [data-edge="${key}"] path.edge-hit`).click();
    const ed = page.locator(`#details-body [data-kind="edge"][data-id="${key}"]`);
    await ed.waitFor();
    expect(await field(ed, 'mover')).toBe(edge.mover);
    expect(await field(ed, 'crossing')).toBe(edge.crossing);
    expect(await field(ed, 'layer')).toBe(String(edge.layer));
    if (edge.interactionFrequency !== null) expect(Math.abs(numberIn(await field(ed, 'interaction')) - edge.interactionFrequency * 1e-9)).toBeLessThanOrEqual(5.1e-5);
    expect(await page.getAttribute('#gate-body', 'data-edge')).toBe(key);
    if (pulses) {
      expect(Math.abs(numberIn(await field(ed, 'fidelity')) - edge.gate.fidelity)).toBeLessThanOrEqual(5.1e-6);
      expect(Math.abs(numberIn(await field(ed, 'fidelityNoisy')) - edge.gate.fidelityNoisy)).toBeLessThanOrEqual(5.1e-6);
      expect(await field(ed, 'family')).toBe(edge.gate.family);
      // Flux and f01 waveforms, and the error split bar.
      expect(await page.locator('#gate-body .chart svg path[stroke="#1f6f78"]').count()).toBe(2);
      expect(await page.locator('#gate-body rect.budget-part').count()).toBeGreaterThanOrEqual(1);
    } else {
      expect(await field(ed, 'family')).toBe('no pulse designed');
      expect(await page.locator('#gate-body').textContent()).toMatch(/without pulse design/);
    }

    // Findings in words: the violations of the plan, grouped by rule.
    expect(await page.getAttribute('#status .badge', 'data-ok')).toBe(String(plan.ok));
    if (plan.violations.length > 0) {
      expect(code).toBe(1);
      const rules = [...new Set(plan.violations.map((v: any) => v.rule))];
      expect(await page.locator('#findings-body details[data-rule]').count()).toBeGreaterThanOrEqual(rules.length);
      expect(await page.locator('#chip-map .violation-ring').count()).toBeGreaterThan(0);
    } else {
      expect(await page.locator('#findings-body [data-empty="violations"]').count()).toBe(1);
    }
    expect(await page.locator('#cautions-body li').count()).toBe(4);

    // The screenshot of what a person sees first, checked to be a picture.
    await page.evaluate('window.scrollTo(0, 0)');
    const shotPath = name === 'clove-17' ? join(SCREENSHOTS, 'clove-17.png') : join(work, `${name}.png`);
    mkdirSync(SCREENSHOTS, { recursive: true });
    const png = await page.screenshot({ path: shotPath });
    const stats = pixelStats(png);
    expect([stats.width, stats.height]).toEqual([1400, 1000]);
    expect(stats.colours).toBeGreaterThan(200);
    expect(stats.lumaStd).toBeGreaterThan(20);
    expect(stats.nonBackground).toBeGreaterThan(0.05);

    // The toggle colours the edges by predicted error instead of by layer.
    const strokes = `[...document.querySelectorAll('#chip-map line.edge-line')].map((e) => e.getAttribute('stroke')).join(',')`;
    const byLayer = await page.evaluate<string>(strokes);
    await page.locator('button[data-colouring="error"]').click();
    expect(await page.getAttribute('button[data-colouring="error"]', 'aria-pressed')).toBe('true');
    expect(await page.evaluate<string>(strokes)).not.toBe(byLayer);
    expect(await page.locator('#map-legends').textContent()).toMatch(/predicted gate error/);

    // Keyboard: focus the edge's partner in the map and press Enter.
    await page.locator(`#chip-map [data-qubit="${edge.partner}"]`).focus();
    await page.keyboard.press('Enter');
    await page.locator(`#details-body [data-kind="qubit"][data-id="${edge.partner}"]`).waitFor();

    expect(problems).toEqual([]);
    expect(aborted).toEqual([]);
    expect(requested.filter((u) => !u.startsWith('file:') && !u.startsWith('data:'))).toEqual([]);
    await context.close();
  });
  it('shows the error budget, idle budgets and cycle when the plan carries them (Bowline-5 plan with the fields added)', async () => {
    const dir = dirs.get('bowline-5')!;
    const plan = JSON.parse(readFileSync(join(dir, 'plan.json'), 'utf8'));
    // Fields of the error-budget work, values chosen for this check only.
    const parts = { coherent: 2e-5, t1: 4e-3, whiteDephasing: 1e-3, fluxNoise: 3e-3, spectators: 5e-4, sweptCrossings: 1e-5, spectatorMoves: 0 };
    const total = Object.values(parts).reduce((x, y) => x + y, 0);
    plan.edges[0].gate.budget = { ...parts, total };
    plan.qubits[plan.edges[0].mover].idle = { t1: 1e-3, dephasing: 2e-3, zz: 1e-4, thermal: 5e-5, total: 3.15e-3 };
    plan.cycle = { duration: 4.2e-7, error: 0.071, gates: 0.05, idles: 0.021 };
    writeFileSync(join(dir, 'with-budget.json'), JSON.stringify(plan));
    const r = await runFluxlane(['report', join(dir, 'with-budget.json'), '--layout', 'layouts/bowline-5.yaml', '-o', join(dir, 'with-budget.html')]);
    expect(r.code, r.err).toBe(0);
    const { page, problems, close } = await openOffline(join(dir, 'with-budget.html'));
    const key = plan.edges[0].qubits.join('-');
    await page.locator(`#chip-map [data-edge="${key}"] path.edge-hit`).click();
    const ed = page.locator(`#details-body [data-kind="edge"][data-id="${key}"]`);
    expect(numberIn(await ed.locator('[data-field="budget-total"]').textContent())).toBeCloseTo(total, 6);
    expect(await ed.locator('[data-field="error"]').textContent()).toMatch(/error budget total/);
    // The split bar: one part per non-zero cause, widths in proportion.
    const widths = await page.evaluate<Record<string, number>>(`Object.fromEntries([...document.querySelectorAll('#gate-body rect.budget-part')].map((e) => [e.getAttribute('data-part'), Number(e.getAttribute('width'))]))`);
    expect(Object.keys(widths).sort()).toEqual(Object.entries(parts).filter(([, v]) => v > 0).map(([k]) => k).sort());
    expect(widths.t1 / widths.fluxNoise).toBeCloseTo(parts.t1 / parts.fluxNoise, 6);
    await page.locator(`#chip-map [data-qubit="${plan.edges[0].mover}"] circle.core`).click();
    const qd = page.locator(`#details-body [data-kind="qubit"][data-id="${plan.edges[0].mover}"]`);
    expect(numberIn(await qd.locator('[data-field="idleBudget"]').textContent())).toBeCloseTo(3.15e-3, 8);
    expect(numberIn(await qd.locator('[data-field="idle-dephasing"]').textContent())).toBeCloseTo(2e-3, 8);
    expect(await page.locator('[data-stat="cycle"]').textContent()).toMatch(/cycle 420\.0 ns/);
    expect(await page.locator('[data-stat="cycle error"]').textContent()).toMatch(/7\.10e-2/);
    expect(problems).toEqual([]);
    await close();
  });
});
