// Shared pieces of the commands: loading a case with its notices, option parsing, output.
import { loadCase, type LoadedCase } from "../case/load.js";
import { CaseError } from "../case/errors.js";
import { RULE_KINDS } from "../assess/rules/registry.js";
import { basename } from "node:path";
import { printErr, printOut, writeFileAtomic } from "../io.js";
import { forTerminal } from "../terminalText.js";
import { baseLength, parseLength, type UnitSystem } from "../units.js";

/** A bad command-line value: reported like a case error (exit 2). */
export class UsageError extends Error {
  constructor(option: string, found: string, expected: string) {
    super(`${option}: found ${JSON.stringify(found)}, expected ${expected}`);
    this.name = "UsageError";
  }
}

/** Loads a case and prints its notes on stderr (none when `quiet`). */
export function load(path: string, quiet = false): LoadedCase {
  const loaded = loadCase(path);
  const kinds = loaded.case.criteria.clogging?.checks ?? [];
  const problems = kinds.flatMap((kind, i) =>
    RULE_KINDS.includes(kind) ? [] : [{ where: `${basename(path)}: criteria.clogging.checks[${i}]`, found: JSON.stringify(kind), expected: `a check kind (${RULE_KINDS.join(", ")})` }],
  );
  if (problems.length > 0) throw new CaseError(problems);
  if (quiet) return loaded;
  for (const notice of loaded.notices) printErr(`outfit: note: ${notice}\n`);
  if (loaded.case.sizing) {
    const s = loaded.case.sizing;
    printErr(`outfit: note: no pond given: using the pond chosen from the site limits, ${(s.depth / baseLength(loaded.case.units)).toFixed(2)} ${loaded.case.units === "US" ? "ft" : "m"} deep, for the ${s.storm} storm's routed estimate${s.withinLimits ? "" : " (the largest the site allows: it holds less)"} (outfit pond shows the depths compared; design --size-pond sizes pond and outlet together)\n`);
  }
  return loaded;
}

/**
 * Commands that size one pond (design --size-pond) refuse a system of ponds (a case with `ponds`) with
 * a user error, exit 2: a system's outlets are designed together by design, its ponds as given.
 */
export function refuseSystem(loaded: LoadedCase, path: string, command: string): void {
  const system = loaded.case.system;
  if (!system) return;
  const single = system.ponds.length === 1 ? "; write a single pond as pond and outlet to design it" : "";
  throw new CaseError([
    {
      where: `${basename(path)}: ponds`,
      found: `a system of ${system.ponds.length} pond${system.ponds.length > 1 ? "s" : ""}`,
      expected: `a case with one pond (pond and outlet): ${command} sizes one pond with its outlet; the outlets of a system of ponds are designed together by outfit design (without --size-pond), its ponds' sizes kept${single}`,
    },
  ]);
}

export function positiveNumber(option: string, text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const value = Number(text);
  if (!Number.isFinite(value) || value <= 0) throw new UsageError(option, text, "a number greater than zero");
  return value;
}

export function positiveLength(option: string, text: string | undefined, units: UnitSystem): number | undefined {
  if (text === undefined) return undefined;
  const value = parseLength(text, units);
  if (typeof value !== "number" || !Number.isFinite(value) || value <= 0) {
    throw new UsageError(option, text, 'a length greater than zero, e.g. 0.5 or "0.5 ft" or "150 mm"');
  }
  return value;
}

/** Prints to stdout, or writes a file whole when --out is given. */
export function emit(text: string, out: string | undefined): void {
  if (out) {
    writeFileAtomic(out, forTerminal(text.endsWith("\n") ? text : text + "\n", false));
    printErr(`outfit: wrote ${out}\n`);
  } else printOut(text.endsWith("\n") ? text : text + "\n");
}

export function isUserError(error: unknown): error is CaseError | UsageError {
  return error instanceof CaseError || error instanceof UsageError;
}

/** A name as a file name: letters, digits, dot, dash and underscore kept, the rest as "_". */
export function safeName(name: string): string {
  return name.replace(/[^A-Za-z0-9._-]+/g, "_") || "storm";
}
