/**
 * The report page: one self-contained HTML file. The style sheet (./style.ts), the report
 * document (./document.ts, as JSON in a `<script type="application/json">`) and the page script
 * (./page-script.ts: the browser code with its d3 modules, bundled) are all inlined, so the file
 * opens from disk with no network. Same document, same bytes.
 */
import { REPORT_DATA_ELEMENT_ID, type ReportDocument } from './document.js';
import { REPORT_CSS } from './style.js';

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Text for HTML element content and attribute values. */
export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ESCAPES[c]);
}

/**
 * JSON that is safe inside a `<script>` element: every `<` is written `\u003c` (so no
 * `</script>` or `<!--` can appear), and the line separators U+2028/U+2029 are escaped too.
 */
export function jsonForScript(value: unknown): string {
  return JSON.stringify(value)
    .replace(/</g, '\\u003c')
    .replace(/\u2028/g, '\\u2028')
    .replace(/\u2029/g, '\\u2029');
}

/** A script's text made safe for an inline `<script>` element. */
export function scriptForInline(script: string): string {
  return script.replace(/<\/(script)/gi, '<\\/$1').replace(/<!--/g, '<\\!--');
}

/** The whole page. */
export function reportHtml(doc: ReportDocument, script: string): string {
  const title = `${doc.chip}: chip report`;
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="fluxlane">
<title>${escapeHtml(title)}</title>
<style>${REPORT_CSS}</style>
</head>
<body>
<header class="top" id="top">
<h1>${escapeHtml(doc.chip)}<span class="kind">chip report</span><span id="status"></span></h1>
<div class="sub" id="subtitle"></div>
<div class="stats" id="stats"></div>
<div class="estimate-note" role="note">Model estimates: verify every frequency, pulse and fidelity on the hardware, and respect your wiring's flux-line current limits before sending any waveform to a chip.</div>
</header>
<noscript><p style="padding:1em 24px">This report draws its pictures with the script inside this file: allow scripts for local files to see them.</p></noscript>
<main>
<section class="card" id="map-card" aria-labelledby="map-title">
<h2 id="map-title">Chip map</h2>
<div class="toolbar" id="map-toolbar"></div>
<p class="hint">Qubits at their layout positions, filled by parking frequency. Hover for a summary; click, or focus with Tab and press Enter, for details.</p>
<div id="chip-map-wrap"></div>
<div class="legends" id="map-legends"></div>
</section>
<section class="card" id="details" aria-live="polite" aria-labelledby="details-title">
<h2 id="details-title">Details</h2>
<div id="details-body"><p class="hint">Select a qubit or an edge in the chip map.</p></div>
</section>
<section class="card wide" id="landscape-card" aria-labelledby="landscape-title">
<h2 id="landscape-title">Frequency landscape</h2>
<p class="hint" id="landscape-hint"></p>
<div id="landscape-legend" class="legends"></div>
<div id="landscape-wrap"></div>
</section>
<section class="card wide" id="gate-panel" aria-labelledby="gate-title">
<h2 id="gate-title">Gate close-up</h2>
<div id="gate-body"></div>
</section>
<section class="card wide" id="timeline-card" aria-labelledby="timeline-title">
<h2 id="timeline-title">Layers in time</h2>
<p class="hint" id="timeline-hint"></p>
<div id="timeline-wrap"></div>
</section>
<section class="card wide" id="weakest-card" aria-labelledby="weakest-title">
<h2 id="weakest-title">Weakest gates</h2>
<div id="weakest-body"></div>
</section>
<section class="card wide findings" id="findings-card" aria-labelledby="findings-title">
<h2 id="findings-title">Findings</h2>
<div id="findings-body"></div>
</section>
<section class="card wide cautions" id="cautions-card" aria-labelledby="cautions-title">
<h2 id="cautions-title">Cautions</h2>
<ul id="cautions-body">${doc.cautions.map((c) => `<li>${escapeHtml(c)}</li>`).join('')}</ul>
</section>
</main>
<footer id="footer"></footer>
<div id="tooltip" role="tooltip"></div>
<script type="application/json" id="${REPORT_DATA_ELEMENT_ID}">${jsonForScript(doc)}</script>
<script>${scriptForInline(script)}</script>
</body>
</html>
`;
}
