// Units at the edges: a case is written in US (ft, ft3, cfs, min) or SI (m, m3, m3/s, min);
// everything inside outfit is SI (m, m2, m3, m3/s, s).

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
  in: FOOT / 12,
  m: 1,
  mm: 0.001,
  cm: 0.01,
};

const LENGTH_PATTERN = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*([a-zA-Z]+)?\s*$/;

/** Parses "6 in", "0.5 ft", "150 mm" or a bare number in the base unit; returns metres or an error text. */
export function parseLength(value: number | string, system: UnitSystem): number | { error: string } {
  if (typeof value === "number") return value * baseLength(system);
  const match = LENGTH_PATTERN.exec(value);
  if (!match) return { error: "a length: a number, or a number and a unit such as \"6 in\" or \"150 mm\"" };
  const unit = match[2];
  const number = Number(match[1]);
  if (unit === undefined) return number * baseLength(system);
  const factor = LENGTH_UNITS[unit.toLowerCase()];
  if (factor === undefined) return { error: `a length unit among ${Object.keys(LENGTH_UNITS).join(", ")}` };
  return number * factor;
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
