// Identical arch or box chambers given by one unit's stage-area table: heights above the chamber's base
// and the plan area of water inside one unit there. The area is linear between rows, so the volume of
// a row interval is exactly its average-end area times its height (to a partial height, with the
// interpolated area). Above the last row the unit is closed: it holds no more.
import type { Chambers } from "../model.js";

export type { Chambers };

/** Water held in all units (m3) at a stage. */
export function chambersVolume(c: Chambers, stage: number): number {
  const h = stage - c.base;
  let volume = 0;
  for (let i = 1; i < c.heights.length && h > c.heights[i - 1]; i++) {
    const h0 = c.heights[i - 1];
    const dh = Math.min(h, c.heights[i]) - h0;
    const a0 = c.areas[i - 1];
    const a = a0 + ((c.areas[i] - a0) * dh) / (c.heights[i] - h0);
    volume += 0.5 * (a0 + a) * dh;
  }
  return c.count * volume;
}

/** Water-surface area (m2) inside all units at a stage. */
export function chambersArea(c: Chambers, stage: number): number {
  const h = stage - c.base;
  const n = c.heights.length;
  if (h < c.heights[0] || h > c.heights[n - 1]) return 0;
  for (let i = 1; i < n; i++) {
    if (h <= c.heights[i]) return c.count * (c.areas[i - 1] + ((c.areas[i] - c.areas[i - 1]) * (h - c.heights[i - 1])) / (c.heights[i] - c.heights[i - 1]));
  }
  return 0;
}

export function chambersTop(c: Chambers): number {
  return c.base + c.heights[c.heights.length - 1];
}

export function chambersBreaks(c: Chambers): number[] {
  return c.heights.map((h) => c.base + h);
}
