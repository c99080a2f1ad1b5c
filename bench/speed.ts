// The rating sweep against the direct evaluation, in the same run: for every bundled case the search
// with the sweep's tables and warm starts ("after") and with every stage evaluated directly
// ("before", `referencePath`), each given the same budget, alternated and repeated (the fastest
// repetition counts: the least disturbed on a shared machine). Printed: routings per second, time
// and routings to the first compliant design (by the wall clock, and the processor time until it was
// in hand: `onFirstCompliant`); for a case with a barrel or a tailwater rating also
// the same pond without them (no barrel, free outfall), the yardstick of the barrel's cost, alternated
// with the other two in each repetition.
// Routings per second count every storm routed in the process (`routingTally`): the search's scores
// and fits, and also the `route` path's routings of the candidates, of their explanations and of the
// existing outlet, whose processor time the search's own count (`SearchRun.routings`) would charge
// without their routings. That count is printed too ("search only"); it favours the pond with fewer
// candidates and cheaper explanations. The searches here run in this thread (no fitter given: the
// inline one), so the tally sees all their routings.
// `OUTFIT_BENCH_CASES=demo,wet-value` limits the section to those cases.
import { readdirSync, existsSync } from "node:fs";
import { join } from "node:path";
import { loadCase } from "../src/case/load.js";
import type { Case } from "../src/model.js";
import type { CaseFile } from "../src/case/schema.js";
import { buildProblem } from "../search/engine/problem.js";
import { runSearch } from "../search/engine/run.js";
import { routingTally } from "../src/routing/router.js";
import type { BenchSection } from "./section.js";

/** Routings per search here: enough for the first compliant design on every bundled case. */
const SPEED_BUDGET = 4000;
const REPEATS = 5;
/** The steadier after/plain ratio: searches of this many routings (a few tenths of a second to a
 * second each, so that compiling and collecting weigh less than in the short ones), after one of
 * each to warm up, alternated STEADY_REPEATS times; the median of each. */
const STEADY_BUDGET = 20000;
const STEADY_REPEATS = 3;

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

interface Figures {
  /** Every routing of the process (`routingTally`) per processor second. */
  perSecond: number;
  /** The search's own count of routings per processor second. */
  searchPerSecond: number;
  firstSeconds: number | null;
  /** Processor seconds until the first compliant design was in hand (its fit ended and it was routed). */
  firstProcessorSeconds: number | null;
  firstRoutings: number | null;
}

/** One search; routings per second of this process's processor time (on a loaded machine the wall
 * clock also counts other work's turns), the time to the first compliant design by the wall clock. */
async function search(c: Case, file: CaseFile, direct: boolean, budget = SPEED_BUDGET): Promise<Figures> {
  const tally = routingTally.count;
  const cpu = process.cpuUsage();
  const processorSeconds = () => {
    const used = process.cpuUsage(cpu);
    return (used.user + used.system) / 1e6;
  };
  let firstProcessorSeconds: number | null = null;
  // Heard as soon as the first compliant design is in hand, not at the end of its round.
  const onFirstCompliant = () => {
    firstProcessorSeconds = processorSeconds();
  };
  const run = await runSearch(buildProblem(c, file, { referencePath: direct }), { seed: "bench", budget, top: 1, starts: 3, beam: 3, onFirstCompliant });
  const seconds = processorSeconds();
  return { perSecond: (routingTally.count - tally) / seconds, searchPerSecond: run.routings / seconds, firstSeconds: run.secondsToFirstCompliant, firstProcessorSeconds, firstRoutings: run.routingsToFirstCompliant };
}

/** The fastest of the repetitions (the same routings each time: the search is deterministic). */
function fastest(runs: Figures[]): Figures {
  const best = runs.reduce((a, b) => (b.perSecond > a.perSecond ? b : a));
  const least = (pick: (f: Figures) => number | null) => runs.reduce<number | null>((m, f) => (pick(f) === null ? m : m === null ? pick(f) : Math.min(m, pick(f)!)), null);
  const searchBest = runs.reduce((m, f) => Math.max(m, f.searchPerSecond), 0);
  return { ...best, searchPerSecond: searchBest, firstSeconds: least((f) => f.firstSeconds), firstProcessorSeconds: least((f) => f.firstProcessorSeconds) };
}

/** The case without its barrel and with a free outfall. */
function withoutBarrel(c: Case, file: CaseFile): { c: Case; file: CaseFile } {
  const outlet = { ...c.outlet! };
  delete outlet.barrel;
  const fileOutlet = { ...file.outlet };
  delete fileOutlet.barrel;
  const plainFile = { ...file, outlet: fileOutlet };
  delete plainFile.tailwater;
  return { c: { ...c, outlet, tailwater: { kind: "free" } }, file: plainFile };
}

async function run(): Promise<void> {
  const casesDir = join(process.cwd(), "cases");
  const rows: string[][] = [];
  const only = process.env.OUTFIT_BENCH_CASES?.split(",").filter((n) => n !== "");
  for (const name of readdirSync(casesDir).sort()) {
    if (only && !only.includes(name)) continue;
    const path = join(casesDir, name, "case.json");
    if (!existsSync(path)) continue;
    const loaded = loadCase(path);
    if (!loaded.data.catalogue) continue;
    const before: Figures[] = [];
    const after: Figures[] = [];
    const plainRuns: Figures[] = [];
    const special = loaded.case.outlet?.barrel !== undefined || loaded.case.tailwater.kind === "rating";
    const bare = special ? withoutBarrel(loaded.case, loaded.data) : null;
    for (let r = 0; r < REPEATS; r++) {
      before.push(await search(loaded.case, loaded.data, true));
      after.push(await search(loaded.case, loaded.data, false));
      if (bare) plainRuns.push(await search(bare.c, bare.file, false));
    }
    const b = fastest(before);
    const a = fastest(after);
    let plain = "";
    if (bare) {
      const p = fastest(plainRuns);
      // The ratio of each repetition with its own plain twin, as a range, and of the fastest of each.
      const ratios = after.map((f, i) => f.perSecond / plainRuns[i].perSecond);
      const range = `${Math.min(...ratios).toFixed(2)}-${Math.max(...ratios).toFixed(2)}`;
      // The steadier measure: longer searches, warmed up, medians.
      await search(loaded.case, loaded.data, false, STEADY_BUDGET);
      await search(bare.c, bare.file, false, STEADY_BUDGET);
      const steadyAfter: number[] = [];
      const steadyPlain: number[] = [];
      for (let r = 0; r < STEADY_REPEATS; r++) {
        steadyAfter.push((await search(loaded.case, loaded.data, false, STEADY_BUDGET)).perSecond);
        steadyPlain.push((await search(bare.c, bare.file, false, STEADY_BUDGET)).perSecond);
      }
      const steady = median(steadyAfter) / median(steadyPlain);
      plain = `${Math.round(p.perSecond)} (after/plain ${(a.perSecond / p.perSecond).toFixed(2)}, per repetition ${range}; search only ${(a.searchPerSecond / p.searchPerSecond).toFixed(2)}; ${STEADY_BUDGET}-routing searches, medians: ${Math.round(median(steadyAfter))} / ${Math.round(median(steadyPlain))} = ${steady.toFixed(2)})`;
    }
    const first = (f: Figures) => (f.firstSeconds === null ? "none" : `${f.firstSeconds.toFixed(3)} s (${f.firstProcessorSeconds?.toFixed(3)} s) / ${f.firstRoutings}`);
    rows.push([
      name + (loaded.case.outlet?.barrel ? " (barrel)" : "") + (loaded.case.tailwater.kind === "rating" ? " (tailwater rating)" : ""),
      String(Math.round(b.perSecond)),
      String(Math.round(a.perSecond)),
      `${(a.perSecond / b.perSecond).toFixed(2)} x`,
      first(b),
      first(a),
      plain || "-",
    ]);
  }
  const header = ["case", "every routing per processor second, before", "after", "speed-up", "first compliant before: wall time (processor time) / routings", "after", "same pond, no barrel, free outfall: routings/s"];
  console.log(`\nRating sweep against the direct evaluation (budget ${SPEED_BUDGET} routings per search, fastest of ${REPEATS} alternated repetitions; every routing of the process counted, the search's and the route path's)`);
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((l) => l[i].length)));
  console.log(header.map((h, i) => h.padEnd(widths[i])).join("  "));
  for (const l of rows) console.log(l.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join("  "));
}

export const speedSection: BenchSection = { name: "speed", run };
