// The report's hydrology section, for a case whose storms come from rainfall: every drainage area
// with its curve number (or runoff coefficient) and sub-areas, its Tc segment by segment, each storm's
// rainfall depth and distribution, the runoff depth, volume and peak of every area, and the methods
// with their sources. What a reviewer checks the inflows and targets against.
import type { Case } from "../../model.js";
import { hydrologyAreas, runoffMethodWords, stormAreaHydrograph, unitDurationWords, type CaseHydrology, type Catchment, type StormHydrology } from "../../case/hydrology.js";
import { DISTRIBUTIONS } from "../../hydrology/distributions.js";
import { dimensionlessShape } from "../../hydrology/unitHydrograph.js";
import { IMPERVIOUS_CURVE_NUMBER } from "../../hydrology/runoff.js";
import { MIN_TC_NRCS } from "../../hydrology/timeOfConcentration.js";
import { MIN_TC_RATIONAL } from "../../hydrology/rational.js";
import { formatter, trimNumber } from "../../format.js";
import { hydrologyUnits } from "../../units.js";
import { areaLabel, durationText } from "../hydrograph.js";
import { section, type Block, type Section, type TableBlock } from "./model.js";

/** What an area is, in words. */
function roleWords(key: string): string {
  if (key === "pre") return "before development, draining to the point of analysis (its peak is the target)";
  if (key === "post") return "after development, draining to the pond (the inflow)";
  if (key === "bypass") return "after development, bypassing the pond to the point of analysis";
  const at = key.lastIndexOf(":");
  const point = key.slice(0, at);
  return key.endsWith(":pre") ? `before development, draining to ${point} (its peak is that point's target)` : `after development, draining to ${point}`;
}

function curveNumberText(k: Catchment): string {
  return k.curveNumber === null ? "-" : trimNumber(k.curveNumber, 1);
}

function tcFromText(k: Catchment): string {
  return k.tcMethod === "flow path" ? `flow path, ${k.segments.length} segment${k.segments.length === 1 ? "" : "s"} (TR-55 ch. 3)` : k.tcMethod === "watershed lag" ? "watershed lag (NEH 630 ch. 15), Tc = lag / 0.6" : "given";
}

function areasTable(c: Case, h: CaseHydrology): TableBlock {
  const hu = hydrologyUnits(c.units);
  const rows = hydrologyAreas(h).map(({ key, catchment: k }) => [
    areaLabel(key),
    roleWords(key),
    `${hu.area(k.area).toFixed(2)} ${hu.labels.area}`,
    curveNumberText(k),
    k.runoffCoefficient === null ? "-" : k.runoffCoefficient.toFixed(2),
    durationText(k.tc),
    tcFromText(k),
    k.lag > 0 ? durationText(k.lag) : "none",
  ]);
  return {
    kind: "table",
    caption: "Drainage areas (curve numbers are area-weighted composites, TR-55 ch. 2 worksheet 2; Tc before the method's minimum)",
    head: ["Area", "Drains", "Size", "Curve number", "Runoff coefficient", "Tc", "Tc from", "Lag to the point"],
    numeric: [false, false, true, true, true, true, false, true],
    rows,
  };
}

function subAreasTable(c: Case, h: CaseHydrology): TableBlock {
  const hu = hydrologyUnits(c.units);
  const rows: string[][] = [];
  for (const { key, catchment: k } of hydrologyAreas(h)) {
    for (const p of k.subAreas) {
      const split =
        p.perviousCurveNumber === null
          ? "given"
          : `pervious ${trimNumber(p.perviousCurveNumber, 1)}, ${trimNumber(100 * p.impervious!, 1)} % impervious at ${IMPERVIOUS_CURVE_NUMBER}` +
            `${p.unconnected ? `, ${trimNumber(100 * p.unconnected, 1)} % of it unconnected` : ", connected"}: TR-55 ${p.relation === "figure 2-4" ? "Figure 2-4" : "Figure 2-3"}` +
            `${p.unconnected && p.relation === "figure 2-3" ? " (at 30 % impervious or more TR-55 takes unconnected area as connected)" : ""}`;
      rows.push([
        areaLabel(key),
        p.name ?? "(whole area)",
        `${hu.area(p.area).toFixed(2)} ${hu.labels.area}`,
        p.curveNumber === null ? "-" : trimNumber(p.curveNumber, 1),
        p.curveNumber === null ? "-" : split,
        p.runoffCoefficient === null ? "-" : p.runoffCoefficient.toFixed(2),
      ]);
    }
  }
  return {
    kind: "table",
    caption: "Sub-areas and their curve numbers (impervious areas at CN 98; Figure 2-3: connected, CNc = CNp + (Pimp/100)(98 - CNp); Figure 2-4: unconnected, below 30 % impervious, times (1 - 0.5 R))",
    head: ["Area", "Sub-area", "Size", "Curve number", "From", "Runoff coefficient"],
    numeric: [false, false, true, true, false, true],
    rows,
  };
}

function segmentsTable(c: Case, h: CaseHydrology): TableBlock | null {
  const f = formatter(c.units);
  const rows: string[][] = [];
  for (const { key, catchment: k } of hydrologyAreas(h)) {
    k.segments.forEach((s, i) => {
      const how =
        s.type === "sheet"
          ? `Manning n ${trimNumber(s.manningN, 3)}, 2-yr 24-h rainfall ${h.twoYearRainfall === null ? "-" : `${trimNumber(hydrologyUnits(c.units).depth(h.twoYearRainfall), 2)} ${hydrologyUnits(c.units).labels.depth}`} (TR-55 eq 3-3)`
          : s.type === "shallow"
            ? `${s.surface} (TR-55 Figure 3-1 / App. F)`
            : `Manning n ${trimNumber(s.manningN, 3)}, hydraulic radius ${f.length(s.hydraulicRadius)} (TR-55 eq 3-4)`;
      rows.push([areaLabel(key), String(i + 1), s.type, f.length(s.length, 0), trimNumber(s.slope, 4), how, durationText(k.travelTimes[i])]);
    });
    if (k.segments.length > 0) rows.push([areaLabel(key), "Tc", "", f.length(k.segments.reduce((a, s) => a + s.length, 0), 0), "", "sum of the travel times", durationText(k.tc)]);
  }
  if (rows.length === 0) return null;
  return {
    kind: "table",
    caption: `Time of concentration by segment (TR-55 ch. 3): travel time of each segment and their sum; the NRCS method uses at least ${durationText(MIN_TC_NRCS)}, the rational method at least ${durationText(MIN_TC_RATIONAL)}`,
    head: ["Area", "Segment", "Flow", `Length (${f.labels.length})`, `Slope (${f.labels.length}/${f.labels.length})`, "With", "Travel time"],
    numeric: [false, true, false, true, true, false, true],
    rows,
  };
}

function rainfallText(c: Case, s: StormHydrology): string {
  const hu = hydrologyUnits(c.units);
  const depth = (m: number) => `${trimNumber(hu.depth(m), c.units === "US" ? 2 : 1)} ${hu.labels.depth}`;
  switch (s.rainfall.kind) {
    case "distribution":
      return `${depth(s.rainfall.depth)} over 24 h, NRCS Type ${s.rainfall.distribution}`;
    case "hyetograph":
      return `${depth(s.rainfall.depth)}, the case's hyetograph (${s.rainfall.curve.times.length} points)`;
    case "idf":
      return `IDF curve "${s.rainfall.name}" (rational method)`;
  }
}

function rainfallTable(c: Case, h: CaseHydrology): TableBlock {
  const rows = c.storms.flatMap((storm, i) => {
    const s = h.storms[i];
    if (!s) return [];
    const source = s.rainfall.kind === "distribution" ? DISTRIBUTIONS[s.rainfall.distribution].source : s.rainfall.kind === "hyetograph" ? "given in the case" : "given in the case";
    return [[storm.name, `${trimNumber(storm.returnPeriod, 2)} yr`, rainfallText(c, s), s.method === "nrcs" ? "NRCS curve number and unit hydrograph" : "rational, modified rational hydrograph", source]];
  });
  return { kind: "table", caption: "Rainfall of each storm", head: ["Storm", "Return period", "Rainfall", "Method", "Distribution's source"], numeric: [false, true, false, false, false], rows };
}

function runoffTable(c: Case, h: CaseHydrology): TableBlock {
  const f = formatter(c.units);
  const hu = hydrologyUnits(c.units);
  const depth = (m: number) => `${hu.depth(m).toFixed(c.units === "US" ? 2 : 1)} ${hu.labels.depth}`;
  const rows: string[][] = [];
  c.storms.forEach((storm, i) => {
    const s = h.storms[i];
    if (!s) return;
    for (const { key } of hydrologyAreas(h)) {
      const r = stormAreaHydrograph(s, key);
      if (!r) continue;
      rows.push([
        storm.name,
        areaLabel(key),
        depth(r.rainfall),
        depth(r.runoff),
        f.volume(r.volume),
        f.flow(r.peak),
        durationText(r.timeOfPeak),
        r.unitDuration === null ? `storm ${durationText(r.stormDuration!)}` : durationText(r.unitDuration),
      ]);
    }
  });
  return {
    kind: "table",
    caption: "Runoff of every area in every storm: depth, volume and peak of its hydrograph (NRCS: step = the unit duration D; rational: the storm duration)",
    head: ["Storm", "Area", "Rainfall", "Runoff depth", "Runoff volume", "Peak", "Time of peak", "D or duration"],
    numeric: [false, false, true, true, true, true, true, true],
    rows,
  };
}

function methodsList(h: CaseHydrology): string[] {
  const methods = new Set(h.storms.filter((s): s is StormHydrology => s !== null).map((s) => s.method));
  const items: string[] = [];
  if (methods.has("nrcs")) {
    items.push(
      `Runoff depth: NRCS curve number equation Q = (P - Ia)^2 / (P - Ia + S), S = 1000/CN - 10 in, Ia = ${h.nrcs.ratio} S (TR-55, 1986, ch. 2, eqs 2-1 to 2-4${h.nrcs.ratio === 0.05 ? "; curve numbers converted for Ia = 0.05 S, Hawkins et al. 2002" : ""}); ${runoffMethodWords(h)}.`,
      `Unit hydrograph: ${dimensionlessShape(h.nrcs.peakRateFactor).source}, qp = ${trimNumber(h.nrcs.peakRateFactor, 1)} A Q / Tp, Tp = D/2 + 0.6 Tc; ${unitDurationWords(h)}; the incremental runoff convolved with it (NEH 630 ch. 16).`,
      "Time of concentration: sheet flow by TR-55 eq 3-3 (at most 300 ft), shallow concentrated flow by TR-55 Figure 3-1 (App. F equations), channel flow by Manning (TR-55 eq 3-4); or the watershed lag (NEH 630 ch. 15); at least 0.1 h (TR-55).",
    );
  }
  if (methods.has("rational")) items.push("Rational method: Q = C i A with i at Tc from the IDF curve; the inflow is the modified rational hydrograph of the duration needing the most storage (FHWA HEC-22, 3rd ed., ch. 3 and 8); Tc at least 5 min (common practice).");
  if (h.catchments.bypass || h.points.length > 0) items.push("Areas bypassing the pond: their hydrographs join the pond's outflow at their point of analysis at each instant, later by their lag (the case format, \"Bypass and the point of analysis\").");
  return items;
}

/** The hydrology section; null when no storm of the case comes from rainfall. */
export function hydrologySection(c: Case, h: CaseHydrology | null): Section | null {
  if (!h || h.storms.every((s) => s === null)) return null;
  const blocks: Block[] = [
    { kind: "text", text: "The inflows, targets and bypasses of the storms below come from rainfall on these drainage areas." },
    { kind: "list", items: methodsList(h) },
    areasTable(c, h),
    subAreasTable(c, h),
  ];
  const segments = segmentsTable(c, h);
  if (segments) blocks.push(segments);
  blocks.push(rainfallTable(c, h), runoffTable(c, h));
  return section("hydrology", "Hydrology", blocks);
}
