// A pond in the case file's own form and units (so that a sized pond can be written into a case).
import type { Pond } from "../model.js";
import { hydrologyUnits, toCaseUnits, type UnitSystem } from "../units.js";

const tidy = (x: number) => Number(x.toFixed(6));

export function pondFile(pond: Pond, units: UnitSystem): Record<string, unknown> {
  const u = toCaseUnits(units);
  const s = pond.storage;
  let storage: Record<string, unknown>;
  switch (s.kind) {
    case "prismoid":
      storage = { prismoid: { length: tidy(u.length(s.length)), width: tidy(u.length(s.width)), sideSlope: s.sideSlope } };
      break;
    case "stageArea":
      storage = { stageArea: s.elevations.map((z, i) => [tidy(u.length(z)), tidy(u.area(s.areas[i]))]) };
      break;
    case "stageStorage":
      storage = { stageStorage: s.elevations.map((z, i) => [tidy(u.length(z)), tidy(u.volume(s.volumes[i]))]) };
      break;
    case "underground":
      throw new Error("an underground storage is never sized from a site");
  }
  return {
    bottom: tidy(u.length(pond.bottom)),
    top: tidy(u.length(pond.top)),
    ...(pond.pool > pond.bottom ? { permanentPool: tidy(u.length(pond.pool)) } : {}),
    storage,
    ...(pond.exfiltration
      ? {
          exfiltration: {
            rate: tidy(hydrologyUnits(units).intensity(pond.exfiltration.rate)),
            sides: pond.exfiltration.sides,
            drainHours: pond.exfiltration.drainHours,
            ...(pond.exfiltration.label !== null ? { source: pond.exfiltration.label } : {}),
          },
        }
      : {}),
  };
}
