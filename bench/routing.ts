// Routing throughput: the fixed-step loop (a 24-hour storm at 1-minute steps), the automatic mode,
// the naive bisection router as the baseline, a bare loop as the floor, the rating table build, and
// the heap before and after many routings.
import { fileURLToPath } from "node:url";
import { loadCase } from "../src/case/load.js";
import type { Hydrograph } from "../src/model.js";
import { buildRatingTable } from "../src/routing/ratingTable.js";
import { route } from "../src/routing/router.js";
import { drainedStage } from "../src/routing/routeCase.js";
import { storageCurve } from "../src/storage/curve.js";
import { FOOT } from "../src/units.js";
import { formatNumber, heapUsed, megabytes, nanoseconds, report, time } from "./measure.js";
import { routeNaive } from "./naiveRouter.js";
import { bareLoop } from "./bareLoop.js";
import type { BenchSection } from "./section.js";

/**
 * An invented 24-hour storm for the demo pond: a sharp peak of 60 cfs at 12 h on a broad base of
 * 4 cfs, given every 6 minutes (241 points), zero at both ends.
 */
export function dayLongStorm(): Hydrograph {
  const cfs = FOOT ** 3;
  const times: number[] = [];
  const flows: number[] = [];
  for (let minute = 0; minute <= 1440; minute += 6) {
    const hours = minute / 60;
    const flow = 60 * Math.exp(-(((hours - 12) / 0.8) ** 2)) + 4 * Math.sin((Math.PI * hours) / 24);
    times.push(minute * 60);
    flows.push(minute === 0 || minute === 1440 ? 0 : flow * cfs);
  }
  return { times: Float64Array.from(times), flows: Float64Array.from(flows) };
}

function run(): void {
  const c = loadCase(fileURLToPath(new URL("../../cases/demo/case.json", import.meta.url))).case;
  const outlet = c.outlet!;
  const table = buildRatingTable(c.pond, outlet, c.tailwater);
  const storm = dayLongStorm();
  const start = c.pond.pool;
  const drained = drainedStage(c);
  const options = { startStage: start, drainedStage: drained };
  const fixedOptions = { ...options, step: 60 };

  // Fixed 1-minute step.
  const fixed = route(table, storm, fixedOptions);
  const fixedTime = time(() => route(table, storm, fixedOptions));
  const perStep = (seconds: number, steps: number) => (seconds / steps) * 1e9;
  const nsFixed = perStep(fixedTime.seconds, fixed.steps);

  // Baseline: bisection on the storage curve at every step.
  const curve = storageCurve(c.pond);
  const naive = routeNaive(curve, table, storm, 60, start, drained);
  const naiveTime = time(() => routeNaive(curve, table, storm, 60, start, drained), { rounds: 3 });
  const nsNaive = perStep(naiveTime.seconds, naive.steps);

  // Floor: the bare storage-indication recurrence on the same table, no bookkeeping.
  const floorSteps = fixed.steps;
  const floorTime = time(() => bareLoop(table, storm, 60, floorSteps));
  const nsFloor = perStep(floorTime.seconds, floorSteps);

  // Automatic step.
  const automatic = route(table, storm, options);
  const automaticTime = time(() => route(table, storm, options));

  // Rating table.
  const buildTime = time(() => buildRatingTable(c.pond, outlet, c.tailwater), { rounds: 5 });

  const cfs = FOOT ** 3;
  report("routing: demo pond, invented 24-hour storm (peak 64 cfs), to drained", [
    ["rating table", `${table.stage.length} stages, built in ${formatNumber(buildTime.seconds * 1e3)} ms (median ${formatNumber(buildTime.median * 1e3)} ms)`],
    ["fixed 1-min step", `${fixed.steps} steps (${formatNumber((fixed.duration / 3600))} h), peak ${formatNumber(fixed.peakOutflow / cfs)} cfs`],
    ["  per step", nanoseconds(nsFixed, perStep(fixedTime.median, fixed.steps))],
    ["  steps per second", `${formatNumber(1e9 / nsFixed / 1e6)} million`],
    ["  storms per second", formatNumber(1 / fixedTime.seconds)],
    ["baseline: bisection on storage", `${naive.steps} steps, peak ${formatNumber(naive.peakOutflow / cfs)} cfs`],
    ["  per step", nanoseconds(nsNaive, perStep(naiveTime.median, naive.steps))],
    ["  storms per second", formatNumber(1 / naiveTime.seconds)],
    ["  router speed-up over baseline", `${formatNumber(nsNaive / nsFixed)} x`],
    ["floor: bare recurrence, no bookkeeping", `${nanoseconds(nsFloor, perStep(floorTime.median, floorSteps))} per step`],
    ["  router / floor", `${formatNumber(nsFixed / nsFloor)} x`],
    ["automatic step", `${automatic.steps} steps of ${formatNumber(automatic.smallestStep)} to ${formatNumber(automatic.largestStep)} s, ${automatic.redoneSteps} redone, peak ${formatNumber(automatic.peakOutflow / cfs)} cfs`],
    ["  per step", nanoseconds(perStep(automaticTime.seconds, automatic.steps), perStep(automaticTime.median, automatic.steps))],
    ["  storms per second", formatNumber(1 / automaticTime.seconds)],
  ]);

  // Memory: many routings must not grow the heap.
  const routings = 20_000;
  const before = heapUsed();
  let sink = 0;
  for (let i = 0; i < routings; i++) sink += route(table, storm, fixedOptions).peakOutflow;
  const after = heapUsed();
  const recordOptions = { ...fixedOptions, record: true };
  for (let i = 0; i < 200; i++) sink += route(table, storm, recordOptions).series!.time.length;
  const afterRecorded = heapUsed();
  report(`memory: heap in use after a full collection`, [
    ["before", megabytes(before)],
    [`after ${routings} fixed-step routings`, `${megabytes(after)} (${after >= before ? "+" : ""}${formatNumber((after - before) / 1024)} kB)`],
    ["after 200 more with the series recorded", `${megabytes(afterRecorded)} (series dropped once used)`],
    ["(checksum)", formatNumber(sink)],
  ]);
}

export const routingSection: BenchSection = { name: "routing", run };
