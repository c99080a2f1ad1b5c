// Marker shapes as path data centred on a point, `size` = half the marker's width.
import { coordinate as c } from "./svg.js";
import type { MarkerShape } from "./style.js";

export function markerPath(shape: MarkerShape, x: number, y: number, size: number): string {
  const s = size;
  switch (shape) {
    case "circle":
      return `M${c(x - s)} ${c(y)} A${c(s)} ${c(s)} 0 1 0 ${c(x + s)} ${c(y)} A${c(s)} ${c(s)} 0 1 0 ${c(x - s)} ${c(y)} Z`;
    case "square":
      return `M${c(x - s)} ${c(y - s)} H${c(x + s)} V${c(y + s)} H${c(x - s)} Z`;
    case "triangle": {
      const h = s * 1.15;
      return `M${c(x)} ${c(y - h)} L${c(x + h)} ${c(y + 0.75 * h)} L${c(x - h)} ${c(y + 0.75 * h)} Z`;
    }
    case "diamond": {
      const h = s * 1.3;
      return `M${c(x)} ${c(y - h)} L${c(x + h)} ${c(y)} L${c(x)} ${c(y + h)} L${c(x - h)} ${c(y)} Z`;
    }
    case "cross":
      return `M${c(x - s)} ${c(y - s)} L${c(x + s)} ${c(y + s)} M${c(x - s)} ${c(y + s)} L${c(x + s)} ${c(y - s)}`;
    case "plus":
      return `M${c(x - s)} ${c(y)} H${c(x + s)} M${c(x)} ${c(y - s)} V${c(y + s)}`;
    case "none":
      return "";
  }
}

/** Shapes drawn with a stroke only (no area to fill). */
export function isStrokeOnly(shape: MarkerShape): boolean {
  return shape === "cross" || shape === "plus";
}
