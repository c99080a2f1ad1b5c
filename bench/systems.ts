// Systems of ponds: the cost of routing the bundled two-ponds demo (an equaliser pipe between two
// ponds, flow back through it) with both ponds solved together at every step, against the two
// single-pond routings it replaces: the upper pond routed alone to a free outfall, then the lower pond
// routed alone on its own inflow plus the upper pond's routed outflow (the hand method, which cannot
// see the lower pond's level acting on the pipe). Every storm of the demo, automatic and fixed 1-min
// steps. Tables are built once, outside the timings, as the routing of one case's storms and the
// search use them. The cost is the processor time of the process, the two alternating round by round
// (`compare`): on a shared machine wall time counts the waits for a core.
import { fileURLToPath } from "node:url";
import { loadCase } from "../src/case/load.js";
import { sumHydrographs } from "../src/hydrology/hydrograph.js";
import type { Hydrograph } from "../src/model.js";
import { buildRatingTable } from "../src/routing/ratingTable.js";
import { route, type RouteOptions } from "../src/routing/router.js";
import { stormInflows, systemPonds } from "../src/routing/routeSystem.js";
import { routeSystem } from "../src/routing/systemRouter.js";
import { buildLinkTable } from "../src/routing/linkTable.js";
import { FOOT } from "../src/units.js";
import { compare, formatNumber, report, time, type Comparison } from "./measure.js";
import type { BenchSection } from "./section.js";

function run(): void {
  const c = loadCase(fileURLToPath(new URL("../../cases/two-ponds/case.json", import.meta.url))).case;
  const system = c.system!;
  const [upper, lower] = system.ponds;
  const outlets = system.ponds.map((p) => p.outlet);
  const cfs = FOOT ** 3;

  const linkTime = time(() => buildLinkTable(upper.outlet, upper.pond, lower.pond), { rounds: 3 });
  const { ponds } = systemPonds(c, system, outlets);
  const link = ponds[0].link!;

  // The two single-pond routings of each storm: the upper pond to a free outfall, then the lower pond.
  const upperTable = buildRatingTable(upper.pond, upper.outlet, { kind: "free" });
  const lowerTable = buildRatingTable(lower.pond, lower.outlet, c.tailwater);
  const drained = (p: typeof upper): RouteOptions => ({ startStage: p.pond.pool, drainedStage: p.pond.pool + c.criteria.drawdownDepth });
  const storms = c.storms.map((storm) => {
    const inflows = stormInflows(storm, system);
    const upperAlone = route(upperTable, inflows[0]!, { ...drained(upper), record: true });
    const upperOut: Hydrograph = { times: Float64Array.from(upperAlone.series!.time), flows: Float64Array.from(upperAlone.series!.outflow) };
    const lowerInflow = sumHydrographs([inflows[1], upperOut]);
    return { storm, inflows, lowerInflow, upperSteps: upperAlone.steps, lowerSteps: route(lowerTable, lowerInflow, drained(lower)).steps };
  });
  const pair = (step?: number) => () => {
    for (const s of storms) {
      route(upperTable, s.inflows[0]!, { ...drained(upper), step });
      route(lowerTable, s.lowerInflow, { ...drained(lower), step });
    }
  };
  const together = (step?: number) => () => {
    for (const s of storms) routeSystem(ponds, s.inflows, { step });
  };
  const automatic = compare(together(), pair());
  const fixed = compare(together(60), pair(60));
  const results = storms.map((s) => routeSystem(ponds, s.inflows, {}));
  const count = storms.length;
  const perSecond = (x: Comparison["a"]) => `${formatNumber(count / x.median)} a second (fastest round ${formatNumber(count / x.fastest)})`;
  const ratio = (x: Comparison) => `${formatNumber(x.ratio.median)} x (rounds ${formatNumber(x.ratio.least)} to ${formatNumber(x.ratio.most)}; aim 3 x)`;
  const last = results[count - 1];

  report(`systems of ponds: the two-ponds demo, its ${count} storms, to drained (processor time)`, [
    ["link table (pipe, both stages)", `${link.up.length} x ${link.down.length} nodes, built in ${formatNumber(linkTime.seconds * 1e3)} ms (median ${formatNumber(linkTime.median * 1e3)} ms)`],
    ["system, automatic step", `${results.map((r) => r.steps).join(" + ")} steps, ${formatNumber(results.reduce((n, r) => n + r.iterations, 0) / results.reduce((n, r) => n + r.steps, 0))} Newton iterations a step; ${last.ponds.length} ponds, ${storms[count - 1].storm.name}: outfall ${formatNumber(last.peakOutflow / cfs)} cfs, back ${formatNumber(last.ponds[0].peakReverse / cfs)} cfs`],
    ["  system routings (a storm)", perSecond(automatic.a)],
    ["two single-pond routings, automatic", `${storms.map((s) => `${s.upperSteps} + ${s.lowerSteps}`).join(", ")} steps`],
    ["  pairs (a storm)", perSecond(automatic.b)],
    ["  system / pair (cost)", ratio(automatic)],
    ["system, fixed 1-min step", perSecond(fixed.a)],
    ["two single-pond routings, fixed 1-min", perSecond(fixed.b)],
    ["  system / pair (cost)", ratio(fixed)],
  ]);
}

export const systemsSection: BenchSection = { name: "systems", run };
