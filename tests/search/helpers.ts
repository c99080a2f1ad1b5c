// Shared pieces of the search tests: invented inflows and a case reduced to its site data.
import { parseCase } from "../../src/case/load.js";

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
