// Whether a printed report splits a plot across pages.
//
// Method: every figure links to itself twice, from its head (above the plot) and from its caption
// (below it). Chromium keeps links in the PDF it prints as link annotations on the page where the link
// is drawn, each naming its destination (the figure's id). So a figure lies whole on one page exactly
// when both of its links are on the same page. This reads Chromium's real pagination for the chosen
// paper size rather than estimating page boundaries from the layout on screen (which `break-inside:
// avoid` shifts as it pushes figures to the next page).
import type { Page } from "playwright-core";
import { pagesByDestination, pdfLinks } from "./pdfLinks.js";

/** Paper sizes in PDF points (1/72 in): ISO A4 210 x 297 mm, US Letter 8.5 x 11 in. */
export const PAPER = { A4: [595.92, 842.88], Letter: [612, 792] } as const;

export interface PrintedFigures {
  pageCount: number;
  mediaBoxes: number[][];
  /** Figure id -> pages (0-based) of its two links. */
  figurePages: Map<string, number[]>;
}

export async function printFigures(page: Page, format: keyof typeof PAPER): Promise<PrintedFigures> {
  const ids = await page.$$eval("figure[id]", (figures) => figures.map((f) => f.id));
  const pdf = await page.pdf({ format, printBackground: true });
  const pages = pdfLinks(pdf);
  const byDestination = pagesByDestination(pages);
  return {
    pageCount: pages.length,
    mediaBoxes: pages.map((p) => p.mediaBox),
    figurePages: new Map(ids.map((id) => [id, byDestination.get(id) ?? []])),
  };
}

/** Figures whose two links are not found exactly once each on one page. */
export function splitFigures(printed: PrintedFigures): string[] {
  return [...printed.figurePages].filter(([, pages]) => pages.length !== 2 || pages[0] !== pages[1]).map(([id, pages]) => `${id} on pages ${pages.map((p) => p + 1).join(", ") || "(no links found)"}`);
}
