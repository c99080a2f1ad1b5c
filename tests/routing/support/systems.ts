// Invented systems of ponds for the routing tests (no real site): case files' JSON, loaded through
// `parseCase` like a file on disk.
import { parseCase } from "../../../src/case/load.js";
import type { Case } from "../../../src/model.js";

export function systemOf(json: unknown): Case {
  return parseCase(json, { label: "test system" }).case;
}

const upperPond = { bottom: 102, top: 107, storage: { prismoid: { length: 90, width: 60, sideSlope: 3 } } };
const lowerPond = { bottom: 100, top: 106, storage: { prismoid: { length: 120, width: 70, sideSlope: 3 } } };
const lowerOutlet = {
  elements: [
    { type: "orifice", shape: "circular", diameter: "10 in", invert: 100 },
    { type: "weir", shape: "rectangular", length: 3, crest: 103.5, endContractions: 2 },
  ],
  spillway: { crest: 105.2, length: 12, sideSlope: 3 },
};

/**
 * Two ponds joined by two 12-in orifices at the upper pond's floor (US). The lower pond's own inflow
 * arrives first and large, so its level rises above the upper pond's floor and water flows back
 * through the orifices before the upper pond's inflow arrives.
 */
export const orificeLinkWithReverse = {
  name: "Two ponds, orifice link, flow back (invented)",
  units: "US",
  ponds: [
    { name: "upper", pond: upperPond, outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "12 in", count: 2, invert: 102 }] }, to: "lower" },
    { name: "lower", pond: lowerPond, outlet: lowerOutlet, to: "outfall" },
  ],
  storms: [
    {
      name: "10-yr",
      returnPeriod: 10,
      target: 12,
      inflows: {
        lower: { series: [[0, 0], [15, 20], [30, 45], [50, 30], [90, 8], [150, 0]] },
        upper: { series: [[0, 0], [60, 0], [100, 14], [140, 20], [200, 6], [300, 0]] },
      },
    },
  ],
};

/** Three ponds in a chain (SI): weir and orifice links, the last to a free outfall. */
export const threePonds = {
  name: "Three ponds in a chain (invented)",
  units: "SI",
  ponds: [
    {
      name: "north",
      pond: { bottom: 31.0, top: 33.0, storage: { prismoid: { length: 40, width: 25, sideSlope: 2.5 } } },
      outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "200 mm", invert: 31.0 }, { type: "weir", shape: "rectangular", length: 1.2, crest: 32.1 }] },
      to: "middle",
    },
    {
      name: "middle",
      pond: { bottom: 30.2, top: 32.4, storage: { stageArea: [[30.2, 600], [31.0, 1100], [32.4, 1900]] } },
      outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "250 mm", invert: 30.2 }, { type: "weir", shape: "v-notch", angle: 90, crest: 31.2 }] },
      to: "south",
    },
    {
      name: "south",
      pond: { bottom: 29.5, top: 31.8, permanentPool: 29.9, storage: { prismoid: { length: 55, width: 30, sideSlope: 3 } } },
      outlet: { elements: [{ type: "orifice", shape: "circular", diameter: "225 mm", invert: 29.9 }, { type: "weir", shape: "rectangular", length: 1.5, crest: 30.9, endContractions: 2 }], spillway: { crest: 31.3, length: 6, sideSlope: 3 } },
      to: "outfall",
    },
  ],
  storms: [
    {
      name: "100-yr",
      returnPeriod: 100,
      target: 0.9,
      inflows: {
        north: { series: [[0, 0], [20, 0.6], [45, 1.4], [70, 0.9], [120, 0.3], [200, 0]] },
        middle: { series: [[0, 0], [15, 0.3], [35, 0.8], [60, 0.4], [120, 0]] },
        south: { series: [[0, 0], [10, 0.5], [25, 1.1], [40, 0.6], [90, 0]] },
      },
    },
  ],
};

/** Two ponds in series joined by a level 24-in equaliser pipe (a barrel without openings), US. */
export const equaliserPipe = {
  name: "Two ponds and an equaliser pipe (invented)",
  units: "US",
  ponds: [
    {
      name: "upper",
      pond: upperPond,
      outlet: { elements: [], barrel: { shape: "circular", diameter: "24 in", length: 80, inletInvert: 102, outletInvert: 102, manningN: 0.013, entrance: "concrete-square-headwall" } },
      to: "lower",
    },
    { name: "lower", pond: lowerPond, outlet: lowerOutlet, to: "outfall" },
  ],
  storms: orificeLinkWithReverse.storms,
};

/**
 * Five ponds in a tree (SI), listed downstream first: east (a short 300-mm pipe, flow back when the
 * middle pond rises above it) and north into middle, middle and west into south, south to a free
 * outfall. Two ponds drain into middle and two into south, so the elimination gathers several rows
 * into one.
 */
export const treeOfPonds = {
  name: "Five ponds in a tree (invented)",
  units: "SI",
  ponds: [
    threePonds.ponds[2],
    { ...threePonds.ponds[1], to: "south" },
    { ...threePonds.ponds[0], name: "west", to: "south" },
    threePonds.ponds[0],
    {
      ...threePonds.ponds[0],
      name: "east",
      pond: { ...threePonds.ponds[0].pond, bottom: 30.8 },
      outlet: { elements: [], barrel: { shape: "circular", diameter: "300 mm", length: 20, inletInvert: 30.8, outletInvert: 30.7, manningN: 0.013, entrance: "concrete-square-headwall" } },
    },
  ],
  storms: [
    {
      ...threePonds.storms[0],
      inflows: {
        ...threePonds.storms[0].inflows,
        east: { series: [[0, 0], [30, 0.9], [60, 0.2], [100, 0]] },
        west: { series: [[0, 0], [10, 0.4], [50, 0.1], [80, 0]] },
      },
    },
  ],
};
