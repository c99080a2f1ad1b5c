// Shared pieces of the commands: loading a case with its notices, option parsing, output.
import { loadCase, type LoadedCase } from "../case/load.js";
import { CaseError } from "../case/errors.js";
import { RULE_KINDS } from "../assess/rules/registry.js";
import { basename } from "node:path";
import { writeFileAtomic } from "../io.js";
import { parseLength, type UnitSystem } from "../units.js";

/** A bad command-line value: reported like a case error (exit 2). */
export class UsageError extends Error {
  constructor(option: string, found: string, expected: string) {
    super(`${option}: found ${JSON.stringify(found)}, expected ${expected}`);
    this.name = "UsageError";
  }
}

export function load(path: string): LoadedCase {
  const loaded = loadCase(path);
  const kinds = loaded.case.criteria.clogging?.checks ?? [];
  const problems = kinds.flatMap((kind, i) =>
    RULE_KINDS.includes(kind) ? [] : [{ where: `${basename(path)}: criteria.clogging.checks[${i}]`, found: JSON.stringify(kind), expected: `a check kind (${RULE_KINDS.join(", ")})` }],
  );
  if (problems.length > 0) throw new CaseError(problems);
  for (const notice of loaded.notices) process.stderr.write(`outfit: note: ${notice}\n`);
  return loaded;
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
    writeFileAtomic(out, text.endsWith("\n") ? text : text + "\n");
    process.stderr.write(`outfit: wrote ${out}\n`);
  } else process.stdout.write(text.endsWith("\n") ? text : text + "\n");
}

export function isUserError(error: unknown): error is CaseError | UsageError {
  return error instanceof CaseError || error instanceof UsageError;
}
