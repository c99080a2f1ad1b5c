// Numbers with units in the case's own units, for every printed value.
import { toCaseUnits, unitLabels, type UnitSystem } from "./units.js";

export interface Formatter {
  units: UnitSystem;
  length(m: number, digits?: number): string;
  elevation(m: number): string;
  /** Diameters and other small sizes: inches (US) or millimetres (SI). */
  size(m: number): string;
  flow(q: number): string;
  volume(v: number): string;
  /** A bare number in case units, for table cells under a header that names the unit. */
  raw: ReturnType<typeof toCaseUnits>;
  labels: ReturnType<typeof unitLabels>;
}

/** One formatter per unit system (a formatter holds no state): the rules word their checks at every evaluation of a search. */
const FORMATTERS = new Map<UnitSystem, Formatter>();

export function formatter(units: UnitSystem): Formatter {
  let f = FORMATTERS.get(units);
  if (!f) {
    f = newFormatter(units);
    FORMATTERS.set(units, f);
  }
  return f;
}

function newFormatter(units: UnitSystem): Formatter {
  const c = toCaseUnits(units);
  const labels = unitLabels(units);
  return {
    units,
    raw: c,
    labels,
    length: (m, digits = 2) => `${c.length(m).toFixed(digits)} ${labels.length}`,
    elevation: (m) => `${c.length(m).toFixed(units === "US" ? 2 : 3)} ${labels.length}`,
    size: (m) => `${trimNumber(c.smallLength(m), units === "US" ? 2 : 0)} ${labels.smallLength}`,
    flow: (q) => `${significant(c.flow(q))} ${labels.flow}`,
    volume: (v) => `${Math.round(c.volume(v)).toLocaleString("en-US")} ${labels.volume}`,
  };
}

/** A number with up to `digits` decimals and no trailing zeros. */
export function trimNumber(x: number, digits: number): string {
  return String(Number(x.toFixed(digits)));
}

/** Three significant figures for flows of any size (at least two decimals below 10). */
export function significant(x: number): string {
  const a = Math.abs(x);
  if (a === 0) return "0";
  if (a >= 100) return x.toFixed(1);
  if (a >= 10) return x.toFixed(2);
  if (a >= 0.1) return x.toFixed(3);
  return x.toPrecision(3);
}

/** A check's value or limit in words: flows, elevations and lengths in case units, drawdown in hours, small sizes in in / mm. */
export function quantityText(f: Formatter, quantity: "flow" | "elevation" | "hours" | "size" | "length", value: number | null): string {
  if (value === null) return "not drained";
  if (quantity === "length") return f.length(value, f.units === "US" ? 2 : 3);
  return quantity === "flow" ? f.flow(value) : quantity === "hours" ? `${value.toFixed(1)} h` : quantity === "size" ? f.size(value) : f.elevation(value);
}

/** A change as a signed percentage ("+8.4 %", "-2.0 %"; no negative zero). */
export function percentChange(fraction: number, digits = 1): string {
  const text = (100 * fraction).toFixed(digits);
  return Number(text) === 0 ? `${(0).toFixed(digits)} %` : `${fraction > 0 ? "+" : ""}${text} %`;
}
