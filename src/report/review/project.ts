// The review report's project block: who and what the report is for (the case file's optional
// `project` section) and what produced it (date of the run, outfit's version, a hash of the inputs).
import type { ProjectFile } from "../../case/schema.js";
import type { FactsBlock } from "./model.js";

export interface RunFacts {
  /** Date and time of the run, ISO 8601 in UTC. */
  date: string;
  version: string;
  /** SHA-256 of the input files (hex), and how many files it covers. */
  inputHash: string;
  inputFiles: number;
}

const NOT_GIVEN = "not given (project section of the case file)";

export function projectFacts(project: ProjectFile | undefined, run: RunFacts): FactsBlock {
  const p = project ?? {};
  const given = (value: string | undefined) => (value === undefined || value.trim() === "" ? NOT_GIVEN : value);
  return {
    kind: "facts",
    rows: [
      ["Project", given(p.name)],
      ["Project number", given(p.number)],
      ["Client", given(p.client)],
      ["Location", given(p.location)],
      ["Jurisdiction", given(p.jurisdiction)],
      ["Engineer", given(p.engineer)],
      ["Revision", given(p.revision)],
      ["Date of run", `${run.date.slice(0, 10)} ${run.date.slice(11, 16)} UTC`],
      ["outfit version", run.version],
      ["Input files (SHA-256)", `${run.inputHash.slice(0, 16)} (${run.inputFiles} file${run.inputFiles === 1 ? "" : "s"})`],
    ],
  };
}
