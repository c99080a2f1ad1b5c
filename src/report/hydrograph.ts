// Output of `outfit hydrograph`: the areas, each storm's runoff per area, the rational duration sweep,
// and the hydrographs as CSV, in the case's units.
import type { Case, Hydrograph } from "../model.js";
import { hydrologyAreas, runoffMethodWords, unitDurationWords, type CaseHydrology, type Catchment, type StormHydrology } from "../case/hydrology.js";
import type { AreaHydrograph } from "../hydrology/hydrograph.js";
import { dimensionlessShape } from "../hydrology/unitHydrograph.js";
import { formatter, percentChange, trimNumber } from "../format.js";
import { hydrologyUnits, toCaseUnits } from "../units.js";
import { cautionText } from "./console.js";
import { withoutNulls } from "./withoutNulls.js";
import { jsonHead } from "./caution.js";
import { PLAIN, renderTable, STORM_NAME_WIDTH, wrap, type Column, type Layout, type Row } from "./terminal.js";

/** Which of a storm's inflow, target and bypass (and its points' targets and bypasses) the case file gives explicitly (explicit values win). */
export interface GivenValues {
  inflow: boolean;
  target: boolean;
  bypass: boolean;
  points: { name: string; target: boolean; bypass: boolean }[];
  /** A system of ponds: the ponds whose inflow the storm gives explicitly. */
  inflows: string[];
}

/** One hydrograph selected for output, with the CSV file it is written to (if any). */
export interface HydrographItem {
  stormIndex: number;
  /** The area's key (`hydrologyAreas`): "pre", "post", "bypass", or "<point>:pre" / "<point>:post"; a pond's name when `pond`. */
  area: string;
  /** The area is a pond's drainage area (a system of ponds, `hydrology.ponds`). */
  pond: boolean;
  result: AreaHydrograph;
  /** NRCS: the same area computed with the other unit-duration choice (standard or converged); null otherwise. */
  alternate: AreaHydrograph | null;
  file: string | null;
}

const SECONDS_PER_MINUTE = 60;

/** A duration in seconds below a minute, in minutes below two hours, else in hours. */
export function durationText(seconds: number): string {
  if (seconds > 0 && seconds < 60) return `${trimNumber(seconds, 1)} s`;
  return seconds < 7200 ? `${(seconds / 60).toFixed(1)} min` : `${(seconds / 3600).toFixed(2)} h`;
}

/** The hydrograph as CSV: header `minutes,flow`, flows in the case's flow unit (readable as an inflow file). */
export function hydrographCsv(c: Case, h: Hydrograph): string {
  const u = toCaseUnits(c.units);
  const lines = ["minutes,flow"];
  for (let i = 0; i < h.times.length; i++) lines.push(`${trimNumber(h.times[i] / SECONDS_PER_MINUTE, 4)},${Number(u.flow(h.flows[i]).toPrecision(6))}`);
  return lines.join("\n") + "\n";
}

/** The rainfall of one storm on one area: the depth and its pattern, or the IDF intensity and duration used. */
function rainfallText(c: Case, s: StormHydrology, r: AreaHydrograph): string {
  const hu = hydrologyUnits(c.units);
  const depth = (m: number) => `${hu.depth(m).toFixed(c.units === "US" ? 2 : 1)} ${hu.labels.depth}`;
  switch (s.rainfall.kind) {
    case "distribution":
      return `${depth(s.rainfall.depth)}, 24-h Type ${s.rainfall.distribution}`;
    case "hyetograph":
      return `${depth(s.rainfall.depth)}, hyetograph`;
    case "idf":
      return `${hu.intensity(r.rainfall / r.stormDuration!).toFixed(2)} ${hu.labels.intensity} for ${durationText(r.stormDuration!)} (IDF "${s.rainfall.name}")`;
  }
}

/** The heading of the comparison column: the peak under the unit-duration choice not used. */
function otherPeakHead(h: CaseHydrology): string {
  return (h.nrcs.unitDuration ?? "standard") === "converged" ? "Peak, standard" : "Peak, converged";
}

function tcText(k: Catchment): string {
  return k.tcMethod === "flow path" ? `flow path (${k.travelTimes.length} segment${k.travelTimes.length > 1 ? "s" : ""})` : k.tcMethod;
}

/** A pond's drainage area in tables ("pond upper"). */
function pondAreaLabel(pond: string): string {
  return `pond ${pond}`;
}

/** What a derived hydrograph is used for in the routed case. */
function usedAs(item: HydrographItem, given: GivenValues): string {
  const area = item.area;
  if (item.pond) return given.inflows.includes(area) ? "shown only (inflow given)" : `inflow of pond ${area}`;
  if (area === "post") return given.inflow ? "shown only (inflow given)" : "inflow";
  if (area === "pre") return given.target ? "shown only (target given)" : "target (its peak)";
  if (area === "bypass") return given.bypass ? "shown only (bypass given)" : "joins at the point of analysis";
  const at = area.lastIndexOf(":");
  const name = area.slice(0, at);
  const own = given.points.find((p) => p.name === name);
  if (area.slice(at + 1) === "pre") return own?.target ? "shown only (target given)" : `target at ${name} (its peak)`;
  return own?.bypass ? "shown only (bypass given)" : `joins at ${name}`;
}

/** The area's name in tables: pre, post, bypass, or "<point> pre" / "<point> post". */
export function areaLabel(area: string): string {
  return area.replace(/:(pre|post)$/, " $1");
}

/**
 * The areas and every storm's runoff per area. Narrow: each hydrograph's storm, area, peak and volume
 * stay in the compact row, then the runoff, time to peak and use as room allows; the rest (the
 * rainfall, Tc and step; an area's curve number, runoff coefficient and Tc source) go below the row.
 */
export function hydrographText(c: Case, h: CaseHydrology, items: HydrographItem[], given: GivenValues[], layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const hu = hydrologyUnits(c.units);
  const depth = (m: number) => `${hu.depth(m).toFixed(c.units === "US" ? 2 : 1)} ${hu.labels.depth}`;
  const areaColumns: Column[] = [
    { head: "Area" },
    { head: "Size", align: "right" },
    { head: "Curve number", align: "right", narrow: "detail" },
    { head: "Runoff coefficient", align: "right", narrow: "detail" },
    { head: "Tc", align: "right" },
    { head: "Tc from", narrow: "detail", label: "Tc from" },
  ];
  const areaRows: Row[] = [];
  const areas = [...hydrologyAreas(h).map((a) => ({ label: areaLabel(a.key), k: a.catchment })), ...h.pondAreas.map((a) => ({ label: pondAreaLabel(a.pond), k: a.catchment }))];
  for (const { label, k } of areas) {
    areaRows.push([
      label,
      `${hu.area(k.area).toFixed(2)} ${hu.labels.area}`,
      k.curveNumber === null ? "-" : k.curveNumber.toFixed(1),
      k.runoffCoefficient === null ? "-" : k.runoffCoefficient.toFixed(2),
      durationText(k.tc),
      tcText(k),
    ]);
  }
  const stormColumns: Column[] = [
    { head: "Storm", wrap: STORM_NAME_WIDTH },
    { head: "Rainfall", narrow: "detail", rank: 6 },
    { head: "Area" },
    { head: "Runoff", align: "right", narrow: "detail", rank: 1 },
    { head: "Peak", align: "right" },
    { head: "Time to peak", align: "right", narrow: "detail", rank: 2 },
    { head: "Volume", align: "right" },
    { head: "Tc used", align: "right", narrow: "detail", rank: 4, label: "Tc used" },
    { head: "Step", align: "right", narrow: "detail", rank: 5 },
    { head: "Used as", narrow: "detail", rank: 3 },
    { head: otherPeakHead(h), align: "right", narrow: "detail", rank: 7, label: otherPeakHead(h).toLowerCase() },
  ];
  const stormRows: Row[] = items.map((item) => {
    const s = h.storms[item.stormIndex]!;
    const r = item.result;
    return [
      c.storms[item.stormIndex].name,
      rainfallText(c, s, r),
      item.pond ? pondAreaLabel(item.area) : areaLabel(item.area),
      depth(r.runoff),
      f.flow(r.peak),
      durationText(r.timeOfPeak),
      f.volume(r.volume),
      durationText(r.tc),
      r.unitDuration === null ? "-" : durationText(r.unitDuration),
      usedAs(item, given[item.stormIndex]),
      item.alternate === null ? "-" : `${f.flow(item.alternate.peak)} (D ${durationText(item.alternate.unitDuration!)}, ${percentChange(item.alternate.peak / r.peak - 1)})`,
    ];
  });
  const methods = new Set(h.storms.filter((s) => s !== null).map((s) => s!.method));
  const prose = (text: string) => wrap(text, layout.width);
  const lines = [prose(`outfit hydrograph: ${c.name} (${c.units} units)`)];
  if (methods.has("nrcs")) {
    lines.push(
      prose(
        `NRCS method: initial abstraction ratio ${h.nrcs.ratio}${h.nrcs.ratio === 0.05 ? " (curve numbers converted, Hawkins et al. 2002)" : ""}; ` +
          `${runoffMethodWords(h)}; unit hydrograph ${dimensionlessShape(h.nrcs.peakRateFactor).source}, ${unitDurationWords(h)}; step = unit duration`,
      ),
    );
    if ((h.nrcs.unitDuration ?? "standard") !== "converged") {
      lines.push(prose("Peak, converged: the same hydrograph with the unit duration halved until the peak settles (time to peak tending to 0.6 Tc): shown for comparison, not used."));
    } else {
      lines.push(prose("Peak, standard: the same hydrograph at the method's unit duration (D <= 0.133 Tc): shown for comparison, not used."));
    }
  }
  if (methods.has("rational")) lines.push(prose("Rational method: Q = C i A; inflow = modified rational hydrograph of the duration needing the most storage"));
  lines.push("", renderTable(layout, areaColumns, areaRows).text, "", renderTable(layout, stormColumns, stormRows).text);
  const sweeps = items.filter((i) => i.area === "post" && h.storms[i.stormIndex]!.sweep);
  for (const item of sweeps) {
    const s = h.storms[item.stormIndex]!;
    const k = s.sweep!.critical;
    lines.push(
      "",
      prose(
        `${c.storms[item.stormIndex].name}: of ${s.sweep!.trials.length} storm durations from ${durationText(s.sweep!.trials[0].duration)} to ` +
          `${durationText(s.sweep!.trials[s.sweep!.trials.length - 1].duration)}, ${durationText(k.duration)} needs the most storage: ` +
          `${hu.intensity(k.intensity).toFixed(2)} ${hu.labels.intensity}, peak ${f.flow(k.peak)}, ${f.volume(k.storage)} held to a release of ${f.flow(s.allowable!)}`,
      ),
    );
  }
  const written = items.filter((i) => i.file !== null);
  if (written.length > 0) lines.push("", prose("Hydrographs written (minutes, flow in " + f.labels.flow + "):"), ...written.map((i) => wrap(`  ${i.file}`, layout.width, 4)));
  lines.push("", cautionText(layout));
  return lines.join("\n");
}

export function hydrographJson(c: Case, h: CaseHydrology, items: HydrographItem[], given: GivenValues[]) {
  const u = toCaseUnits(c.units);
  const hu = hydrologyUnits(c.units);
  const minutes = (s: number | null) => (s === null ? null : s / SECONDS_PER_MINUTE);
  const catchment = (k: Catchment | null) =>
    k && {
      area: hu.area(k.area),
      curveNumber: k.curveNumber,
      runoffCoefficient: k.runoffCoefficient,
      tc: minutes(k.tc),
      tcFrom: k.tcMethod,
      travelTimes: k.travelTimes.map((t) => minutes(t)),
      lag: minutes(k.lag),
      subAreas: k.subAreas.map((p) => ({
        name: p.name,
        area: hu.area(p.area),
        curveNumber: p.curveNumber,
        perviousCurveNumber: p.perviousCurveNumber,
        impervious: p.impervious,
        unconnected: p.unconnected,
        relation: p.relation === null ? null : `TR-55 ${p.relation}`,
        runoffCoefficient: p.runoffCoefficient,
      })),
      runoffParts: h.runoffMethod === "separate" ? k.runoffParts : null,
    };
  const storms = h.storms.flatMap((s, index) => {
    const mine = items.filter((i) => i.stormIndex === index);
    if (!s || mine.length === 0) return [];
    const r = s.rainfall;
    return [
      {
        name: c.storms[index].name,
        returnPeriod: c.storms[index].returnPeriod,
        method: s.method,
        rainfall: {
          kind: r.kind,
          depth: r.kind === "idf" ? null : hu.depth(r.depth),
          distribution: r.kind === "distribution" ? r.distribution : null,
          idf: r.kind === "idf" ? r.name : null,
        },
        inflow: given[index].inflow ? "given" : "derived",
        target: c.storms[index].target === null ? null : u.flow(c.storms[index].target!),
        targetFrom: given[index].target ? "given" : c.storms[index].target === null ? null : "derived",
        areas: Object.fromEntries(
          mine.map((i) => [
            i.pond ? pondAreaLabel(i.area) : i.area,
            {
              rainfall: hu.depth(i.result.rainfall),
              runoff: hu.depth(i.result.runoff),
              peak: u.flow(i.result.peak),
              timeOfPeak: minutes(i.result.timeOfPeak),
              volume: u.volume(i.result.volume),
              tc: minutes(i.result.tc),
              unitDuration: minutes(i.result.unitDuration),
              // NRCS: the peak under the other unit-duration choice, for comparison (not used).
              ...(i.alternate
                ? { [(h.nrcs.unitDuration ?? "standard") === "converged" ? "standard" : "converged"]: { peak: u.flow(i.alternate.peak), unitDuration: minutes(i.alternate.unitDuration) } }
                : {}),
              unitTimeToPeak: minutes(i.result.unitTimeToPeak),
              stormDuration: minutes(i.result.stormDuration),
              points: i.result.hydrograph.times.length,
              file: i.file,
            },
          ]),
        ),
        sweep: s.sweep && {
          allowable: u.flow(s.allowable!),
          criticalDuration: minutes(s.sweep.critical.duration),
          storage: u.volume(s.sweep.critical.storage),
          trials: s.sweep.trials.map((t) => ({
            duration: minutes(t.duration),
            intensity: hu.intensity(t.intensity),
            peak: u.flow(t.peak),
            storage: u.volume(t.storage),
          })),
        },
      },
    ];
  });
  const labels = formatter(c.units).labels;
  // Fields without a value (a rational area's curve number, an NRCS storm's sweep) are left out.
  return withoutNulls({
    ...jsonHead("hydrograph", c),
    unitLabels: { flow: labels.flow, volume: labels.volume, area: hu.labels.area, depth: hu.labels.depth, intensity: hu.labels.intensity, time: "min" },
    nrcs: {
      initialAbstractionRatio: h.nrcs.ratio,
      peakRateFactor: h.nrcs.peakRateFactor,
      unitHydrograph: dimensionlessShape(h.nrcs.peakRateFactor).source,
      unitDuration: typeof h.nrcs.unitDuration === "number" ? minutes(h.nrcs.unitDuration) : (h.nrcs.unitDuration ?? "standard"),
      unitDurationRule: unitDurationWords(h),
      runoffMethod: h.runoffMethod,
      runoffRule: runoffMethodWords(h),
    },
    areas: {
      ...Object.fromEntries(hydrologyAreas(h).map((a) => [a.key, catchment(a.catchment)])),
      ...(h.pondAreas.length ? { ponds: Object.fromEntries(h.pondAreas.map((a) => [a.pond, catchment(a.catchment)])) } : {}),
    },
    storms,
  });
}
