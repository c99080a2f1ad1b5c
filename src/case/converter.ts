// Case-file values to SI, collecting the problems found on the way with their JSON paths.
import type { Length } from "./schema.js";
import { show, type Problem } from "./errors.js";
import { baseFlow, parseLength, type UnitSystem } from "../units.js";

/** Converts case-file values to SI and collects problems that involve several fields. */
export class Converter {
  readonly problems: Problem[] = [];
  constructor(
    readonly units: UnitSystem,
    readonly label: string,
  ) {}

  length(value: Length, path: string): number {
    const parsed = parseLength(value, this.units);
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
}
