// A pond's stage-storage relation as functions of stage (storage measured above pond.bottom).
import type { Pond } from "../model.js";
import { prismoidArea, prismoidVolume } from "./prismoid.js";
import { stageAreaArea, stageAreaVolume } from "./stageArea.js";
import { stageStorageArea, stageStorageVolume } from "./stageStorage.js";
import { undergroundArea, undergroundBreaks, undergroundVolume } from "./underground.js";

export interface StorageCurve {
  /** m3 above pond.bottom at a stage (m). */
  volume(stage: number): number;
  /** Plan area (m2) at a stage. */
  area(stage: number): number;
}

export function storageCurve(pond: Pond): StorageCurve {
  const s = pond.storage;
  const bottom = pond.bottom;
  switch (s.kind) {
    case "prismoid":
      return {
        volume: (stage) => prismoidVolume(s.length, s.width, s.sideSlope, stage - bottom),
        area: (stage) => prismoidArea(s.length, s.width, s.sideSlope, stage - bottom),
      };
    case "stageArea": {
      const base = stageAreaVolume(s.elevations, s.areas, bottom);
      return {
        volume: (stage) => (stage <= bottom ? 0 : stageAreaVolume(s.elevations, s.areas, stage) - base),
        area: (stage) => stageAreaArea(s.elevations, s.areas, stage),
      };
    }
    case "stageStorage": {
      const base = stageStorageVolume(s.elevations, s.volumes, bottom);
      return {
        volume: (stage) => (stage <= bottom ? 0 : stageStorageVolume(s.elevations, s.volumes, stage) - base),
        area: (stage) => stageStorageArea(s.elevations, s.volumes, stage),
      };
    }
    case "underground": {
      const base = undergroundVolume(s, bottom);
      return {
        volume: (stage) => (stage <= bottom ? 0 : undergroundVolume(s, stage) - base),
        area: (stage) => undergroundArea(s, stage),
      };
    }
  }
}

/** Elevations where the storage relation has a kink (table rows, inverts and crowns, a bed's base and top). */
export function storageBreaks(pond: Pond): number[] {
  const s = pond.storage;
  switch (s.kind) {
    case "prismoid":
      return [];
    case "stageArea":
    case "stageStorage":
      return s.elevations;
    case "underground":
      return undergroundBreaks(s);
  }
}
