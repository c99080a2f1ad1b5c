// design on a system of ponds (the bundled cases/two-ponds: an equaliser pipe from the upper pond into
// the lower pond, whose outlet drains to the outfall): the outlets of both ponds designed together and
// judged by the system routed together; the explanation names the pond and the check that binds and
// what relaxes it; the existing system is row 0; kept parts stay; the same ranking on 1 and 2 workers,
// from a journal, and split into shards and gathered; and a single pond written as a `ponds` list of
// one designs exactly as the single pond. Every candidate is checked again through `route` on the case
// file the run wrote (itself checked against odex in tests/routing/systemOde.test.ts).
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { loadCase } from "../../src/case/load.js";
import { buildProblem } from "../../search/engine/problem.js";
import { runSearch, type JournalEntry } from "../../search/engine/run.js";
import { routeSystemCase } from "../../src/routing/routeSystem.js";
import { assessSystem } from "../../src/assess/systemAssess.js";

const cli = join(process.cwd(), "dist/src/cli.js");
const CASE = "cases/two-ponds/case.json";
const dir = (name: string) => mkdtempSync(join(tmpdir(), `outfit-${name}-`));

function outfit(...args: string[]) {
  const r = spawnSync(process.execPath, [cli, ...args], { encoding: "utf8", timeout: 600_000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

interface SystemCandidate {
  rank: number;
  description: string;
  ponds: { name: string; outlet: unknown }[];
  storms: { name: string; peakOutflow: number; ratio: number | null; ponds: { name: string; maxStage: number; peakReverse: number }[] }[];
  compliant: boolean;
  cost: number;
  binding: { name: string; pond?: string } | null;
  explanation: string[];
  caseFile: string;
}

describe("design on a system of ponds (cases/two-ponds)", () => {
  const out = dir("system-design");
  const run = outfit("design", CASE, "--budget", "3000", "--workers", "1", "--json", "--quiet", "--out", out);
  const json = JSON.parse(run.stdout) as { search: { success: boolean; routings: number }; candidates: SystemCandidate[]; baseline?: { ponds: { name: string }[]; compliant: boolean; verdict: string } };

  it("finds a compliant system and explains it: the pond and the check that bind, and a move that relaxes it", () => {
    expect(run.code).toBe(0);
    expect(json.search.success).toBe(true);
    const best = json.candidates[0];
    expect(best.compliant).toBe(true);
    // Every pond's outlet, ready to paste back (the contract's ponds of a design).
    expect(best.ponds.map((p) => p.name)).toEqual(["upper", "lower"]);
    expect(best.binding).not.toBeNull();
    expect(["upper", "lower", "outfall"]).toContain(best.binding!.pond);
    expect(best.binding!.name.startsWith(`${best.binding!.pond}: `)).toBe(true);
    expect(best.explanation[0]).toMatch(/^binding: (upper|lower|outfall): /);
    const relax = best.explanation.filter((line) => line.startsWith("relax: "));
    expect(relax.length).toBeGreaterThan(0);
    // A move of an elevation of a named pond, a pipe size, or the rule's remedy in the pond that binds.
    expect(relax.some((line) => / of pond (upper|lower) /.test(line) || /the pipe of pond upper/.test(line) || new RegExp(`^relax: (in pond ${best.binding!.pond}|at the outfall), `).test(line))).toBe(true);
  });

  it("each candidate's case file routes as the run reported it (the ponds together, the flow at the outfall and each pond)", () => {
    for (const candidate of json.candidates.slice(0, 3)) {
      const c = loadCase(join(out, candidate.caseFile)).case;
      expect(c.system!.ponds.map((p) => p.name)).toEqual(["upper", "lower"]);
      const routing = routeSystemCase(c);
      const assessment = assessSystem(c, routing);
      expect(assessment.compliant).toBe(candidate.compliant);
      routing.storms.forEach(({ result }, k) => {
        const reported = candidate.storms[k];
        expect(result.peakOutflow / 0.3048 ** 3).toBeCloseTo(reported.peakOutflow, 6);
        result.ponds.forEach((p, i) => expect(p.maxStage / 0.3048).toBeCloseTo(reported.ponds[i].maxStage, 6));
      });
    }
  });

  it("shows the existing system as row 0 (its ponds as given, routed together) and what the alternatives save", () => {
    expect(json.baseline).toBeDefined();
    expect(json.baseline!.ponds.map((p) => p.name)).toEqual(["upper", "lower"]);
    expect(json.baseline!.verdict).toMatch(/^The existing system is /);
    const text = readFileSync(join(out, "summary.txt"), "utf8");
    expect(text).toContain("Row 0 is the existing system");
    expect(text).toMatch(/\n0 +upper: 30 in barrel/);
  });

  it("report on the run compares the candidates against the existing system and reports the first system in full", () => {
    const r = outfit("report", out, "--format", "md", "--out", join(out, "review", "run.md"));
    expect(r.code).toBe(0);
    const md = readFileSync(join(out, "review", "run.md"), "utf8");
    expect(md).toContain("## 2 Candidates compared");
    expect(md).toContain("Against the existing system (row 0: every pond's outlet as the case gives it");
    expect(md).toContain("### 4.1 Pond upper");
    expect(md).toContain("upper: outlet structure, elevation");
    expect(md).toContain("lower: outlet structure, elevation");
    expect(md).not.toContain("does not match the design run's results");
  });
});

/** The demo with the lower pond's riser kept as it is. */
function keptRiserCase(): string {
  const json = JSON.parse(readFileSync(CASE, "utf8"));
  json.ponds[1].outlet.riser.keep = true;
  const file = join("cases", "two-ponds", "kept-riser.tmp.json");
  writeFileSync(file, JSON.stringify(json));
  return file;
}

describe("design on a system: kept parts, workers, journal, shards", () => {
  it("keeps a kept part of a pond's outlet in every candidate", () => {
    const file = keptRiserCase();
    try {
      const r = outfit("design", file, "--budget", "2000", "--workers", "1", "--json", "--quiet");
      expect(r.code).toBe(0);
      const candidates = (JSON.parse(r.stdout) as { candidates: SystemCandidate[] }).candidates;
      expect(candidates.length).toBeGreaterThan(0);
      const given = JSON.parse(readFileSync(CASE, "utf8")).ponds[1].outlet.riser as { diameter: number; crest: number };
      for (const c of candidates) {
        const riser = (c.ponds[1].outlet as { riser: { diameter: number; crest: number } }).riser;
        expect(riser.diameter).toBe(given.diameter);
        expect(riser.crest).toBe(given.crest);
      }
    } finally {
      rmSync(file);
    }
  });

  it("gives the same ranking on 1 and on 2 workers", () => {
    const ranking = (stdout: string) => (JSON.parse(stdout) as { candidates: SystemCandidate[] }).candidates.map((c) => JSON.stringify(c.ponds) + " " + c.cost);
    const one = outfit("design", CASE, "--budget", "2000", "--workers", "1", "--json", "--quiet");
    const two = outfit("design", CASE, "--budget", "2000", "--workers", "2", "--json", "--quiet");
    expect(two.code).toBe(0);
    expect(ranking(two.stdout)).toEqual(ranking(one.stdout));
  });

  it("replays a journal into the same ranking, and shards gathered give the single run's (two parts)", async () => {
    const loaded = loadCase(CASE);
    const problem = buildProblem(loaded.case, loaded.data);
    const options = { seed: "outfit", budget: 10_000, top: 5, starts: 3, beam: 3 };
    const journal: JournalEntry[] = [];
    const single = await runSearch(problem, { ...options, onLayout: (e) => journal.push(e) });
    expect(single.parts).toBe(2);
    const rank = (r: typeof single) => r.candidates.map((c) => `${c.description} ${c.cost}`);
    const done = new Map(journal.map((e) => [e.key, e]));
    const replayed = await runSearch(problem, { ...options, done });
    expect(rank(replayed)).toEqual(rank(single));
    expect(replayed.layoutsFromJournal).toBe(replayed.layoutsFitted);
    // Two shards, each its share of the parts; gathered from their journals the ranking is the single run's.
    const shards: JournalEntry[] = [];
    for (const index of [1, 2]) {
      const part = await runSearch(problem, { ...options, shard: { index, count: 2 }, onLayout: (e) => shards.push(e) });
      expect(part.partsRun).toBe(1);
    }
    const gathered = await runSearch(problem, { ...options, done: new Map(shards.map((e) => [e.key, e])) });
    expect(rank(gathered)).toEqual(rank(single));
    expect(gathered.layoutsFromJournal).toBe(gathered.layoutsFitted);
  }, 900_000);
});

describe("a single pond written as a `ponds` list of one", () => {
  it.each(["demo", "si-wet-barrel"])("%s: design gives exactly the single pond's ranking, each candidate with its ponds", (name) => {
    const file = join("cases", name, "case.json");
    const json = JSON.parse(readFileSync(file, "utf8"));
    const { pond, outlet, ...rest } = json;
    const one = join("cases", name, "as-system-of-one.tmp.json");
    writeFileSync(one, JSON.stringify({ ...rest, ponds: [{ name: "only", pond, outlet, to: "outfall" }] }));
    try {
      // In this process too: the listed pond's problem is the single pond's.
      const loaded = loadCase(one);
      expect(buildProblem(loaded.case, loaded.data).listedPond).toBe("only");
      const single = JSON.parse(outfit("design", file, "--budget", "2000", "--workers", "1", "--json", "--quiet").stdout) as { candidates: (SystemCandidate & { outlet: unknown; error: number })[] };
      const listed = JSON.parse(outfit("design", one, "--budget", "2000", "--workers", "1", "--json", "--quiet").stdout) as typeof single;
      expect(listed.candidates.map((c) => [c.description, c.cost, c.error, JSON.stringify(c.outlet)])).toEqual(single.candidates.map((c) => [c.description, c.cost, c.error, JSON.stringify(c.outlet)]));
      for (const c of listed.candidates) expect(c.ponds).toEqual([{ name: "only", outlet: c.outlet }]);
    } finally {
      rmSync(one);
    }
  });
});
