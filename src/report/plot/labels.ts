// Labels that never overlap: a placer that knows the boxes already taken (markers, labels placed) and
// puts each new label at the first of its candidate positions where it overlaps none and stays in its
// area, or leaves it out. Text widths are estimated on the wide side (no font metrics here).
import { element, escapeMarkup } from "./svg.js";
import { INK, PAPER } from "./style.js";

/** A text's box in drawing units, estimated on the wide side (no font metrics here): 0.65 em a character. */
export interface LabelBox {
  left: number;
  right: number;
  top: number;
  bottom: number;
}

export const LABEL_FONT = 10.5;

export function labelBox(text: string, x: number, y: number, anchor: "start" | "end" | "middle", fontSize = LABEL_FONT): LabelBox {
  const w = text.length * 0.65 * fontSize;
  const left = anchor === "start" ? x : anchor === "end" ? x - w : x - w / 2;
  return { left, right: left + w, top: y - 0.95 * fontSize, bottom: y + 0.3 * fontSize };
}

/**
 * The labels and markers drawn so far inside the plot: a new label goes where it overlaps none of them
 * and stays inside the plot, or is not drawn (its point keeps its `data-label`; the legend and the
 * tables name it). So no label is drawn over another.
 */
export class LabelPlacer {
  private readonly taken: LabelBox[] = [];
  constructor(private readonly area: LabelBox) {}
  /** Marks a box as taken (a marker, a label placed elsewhere). */
  take(box: LabelBox): void {
    this.taken.push(box);
  }
  fits(box: LabelBox): boolean {
    const a = this.area;
    if (box.left < a.left || box.right > a.right || box.top < a.top || box.bottom > a.bottom) return false;
    return !this.taken.some((t) => box.left < t.right && box.right > t.left && box.top < t.bottom && box.bottom > t.top);
  }
  /** The first of the candidate positions that fits (taken at once), or null. */
  place(text: string, candidates: readonly (readonly [number, number, "start" | "end" | "middle"])[]): { x: number; y: number; anchor: "start" | "end" | "middle" } | null {
    for (const [x, y, anchor] of candidates) {
      const box = labelBox(text, x, y, anchor);
      if (this.fits(box)) {
        this.take(box);
        return { x, y, anchor };
      }
    }
    return null;
  }
}

/** A label's text with a paper-coloured halo, so it reads over lines. */
export function label(text: string, x: number, y: number, anchor: "start" | "end" | "middle", colour: string): string {
  return element("text", {
    x, y, "text-anchor": anchor, "font-size": 10.5, fill: colour === "#000000" ? INK : colour,
    stroke: PAPER, "stroke-width": 3, "paint-order": "stroke", "stroke-linejoin": "round",
  }, escapeMarkup(text));
}
