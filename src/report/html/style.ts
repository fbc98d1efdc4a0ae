/**
 * The report page's style sheet (inlined into the page by ./page.ts). Our own look: warm paper
 * background, ink text, one teal accent; red for violations, amber for flags. System fonts only
 * (the page works offline). Colours of data (parking frequency, layers, errors) live in
 * ./browser/colours.ts.
 */
export const REPORT_CSS = `
:root {
  --paper: #f6f4ef; --panel: #ffffff; --ink: #1d2330; --muted: #5a6172; --line: #d8d2c4;
  --accent: #1f6f78; --accent-soft: #dcecec; --bad: #c2362b; --warn: #b87a00; --good: #2f7d4f;
  --mono: ui-monospace, "DejaVu Sans Mono", Menlo, Consolas, monospace;
}
* { box-sizing: border-box; }
html { font-size: 15px; }
body { margin: 0; background: var(--paper); color: var(--ink); font-family: system-ui, "DejaVu Sans", "Segoe UI", Helvetica, Arial, sans-serif; line-height: 1.45; }
header.top { padding: 14px 24px 10px; border-bottom: 3px solid var(--accent); background: var(--panel); }
header.top h1 { margin: 0; font-size: 1.55rem; letter-spacing: 0.01em; }
header.top h1 .kind { color: var(--muted); font-weight: 400; font-size: 1.05rem; margin-left: 0.5em; }
header.top .sub { color: var(--muted); margin-top: 2px; }
.badge { display: inline-block; padding: 1px 9px; border-radius: 10px; font-weight: 600; font-size: 0.85rem; vertical-align: middle; margin-left: 10px; }
.badge.ok { background: #e2f1e6; color: var(--good); }
.badge.bad { background: #f8e1de; color: var(--bad); }
.stats { display: flex; flex-wrap: wrap; gap: 6px 22px; margin-top: 8px; font-size: 0.92rem; }
.stats b { font-variant-numeric: tabular-nums; }
.estimate-note { margin-top: 8px; padding: 6px 10px; background: #fff6e0; border-left: 4px solid var(--warn); font-size: 0.9rem; }
main { padding: 14px 24px 40px; display: grid; grid-template-columns: minmax(0, 1fr) 380px; gap: 16px; align-items: start; }
section.card { background: var(--panel); border: 1px solid var(--line); border-radius: 6px; padding: 10px 14px 14px; min-width: 0; }
section.card h2 { font-size: 1.08rem; margin: 0 0 6px; color: var(--accent); }
section.card h3 { font-size: 0.98rem; margin: 10px 0 4px; }
.wide { grid-column: 1 / -1; }
.hint { color: var(--muted); font-size: 0.85rem; margin: 2px 0 6px; }
.toolbar { display: flex; flex-wrap: wrap; gap: 8px; align-items: center; margin-bottom: 6px; }
.toggle { display: inline-flex; border: 1px solid var(--accent); border-radius: 5px; overflow: hidden; }
.toggle button { border: 0; background: var(--panel); color: var(--accent); padding: 4px 11px; font: inherit; font-size: 0.88rem; cursor: pointer; }
.toggle button[aria-pressed="true"] { background: var(--accent); color: #fff; }
.toggle button:focus-visible, button.linkish:focus-visible { outline: 3px solid #f0b429; outline-offset: 1px; }
#chip-map-wrap { position: relative; }
#chip-map { width: 100%; height: auto; display: block; background: #fbfaf7; border: 1px solid #ece7dc; border-radius: 4px; }
.legends { display: flex; flex-wrap: wrap; gap: 10px 26px; margin-top: 6px; font-size: 0.82rem; color: var(--muted); }
.legend > svg { display: block; }
.legend .title { font-size: 0.82rem; color: var(--ink); }
.qubit, .edge, .row-hit, .gate-bar, .layer-block { cursor: pointer; }
.qubit:focus, .edge:focus { outline: none; }
.qubit:focus-visible .focus-ring, .edge:focus-visible .edge-focus { stroke: #f0b429; stroke-width: 3px; visibility: visible; }
.focus-ring, .edge-focus { visibility: hidden; fill: none; pointer-events: none; }
.qubit.selected .core { stroke: var(--ink); stroke-width: 3px; }
.edge.selected .edge-line { stroke-width: 7px; }
.dim { opacity: 0.28; }
.qubit.dim { opacity: 1; }
.qubit.dim .core, .qubit.dim .flag-ring, .qubit.dim .violation-ring, .qubit.dim .qlabel { opacity: 0.35; }
.qlabel { font-size: 11px; font-weight: 600; pointer-events: none; paint-order: stroke; stroke: rgba(255,255,255,0.85); stroke-width: 3px; fill: var(--ink); }
#details { position: sticky; top: 10px; max-height: calc(100vh - 20px); overflow: auto; }
#details dl { display: grid; grid-template-columns: auto 1fr; gap: 2px 12px; margin: 4px 0 8px; font-size: 0.9rem; }
#details dt { color: var(--muted); }
#details dd { margin: 0; font-variant-numeric: tabular-nums; }
#details .title { font-size: 1.15rem; font-weight: 700; }
#details .where { color: var(--muted); font-size: 0.88rem; }
ul.plain { list-style: none; padding: 0; margin: 4px 0; }
ul.plain li { margin: 2px 0; }
button.linkish { border: 0; background: none; color: var(--accent); padding: 0; font: inherit; cursor: pointer; text-decoration: underline; text-underline-offset: 2px; }
.tag { display: inline-block; font-size: 0.75rem; padding: 0 6px; border-radius: 8px; margin-right: 4px; }
.tag.bad { background: #f8e1de; color: var(--bad); }
.tag.warn { background: #fbefd2; color: var(--warn); }
.tag.info { background: var(--accent-soft); color: var(--accent); }
#tooltip { position: fixed; pointer-events: none; z-index: 10; background: rgba(29,35,48,0.94); color: #fff; padding: 5px 8px; border-radius: 4px; font-size: 0.82rem; max-width: 340px; display: none; }
#landscape-wrap { max-height: 72vh; overflow: auto; border: 1px solid #ece7dc; border-radius: 4px; }
#landscape text.rowlabel { font-size: 11px; fill: var(--ink); }
.axis text { font-size: 11px; fill: var(--muted); }
.axis path, .axis line { stroke: #9a9486; }
.grid line { stroke: #ebe6da; }
#gate-panel .charts { display: grid; grid-template-columns: repeat(auto-fit, minmax(320px, 1fr)); gap: 10px; }
.chart-title { font-size: 0.86rem; font-weight: 600; margin: 4px 0 0; }
.budget-bar { margin: 6px 0 2px; }
.budget-keys { display: flex; flex-wrap: wrap; gap: 4px 14px; font-size: 0.82rem; }
.budget-keys span::before { content: ""; display: inline-block; width: 10px; height: 10px; margin-right: 4px; vertical-align: -1px; background: var(--swatch); border-radius: 2px; }
#timeline-wrap { overflow-x: auto; }
table.gates { border-collapse: collapse; width: 100%; font-size: 0.88rem; }
table.gates th, table.gates td { text-align: left; padding: 3px 8px; border-bottom: 1px solid #ece7dc; font-variant-numeric: tabular-nums; }
table.gates th { color: var(--muted); font-weight: 600; }
table.gates tr:hover td { background: #f3f0e8; }
.findings details { margin: 4px 0; }
.findings summary { cursor: pointer; font-weight: 600; }
.findings .doc { color: var(--muted); font-size: 0.86rem; margin: 2px 0 4px 18px; }
.findings li { font-size: 0.9rem; }
.findings li.bad::marker { color: var(--bad); }
.findings li.warn::marker { color: var(--warn); }
.explanation pre { white-space: pre-wrap; font-family: var(--mono); font-size: 0.82rem; background: #f7f5ef; padding: 6px 8px; border-radius: 4px; margin: 4px 0; }
.cautions li { margin: 4px 0; }
footer { padding: 0 24px 30px; color: var(--muted); font-size: 0.82rem; }
@media (max-width: 980px) { main { grid-template-columns: 1fr; } #details { position: static; max-height: none; } }
`;
