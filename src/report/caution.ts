// The caution every output carries.
import type { UnitSystem } from "../units.js";
export const CAUTION =
  "Preliminary design aid only: check every result against the local stormwater and dam-safety codes; " +
  "a licensed professional engineer must review, complete and seal any design.";

/** The head of every command's `--json` output: the tool, the command, the case, its units and the caution. */
export function jsonHead(command: string, c: { name: string; units: UnitSystem }) {
  return { tool: "outfit" as const, command, case: c.name, units: c.units, caution: CAUTION };
}
