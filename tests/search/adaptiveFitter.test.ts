// The default fitter of `design` (search/parallel/pool.ts `AdaptiveFitter`): the main thread while the run is
// short, all cores once the rest is worth the workers' start. The ranking is the same whichever,
// and wherever in the run it spread: the search through the built modules (the workers run
// dist/search/parallel/fitWorker.js) with a fitter that spreads after a few calls, against one that never does.
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { SETTLE_SECONDS, SPREAD_SECONDS, SYSTEM_SPREAD_SECONDS, worthSpreading } from "../../search/parallel/pool.js";

const dist = (path: string) => pathToFileURL(join(process.cwd(), "dist", path)).href;
const CASE = join(process.cwd(), "cases/small-compliant/case.json");

describe("spreading a run over the workers", () => {
  it("spreads when the time left, or the routings left at the rate so far, reach SPREAD_SECONDS, never before SETTLE_SECONDS", () => {
    expect(SPREAD_SECONDS).toBe(6);
    expect(SETTLE_SECONDS).toBe(2);
    // Under SETTLE_SECONDS: one thread, whatever remains, a compliant design in hand or not.
    expect(worthSpreading({ routings: 100, seconds: 0.5, compliant: 0 }, { routings: 1e9 })).toBe(false);
    expect(worthSpreading({ routings: 2000, seconds: 1.9, compliant: 3 }, { routings: 1e9 })).toBe(false);
    expect(worthSpreading({ routings: 0, seconds: 0.3, compliant: 1 }, { routings: 0, seconds: 8 * 3600 })).toBe(false);
    // A time budget: its time left.
    expect(worthSpreading({ routings: 0, seconds: 2 }, { routings: 0, seconds: 8 * 3600 })).toBe(true);
    expect(worthSpreading({ routings: 0, seconds: 2 }, { routings: 0, seconds: 7.5 })).toBe(false);
    expect(worthSpreading({ routings: 5000, seconds: 10 }, { routings: 0, seconds: 15.5 })).toBe(false);
    // A routing budget: unknown before anything is counted, then the routings left at the rate so far.
    expect(worthSpreading({ routings: 0, seconds: 2.4 }, { routings: 1e9 })).toBe(false);
    expect(worthSpreading({ routings: 5000, seconds: 2 }, { routings: 20000 })).toBe(true); // 15000 at 2500/s: 6 s
    expect(worthSpreading({ routings: 8000, seconds: 2 }, { routings: 20000 })).toBe(false); // 12000 at 4000/s: 3 s
    expect(worthSpreading({ routings: 20000, seconds: 5 }, { routings: 20000 })).toBe(false);
    // The parts' own routings left, when the progress gives them (parts that stopped early spend nothing more).
    expect(worthSpreading({ routings: 5000, seconds: 2, routingsLeft: 4000 }, { routings: 20000 })).toBe(false);
  });

  it("a system of ponds spreads only on a rest of SYSTEM_SPREAD_SECONDS (its workers gain less)", () => {
    expect(SYSTEM_SPREAD_SECONDS).toBe(30);
    // 15000 at 2500/s: 6 s, worth it for one pond, not for a system.
    expect(worthSpreading({ routings: 5000, seconds: 2 }, { routings: 20000 }, SYSTEM_SPREAD_SECONDS)).toBe(false);
    // The default two-ponds run as its first progress report saw it: 17 s projected (5 s were left).
    expect(worthSpreading({ routings: 2600, seconds: 2.6 }, { routings: 20000 }, SYSTEM_SPREAD_SECONDS)).toBe(false);
    expect(worthSpreading({ routings: 5000, seconds: 2 }, { routings: 80000 }, SYSTEM_SPREAD_SECONDS)).toBe(true); // 75000: 30 s
    expect(worthSpreading({ routings: 0, seconds: 2 }, { routings: 0, seconds: 31.5 }, SYSTEM_SPREAD_SECONDS)).toBe(false);
    expect(worthSpreading({ routings: 0, seconds: 2 }, { routings: 0, seconds: 32 }, SYSTEM_SPREAD_SECONDS)).toBe(true);
  });

  it("gives the same ranking when it spreads mid-run as in one thread throughout", async () => {
    const { loadCase } = await import(dist("src/case/load.js"));
    const { buildProblem } = await import(dist("search/engine/problem.js"));
    const { runSearch } = await import(dist("search/engine/run.js"));
    const { AdaptiveFitter } = await import(dist("search/parallel/pool.js"));
    const loaded = loadCase(CASE);
    const problem = buildProblem(loaded.case, loaded.data);
    const settings = { seed: "spread", starts: 3 };
    const search = async (spreadAfter: number) => {
      let calls = 0;
      const fitter = new AdaptiveFitter(problem, { path: CASE }, settings, 2, () => ++calls > spreadAfter);
      try {
        const run = await runSearch(problem, { seed: "spread", budget: 6000, top: 5, starts: 3, beam: 3, fitter });
        return { workers: run.workers, ranking: run.candidates.map((c: { file: unknown; cost: number }) => JSON.stringify(c.file) + " " + c.cost), routings: run.routings };
      } finally {
        await fitter.close();
      }
    };
    const inline = await search(Infinity);
    const spread = await search(6);
    expect(inline.workers).toBe(1);
    expect(spread.workers).toBe(2);
    expect(spread.ranking).toEqual(inline.ranking);
    expect(spread.routings).toBe(inline.routings);
  }, 120_000);

  it("keeps a short default run in the main thread, with the ranking of two workers", () => {
    const cli = join(process.cwd(), "dist/src/cli.js");
    const run = (...args: string[]) => JSON.parse(spawnSync(process.execPath, [cli, "design", CASE, "--budget", "2000", "--json", "--quiet", ...args], { encoding: "utf8", timeout: 120_000 }).stdout);
    const byDefault = run();
    const two = run("--workers", "2");
    expect(byDefault.search.workers).toBe(1);
    expect(two.search.workers).toBe(2);
    expect(byDefault.candidates).toEqual(two.candidates);
  }, 120_000);
});
