// The review report as plain data: sections of tables, figures and text, rendered to HTML or
// Markdown. All text here is unescaped user-facing text; the renderers escape it.

export type Tone = "pass" | "fail" | "binding";

export interface Cell {
  text: string;
  tone?: Tone;
}

export interface TableBlock {
  kind: "table";
  caption: string;
  head: string[];
  rows: (string | Cell)[][];
  /** Right-aligned (numeric) columns. */
  numeric: boolean[];
  /** Text columns whose cells stay on one line (short phrases such as "barrel, inlet control"). */
  nowrap?: boolean[];
}

export interface FigureBlock {
  kind: "figure";
  /** Document id, "fig-3". */
  id: string;
  number: number;
  /** Short machine name for file names, "storm-2-hydrograph". */
  slug: string;
  title: string;
  caption: string;
  /** Inline SVG markup (no XML declaration, no namespace). */
  svg: string;
}

export interface TextBlock {
  kind: "text";
  text: string;
}

export interface ListBlock {
  kind: "list";
  items: string[];
}

/** Label and value pairs (a summary). */
export interface FactsBlock {
  kind: "facts";
  rows: [string, string][];
}

export interface NoteBlock {
  kind: "note";
  tone: "caution" | "warning" | "pass" | "fail";
  text: string;
}

export type Block = TableBlock | FigureBlock | TextBlock | ListBlock | FactsBlock | NoteBlock;

export interface Section {
  id: string;
  title: string;
  blocks: Block[];
  subsections: Section[];
}

export interface ReportDocument {
  /** "outfit review report: <case name>". */
  title: string;
  /** The line under the title: what was reported and from which file. */
  subtitle: string;
  verdict: NoteBlock;
  /** The project block: project facts from the case file, the date of the run, version, input hash. */
  project: FactsBlock;
  caution: string;
  sections: Section[];
}

export function section(id: string, title: string, blocks: Block[], subsections: Section[] = []): Section {
  return { id, title, blocks, subsections };
}

/** Hands out figure numbers and ids in document order. */
export class FigureCounter {
  private next = 1;
  figure(slug: string, title: string, caption: string, svgFor: (id: string) => string): FigureBlock {
    const number = this.next++;
    const id = `fig-${number}`;
    return { kind: "figure", id, number, slug, title, caption, svg: svgFor(id) };
  }
}
