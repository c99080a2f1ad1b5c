// Errors a user can cause: each names where (JSON path or file:line), the value found and what was expected.

export interface Problem {
  /** "case.json: pond.storage.prismoid.length" or "inflow-2yr.csv:14". */
  where: string;
  found: string;
  expected: string;
}

export class CaseError extends Error {
  readonly problems: Problem[];
  constructor(problems: Problem[]) {
    super(problems.map(formatProblem).join("\n"));
    this.name = "CaseError";
    this.problems = problems;
  }
}

export function formatProblem(p: Problem): string {
  return `${p.where}: found ${p.found}, expected ${p.expected}`;
}

/** A short printable form of a value found in the input (src/fields.ts, shared with the parts). */
export { show } from "../fields.js";

/** Formats a JSON path such as ["storms", 0, "inflow"] as storms[0].inflow. */
export function jsonPath(path: readonly PropertyKey[]): string {
  let out = "";
  for (const key of path) {
    if (typeof key === "number") out += `[${key}]`;
    else out += (out ? "." : "") + String(key);
  }
  return out || "(top level)";
}

/** What a failed read found, in words ("no such file", "a directory", ...). */
export function describeIoError(error: unknown): string {
  const code = (error as { code?: string }).code;
  if (code === "ENOENT") return "no such file";
  if (code === "EISDIR") return "a directory";
  if (code === "EACCES" || code === "EPERM") return "a path without permission (permission denied)";
  if (code === "ENOTDIR") return "a path through a file (a part of it is not a directory)";
  if (code === "EROFS") return "a read-only file system";
  if (code === "ENAMETOOLONG") return "a name too long";
  if (code === "ENOSPC") return "a full disk";
  if (code === "EEXIST") return "a file where a directory is needed";
  if (code === "EINVAL") return "a path the system cannot use";
  return error instanceof Error ? error.message : String(error);
}
