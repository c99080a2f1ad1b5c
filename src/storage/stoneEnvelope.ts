// A rectangular bed of stone around pipes or chambers: water fills the voids of the stone, which is
// the bed's volume less what the pipes or chambers take, times the void ratio (porosity: void volume
// over total volume of the stone). Below the bed's top, at a stage z:
//   V_stone(z) = n (L W (z - bottom) - V_inner,full(z)),  V = V_inner(z) + V_stone(z)
// where V_inner,full is the space the units take below z, counted full (their walls are not modelled:
// the inside section stands for the outside one).
import type { StoneBed } from "../model.js";

export type { StoneBed };

/**
 * Water (m3) in the voids of the stone at a stage, given the space the units take below that stage
 * (`displaced`, m3, capped at the bed's top by the caller's own stage).
 */
export function stoneVolume(bed: StoneBed, stage: number, displaced: (stage: number) => number): number {
  const z = Math.min(Math.max(stage, bed.bottom), bed.top);
  return bed.voidRatio * (bed.length * bed.width * (z - bed.bottom) - displaced(z));
}

/** Surface area (m2) of the water in the voids at a stage, given the units' own section area there. */
export function stoneArea(bed: StoneBed, stage: number, unitsArea: number): number {
  if (stage < bed.bottom || stage > bed.top) return 0;
  return bed.voidRatio * (bed.length * bed.width - unitsArea);
}
