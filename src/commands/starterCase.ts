// The starter case that `outfit starter` writes: an invented pond with every field of the case
// format used once and explained by a comment field ("//..."; the loader ignores such fields).
import type { UnitSystem } from "../units.js";
import { CAUTION } from "../report/caution.js";

/** A hydrograph's shape: [minutes, fraction of the peak]. */
const SHAPE: readonly (readonly [number, number])[] = [
  [0, 0], [10, 0.1], [20, 0.45], [30, 0.9], [40, 1], [50, 0.8], [60, 0.6], [80, 0.35],
  [100, 0.2], [120, 0.12], [150, 0.05], [180, 0.02], [240, 0],
];

function hydrograph(peak: number, digits: number): [number, number][] {
  return SHAPE.map(([t, f]) => [t, Number((f * peak).toFixed(digits))]);
}

interface Numbers {
  bottom: number; top: number; length: number; width: number;
  peaks: [number, number, number]; targets: [number, number, number]; flowDigits: number;
  freeboard: string; drawdownDepth: string;
  buildability: { web: string; levelSpacing: string; rimClearance: string };
  low: { diameter: string; invert: number }; mid: { diameter: string; invert: number };
  weir: { length: number; crest: number };
  riser: { diameter: number; crest: number };
  barrel: { diameter: string; length: number; inlet: number; outlet: number };
  spillway: { crest: number; length: number };
  catalogue: { orifices: string[]; weirLengths: number[]; risers: number[]; barrels: string[]; step: number };
}

const US: Numbers = {
  bottom: 100, top: 105, length: 200, width: 100,
  peaks: [12, 22, 38], targets: [3.5, 8, 18], flowDigits: 2,
  freeboard: "1 ft", drawdownDepth: "0.1 ft",
  buildability: { web: "6 in", levelSpacing: "0.25 ft", rimClearance: "0.25 ft" },
  low: { diameter: "4 in", invert: 100 }, mid: { diameter: "6 in", invert: 101.5 },
  weir: { length: 1.5, crest: 102.6 },
  riser: { diameter: 4, crest: 103.4 },
  barrel: { diameter: "18 in", length: 50, inlet: 99.5, outlet: 99 },
  spillway: { crest: 104.1, length: 10 },
  catalogue: { orifices: ["3 in", "4 in", "6 in", "8 in", "10 in", "12 in"], weirLengths: [1, 1.5, 2, 3, 4], risers: [3, 4, 5], barrels: ["15 in", "18 in", "24 in", "30 in"], step: 0.05 },
};

const SI: Numbers = {
  bottom: 50, top: 51.5, length: 60, width: 30,
  peaks: [0.34, 0.62, 1.08], targets: [0.1, 0.22, 0.5], flowDigits: 3,
  freeboard: "0.3 m", drawdownDepth: "0.03 m",
  buildability: { web: "150 mm", levelSpacing: "75 mm", rimClearance: "75 mm" },
  low: { diameter: "100 mm", invert: 50 }, mid: { diameter: "150 mm", invert: 50.45 },
  weir: { length: 0.45, crest: 50.78 },
  riser: { diameter: 1.2, crest: 51.02 },
  barrel: { diameter: "450 mm", length: 15, inlet: 49.85, outlet: 49.7 },
  spillway: { crest: 51.23, length: 3 },
  catalogue: { orifices: ["75 mm", "100 mm", "150 mm", "200 mm", "250 mm", "300 mm"], weirLengths: [0.3, 0.45, 0.6, 0.9, 1.2], risers: [0.9, 1.2, 1.5], barrels: ["375 mm", "450 mm", "600 mm", "750 mm"], step: 0.01 },
};

/** The starter case as a JSON value, in US or SI units. */
export function starterCase(units: UnitSystem): unknown {
  const n = units === "US" ? US : SI;
  const L = units === "US" ? "ft" : "m";
  const Q = units === "US" ? "cfs" : "m3/s";
  const storm = (i: 0 | 1 | 2, name: string, years: number) => ({
    name,
    returnPeriod: years,
    target: n.targets[i],
    inflow: { series: hydrograph(n.peaks[i], n.flowDigits) },
  });
  return {
    "//": `Starter case written by outfit: an invented pond to replace with the site's own. Fields whose name starts with "//" are comments and are ignored. ${CAUTION}`,
    name: "Starter pond (invented example)",
    "//units": `"US" (ft, ft3, cfs) or "SI" (m, m3, m3/s); times are always minutes. A length may carry its unit: "6 in", "150 mm".`,
    units,
    "//project": "Optional: shown in the review report's project block. Every field is free text.",
    project: {
      name: "Starter pond",
      number: "0000-00",
      client: "Invented client",
      location: "Invented site",
      jurisdiction: "The reviewing authority",
      engineer: "Your name",
      revision: "A",
    },
    "//site": `Instead of "pond", a "site" section lets outfit choose the pond's depth and footprint (outfit pond): {"maxDepth", "floor" or "existingGrade", "embankment": {"maxHeight"}, "groundwater": {"seasonalHigh", "separation"}, "outfallInvert", "maxTopLength", "maxTopWidth", "step"}.`,
    pond: {
      "//": `bottom: lowest elevation of the storage (${L}); top: top of embankment. storage: exactly one of prismoid (floor length x width, side slope H:1V), stageArea [[elevation, area]] or stageStorage [[elevation, volume]], or an underground pipeGallery or chambers (which hold nothing above their top unless "structures" or "surfacePonding" are declared). Add "permanentPool" for a wet pond.`,
      "//exfiltration": `Optional, for an infiltration basin (a dry pond): {"rate": "${units === "US" ? "0.5 in/h" : "12 mm/h"}", "sides": true, "drainHours": 72}, the design infiltration rate over the wetted floor (and sides), and the hours allowed to drain.`,
      bottom: n.bottom,
      top: n.top,
      storage: { prismoid: { length: n.length, width: n.width, sideSlope: 3 } },
    },
    "//tailwater": `{"free": true} (free outfall), {"elevation": z} or {"rating": [[flow, elevation], ...]}.`,
    tailwater: { free: true },
    "//storms": `One entry per design storm: a unique name, the return period (years), the allowable peak release "target" (${Q}) and the inflow hydrograph as [minutes, ${Q}] pairs (or {"file": "inflow.csv"} with time,flow rows). A storm may add "bypass" (the same forms, and "lag" in minutes): the runoff that skips the pond and joins its outflow at the point of analysis, where the target then applies.`,
    storms: [storm(0, "2-yr", 2), storm(1, "10-yr", 10), storm(2, "100-yr", 100)],
    criteria: {
      "//": "tolerance: how far a routed peak may lie above (over) or below (under) its target, as fractions; freeboard below the top of embankment for the largest storm; drawdown: hours to drain after the peak stage, to within depth of the floor.",
      tolerance: { over: 0, under: 0.1 },
      freeboard: { depth: n.freeboard },
      drawdown: { hours: 72, depth: n.drawdownDepth },
      spillway: { dryThrough: 100 },
      buildability: {
        "//": "What a drafter can build (these are the defaults, common practice): web, the clear wall between two openings and to a box's corners; levelSpacing, the least distance between distinct control levels; rimClearance, how far weir crests and opening tops stay below the riser's rim. Add headwallWidth where the openings are in a headwall without a riser.",
        web: n.buildability.web,
        levelSpacing: n.buildability.levelSpacing,
        rimClearance: n.buildability.rimClearance,
        source: "common practice",
      },
    },
    outlet: {
      "//": "The outlet to rate and route: openings in the riser wall (orifices, weirs), the riser's rim, the barrel that drains the riser and the emergency spillway. Add \"keep\": true to a part for design to keep it as it is.",
      elements: [
        { type: "orifice", shape: "circular", diameter: n.low.diameter, count: 1, invert: n.low.invert },
        { type: "orifice", shape: "circular", diameter: n.mid.diameter, count: 1, invert: n.mid.invert },
        { type: "weir", shape: "rectangular", length: n.weir.length, crest: n.weir.crest, endContractions: 2 },
      ],
      riser: { shape: "circular", diameter: n.riser.diameter, crest: n.riser.crest },
      barrel: {
        "//": "HDS-5 inlet and outlet control; entrance: concrete-square-headwall, concrete-groove-headwall, concrete-groove-projecting, cmp-headwall, cmp-mitered, cmp-projecting, box-wingwall-30-75 or box-wingwall-15-90.",
        shape: "circular", diameter: n.barrel.diameter, length: n.barrel.length,
        inletInvert: n.barrel.inlet, outletInvert: n.barrel.outlet, manningN: 0.013, entrance: "concrete-square-headwall",
      },
      spillway: { "//": "Broad-crested trapezoid: crest elevation, bottom length, side slope H:1V.", crest: n.spillway.crest, length: n.spillway.length, sideSlope: 3 },
    },
    catalogue: {
      "//": "What outfit design may use: standard sizes only. maxStages: most distinct opening elevations; elevationStep: inverts and crests are multiples of it.",
      orifice: { diameters: n.catalogue.orifices, maxCount: 2 },
      weir: { "//": "shapes: rectangular (contracted at both ends), v-notch, cipolletti (a trapezoid with sides 1 H : 4 V); lengths serve the rectangular and Cipolletti weirs, angles the v-notches.", shapes: ["rectangular", "v-notch"], lengths: n.catalogue.weirLengths, angles: [30, 45, 60, 90] },
      riser: { diameters: n.catalogue.risers },
      barrel: { diameters: n.catalogue.barrels },
      maxStages: 3,
      elevationStep: n.catalogue.step,
    },
  };
}
