// Fits done ahead by an idle worker (search/parallel/pool.ts, `fit`'s `ahead`): a later round that holds the
// job takes that outcome, and it is the outcome the job has when fitted in its own round, so the
// search's ranking does not depend on what was guessed. Through the built modules (the workers run
// dist/search/parallel/fitWorker.js).
import { describe, expect, it } from "vitest";
import { join } from "node:path";
import { pathToFileURL } from "node:url";

const dist = (path: string) => pathToFileURL(join(process.cwd(), "dist", path)).href;
const CASE = join(process.cwd(), "cases/small-compliant/case.json");

describe("fits done ahead", () => {
  it("a round takes the outcome a worker fitted ahead, the same as fitting the job in that round", async () => {
    const { loadCase } = await import(dist("src/case/load.js"));
    const { buildProblem } = await import(dist("search/engine/problem.js"));
    const { planning, scoreHere } = await import(dist("search/engine/layouts.js"));
    const { layoutKey } = await import(dist("search/engine/layout.js"));
    const { WorkerFitter } = await import(dist("search/parallel/pool.js"));
    const loaded = loadCase(CASE);
    const problem = buildProblem(loaded.case, loaded.data);
    const layouts = scoreHere(problem, planning(problem, 3)).result.layouts.slice(0, 4);
    expect(layouts.length).toBe(4);
    const jobs = layouts.map(({ layout }: { layout: unknown }) => ({ key: layoutKey(layout), layout }));
    const settings = { seed: "ahead", starts: 2 };
    const never = () => false;

    // Round one holds one job; the second worker is idle and fits the other three ahead.
    const guessing = new WorkerFitter(problem, { path: CASE }, settings, 2);
    const alone = new WorkerFitter(problem, { path: CASE }, settings, 2);
    try {
      const heard: number[] = [];
      await guessing.fit([jobs[0]], () => {}, never, jobs.slice(1));
      const taken = await guessing.fit(jobs.slice(1), (i: number) => heard.push(i), never);
      expect(guessing.aheadStarted).toBeGreaterThanOrEqual(1);
      expect(guessing.aheadUsed).toBe(guessing.aheadStarted);
      // Every outcome was heard (the journal's) and placed by its job.
      expect(heard.sort()).toEqual([0, 1, 2]);
      const fresh = await alone.fit(jobs.slice(1), () => {}, never);
      expect(alone.aheadUsed).toBe(0);
      expect(taken).toEqual(fresh);
    } finally {
      await guessing.close();
      await alone.close();
    }
  }, 120_000);
});
