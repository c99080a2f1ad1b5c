// The riser chamber drained by a barrel: at each pond stage the chamber level is the one at which
// the flow in through the openings and the rim equals the barrel's flow at that level.
import type { Outlet } from "../case/model.js";

export interface ChamberSolution {
  /** Chamber water level (m). */
  level: number;
  /** Flow through the barrel = flow in through the openings and rim (m3/s). */
  flow: number;
  control: "openings free" | "barrel inlet control" | "barrel outlet control";
}

export function chamberLevel(_outlet: Outlet, _ws: number, _tw: number): ChamberSolution {
  throw new Error("barrel hydraulics are not available in this version");
}
