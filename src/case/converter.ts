// Case-file values to SI, collecting the problems found on the way with their JSON paths.
import type { Length } from "../fields.js";
import { show, type Problem } from "./errors.js";
import { baseFlow, parseFlow, parseLength, type UnitSystem } from "../units.js";

/** Converts case-file values to SI and collects problems that involve several fields (the parts' `Conversion`). */
export class Converter {
  readonly problems: Problem[] = [];
  constructor(
    readonly units: UnitSystem,
    readonly label: string,
  ) {}

  length(value: Length, path: string): number {
    return this.quantity(parseLength, value, path);
  }
  /** A flow ("6.5 cfs", "184 L/s", or a bare number in cfs / m3/s), m3/s. */
  flowOf(value: number | string, path: string): number {
    return this.quantity(parseFlow, value, path);
  }
  /** Any quantity by its parser (units.ts); a problem and NaN when it does not parse. */
  quantity(parse: (value: number | string, system: UnitSystem) => number | { error: string }, value: number | string, path: string): number {
    const parsed = parse(value, this.units);
    if (typeof parsed === "number") return parsed;
    this.problem(path, show(value), parsed.error);
    return NaN;
  }
  optionalLength(value: Length | undefined, path: string, fallback: number): number {
    return value === undefined ? fallback : this.length(value, path);
  }
  problem(path: string, found: string, expected: string): void {
    this.problems.push({ where: `${this.label}: ${path}`, found, expected });
  }
  get flow(): number {
    return baseFlow(this.units);
  }
  /** Checks SI values of a table column (rows may carry different units) for order; returns them. */
  increasing(values: number[], strictly: boolean, name: string, at: (i: number) => { path: string; found: unknown }): number[] {
    for (let i = 1; i < values.length; i++) {
      // Rounding of unit factors aside (0.1 ac and 4356 ft2 are the same area).
      const bad = strictly ? !(values[i] > values[i - 1]) : values[i] < values[i - 1] - 1e-12 * Math.abs(values[i - 1]);
      if (bad && !Number.isNaN(values[i]) && !Number.isNaN(values[i - 1])) {
        const { path, found } = at(i);
        if (!this.problems.some((p) => p.where === `${this.label}: ${path}`)) {
          this.problem(path, show(found), `${name} ${strictly ? "strictly increasing" : "not decreasing"} (row before has ${show(at(i - 1).found)})`);
        }
      }
    }
    return values;
  }
}
