/**
 * The report page's HTML (src/report/html/page.ts) and its inlined script
 * (src/report/html/page-script.ts): self-contained (no external script, style, font or image),
 * data and script that cannot close their <script> element, and the same bytes for the same
 * document. What the page draws is checked in a real browser: test/report/browser.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { escapeHtml, jsonForScript, reportHtml, scriptForInline } from '../../../src/report/html/page.js';
import { pageScript } from '../../../src/report/html/page-script.js';
import { REPORT_DATA_ELEMENT_ID, REPORT_FORMAT, REPORT_VERSION, type ReportDocument } from '../../../src/report/html/document.js';
import { REPORT_CAUTIONS } from '../../../src/report/html/build-document.js';

const doc: ReportDocument = {
  format: REPORT_FORMAT, version: REPORT_VERSION, chip: 'Knot <b>&</b> "test"', description: 'ends a script: </script><script>alert(1)</script> \u2028',
  layoutFile: 'x.yaml', seed: 1, ok: true, pulses: false, note: null, cautions: [...REPORT_CAUTIONS], qubits: [], edges: [], layers: [],
  layerLowerBound: null, layeredNs: null, cycle: null, violations: [], flags: [], explanations: [], rules: [], crowdedBands: [], waveformNote: null,
};

describe('the report page', () => {
  it('embeds the document as JSON that reads back exactly and cannot end its script element', () => {
    const json = jsonForScript(doc);
    expect(json).not.toMatch(/<\/?script/i);
    expect(json).not.toContain('<');
    expect(json).not.toContain('\u2028');
    expect(JSON.parse(json)).toEqual(doc);
    expect(scriptForInline('a("</script>"); b("<!--")')).toBe('a("<\\/script>"); b("<\\!--")');
    expect(escapeHtml(`<a href="x">&'`)).toBe('&lt;a href=&quot;x&quot;&gt;&amp;&#39;');
  });

  it('is one self-contained file: no external scripts, styles, fonts or images, and the cautions in plain HTML', async () => {
    const html = reportHtml(doc, await pageScript());
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(html).not.toMatch(/<script[^>]*\ssrc=/i);
    expect(html).not.toMatch(/<link\b/i);
    expect(html).not.toMatch(/@import|url\(\s*['"]?(https?:)?\/\//i);
    expect(html).not.toMatch(/<img\b|<iframe\b/i);
    expect(html).toContain(`<script type="application/json" id="${REPORT_DATA_ELEMENT_ID}">`);
    expect(html).toContain('<title>Knot &lt;b&gt;&amp;&lt;/b&gt; &quot;test&quot;: chip report</title>');
    expect(html.match(/<\/script>/g)).toHaveLength(2);
    for (const c of REPORT_CAUTIONS) expect(html).toContain(escapeHtml(c));
    expect(html).toMatch(/respect your wiring's flux-line current limits/);
  });

  it('the page script is a bundle of the browser code with the d3 licence notice, the same each time', async () => {
    const script = await pageScript();
    expect(script).toMatch(/^\/\* fluxlane chip report page\. Built from .*d3-scale 4\.0\.3.*ISC License/);
    expect(script).not.toMatch(/\bimport\s*\(|\brequire\(/);
    expect(await pageScript()).toBe(script);
    expect(reportHtml(doc, script)).toBe(reportHtml(JSON.parse(JSON.stringify(doc)), script));
  });
});
