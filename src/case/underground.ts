// The case file's underground storage forms (pipe gallery, chambers, stone bed) in SI, with the checks
// that involve several fields: the units sit inside the bed, the bed inside the pond's range.
import type { Length, StorageFile, StoneFile } from "./schema.js";
import type { RisingStructure, SurfacePonding } from "../model.js";
import type { Storage } from "../model.js";
import type { Converter } from "./converter.js";
import { show } from "./errors.js";
import { baseArea, baseLength, parsePondArea } from "../units.js";
import type { StoneBed, UndergroundUnits } from "../model.js";
import { systemTop, unitsFootprint } from "../storage/underground.js";

const SLACK = 1e-9;

export function normalizeUnderground(s: StorageFile, cv: Converter, bottom: number, top: number): Storage {
  const at = (path: string, value: Length | undefined, fallback: number) => cv.optionalLength(value, `pond.storage.${path}`, fallback);
  let units: UndergroundUnits;
  let stoneFile: StoneFile | undefined;
  const form = (s.pipeGallery ?? s.chambers)!;
  let where: string;
  let lowest: number;
  if (s.pipeGallery) {
    const g = s.pipeGallery;
    where = "pipeGallery";
    stoneFile = g.stone;
    lowest = at("pipeGallery.invert", g.invert, bottom);
    units = {
      kind: "pipeGallery",
      gallery: {
        diameter: cv.length(g.diameter, "pond.storage.pipeGallery.diameter"),
        length: cv.length(g.length, "pond.storage.pipeGallery.length"),
        count: g.count,
        slope: g.slope ?? 0,
        invert: lowest,
      },
    };
  } else {
    const c = s.chambers!;
    where = "chambers";
    stoneFile = c.stone;
    lowest = at("chambers.base", c.base, bottom);
    if (c.stageArea[0][0] !== 0) cv.problem("pond.storage.chambers.stageArea[0][0]", show(c.stageArea[0][0]), "a first height of 0 (heights are above the chambers' base)");
    units = {
      kind: "chambers",
      chambers: {
        count: c.count,
        base: lowest,
        heights: c.stageArea.map((r) => r[0] * baseLength(cv.units)),
        areas: c.stageArea.map((r) => r[1] * baseArea(cv.units)),
      },
    };
  }
  const low = where === "pipeGallery" ? "invert" : "base";
  if (lowest < bottom - SLACK) cv.problem(`pond.storage.${where}.${low}`, show(lowest / baseLength(cv.units)), `an elevation at or above pond.bottom`);
  let stone: StoneBed | null = null;
  if (stoneFile) {
    const path = `${where}.stone`;
    stone = {
      voidRatio: stoneFile.voidRatio,
      length: cv.length(stoneFile.length, `pond.storage.${path}.length`),
      width: cv.length(stoneFile.width, `pond.storage.${path}.width`),
      bottom: at(`${path}.bottom`, stoneFile.bottom, bottom),
      top: at(`${path}.top`, stoneFile.top, top),
    };
    const shown = (v: Length | undefined, fallback: string) => (v === undefined ? `${fallback} (the default)` : show(v));
    if (stone.bottom < bottom - SLACK) cv.problem(`pond.storage.${path}.bottom`, shown(stoneFile.bottom, "pond.bottom"), "an elevation at or above pond.bottom");
    if (stone.bottom > lowest + SLACK) cv.problem(`pond.storage.${path}.bottom`, shown(stoneFile.bottom, "pond.bottom"), `an elevation at or below the ${where === "pipeGallery" ? "pipes' invert" : "chambers' base"}`);
    const unitsTop = systemTop({ units, stone: null });
    if (!(stone.top > stone.bottom)) cv.problem(`pond.storage.${path}.top`, shown(stoneFile.top, "pond.top"), "an elevation above the bed's bottom");
    else if (stone.top < unitsTop - SLACK) cv.problem(`pond.storage.${path}.top`, shown(stoneFile.top, "pond.top"), `an elevation at or above the top of the ${where === "pipeGallery" ? "highest crown" : "chambers"}`);
    if (unitsFootprint(units) > stone.length * stone.width * (1 + SLACK)) {
      cv.problem(`pond.storage.${path}`, "a bed smaller in plan than the units it holds", "length x width at least the units' footprint (pipes: count x diameter x length)");
    }
  }
  const systemTopAt = systemTop({ units, stone });
  const structures = (form.structures ?? []).map((x, i): RisingStructure => {
    const path = `pond.storage.${where}.structures[${i}]`;
    const rim = cv.length(x.rim, `${path}.rim`);
    if (rim <= systemTopAt + SLACK) cv.problem(`${path}.rim`, show(x.rim), `a rim above the system's top (${show(systemTopAt / baseLength(cv.units))}): a structure counts only where it rises above the system`);
    return { name: x.name, area: cv.quantity(parsePondArea, x.area, `${path}.area`), rim };
  });
  const names = new Set<string>();
  structures.forEach((x, i) => {
    if (names.has(x.name)) cv.problem(`pond.storage.${where}.structures[${i}].name`, show(x.name), "a name not used by another structure");
    names.add(x.name);
  });
  let ponding: SurfacePonding | null = null;
  const p = form.surfacePonding;
  if (p) {
    const path = `pond.storage.${where}.surfacePonding`;
    const elevations = p.stageArea.map((r) => r[0] * baseLength(cv.units));
    const areas = p.stageArea.map((r, i) => cv.quantity(parsePondArea, r[1], `${path}.stageArea[${i}][1]`));
    ponding = { elevations, areas, limit: p.limit === undefined ? null : cv.length(p.limit, `${path}.limit`) };
    const lowestRim = Math.min(...structures.map((x) => x.rim));
    if (elevations[0] < systemTopAt - SLACK) cv.problem(`${path}.stageArea[0][0]`, show(p.stageArea[0][0]), `a first elevation at or above the system's top (${show(systemTopAt / baseLength(cv.units))})`);
    if (structures.length === 0) cv.problem(path, "surface ponding without a structure", `at least one structure (pond.storage.${where}.structures: an inlet or manhole) through which the water reaches the surface`);
    else if (elevations[0] > lowestRim + SLACK) cv.problem(`${path}.stageArea[0][0]`, show(p.stageArea[0][0]), `a first elevation at or below the lowest rim (${show(lowestRim / baseLength(cv.units))}), where the water reaches the surface`);
    if (ponding.limit !== null && ponding.limit < elevations[0] - SLACK) cv.problem(`${path}.limit`, show(p.limit!), `an elevation at or above the ponding's first row (${show(p.stageArea[0][0])})`);
    for (let i = 1; i < areas.length; i++) {
      if (areas[i] < areas[i - 1] - 1e-12 * areas[i - 1]) cv.problem(`${path}.stageArea[${i}][1]`, show(p.stageArea[i][1]), `area not decreasing (row before has ${show(p.stageArea[i - 1][1])})`);
    }
  }
  return { kind: "underground", units, stone, structures, ponding };
}
