// Systems of ponds: the cost of routing the bundled two-ponds demo (an equaliser pipe between two
// ponds, flow back through it) with both ponds solved together at every step, against the two
// single-pond routings it replaces: the upper pond routed alone to a free outfall, then the lower pond
// routed alone on its own inflow plus the upper pond's routed outflow (the hand method, which cannot
// see the lower pond's level acting on the pipe). Tables are built once, outside the timings, as the
// routing of one case's storms and the search use them.
import { fileURLToPath } from "node:url";
import { loadCase } from "../src/case/load.js";
import { sumHydrographs } from "../src/case/system.js";
import type { Hydrograph } from "../src/model.js";
import { buildRatingTable } from "../src/routing/ratingTable.js";
import { route, type RouteOptions } from "../src/routing/router.js";
import { stormInflows, systemPonds } from "../src/routing/routeSystem.js";
import { routeSystem } from "../src/routing/systemRouter.js";
import { buildLinkTable } from "../src/routing/linkTable.js";
import { FOOT } from "../src/units.js";
import { formatNumber, report, time } from "./measure.js";
import type { BenchSection } from "./section.js";

function run(): void {
  const c = loadCase(fileURLToPath(new URL("../../cases/two-ponds/case.json", import.meta.url))).case;
  const system = c.system!;
  const [upper, lower] = system.ponds;
  const outlets = system.ponds.map((p) => p.outlet);
  const storm = c.storms[c.storms.length - 1];
  const inflows = stormInflows(storm, system);
  const cfs = FOOT ** 3;

  const linkTime = time(() => buildLinkTable(upper.outlet, upper.pond, lower.pond), { rounds: 3 });
  const { ponds } = systemPonds(c, system, outlets);
  const link = ponds[0].link!;

  // The two single-pond routings: the upper pond to a free outfall, then the lower pond.
  const upperTable = buildRatingTable(upper.pond, upper.outlet, { kind: "free" });
  const lowerTable = buildRatingTable(lower.pond, lower.outlet, c.tailwater);
  const drained = (p: typeof upper): RouteOptions => ({ startStage: p.pond.pool, drainedStage: p.pond.pool + c.criteria.drawdownDepth });
  const upperAlone = route(upperTable, inflows[0]!, { ...drained(upper), record: true });
  const upperOut: Hydrograph = { times: Float64Array.from(upperAlone.series!.time), flows: Float64Array.from(upperAlone.series!.outflow) };
  const lowerInflow = sumHydrographs([inflows[1], upperOut]);
  const lowerAlone = route(lowerTable, lowerInflow, drained(lower));
  const pair = (step?: number) => () => {
    route(upperTable, inflows[0]!, { ...drained(upper), step });
    route(lowerTable, lowerInflow, { ...drained(lower), step });
  };
  const pairAutomatic = time(pair());
  const pairFixed = time(pair(60));

  // The system, both ponds together.
  const together = routeSystem(ponds, inflows, {});
  const systemAutomatic = time(() => routeSystem(ponds, inflows, {}));
  const fixed = routeSystem(ponds, inflows, { step: 60 });
  const systemFixed = time(() => routeSystem(ponds, inflows, { step: 60 }));
  const ratio = (a: number, b: number) => `${formatNumber(a / b)} x`;

  report(`systems of ponds: the two-ponds demo, ${storm.name} storm, to drained`, [
    ["link table (pipe, both stages)", `${link.up.length} x ${link.down.length} nodes, built in ${formatNumber(linkTime.seconds * 1e3)} ms (median ${formatNumber(linkTime.median * 1e3)} ms)`],
    ["system, automatic step", `${together.steps} steps, ${together.iterations} Newton iterations, peak at the outfall ${formatNumber(together.peakOutflow / cfs)} cfs, back ${formatNumber(together.ponds[0].peakReverse / cfs)} cfs`],
    ["  system routings per second", `${formatNumber(1 / systemAutomatic.seconds)} (median ${formatNumber(1 / systemAutomatic.median)})`],
    ["two single-pond routings, automatic", `${upperAlone.steps} + ${lowerAlone.steps} steps, peak at the outfall ${formatNumber(lowerAlone.peakOutflow / cfs)} cfs (no flow back)`],
    ["  pairs per second", `${formatNumber(1 / pairAutomatic.seconds)} (median ${formatNumber(1 / pairAutomatic.median)})`],
    ["  system / pair (cost)", ratio(systemAutomatic.seconds, pairAutomatic.seconds)],
    ["system, fixed 1-min step", `${fixed.steps} steps, ${fixed.iterations} Newton iterations`],
    ["  system routings per second", `${formatNumber(1 / systemFixed.seconds)} (median ${formatNumber(1 / systemFixed.median)})`],
    ["two single-pond routings, fixed 1-min", `pairs per second ${formatNumber(1 / pairFixed.seconds)} (median ${formatNumber(1 / pairFixed.median)})`],
    ["  system / pair (cost)", ratio(systemFixed.seconds, pairFixed.seconds)],
  ]);
}

export const systemsSection: BenchSection = { name: "systems", run };
