// Reads the link annotations of a PDF written by Chromium: for each page, the named destinations its
// links point to and where they sit. Chromium (Skia) writes pages, page trees and annotations as plain
// dictionaries (only content streams and fonts are compressed), so a few patterns suffice.

export interface PageLinks {
  /** 0-based page index. */
  page: number;
  mediaBox: number[];
  links: { dest: string; rect: number[] }[];
}

function objects(pdf: string): Map<number, string> {
  const map = new Map<number, string>();
  const pattern = /(\d+) 0 obj\s*([\s\S]*?)endobj/g;
  let match: RegExpExecArray | null;
  while ((match = pattern.exec(pdf))) map.set(Number(match[1]), match[2]);
  return map;
}

function references(text: string | undefined): number[] {
  return text ? Array.from(text.matchAll(/(\d+) 0 R/g), (m) => Number(m[1])) : [];
}

function numbers(text: string | undefined): number[] {
  return text ? text.trim().split(/\s+/).map(Number) : [];
}

/** The pages in document order (walking the page tree from the catalogue) with their links. */
export function pdfLinks(buffer: Buffer): PageLinks[] {
  const pdf = buffer.toString("latin1");
  const objs = objects(pdf);
  const catalogue = [...objs.values()].find((body) => /\/Type\s*\/Catalog\b/.test(body));
  if (!catalogue) throw new Error("PDF: no catalogue found");
  const root = Number(/\/Pages\s+(\d+) 0 R/.exec(catalogue)?.[1]);
  const pages: number[] = [];
  const walk = (id: number) => {
    const body = objs.get(id) ?? "";
    if (/\/Type\s*\/Pages\b/.test(body)) for (const kid of references(/\/Kids\s*\[([^\]]*)\]/.exec(body)?.[1])) walk(kid);
    else if (/\/Type\s*\/Page\b/.test(body)) pages.push(id);
  };
  walk(root);
  return pages.map((id, page) => {
    const body = objs.get(id)!;
    const links = references(/\/Annots\s*\[([^\]]*)\]/.exec(body)?.[1]).flatMap((ref) => {
      const annot = objs.get(ref) ?? "";
      const dest = /\/Dest\s*\/([^\s/>\]]+)/.exec(annot)?.[1];
      if (!/\/Subtype\s*\/Link\b/.test(annot) || dest === undefined) return [];
      return [{ dest, rect: numbers(/\/Rect\s*\[([^\]]*)\]/.exec(annot)?.[1]) }];
    });
    return { page, mediaBox: numbers(/\/MediaBox\s*\[([^\]]*)\]/.exec(body)?.[1]), links };
  });
}

/** For every destination, the pages its links sit on. */
export function pagesByDestination(pages: readonly PageLinks[]): Map<string, number[]> {
  const map = new Map<string, number[]>();
  for (const p of pages) for (const link of p.links) map.set(link.dest, [...(map.get(link.dest) ?? []), p.page]);
  return map;
}
