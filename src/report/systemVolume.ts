// `outfit volume` on a system of ponds. The storms' estimates are made for the system as a whole: the
// inflow of all ponds together against the target at the outfall, compared with the storage all
// ponds hold together below their limit levels (no single stage applies to several ponds). A pond
// with its own target (`storms[].pondTargets`) also gets the estimates of its own inflow against that
// target and the stage they reach in it: what the ponds upstream release into it is not known before
// routing and is left out, so those volumes are lower bounds for a pond with ponds upstream.
import type { Case, PondSystem } from "../model.js";
import { availableStorage, caseEstimates, freeboardLevel, stormVolumes, type StormEstimate, type StormEstimateInputs } from "../sizing/stormEstimates.js";
import { pondCase, pondStorm } from "../assess/systemAssess.js";
import { formatter } from "../format.js";
import { toCaseUnits } from "../units.js";
import { cautionText } from "./console.js";
import { CAUTION } from "./caution.js";
import { chainWords } from "./systemReport.js";
import { estimatesJson, estimatesTable, methodLines } from "./volume.js";
import { PLAIN, wrap, type Layout } from "./terminal.js";

export interface SystemEstimates {
  /** The system as a whole, per storm. */
  system: StormEstimate[];
  /** Storage of all ponds together below their limit levels (m3). */
  available: number;
  /** Ponds with their own target: their own inflow's estimates, per storm with a pond target. */
  ponds: { index: number; estimates: StormEstimate[] }[];
}

export const SYSTEM_VOLUME_HOW =
  "A system of ponds: each storm's estimates take the inflow of all ponds together against the target at the outfall, and the volume is compared with the storage of all ponds together below their limit levels (\"Below limit level\": it fits there; no single stage applies). A pond with its own target is estimated on its own inflow against that target, with the stage it reaches in that pond; what the ponds upstream release into it is not known before routing and is left out.";

/** Each storm's estimates for the system and for the ponds with their own targets. */
export function systemEstimates(c: Case, system: PondSystem, inputs: readonly StormEstimateInputs[]): SystemEstimates {
  // Each pond below its own lowest limit level (its own spillway), as a single pond.
  const available = system.ponds.reduce((sum, _p, i) => sum + availableStorage(pondCase(c, system, i)), 0);
  const whole = c.storms.map((storm, k) => {
    const e = stormVolumes(storm, inputs[k]);
    for (const m of e.methods) if (m.volume !== null) m.fits = m.volume <= available * (1 + 1e-12);
    return e;
  });
  const ponds = system.ponds.flatMap((_, i) => {
    const targeted = c.storms.flatMap((storm, k) => (storm.pondTargets?.[i] != null ? [k] : []));
    if (targeted.length === 0) return [];
    // The pond alone on its own inflow against its own target: published, lower-bound and routed estimates.
    const view = { ...pondCase(c, system, i), storms: targeted.map((k) => pondStorm(c.storms[k], i)) };
    return [{ index: i, estimates: caseEstimates(view, targeted.map((k) => ({ group: inputs[k].group, rational: null }))) }];
  });
  return { system: whole, available, ponds };
}

export function systemVolumeText(c: Case, system: PondSystem, e: SystemEstimates, layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const lines = [
    wrap(`outfit volume: ${c.name} (${c.units} units), a system of ${system.ponds.length} ponds: ${chainWords(system)}`, layout.width),
    ...system.ponds.map((p, i) => wrap(`Pond ${p.name}: freeboard level ${f.elevation(p.pond.top - c.criteria.freeboardDepth)}; holds ${f.volume(availableStorage(pondCase(c, system, i)))} above its ${p.pond.pool > p.pond.bottom ? "permanent pool" : "floor"} below its lowest limit level`, layout.width)),
    wrap(`All ponds together hold ${f.volume(e.available)} below their limit levels.`, layout.width),
    "",
    wrap(SYSTEM_VOLUME_HOW, layout.width),
    "",
    "The system (all ponds' inflows, the target at the outfall):",
    estimatesTable(c, e.system, layout),
    ...e.ponds.flatMap(({ index, estimates }) => ["", wrap(`Pond ${system.ponds[index].name} (its own inflow against its own target):`, layout.width), estimatesTable(pondCase(c, system, index), estimates, layout)]),
    "",
    wrap("Volumes are storage above the permanent pool (or the floor) before any outlet exists: estimates to size a pond, not routed results.", layout.width),
    ...methodLines(layout),
    "",
    cautionText(layout),
  ];
  return lines.join("\n");
}

export function systemVolumeJson(c: Case, system: PondSystem, e: SystemEstimates) {
  const u = toCaseUnits(c.units);
  return {
    name: c.name,
    units: c.units,
    how: SYSTEM_VOLUME_HOW,
    availableStorage: u.volume(e.available),
    ponds: system.ponds.map((p, i) => {
      const view = pondCase(c, system, i);
      const own = e.ponds.find((x) => x.index === i);
      return {
        name: p.name,
        freeboardLevel: u.length(freeboardLevel(view)),
        availableStorage: u.volume(availableStorage(view)),
        ...(own ? { storms: estimatesJson(view, own.estimates) } : {}),
      };
    }),
    storms: estimatesJson(c, e.system),
    caution: CAUTION,
  };
}
