// Shared pieces of the storage tests: a case from JSON through the loader, and its problems as text.
import { parseCase } from "../../src/case/load.js";
import { CaseError } from "../../src/case/errors.js";

export const caseOf = (json: unknown) => parseCase(json, { label: "test case" }).case;

/** The CaseError message a case file gives ("" when it loads). */
export function caseProblems(json: unknown): string {
  try {
    caseOf(json);
    return "";
  } catch (e) {
    if (e instanceof CaseError) return e.message;
    throw e;
  }
}
