// The case file's underground storage forms (pipe gallery, chambers, stone bed) in SI, with the checks
// that involve several fields: the units sit inside the bed, the bed inside the pond's range.
import type { Length, StorageFile, StoneFile } from "./schema.js";
import type { Storage } from "../model.js";
import type { Converter } from "./converter.js";
import { show } from "./errors.js";
import { baseArea, baseLength } from "../units.js";
import type { StoneBed, UndergroundUnits } from "../model.js";
import { systemTop, unitsFootprint } from "../storage/underground.js";

const SLACK = 1e-9;

export function normalizeUnderground(s: StorageFile, cv: Converter, bottom: number, top: number): Storage {
  const at = (path: string, value: Length | undefined, fallback: number) => cv.optionalLength(value, `pond.storage.${path}`, fallback);
  let units: UndergroundUnits;
  let stoneFile: StoneFile | undefined;
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
  return { kind: "underground", units, stone };
}
