// An outlet written back in the case file's `outlet` form, in the case's units, with every
// coefficient explicit, so that it can be pasted into a case and routed again: each part by its kind.
import type { Outlet } from "../model.js";
import type { OutletFile } from "../case/schema.js";
import type { UnitSystem } from "../units.js";
import { elementToFile } from "../parts/registry.js";
import { riserToFile } from "../parts/riser.js";
import { barrelToFile } from "../parts/barrel.js";
import { spillwayToFile } from "../parts/spillway.js";

export function outletToFile(outlet: Outlet, units: UnitSystem): OutletFile {
  const file: OutletFile = { elements: outlet.elements.map((e) => elementToFile(e, units)) };
  if (outlet.riser) file.riser = riserToFile(outlet.riser, units);
  if (outlet.barrel) file.barrel = barrelToFile(outlet.barrel, units);
  if (outlet.spillway) file.spillway = spillwayToFile(outlet.spillway, units);
  return file;
}
