// The spread of a design (src/assess/spread.ts) in words and in the contract's JSON: its least reserve
// below the limit level and under which departure, then the reserve under each departure.
import type { Case } from "../model.js";
import type { Spread } from "../assess/spread.js";
import { toCaseUnits } from "../units.js";

const lengthUnit = (c: Case) => (c.units === "US" ? "ft" : "m");

/** A reserve in the case's units: "0.42 ft". */
function reserveText(c: Case, m: number): string {
  return `${toCaseUnits(c.units).length(m).toFixed(c.units === "US" ? 2 : 3)} ${lengthUnit(c)}`;
}

/** One line: the least reserve, where it is, and the reserve under each departure. */
export function spreadLine(c: Case, spread: Spread): string {
  const w = spread.worst;
  const least =
    spread.reserve >= 0
      ? `least reserve ${reserveText(c, spread.reserve)} below the ${w.by} (${w.storm}, ${w.label})`
      : `passes the ${w.by} by ${reserveText(c, -spread.reserve)} (${w.storm}, ${w.label})`;
  const each = spread.departures.map((d) => `${d.label} ${reserveText(c, d.reserve)}`).join(", ");
  return `spread: ${least}; reserve with ${each}`;
}

export function spreadJson(c: Case, spread: Spread) {
  const u = toCaseUnits(c.units);
  const departure = (d: Spread["worst"]) => ({ departure: d.key, label: d.label, reserve: u.length(d.reserve), storm: d.storm, limit: d.by });
  return { reserve: u.length(spread.reserve), worst: departure(spread.worst), departures: spread.departures.map(departure) };
}
