// Units at the edges: a case is written in US (ft, ft3, cfs, min) or SI (m, m3, m3/s, min);
// everything inside outfit is SI (m, m2, m3, m3/s, s).

import { own } from "./own.js";

export type UnitSystem = "US" | "SI";

/** Metres per foot (exact, international foot). */
export const FOOT = 0.3048;
/** Standard gravity, m/s2 (= 32.174 ft/s2, the case contract's value). */
export const GRAVITY = 9.80665;
export const SECONDS_PER_MINUTE = 60;
export const SECONDS_PER_HOUR = 3600;

/** Metres per length unit accepted in case files. */
export const LENGTH_UNITS: Readonly<Record<string, number>> = {
  ft: FOOT,
  foot: FOOT,
  feet: FOOT,
  in: FOOT / 12,
  inch: FOOT / 12,
  inches: FOOT / 12,
  '"': FOOT / 12,
  m: 1,
  mm: 0.001,
  cm: 0.01,
};

/** Square metres per area unit accepted for watershed areas (1 ac = 43,560 ft2; 1 mi2 = 640 ac). */
export const AREA_UNITS: Readonly<Record<string, number>> = {
  ac: 43560 * FOOT * FOOT,
  ha: 1e4,
  km2: 1e6,
  mi2: 640 * 43560 * FOOT * FOOT,
  ft2: FOOT * FOOT,
  m2: 1,
};

/** Cubic metres per second per flow unit (US gallon 3.785411784 L, exact). */
export const FLOW_UNITS: Readonly<Record<string, number>> = {
  cfs: FOOT ** 3,
  "ft3/s": FOOT ** 3,
  "m3/s": 1,
  cms: 1,
  "l/s": 0.001,
  gpm: 3.785411784e-3 / 60,
};

/** Metres per second per rainfall-intensity unit. */
export const INTENSITY_UNITS: Readonly<Record<string, number>> = {
  "in/h": FOOT / 12 / SECONDS_PER_HOUR,
  "in/hr": FOOT / 12 / SECONDS_PER_HOUR,
  "mm/h": 0.001 / SECONDS_PER_HOUR,
  "mm/hr": 0.001 / SECONDS_PER_HOUR,
};

/** Largest magnitude of any number in a case file (and smallest non-zero one): beyond these a value
 * is a typo or an overflow ("1e999"), and products of such values overflow to Infinity or to 0. */
export const NUMBER_LIMIT = 1e12;
export const NUMBER_FLOOR = 1e-12;

/** A finite number inside the limits above (zero allowed). */
export function isUsableNumber(value: number): boolean {
  return Number.isFinite(value) && Math.abs(value) <= NUMBER_LIMIT && (value === 0 || Math.abs(value) >= NUMBER_FLOOR);
}
/** What `isUsableNumber` accepts, in words. */
export const USABLE_NUMBER = "a finite number (0, or of magnitude from 1e-12 to 1e12)";

/** The one parser of numeric text: a decimal number ("12", "-0.5", "3e2") that is usable, else null. */
export function parseNumber(text: string): number | null {
  if (!/^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*$/.test(text)) return null;
  const value = Number(text);
  // "1e-999" reads as 0: an underflow, not a zero.
  if (value === 0 && /[1-9]/.test(text.replace(/[eE].*$/, ""))) return null;
  return isUsableNumber(value) ? value : null;
}

/** A number, optionally followed by a unit such as "in", "km2", "mm/h", "L/s" or the inch mark ("6\""). */
export const QUANTITY_PATTERN = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*([a-zA-Z][a-zA-Z0-9/]*|")?\s*$/;

/** A quantity's number and unit text as written, or why it is not one; `units` lists the known units. */
export function splitQuantity(text: string, units: Readonly<Record<string, number>>): { number: number; factor: number | null } | { error: string } {
  const match = QUANTITY_PATTERN.exec(text);
  if (!match) return { error: "not a number with an optional unit" };
  const number = parseNumber(match[1]);
  if (number === null) return { error: USABLE_NUMBER };
  if (match[2] === undefined) return { number, factor: null };
  const factor = own(units, match[2].toLowerCase());
  if (factor === undefined) return { error: `a unit among ${Object.keys(units).join(", ")} ("${match[2]}" is not one)` };
  return { number, factor };
}

/** Cubic metres per second per square metre per unit-area release rate ("0.04 cfs/ac", "2 L/s/ha"). */
export const UNIT_AREA_RATE_UNITS: Readonly<Record<string, number>> = {
  "cfs/ac": FOOT ** 3 / AREA_UNITS.ac,
  "l/s/ha": 0.001 / AREA_UNITS.ha,
  "m3/s/ha": 1 / AREA_UNITS.ha,
};

/** Parses a number with an optional unit from `units`; a bare number is in `base` (SI per bare unit). */
export function parseQuantity(
  value: number | string,
  units: Readonly<Record<string, number>>,
  base: number,
  what: string,
  examples: string,
): number | { error: string } {
  if (typeof value === "number") {
    return isUsableNumber(value) ? value * base : { error: `${what}: ${USABLE_NUMBER}` };
  }
  const parts = splitQuantity(value, units);
  if ("error" in parts) {
    if (parts.error.startsWith("a unit")) return { error: `${what} unit among ${Object.keys(units).join(", ")}` };
    return { error: `${what}: a number, or a number and a unit such as ${examples}; the number ${USABLE_NUMBER}` };
  }
  const si = parts.number * (parts.factor ?? base);
  return Number.isFinite(si) ? si : { error: `${what}: ${USABLE_NUMBER}` };
}

/** Parses "6 in", "0.5 ft", "150 mm" or a bare number in the base unit; returns metres or an error text. */
export function parseLength(value: number | string, system: UnitSystem): number | { error: string } {
  return parseQuantity(value, LENGTH_UNITS, baseLength(system), "a length", '"6 in" or "150 mm"');
}

/** Parses a flow ("6.5 cfs", "184 L/s", "0.18 m3/s"; a bare number is cfs (US) or m3/s (SI)); returns m3/s. */
export function parseFlow(value: number | string, system: UnitSystem): number | { error: string } {
  return parseQuantity(value, FLOW_UNITS, baseFlow(system), "a flow", '"6.5 cfs" or "184 L/s"');
}

/** Parses a pond surface area ("0.56 ac", "2300 m2"; a bare number is ft2 (US) or m2 (SI)); returns m2. */
export function parsePondArea(value: number | string, system: UnitSystem): number | { error: string } {
  return parseQuantity(value, AREA_UNITS, baseArea(system), "an area", '"0.56 ac" or "2300 m2"');
}

/** Parses a watershed area ("12 ac", "4.9 ha"; a bare number is acres (US) or hectares (SI)); returns m2. */
export function parseArea(value: number | string, system: UnitSystem): number | { error: string } {
  return parseQuantity(value, AREA_UNITS, baseWatershedArea(system), "an area", '"12 ac" or "4.9 ha"');
}

/** Parses a rainfall or runoff depth ("3.2 in", "81 mm"; a bare number is inches (US) or mm (SI)); returns m. */
export function parseDepth(value: number | string, system: UnitSystem): number | { error: string } {
  return parseQuantity(value, LENGTH_UNITS, baseDepth(system), "a depth", '"3.2 in" or "81 mm"');
}

/** Parses a rainfall intensity ("2.5 in/h", "60 mm/h"; a bare number is in/h (US) or mm/h (SI)); returns m/s. */
export function parseIntensity(value: number | string, system: UnitSystem): number | { error: string } {
  return parseQuantity(value, INTENSITY_UNITS, baseIntensity(system), "an intensity", '"2.5 in/h" or "60 mm/h"');
}

/** Parses a unit-area release rate ("0.04 cfs/ac", "2.5 L/s/ha"; a bare number is cfs/ac (US) or L/s/ha (SI)); returns m3/s per m2. */
export function parseUnitAreaRate(value: number | string, system: UnitSystem): number | { error: string } {
  const base = system === "US" ? UNIT_AREA_RATE_UNITS["cfs/ac"] : UNIT_AREA_RATE_UNITS["l/s/ha"];
  return parseQuantity(value, UNIT_AREA_RATE_UNITS, base, "a release rate per area", '"0.04 cfs/ac" or "2.5 L/s/ha"');
}

/** Square metres per bare watershed-area number: acres (US) or hectares (SI). */
export function baseWatershedArea(system: UnitSystem): number {
  return system === "US" ? AREA_UNITS.ac : AREA_UNITS.ha;
}
/** Metres per bare depth number: inches (US) or millimetres (SI). */
export function baseDepth(system: UnitSystem): number {
  return system === "US" ? LENGTH_UNITS.in : LENGTH_UNITS.mm;
}
/** Metres per second per bare intensity number: in/h (US) or mm/h (SI). */
export function baseIntensity(system: UnitSystem): number {
  return system === "US" ? INTENSITY_UNITS["in/h"] : INTENSITY_UNITS["mm/h"];
}

/** Metres per base length unit of a system. */
export function baseLength(system: UnitSystem): number {
  return system === "US" ? FOOT : 1;
}
/** Square metres per base area unit. */
export function baseArea(system: UnitSystem): number {
  return baseLength(system) ** 2;
}
/** Cubic metres per base volume unit. */
export function baseVolume(system: UnitSystem): number {
  return baseLength(system) ** 3;
}
/** Cubic metres per second per base flow unit (cfs or m3/s). */
export function baseFlow(system: UnitSystem): number {
  return baseLength(system) ** 3;
}
/** SI value per case value of a weir-type coefficient (dimension length^0.5 / time). */
export function baseWeirCoefficient(system: UnitSystem): number {
  return Math.sqrt(baseLength(system));
}

/** Labels of the base units of a system, for printing. */
export interface UnitLabels {
  length: string;
  smallLength: string;
  area: string;
  volume: string;
  flow: string;
}

export function unitLabels(system: UnitSystem): UnitLabels {
  return system === "US"
    ? { length: "ft", smallLength: "in", area: "ft2", volume: "ft3", flow: "cfs" }
    : { length: "m", smallLength: "mm", area: "m2", volume: "m3", flow: "m3/s" };
}

/** Converts SI values back to the case's units for output. */
export function toCaseUnits(system: UnitSystem) {
  const L = baseLength(system);
  return {
    length: (m: number) => m / L,
    smallLength: (m: number) => (system === "US" ? m / (FOOT / 12) : m * 1000),
    area: (m2: number) => m2 / (L * L),
    volume: (m3: number) => m3 / (L * L * L),
    flow: (q: number) => q / (L * L * L),
    weirCoefficient: (c: number) => c / Math.sqrt(L),
  };
}

/** Labels and converters of the hydrology quantities (watershed area, rainfall depth, intensity) for output. */
export function hydrologyUnits(system: UnitSystem) {
  const area = baseWatershedArea(system);
  const depth = baseDepth(system);
  const intensity = baseIntensity(system);
  return {
    labels: system === "US" ? { area: "ac", depth: "in", intensity: "in/h" } : { area: "ha", depth: "mm", intensity: "mm/h" },
    area: (m2: number) => m2 / area,
    depth: (m: number) => m / depth,
    intensity: (ms: number) => ms / intensity,
  };
}
