// Invented ponds for the routing tests (no real site): each is a case file's JSON, loaded through the
// same `parseCase` path as a file on disk, so the tests route exactly what a user's case would give.
import { parseCase } from "../../../src/case/load.js";
import type { Case } from "../../../src/model.js";

export function caseOf(json: unknown): Case {
  return parseCase(json, { label: "test case" }).case;
}

/** A dry pond with a multi-stage outlet: two orifices, a contracted weir, a riser and a spillway (US). */
export const dryMultiStage = {
  name: "Dry pond, multi-stage outlet (invented)",
  units: "US",
  pond: { bottom: 100, top: 106, storage: { prismoid: { length: 220, width: 110, sideSlope: 3 } } },
  storms: [
    {
      name: "100-yr",
      returnPeriod: 100,
      inflow: { series: [[0, 0], [20, 8], [40, 35], [60, 62], [80, 48], [120, 25], [180, 10], [300, 0]] },
    },
    { name: "2-yr", returnPeriod: 2, inflow: { series: [[0, 0], [30, 3], [50, 11], [70, 8], [120, 3], [240, 0]] } },
  ],
  outlet: {
    elements: [
      { type: "orifice", shape: "circular", diameter: "6 in", invert: 100 },
      { type: "orifice", shape: "circular", diameter: "10 in", invert: 102 },
      { type: "weir", shape: "rectangular", length: 2, crest: 103.5, endContractions: 2 },
    ],
    riser: { shape: "circular", diameter: 4, crest: 104.5 },
    spillway: { crest: 105, length: 12, sideSlope: 3 },
  },
};

/**
 * A small tank behind one large orifice (SI): the rating is steep against the storage, so the time
 * constant dS/dO is about a minute and the outflow follows the inflow closely.
 */
export const steepOrificeOnly = {
  name: "Small tank, one large orifice (invented)",
  units: "SI",
  pond: { bottom: 50, top: 53, storage: { stageArea: [[50, 12], [51, 18], [52, 26], [53, 36]] } },
  storms: [
    { name: "short burst", returnPeriod: 10, inflow: { series: [[0, 0], [10, 0.25], [14, 0.65], [25, 0.45], [40, 0.15], [70, 0]] } },
  ],
  outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "450 mm", invert: 50 }] },
};

/** A wet pond (permanent pool) with a low orifice at the pool, a v-notch and a contracted weir (SI). */
export const wetPond = {
  name: "Wet pond with permanent pool (invented)",
  units: "SI",
  pond: {
    bottom: 20,
    top: 23.5,
    permanentPool: 21,
    storage: { stageArea: [[20, 500], [21, 800], [22, 1200], [23.5, 1800]] },
  },
  storms: [
    { name: "25-yr", returnPeriod: 25, inflow: { series: [[0, 0], [30, 0.3], [60, 1.1], [90, 0.8], [180, 0.3], [360, 0]] } },
  ],
  outlet: {
    elements: [
      { type: "orifice", shape: "circular", diameter: "100 mm", invert: 21 },
      { type: "weir", shape: "v-notch", angle: 60, crest: 21.6 },
      { type: "weir", shape: "rectangular", length: 1.0, crest: 22.3, endContractions: 2 },
    ],
  },
};

/** A dry pond given as a stage-storage table, with a rectangular orifice and a riser (US), partly submerged by tailwater. */
export const stageStorageWithTailwater = {
  name: "Stage-storage pond under a fixed tailwater (invented)",
  units: "US",
  pond: {
    bottom: 300,
    top: 306,
    storage: { stageStorage: [[300, 0], [301, 9000], [302, 21000], [303, 36000], [304, 54000], [305, 75000], [306, 99000]] },
  },
  tailwater: { elevation: 300.6 },
  storms: [{ name: "10-yr", returnPeriod: 10, inflow: { series: [[0, 0], [15, 5], [35, 24], [55, 30], [90, 14], [150, 4], [240, 0]] } }],
  outlet: {
    elements: [{ type: "orifice", shape: "rectangular", width: 0.75, height: 0.5, invert: 300 }],
    riser: { shape: "box", length: 3, width: 3, crest: 303.2 },
  },
};

/**
 * An infiltration basin (US): a prismoid exfiltrating 0.5 in/h over its floor and side slopes, with a
 * 6-in orifice 0.5 ft above the floor (the water below it leaves only into the ground) and a weir.
 */
export const infiltrationBasin = {
  name: "Infiltration basin (invented)",
  units: "US",
  pond: {
    bottom: 40,
    top: 45,
    storage: { prismoid: { length: 140, width: 70, sideSlope: 3 } },
    exfiltration: { rate: "0.5 in/h", sides: true },
  },
  storms: [{ name: "10-yr", returnPeriod: 10, inflow: { series: [[0, 0], [20, 6], [40, 22], [60, 30], [90, 15], [150, 5], [300, 0]] } }],
  outlet: {
    elements: [
      { type: "orifice", shape: "circular", diameter: "6 in", invert: 40.5 },
      { type: "weir", shape: "rectangular", length: 2, crest: 42.5, endContractions: 2 },
    ],
  },
};

/**
 * Chambers in a stone bed (SI) exfiltrating 20 mm/h through the bed's base and walls, an orifice 0.25 m
 * above the base, and a manhole above the bed's top into which the storm rises.
 */
export const exfiltratingChambers = {
  name: "Chambers in stone, exfiltrating (invented)",
  units: "SI",
  pond: {
    bottom: 30,
    top: 32,
    storage: {
      chambers: {
        count: 30,
        base: 30.15,
        stageArea: [[0, 2.2], [0.5, 2.0], [0.9, 0.8], [1.0, 0]],
        stone: { voidRatio: 0.4, length: 26, width: 9, top: 31.3 },
        structures: [{ name: "MH-1", area: 1.5, rim: 32 }],
      },
    },
    exfiltration: { rate: "20 mm/h", sides: true },
  },
  storms: [{ name: "25-yr", returnPeriod: 25, inflow: { series: [[0, 0], [10, 0.025], [25, 0.085], [40, 0.06], [70, 0.02], [120, 0]] } }],
  outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "100 mm", invert: 30.25 }] },
};
