// A design run's results directory (`outfit design --out DIR`): results.json and one ready-to-route
// case file per candidate. Read here for the report; every candidate is routed again from its file.
import { readFileSync, statSync } from "node:fs";
import { join, resolve } from "node:path";
import { z } from "zod";
import { CaseError, show } from "../../case/errors.js";
import { fromIssue, loadCase } from "../../case/load.js";
import type { Case } from "../../model.js";

const stormSchema = z.looseObject({
  name: z.string(),
  peakOutflow: z.number(),
  /** With a bypass: the peak at the point of analysis, to which the target applies. */
  peakAtPoint: z.number().optional(),
  maxStage: z.number(),
});

const changeSchema = z.looseObject({ kind: z.string(), text: z.string() });

/** A part used outside its formula's range (and other warnings), as the run wrote them. */
const warningsSchema = z.array(z.looseObject({ part: z.string(), reason: z.string() })).optional();

const candidateSchema = z.looseObject({
  rank: z.number().int().positive(),
  description: z.string(),
  compliant: z.boolean(),
  warnings: warningsSchema,
  cost: z.number().nullable().optional(),
  binding: z.looseObject({ name: z.string(), slack: z.number() }).nullable(),
  explanation: z.array(z.string()),
  storms: z.array(stormSchema),
  caseFile: z.string().min(1),
  /** Value engineering: against the existing outlet (the run's baseline). */
  saving: z.looseObject({ cost: z.number(), percent: z.number().nullable() }).optional(),
  changes: z.array(changeSchema).optional(),
});

/** The existing outlet of a value-engineering run, as the run routed and assessed it. */
const baselineSchema = z.looseObject({
  description: z.string(),
  compliant: z.boolean(),
  warnings: warningsSchema,
  cost: z.number(),
  binding: z.looseObject({ name: z.string(), slack: z.number() }).nullable(),
  explanation: z.array(z.string()),
  storms: z.array(stormSchema.extend({ target: z.number().nullable() })),
  verdict: z.string(),
});

export const designResultsSchema = z.looseObject({
  tool: z.literal("outfit"),
  command: z.literal("design"),
  case: z.string(),
  units: z.enum(["US", "SI"]),
  caseFile: z.string(),
  search: z.looseObject({
    stoppedBecause: z.string(),
    layouts: z.number(),
    routings: z.number(),
    seconds: z.number(),
    seed: z.union([z.number(), z.string()]),
    /** A shard's run (`design --shard k/n`): "k/n", and what it left to the gather. */
    shard: z.string().optional(),
    leftToGather: z.array(z.string()).optional(),
  }),
  baseline: baselineSchema.optional(),
  candidates: z.array(candidateSchema).min(1),
});

export type DesignResults = z.infer<typeof designResultsSchema>;
export type DesignCandidate = z.infer<typeof candidateSchema>;

export interface LoadedCandidate {
  reported: DesignCandidate;
  /** The candidate's case file, loaded. */
  case: Case;
  file: string;
}

export interface DesignRun {
  directory: string;
  results: DesignResults;
  candidates: LoadedCandidate[];
  notices: string[];
}

export const RESULTS_FILE = "results.json";

export function isDirectory(path: string): boolean {
  try {
    return statSync(path).isDirectory();
  } catch {
    return false;
  }
}

/** Reads results.json and every candidate's case file; throws CaseError naming the file and field. */
export function loadDesignRun(directory: string): DesignRun {
  const file = join(directory, RESULTS_FILE);
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch {
    throw new CaseError([{ where: file, found: "no readable file", expected: `the design run's ${RESULTS_FILE} (written by outfit design --out DIR)` }]);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    throw new CaseError([{ where: file, found: `text that is not JSON (${error instanceof Error ? error.message : String(error)})`, expected: "the JSON written by outfit design" }]);
  }
  const parsed = designResultsSchema.safeParse(json, { reportInput: true });
  if (!parsed.success) {
    throw new CaseError(parsed.error.issues.slice(0, 12).map((issue) => fromIssue(issue, file)));
  }
  const results = parsed.data;
  const ranks = new Set<number>();
  results.candidates.forEach((k, i) => {
    if (ranks.has(k.rank)) throw new CaseError([{ where: `${file}: candidates[${i}].rank`, found: show(k.rank), expected: "a rank no other candidate has" }]);
    ranks.add(k.rank);
  });
  const notices: string[] = [];
  const candidates = results.candidates.map((reported, i) => {
    const path = resolve(directory, reported.caseFile);
    let loaded;
    try {
      loaded = loadCase(path);
    } catch (error) {
      if (error instanceof CaseError) {
        throw new CaseError([{ where: `${file}: candidates[${i}].caseFile`, found: show(reported.caseFile), expected: "a readable candidate case file beside results.json" }, ...error.problems]);
      }
      throw error;
    }
    notices.push(...loaded.notices);
    if (loaded.case.units !== results.units) {
      throw new CaseError([{ where: `${path}: units`, found: show(loaded.case.units), expected: `the design run's units (${results.units})` }]);
    }
    if (!loaded.case.outlet) {
      throw new CaseError([{ where: `${path}: outlet`, found: "nothing (the field is missing)", expected: "the candidate's outlet" }]);
    }
    return { reported, case: loaded.case, file: path };
  });
  return { directory, results, candidates, notices };
}
