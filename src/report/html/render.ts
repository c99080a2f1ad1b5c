// The review report as one self-contained HTML file: inline CSS and SVG, no script, no external
// asset (the content security policy forbids every load).
import { escapeMarkup as e } from "../plot/svg.js";
import type { Block, Cell, ReportDocument, Section } from "../review/model.js";
import { REPORT_CSS } from "./css.js";

const POLICY = "default-src 'none'; style-src 'unsafe-inline'; img-src data:; base-uri 'none'; form-action 'none'";

export function renderHtml(doc: ReportDocument, version: string): string {
  const numbered = doc.sections.map((s, i) => renderSection(s, [i + 1], 2)).join("\n");
  const contents = doc.sections.map((s, i) => `<li><a href="#${s.id}">${i + 1} ${e(s.title)}</a></li>`).join("");
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${POLICY}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="outfit ${e(version)}">
<title>${e(doc.title)}</title>
<style>${REPORT_CSS}</style>
</head>
<body>
<main class="sheet">
<header class="title-block">
<div class="tool">outfit ${e(version)} &middot; review report</div>
<div><h1>${e(doc.title)}</h1><p class="subtitle">${e(doc.subtitle)}</p></div>
${renderBlock(doc.verdict)}
<dl class="facts project" aria-label="Project">${doc.project.rows.map(([k, v]) => `<dt>${e(k)}</dt><dd>${e(v)}</dd>`).join("")}</dl>
</header>
<div class="note caution" role="note"><strong>Caution</strong>${e(doc.caution)}</div>
<nav class="contents" aria-label="Contents"><strong>Contents</strong><ol>${contents}</ol></nav>
${numbered}
<footer>Written by outfit ${e(version)}. ${e(doc.caution)}</footer>
</main>
</body>
</html>
`;
}

function renderSection(s: Section, number: number[], level: 2 | 3 | 4): string {
  const tag = `h${level}`;
  // A real space after the number, so that copied or extracted text reads "5.2 12-yr storm".
  const heading = `<${tag} id="${s.id}"><span class="number">${number.join(".")}</span> ${e(s.title)}</${tag}>`;
  const blocks = s.blocks.map(renderBlock).join("\n");
  const subsections = s.subsections.map((sub, i) => renderSection(sub, [...number, i + 1], level === 2 ? 3 : 4)).join("\n");
  return `<section class="level-${level}">\n${heading}\n${blocks}\n${subsections}\n</section>`;
}

function cell(c: string | Cell, numeric: boolean, nowrap = false): string {
  const text = typeof c === "string" ? c : c.text;
  const classes = [numeric ? "number" : "", nowrap ? "nowrap" : "", typeof c === "string" ? "" : c.tone ?? ""].filter(Boolean).join(" ");
  return `<td${classes ? ` class="${classes}"` : ""}>${e(text)}</td>`;
}

function renderBlock(b: Block): string {
  switch (b.kind) {
    case "text":
      return `<p>${e(b.text)}</p>`;
    case "list":
      return `<ul class="items">${b.items.map((item) => `<li>${e(item)}</li>`).join("")}</ul>`;
    case "facts":
      return `<dl class="facts">${b.rows.map(([k, v]) => `<dt>${e(k)}</dt><dd>${e(v)}</dd>`).join("")}</dl>`;
    case "note": {
      const label = { caution: "Caution", warning: "Warning", pass: "Pass", fail: "Fail" }[b.tone];
      return `<div class="note ${b.tone}" role="note"><strong>${label}</strong>${e(b.text)}</div>`;
    }
    case "table": {
      const head = b.head.map((h, i) => `<th${b.numeric[i] ? ' class="number"' : ""} scope="col">${e(h)}</th>`).join("");
      const rows = b.rows.map((row) => `<tr>${row.map((c, i) => cell(c, b.numeric[i] ?? false, b.nowrap?.[i] ?? false)).join("")}</tr>`).join("\n");
      // Tables of many columns are set smaller so that they fit the page.
      return `<table${b.head.length > 9 ? ' class="dense"' : ""}>\n<caption>${e(b.caption)}</caption>\n<thead><tr>${head}</tr></thead>\n<tbody>\n${rows}\n</tbody>\n</table>`;
    }
    case "figure":
      // The figure links to itself at its head and in its caption: on paper the two links mark where
      // the figure starts and ends (the browser test reads them from the PDF to find split figures).
      return `<figure class="plot-figure" id="${b.id}" data-figure="${e(b.slug)}">
<div class="figure-head"><a href="#${b.id}">Figure ${b.number}</a>${e(b.title)}</div>
${b.svg}
<figcaption><a href="#${b.id}">Figure ${b.number}.</a>${e(b.caption)}</figcaption>
</figure>`;
  }
}
