// The review report of one outlet routed through a case: summary, storage, rating, storms, checks,
// methods and the caution.
import type { Case, Hydrograph, Outlet } from "../../model.js";
import { drainedStage, type CaseRouting } from "../../routing/routeCase.js";
import { outletWall, type Assessment } from "../../assess/assess.js";
import { formatter } from "../../format.js";
import { CAUTION } from "../caution.js";
import { hydrographChart, prePostChart, ratingChart, stageChart, storageChart } from "./figures.js";
import { eventWindow, peakWindow } from "./window.js";
import { drawingInput } from "../drawing/input.js";
import { outletDrawing } from "../drawing/outletDrawing.js";
import { defaultStageStep, hydrographTable, prePostTable, stageStorageDischargeTable } from "./submittal.js";
import { projectFacts, type RunFacts } from "./project.js";
import { chamberThrottles, niceStep, ratingRows } from "../rating.js";
import { baseLength } from "../../units.js";
import type { ProjectFile } from "../../case/schema.js";
import type { CaseHydrology } from "../../case/hydrology.js";
import { hydrologySection } from "./hydrology.js";
import { methodsTable } from "./methods.js";
import { caseFacts, checksTable, partsTable, ratingTable, resultsTable, stormSummary, stormsTable, verdictNote, wallTable, warningsList } from "./tables.js";
import { FigureCounter, section, type Block, type ReportDocument, type Section } from "./model.js";
import { storageBlocks } from "./storage.js";
import type { StormEstimateInputs } from "../../sizing/stormEstimates.js";

export interface RoutedOutlet {
  outlet: Outlet;
  routing: CaseRouting;
  assessment: Assessment;
}

/** What the report takes besides the routed outlet: the project block's facts and the table settings. */
export interface ReportInputs {
  project: ProjectFile | undefined;
  run: RunFacts;
  /** Pre-development runoff per storm of the case, in order (null where the case has none). */
  preDevelopment: readonly (Hydrograph | null)[];
  /** The case's hydrology section as derived (null without one): the report's hydrology section. */
  hydrology?: CaseHydrology | null;
  /** Stage step of the stage-storage-discharge table (m); default 0.1 ft / 0.02 m. */
  stageStep?: number;
  /** Interval of the hydrograph tables (minutes); default chosen per storm. */
  hydrographInterval?: number;
  /** What each storm's published estimates need (TR-55 group, rational sweep), in storm order; default none. */
  estimates?: readonly StormEstimateInputs[];
}

/** Stage-storage figure, the storms' limit levels, the estimates beside the routed outlet's storage and the sizing trade-off. */
export function storageSection(c: Case, outlet: Outlet | undefined, figures: FigureCounter, routing?: CaseRouting, estimates?: readonly StormEstimateInputs[]): Section {
  const f = formatter(c.units);
  return section("storage", "Pond and stage-storage", [
    figures.figure("stage-storage", "Stage-storage", `Storage above the pond bottom (${f.elevation(c.pond.bottom)}) against stage, up to the top of embankment (${f.elevation(c.pond.top)}).`, (id) => storageChart(id, c, outlet)),
    ...(routing ? storageBlocks(c, routing, estimates ?? c.storms.map(() => ({ group: null, rational: null }))) : []),
  ]);
}

/**
 * The sections of one routed outlet: its rating, the storms and the checks. `prefix` keeps ids
 * unique when a report holds several outlets (a design run's candidates).
 */
/**
 * `tables` false leaves out the long tables a reviewer checks by hand (the stage-storage-discharge
 * table and the hydrograph tables), for the candidates of a design run other than the first, whose
 * own report (`outfit report` on its case file) holds them; `note` says so where they would be.
 */
export function outletSections(c: Case, routed: RoutedOutlet, figures: FigureCounter, inputs: ReportInputs, prefix = "", tables: { full: boolean; note?: string } = { full: true }): Section[] {
  const { outlet, routing, assessment } = routed;
  const f = formatter(c.units);
  const coarse = ratingRows(c, outlet, niceStep((c.pond.top - c.pond.bottom) / baseLength(c.units)) * baseLength(c.units));
  const throttled = chamberThrottles(outlet, coarse);
  const throttleNote = throttled
    ? ` Where the barrel throttles the openings (the table's "limited by: barrel"), the chamber behind them rises and submerges them, so each opening's curve bends back to smaller flows as the stage rises; the barrel's curve, which carries them all, and the total still rise.`
    : "";
  const rating = section(`${prefix}rating`, "Outlet and rating", [
    partsTable(c, outlet),
    ...(outletWall(assessment).openings.length ? [wallTable(c, outlet, outletWall(assessment))] : []),
    figures.figure(`${prefix}outlet-drawing`, "Outlet structure, elevation",
      `The outlet drawn to one scale across and up: left, a section through the ${outlet.riser ? "riser" : "headwall"} with the pond floor, the barrel leaving its base, the top of embankment, the spillway crest and the freeboard line; right, the ${outlet.riser ? "riser's wall developed (its perimeter unrolled)" : "headwall"} seen from outside, with every opening at its elevation and at the place the wall table gives it (a round riser unrolled from the barrel's centreline, 0 degrees at the left edge); dashed: each storm's peak stage.`,
      (id) => outletDrawing(id, drawingInput(c, outlet, routing.storms, outletWall(assessment)))),
    figures.figure(`${prefix}rating`, "Rating, part by part", `Outflow of each part and the total (thick solid) against stage. Diamonds: each storm's target at its maximum stage, the bar spanning its target band; dots: the routed peak outflow at the maximum stage. The flow axis ends at twice the largest target or peak; larger flows run off the right edge and are listed in the table below.${throttleNote}`, (id) => ratingChart(id, c, outlet, routing.storms)),
    ratingTable(c, outlet),
    tables.full ? stageStorageDischargeTable(c, outlet, inputs.stageStep ?? defaultStageStep(c)) : { kind: "text", text: tables.note ?? "" },
  ]);
  const stormSections = routing.storms.map((sr, i) => {
    const window = eventWindow(sr);
    const detail = peakWindow(sr, window);
    const pre = inputs.preDevelopment[c.storms.indexOf(sr.storm)] ?? null;
    const bypass = sr.storm.bypass !== null && sr.storm.bypass !== undefined;
    const lines = `Inflow (solid) and total outflow (dashed, squares)${bypass ? "; the bypass (dotted, triangles) and the flow at the point of analysis, outflow plus bypass at each instant (thick solid), to which the target applies" : ""}${sr.storm.target === null ? "" : "; hatched: the target band, dotted: the target"}`;
    const blocks: Block[] = [
      { kind: "text", text: stormSummary(c, sr) },
      figures.figure(`${prefix}storm-${i + 1}-hydrograph`, `${sr.storm.name}: inflow and outflow`,
        `${lines}. From ${window.start.toFixed(2)} h to ${window.end.toFixed(2)} h of ${window.simulated.toFixed(2)} h simulated: from the rise of the inflow to the recession of the outflow${detail ? `; the shaded span (${detail.start.toFixed(2)} h to ${detail.end.toFixed(2)} h) is drawn larger in the next figure` : ""}. The stage plot below covers the whole simulation.`,
        (id) => hydrographChart(id, c, sr, window, "hydrograph", detail)),
      ...(detail
        ? [figures.figure(`${prefix}storm-${i + 1}-peak`, `${sr.storm.name}: the peaks in detail`,
            `${lines}, from ${detail.start.toFixed(2)} h to ${detail.end.toFixed(2)} h, where the peaks are.`,
            (id) => hydrographChart(id, c, sr, detail, "hydrograph-peak"))]
        : []),
      figures.figure(`${prefix}storm-${i + 1}-stage`, `${sr.storm.name}: stage`,
        `Stage until the pond has drained (at or below ${f.elevation(drainedStage(c))}) or the simulation ended, with the top of embankment, the freeboard line${outlet.spillway ? " and the spillway crest" : ""}.`,
        (id) => stageChart(id, c, outlet, sr)),
      prePostTable(c, sr, pre),
      ...(pre
        ? [figures.figure(`${prefix}storm-${i + 1}-pre-post`, `${sr.storm.name}: before and after development`,
            "Pre-development runoff (dotted, triangles), post-development inflow (solid) and the routed outflow (dashed, squares) on one time axis.",
            (id) => prePostChart(id, c, sr, pre))]
        : []),
      ...(tables.full ? [hydrographTable(c, sr, inputs.hydrographInterval)] : []),
    ];
    return section(`${prefix}storm-${i + 1}`, `${sr.storm.name} storm (${sr.storm.returnPeriod} yr)`, blocks);
  });
  const storms = section(`${prefix}storms`, "Storms routed", [resultsTable(c, routing)], stormSections);
  const checks = section(`${prefix}checks`, "Checks", [verdictNote(c, assessment), checksTable(c, assessment), { kind: "text", text: "Warnings:" }, warningsList(assessment)]);
  return [rating, storms, checks];
}

export function methodsSection(c: Case, outlets: readonly Outlet[], hydrology: CaseHydrology | null = null): Section {
  return section("methods", "Methods and sources", [methodsTable(c, outlets, hydrology)]);
}

export function cautionSection(): Section {
  return section("caution", "Caution", [{ kind: "note", tone: "caution", text: CAUTION }]);
}

/** A section that may be absent, as a list of none or one. */
export function optional(s: Section | null): Section[] {
  return s ? [s] : [];
}

/** The report of the case's own outlet. */
export function caseReport(c: Case, routed: RoutedOutlet, source: string, inputs: ReportInputs): ReportDocument {
  const figures = new FigureCounter();
  return {
    title: `Review report: ${c.name}`,
    subtitle: `The outlet of case file ${source}, routed and checked by outfit.`,
    verdict: verdictNote(c, routed.assessment),
    project: projectFacts(inputs.project, inputs.run),
    caution: CAUTION,
    sections: [
      section("summary", "Case", [caseFacts(c), stormsTable(c)]),
      ...optional(hydrologySection(c, inputs.hydrology ?? null)),
      storageSection(c, routed.outlet, figures, routed.routing, inputs.estimates),
      ...outletSections(c, routed, figures, inputs),
      methodsSection(c, [routed.outlet], inputs.hydrology ?? null),
      cautionSection(),
    ],
  };
}
