// The report's storage blocks: the storms' limit levels, the estimates side by side with the storage
// the routed outlet uses, the sizing trade-off of a case with site limits, and what an underground
// system or exfiltration adds.
import type { Case } from "../../model.js";
import type { CaseRouting } from "../../routing/routeCase.js";
import { formatter } from "../../format.js";
import { storageCurve } from "../../storage/curve.js";
import { systemTop } from "../../storage/underground.js";
import { hydrologyUnits } from "../../units.js";
import { caseEstimates, METHOD_SOURCES, sizingEstimate, type StormEstimate, type StormEstimateInputs } from "../../sizing/stormEstimates.js";
import { CATALOGUE_ALLOWANCE, choosePond } from "../../sizing/pondChoice.js";
import { pondCostWeights } from "../../sizing/pondCost.js";
import { blockedWords } from "../pondSizing.js";
import { limitWords, stageText } from "../volume.js";
import type { Block, Cell, TableBlock } from "./model.js";

/** The estimates of each storm and, last, the storage the routed outlet uses, against the storm's limit level. */
export function estimatesTable(c: Case, estimates: readonly StormEstimate[], routing: CaseRouting): TableBlock {
  const f = formatter(c.units);
  const pool = storageCurve(c.pond).volume(c.pond.pool);
  const rows: (string | Cell)[][] = [];
  for (const e of estimates) {
    if (e.storm.target === null) continue;
    const routed = routing.storms.find((s) => s.storm === e.storm);
    e.methods.forEach((m, i) => {
      rows.push([
        i === 0 ? e.storm.name : "",
        METHOD_SOURCES[m.method].label,
        m.volume === null ? "-" : f.volume(m.volume),
        stageText(c, m.stage),
        m.fits === null ? "-" : m.fits ? "yes" : { text: "no", tone: "fail" },
        [m.note, m.governingDuration === null ? null : `governing duration ${(m.governingDuration / 60).toFixed(0)} min`].filter((x) => x).join("; "),
      ]);
    });
    if (routed) {
      const used = routed.result.maxStorage - pool;
      const below = routed.result.maxStage <= e.limit!.level + 1e-9;
      rows.push([
        "",
        { text: "the routed outlet", tone: "binding" },
        { text: f.volume(used), tone: "binding" },
        f.elevation(routed.result.maxStage),
        below ? { text: "yes", tone: "pass" } : { text: "no", tone: "fail" },
        `limit level ${limitWords(c, e.limit!)}, ${f.volume(e.available!)} below it${routed.result.governingDuration !== undefined ? `; governing duration ${(routed.result.governingDuration / 60).toFixed(0)} min` : ""}`,
      ]);
    }
  }
  return {
    kind: "table",
    caption: "Storage estimates beside the storage the routed outlet uses (above the permanent pool or the floor)",
    head: ["Storm", "Method", "Volume", "Stage reached", "Below limit level", "Note"],
    numeric: [false, false, true, true, false, false],
    rows,
  };
}

/** The depths compared for a case with site limits (the pond the routed estimates size). */
export function tradeOffBlock(c: Case): TableBlock | null {
  if (!c.site || !c.storms.some((s) => s.target !== null)) return null;
  const f = formatter(c.units);
  const choice = choosePond({ site: c.site, criteria: c.criteria, spillway: c.outlet?.spillway, tailwater: c.tailwater, storms: c.storms, costs: pondCostWeights(c.units, c.costs) });
  const grade = c.site.existingGrade !== null;
  const rows = choice.options.map((o): (string | Cell)[] => {
    const s = o.sized;
    return [
      f.length(o.depth),
      o.levels ? f.elevation(o.levels.floor) : "-",
      o.levels ? f.elevation(o.levels.top) : "-",
      s ? (s.topLength !== null ? `${f.length(s.topLength, 1)} x ${f.length(s.topWidth!, 1)}` : `${Math.round(f.raw.area(s.topArea)).toLocaleString("en-US")} ${f.labels.length}2`) : "-",
      s ? f.volume(s.cut) : "-",
      ...(grade ? [s ? f.volume(s.fill) : "-"] : []),
      s ? `${Math.round(f.raw.area(s.land)).toLocaleString("en-US")} ${f.labels.length}2` : "-",
      o.cost ? o.cost.total.toFixed(1) : "-",
      o.blocked ? { text: `not possible: ${blockedWords(c, o.blocked)}`, tone: "fail" } : o === choice.chosen ? { text: "chosen (least cost)", tone: "pass" } : "holds the estimates",
    ];
  });
  return {
    kind: "table",
    caption: `Sizing trade-off: the depths compared (site.maxDepth ${f.length(c.site.maxDepth)} is a limit), each with the smallest pond holding every storm's routed estimate and ${Math.round(100 * CATALOGUE_ALLOWANCE)} % more for catalogue sizes below its limit level; cost proxy: excavation, fill and land (invented weights)`,
    head: ["Depth", "Floor", "Top", "Top size", grade ? "Cut" : "Excavation", ...(grade ? ["Fill"] : []), "Land", "Cost (units)", "Result"],
    numeric: [true, true, true, true, true, ...(grade ? [true] : []), true, true, false],
    rows,
  };
}

/** Every storage block of the report: limit levels, estimates against the routed outlet, the trade-off, underground and exfiltration facts. */
export function storageBlocks(c: Case, routing: CaseRouting, inputs: readonly StormEstimateInputs[]): Block[] {
  const f = formatter(c.units);
  const estimates = caseEstimates(c, inputs);
  const sizing = sizingEstimate(estimates);
  const blocks: Block[] = [
    {
      kind: "text",
      text:
        "Each storm may use the storage below its limit level: the lower of the freeboard level and, for a storm that must keep the spillway dry, the spillway crest" +
        (c.pond.storage.kind === "underground" ? `; an underground system also ends at its top (${f.elevation(systemTop(c.pond.storage))}), above which only the declared structures and surface ponding hold water` : "") +
        ". The hydrograph differences are lower bounds; the routed estimates route each storm through notional outlets of the usual kinds, each sized so its peak meets the middle of the target band." +
        (sizing ? ` A pond sized from the estimates holds the largest routed estimate, ${f.volume(sizing.volume)} (${sizing.storm}, ${METHOD_SOURCES[sizing.method].label}), and ${Math.round(100 * CATALOGUE_ALLOWANCE)} % more.` : ""),
    },
    estimatesTable(c, estimates, routing),
  ];
  const x = c.pond.exfiltration;
  if (x) {
    const h = hydrologyUnits(c.units);
    blocks.push({
      kind: "facts",
      rows: [
        ["Exfiltration", `${Number(h.intensity(x.rate).toPrecision(3))} ${h.labels.intensity} over the wetted bottom${x.sides ? " and sides" : ""}; drain time limit ${x.drainHours} h${x.label ? ` (${x.label})` : ""}`],
        ...routing.storms.map((s): [string, string] => [`${s.storm.name} exfiltrated`, `${f.volume(s.result.volumeExfiltrated)}, at most ${f.flow(s.result.peakExfiltration)}`]),
      ],
    });
  }
  const s = c.pond.storage;
  if (s.kind === "underground") {
    const declared = [...s.structures.map((x) => `${x.name}: ${Math.round(f.raw.area(x.area) * 100) / 100} ${f.labels.length}2 of water, rim ${f.elevation(x.rim)}`), ...(s.ponding ? [`surface ponding from ${f.elevation(s.ponding.elevations[0])}${s.ponding.limit !== null ? `, permitted to ${f.elevation(s.ponding.limit)}` : ""}`] : [])];
    blocks.push({ kind: "text", text: declared.length ? `Declared above the system's top: ${declared.join("; ")}.` : "Nothing is declared above the system's top: it stores nothing there." });
  }
  const tradeOff = tradeOffBlock(c);
  if (tradeOff) blocks.push(tradeOff);
  return blocks;
}
