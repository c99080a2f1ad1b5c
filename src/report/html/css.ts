// The report's look on screen and on paper (A4 or Letter: the page size follows the printer's paper).
// Tones are taken from the Okabe-Ito palette of the plots.
export const REPORT_CSS = `
:root {
  --ink: #22262e; --muted: #5b606b; --rule: #d9d5cb; --paper: #ffffff; --desk: #f3f1ec;
  --pass: #00674b; --pass-bg: #e3f3ed; --fail: #a3410a; --fail-bg: #fbe9df;
  --caution: #8a5a00; --caution-bg: #fdf3dc; --accent: #0072b2; --stripe: #f6f4ef;
}
* { box-sizing: border-box; }
html { background: var(--desk); }
body { margin: 0; color: var(--ink); font: 14px/1.45 system-ui, "Segoe UI", "DejaVu Sans", Helvetica, Arial, sans-serif; }
.sheet { max-width: 1000px; margin: 24px auto; padding: 28px 40px 40px; background: var(--paper); border: 1px solid var(--rule); }
header.title-block { display: grid; grid-template-columns: 1fr auto; gap: 8px 24px; align-items: start; border: 2px solid var(--ink); padding: 14px 18px; }
header .tool { grid-column: 1 / -1; font-size: 11px; letter-spacing: 0.12em; text-transform: uppercase; color: var(--muted); }
header h1 { margin: 0; font-size: 22px; line-height: 1.25; overflow-wrap: anywhere; }
header .subtitle { margin: 4px 0 0; color: var(--muted); overflow-wrap: anywhere; }
.note { border: 1px solid; border-left-width: 6px; padding: 8px 12px; margin: 12px 0; }
.note.pass { color: var(--pass); background: var(--pass-bg); }
.note.fail { color: var(--fail); background: var(--fail-bg); }
.note.caution, .note.warning { color: var(--caution); background: var(--caution-bg); }
.note strong { text-transform: uppercase; letter-spacing: 0.06em; font-size: 12px; margin-right: 6px; }
header .note { margin: 0; max-width: 320px; }
header dl.project { grid-column: 1 / -1; grid-template-columns: max-content 1fr max-content 1fr; margin: 6px 0 0; padding-top: 8px; border-top: 1px solid var(--rule); font-size: 12.5px; }
nav.contents { margin: 16px 0 8px; font-size: 13px; }
nav.contents ol { margin: 4px 0; padding-left: 0; list-style: none; columns: 2; }
h2 { font-size: 18px; margin: 30px 0 10px; padding-bottom: 4px; border-bottom: 2px solid var(--ink); }
h3 { font-size: 15px; margin: 22px 0 8px; }
h2 .number, h3 .number { color: var(--accent); margin-right: 4px; font-variant-numeric: tabular-nums; }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: 3px 18px; margin: 8px 0 14px; }
dl.facts dt { color: var(--muted); }
dl.facts dd { margin: 0; overflow-wrap: anywhere; }
table { border-collapse: collapse; margin: 8px 0 16px; width: 100%; font-size: 12.5px; }
caption { text-align: left; font-weight: 600; padding-bottom: 4px; }
thead { display: table-header-group; }
th { text-align: left; border-bottom: 2px solid var(--ink); padding: 4px 8px 4px 0; vertical-align: bottom; }
td { border-bottom: 1px solid var(--rule); padding: 3px 8px 3px 0; vertical-align: top; overflow-wrap: break-word; }
th { overflow-wrap: normal; hyphens: manual; }
tbody tr:nth-child(even) td { background: var(--stripe); }
th.number, td.number { text-align: right; font-variant-numeric: tabular-nums; }
td.number, td.nowrap { white-space: nowrap; }
table.dense { font-size: 11.5px; }
table.dense th, table.dense td { padding-right: 6px; }
td.pass { color: var(--pass); }
td.fail { color: var(--fail); font-weight: 600; }
td.binding { font-weight: 700; }
td.binding::before { content: "\\25B6\\00A0"; color: var(--accent); }
figure.plot-figure { margin: 14px 0 20px; padding: 10px 12px 8px; border: 1px solid var(--rule); border-top: 3px solid var(--accent); }
.figure-head { font-weight: 600; margin-bottom: 6px; overflow-wrap: anywhere; }
.figure-head a, figcaption a { color: var(--accent); text-decoration: none; margin-right: 6px; }
svg.plot, svg.drawing { display: block; width: 100%; height: auto; }
figcaption { font-size: 12px; color: var(--muted); margin-top: 4px; overflow-wrap: anywhere; }
ul.items { margin: 6px 0 14px; padding-left: 20px; }
p { margin: 6px 0 10px; }
footer { margin-top: 28px; font-size: 12px; color: var(--muted); border-top: 1px solid var(--rule); padding-top: 8px; }
@page { margin: 14mm 12mm 16mm; }
@media print {
  html { background: none; }
  body { font-size: 9.5pt; }
  .sheet { max-width: none; margin: 0; padding: 0; border: none; }
  figure.plot-figure, table, .note, dl.facts, header.title-block { break-inside: avoid; page-break-inside: avoid; }
  tr { break-inside: avoid; }
  h2, h3, caption, .figure-head { break-after: avoid; page-break-after: avoid; }
  nav.contents ol { columns: 2; }
  a { color: inherit; }
  table { font-size: 8.5pt; }
  table.dense { font-size: 7.5pt; }
  * { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
}
`;
