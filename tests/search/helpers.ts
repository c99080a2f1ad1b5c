// Shared pieces of the search tests: invented inflows, a case reduced to its site data, and the
// layouts a run's journal holds.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { parseCase } from "../../src/case/load.js";

/** Whether a journal line is a fitted layout's (the others are the header and scored chunks of layouts). */
export const isLayoutLine = (line: string) => line.trim() !== "" && typeof (JSON.parse(line) as { key?: unknown }).key === "string";

/** The keys of the layouts in the journal of the run written to `out`. */
export function journalKeys(out: string): string[] {
  return readFileSync(join(out, "journal.jsonl"), "utf8")
    .split("\n")
    .slice(1)
    .filter(isLayoutLine)
    .map((line) => (JSON.parse(line) as { key: string }).key);
}

/** The scored chunks of layouts in the journal of the run written to `out`. */
export function journalScreens(out: string): number {
  return readFileSync(join(out, "journal.jsonl"), "utf8")
    .split("\n")
    .slice(1)
    .filter((line) => line.trim() !== "" && typeof (JSON.parse(line) as { screen?: unknown }).screen === "string").length;
}

/** An invented gamma-shaped inflow hydrograph (NRCS-like shape, m = 3.7) at 5-minute points. */
export function gammaInflow(peak: number, timeToPeak: number, decimals = 3): [number, number][] {
  const points: [number, number][] = [];
  for (let t = 0; t <= timeToPeak * 6; t += 5) {
    const x = t / timeToPeak;
    points.push([t, t === 0 ? 0 : Number((peak * x ** 3.7 * Math.exp(3.7 * (1 - x))).toFixed(decimals))]);
  }
  points[points.length - 1][1] = 0;
  return points;
}

/**
 * The case with its outlet reduced to the site data (barrel, spillway), parsed: the search must find
 * the openings and riser itself (an outlet in the case would be its baseline and a starting point).
 */
export function siteOnly(json: { outlet: object }) {
  const { elements: _elements, riser: _riser, ...site } = json.outlet as { elements?: unknown; riser?: unknown };
  return parseCase({ ...json, outlet: site });
}

/** An invented dry pond with a planted three-level outlet under a riser (targets left to each test). */
export const plantedDryCase = {
  name: "Planted outlet, invented dry pond",
  units: "US",
  pond: { bottom: 50, top: 56, storage: { prismoid: { length: 150, width: 75, sideSlope: 3 } } },
  storms: [
    { name: "2-yr", returnPeriod: 2, inflow: { series: gammaInflow(14, 45) } },
    { name: "10-yr", returnPeriod: 10, inflow: { series: gammaInflow(26, 45) } },
    { name: "100-yr", returnPeriod: 100, inflow: { series: gammaInflow(44, 45) } },
  ],
  criteria: { tolerance: { over: 0, under: 0.1 }, freeboard: { depth: "1 ft" } },
  outlet: {
    elements: [
      { type: "orifice", shape: "circular", diameter: "6 in", count: 1, invert: 50 },
      { type: "orifice", shape: "circular", diameter: "8 in", count: 2, invert: 51.6 },
      { type: "weir", shape: "rectangular", length: 2, crest: 53.2, endContractions: 2 },
    ],
    riser: { shape: "circular", diameter: 4, crest: 54.3 },
    spillway: { crest: 55, length: 10, sideSlope: 3 },
  },
  catalogue: {
    orifice: { diameters: ["3 in", "4 in", "6 in", "8 in", "10 in", "12 in"], maxCount: 3 },
    weir: { shapes: ["rectangular"], lengths: [1, 2, 3, 4] },
    riser: { diameters: [3, 4, 5] },
    maxStages: 3,
    elevationStep: 0.05,
  },
};
