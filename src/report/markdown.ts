// The review report as Markdown: the same sections and tables, each plot written as its own SVG file
// beside the Markdown file and linked from it.
import { standaloneSvg } from "./plot/svg.js";
import type { Block, Cell, ReportDocument, Section } from "./review/model.js";

export interface MarkdownReport {
  text: string;
  /** SVG files to write beside the Markdown file: name (no directory) and content. */
  figures: { file: string; svg: string }[];
}

/** Escapes text so that Markdown shows it literally (HTML special characters as entities). */
export function markdownText(text: string): string {
  return text
    .replace(/[\\`*_[\]|~]/g, (ch) => `\\${ch}`)
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/\r?\n/g, " ");
}

/** `stem` names the figure files: "<stem>.fig-01-rating.svg". */
export function renderMarkdown(doc: ReportDocument, stem: string, version: string): MarkdownReport {
  const figures: MarkdownReport["figures"] = [];
  const out: string[] = [
    `# ${markdownText(doc.title)}`,
    "",
    markdownText(doc.subtitle),
    "",
    `> **Caution.** ${markdownText(doc.caution)}`,
    "",
    block(doc.verdict, stem, figures),
    "",
    block(doc.project, stem, figures),
    "",
  ];
  doc.sections.forEach((s, i) => sectionText(s, [i + 1], 2, stem, figures, out));
  out.push("---", "", `Written by outfit ${markdownText(version)}. ${markdownText(doc.caution)}`, "");
  return { text: out.join("\n"), figures };
}

function sectionText(s: Section, number: number[], level: number, stem: string, figures: MarkdownReport["figures"], out: string[]): void {
  out.push(`${"#".repeat(level)} ${number.join(".")} ${markdownText(s.title)}`, "");
  for (const b of s.blocks) out.push(block(b, stem, figures), "");
  s.subsections.forEach((sub, i) => sectionText(sub, [...number, i + 1], Math.min(level + 1, 6), stem, figures, out));
}

function cellText(c: string | Cell): string {
  const text = markdownText(typeof c === "string" ? c : c.text);
  return typeof c !== "string" && (c.tone === "fail" || c.tone === "binding") ? `**${text}**` : text;
}

function block(b: Block, stem: string, figures: MarkdownReport["figures"]): string {
  switch (b.kind) {
    case "text":
      return markdownText(b.text);
    case "list":
      return b.items.map((item) => `- ${markdownText(item)}`).join("\n");
    case "facts":
      return ["| | |", "|---|---|", ...b.rows.map(([k, v]) => `| ${markdownText(k)} | ${markdownText(v)} |`)].join("\n");
    case "note": {
      const label = { caution: "Caution", warning: "Warning", pass: "Pass", fail: "Fail" }[b.tone];
      return `> **${label}.** ${markdownText(b.text)}`;
    }
    case "table":
      return [
        `**${markdownText(b.caption)}**`,
        "",
        `| ${b.head.map(markdownText).join(" | ")} |`,
        `|${b.head.map((_, i) => (b.numeric[i] ? "---:" : "---")).join("|")}|`,
        ...b.rows.map((row) => `| ${row.map(cellText).join(" | ")} |`),
      ].join("\n");
    case "figure": {
      const file = `${stem}.fig-${String(b.number).padStart(2, "0")}-${b.slug}.svg`;
      figures.push({ file, svg: standaloneSvg(b.svg) });
      return `![Figure ${b.number}: ${markdownText(b.title)}](${linkTarget(file)})\n\n*Figure ${b.number}.* ${markdownText(b.caption)}`;
    }
  }
}

/** A file name as a link target: percent-encoded, parentheses included. */
function linkTarget(file: string): string {
  return encodeURIComponent(file).replace(/[()]/g, (ch) => `%${ch.charCodeAt(0).toString(16).toUpperCase()}`);
}
