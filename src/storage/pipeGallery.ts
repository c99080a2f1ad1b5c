// A gallery of identical parallel pipes laid on a slope: the water in the pipes at a stage, from the
// exact part-full circle. The low end's invert is `invert`; along the pipe the invert rises by slope*x,
// so the volume of one pipe is the integral of the segment area over its length:
//   level pipe:  V = L A(z - invert)
//   slope S > 0: V = (G(z - invert) - G(z - invert - S L)) / S, G the depth integral of the area.
import type { PipeGallery } from "../model.js";

export type { PipeGallery };
import { segmentArea, segmentAreaIntegral, segmentWidth } from "./circularSegment.js";

/** Below this slope a pipe is treated as level (the sloped formula loses digits). */
const LEVEL = 1e-9;

/** Water held in the pipes (m3) at a stage. */
export function galleryVolume(g: PipeGallery, stage: number): number {
  const y = stage - g.invert;
  if (y <= 0) return 0;
  if (g.slope < LEVEL) return g.count * g.length * segmentArea(g.diameter, y);
  const rise = g.slope * g.length;
  return (g.count * (segmentAreaIntegral(g.diameter, y) - segmentAreaIntegral(g.diameter, y - rise))) / g.slope;
}

/** Water-surface area (m2) inside the pipes at a stage (the derivative of the volume). */
export function galleryArea(g: PipeGallery, stage: number): number {
  const y = stage - g.invert;
  if (g.slope < LEVEL) return g.count * g.length * segmentWidth(g.diameter, y);
  return (g.count * (segmentArea(g.diameter, y) - segmentArea(g.diameter, y - g.slope * g.length))) / g.slope;
}

/** Elevation of the highest crown (m). */
export function galleryTop(g: PipeGallery): number {
  return g.invert + g.slope * g.length + g.diameter;
}

/** Elevations where the gallery's area changes form: inverts and crowns at both ends. */
export function galleryBreaks(g: PipeGallery): number[] {
  const rise = g.slope * g.length;
  return [g.invert, g.invert + rise, g.invert + g.diameter, g.invert + rise + g.diameter];
}
