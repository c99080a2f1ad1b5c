// Loads a case file: JSON -> zod validation -> checks across fields -> SI model.
import { readFileSync } from "node:fs";
import { basename, dirname, resolve } from "node:path";
import type { z } from "zod";
import { caseSchema, type CaseFile } from "./schema.js";
import { CaseError, describeIoError, jsonPath, show, type Problem } from "./errors.js";
import { normalizeCase } from "./normalize.js";
import type { Case, Hydrograph } from "../model.js";
import { unknownFields } from "./unknownFields.js";
import { FORMAT_DEPTH, MAX_CASE_DEPTH, nesting } from "./depth.js";

export interface LoadedCase {
  case: Case;
  /** The validated file, in the case's own units (the search writes candidates from it). */
  data: CaseFile;
  /** The JSON exactly as read (candidate case files copy it with a new outlet). */
  json: unknown;
  /** Fields the contract does not know, reported but not fatal. */
  notices: string[];
  /** Every inflow file read, by absolute path, as SI series (a worker thread reuses them). */
  hydrographs: Map<string, Hydrograph>;
}

/** Reads and validates a case file; throws CaseError naming every problem found. */
export function loadCase(path: string, options: Pick<ParseOptions, "hydrographs"> = {}): LoadedCase {
  const file = resolve(path);
  const label = basename(file);
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch (error) {
    throw new CaseError([{ where: path, found: describeIoError(error), expected: "a readable case file (JSON)" }]);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    throw new CaseError([{ where: jsonErrorPlace(text, message, label), found: `text that is not JSON (${message.split("\n")[0]})`, expected: "a JSON case file" }]);
  }
  return parseCase(json, { file, label, hydrographs: options.hydrographs });
}

export interface ParseOptions {
  /** Absolute path of the case file; CSV inflows are found relative to it. */
  file?: string;
  /** Name used in messages. */
  label?: string;
  /** Inflow files already read (by absolute path, as `LoadedCase.hydrographs` holds them): not read again. */
  hydrographs?: Map<string, Hydrograph>;
}

/** Validates a parsed JSON value as a case. */
export function parseCase(json: unknown, options: ParseOptions = {}): LoadedCase {
  const file = options.file ?? "";
  const label = options.label ?? (file ? basename(file) : "case");
  // Before anything walks the value: a file nested deeper than any case is a user error, not a stack overflow.
  const { depth, beyond } = nesting(json, MAX_CASE_DEPTH);
  if (beyond !== null) {
    throw new CaseError([
      {
        where: `${label}: ${beyond || "(the top level)"}`,
        found: `JSON nested ${depth.toLocaleString("en-US")} levels deep (arrays and objects)`,
        expected: `a case file nested at most ${MAX_CASE_DEPTH} levels deep (the case format's deepest arrays are ${FORMAT_DEPTH} levels down; this value is deeper)`,
      },
    ]);
  }
  const unknown = unknownFields(caseSchema, json);
  // A misspelled known field would silently drop what it says (a drawdown limit, a freeboard): an error.
  const misspelled: Problem[] = unknown
    .filter((u) => u.near !== null)
    .map((u) => ({ where: `${label}: ${u.path}`, found: `the field ${show(u.key)}`, expected: `a field of the case format (did you mean ${u.near}?)` }));
  const result = caseSchema.safeParse(json, { reportInput: true });
  if (!result.success) throw new CaseError([...misspelled, ...result.error.issues.map((issue) => fromIssue(issue, label))].slice(0, 12));
  if (misspelled.length > 0) throw new CaseError(misspelled);
  const notices = unknown.map((u) => `${label}: ${u.path}: field not in the case format, ignored`);
  const data: CaseFile = result.data;
  const notes: string[] = [];
  const hydrographs = new Map(options.hydrographs ?? []);
  const c = normalizeCase(data, { file, label, directory: file ? dirname(file) : process.cwd(), notes, hydrographs });
  // The catalogue's implausible bare sizes have no routed outlet to be reported with: a note each.
  const sizes = (c.sizeWarnings ?? []).filter((w) => w.part.startsWith("catalogue.")).map((w) => `${label}: ${w.part}: plausibility warning: ${w.reason}`);
  return { case: c, data, json, notices: [...notices, ...notes, ...sizes], hydrographs };
}

/** A zod issue as a problem naming the path, the value found and what was expected. */
export function fromIssue(issue: z.core.$ZodIssue, label: string): Problem {
  const where = `${label}: ${jsonPath(issue.path)}`;
  let input = (issue as { input?: unknown }).input;
  // A union without a matching discriminator reports the whole object at the discriminator's path
  // (outlet.elements[2].type): show the discriminator's own value.
  const last = issue.path[issue.path.length - 1];
  if (issue.code === "invalid_union" && typeof last === "string" && isRecord(input) && last in input) input = input[last];
  const custom = !issue.message.startsWith("Invalid") && !issue.message.startsWith("Too ");
  const found = input === undefined ? "nothing (the field is missing)" : show(input);
  switch (issue.code) {
    case "invalid_type":
      return { where, found, expected: custom ? issue.message : `a value of type ${issue.expected}` };
    case "invalid_value":
      return {
        where,
        found,
        expected: custom ? issue.message : `one of ${issue.values.map((v) => show(v)).join(", ")}`,
      };
    case "too_small":
      return {
        where,
        found: Array.isArray(input) ? `${input.length} entries` : found,
        expected: custom ? issue.message : `at least ${String(issue.minimum)}`,
      };
    default:
      return { where, found, expected: custom ? issue.message : issue.message.replace(/^Invalid input:?\s*/i, "") };
  }
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === "object" && value !== null && !Array.isArray(value);
}

/** "file.json:3:14" for a JSON.parse message that gives a position, else just the file. */
function jsonErrorPlace(text: string, message: string, label: string): string {
  const match = /at position (\d+)/.exec(message);
  if (!match) return label;
  const before = text.slice(0, Number(match[1]));
  const line = before.split("\n").length;
  const column = before.length - before.lastIndexOf("\n");
  return `${label}:${line}:${column}`;
}
