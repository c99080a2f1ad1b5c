// `outfit hydrograph`: each rainfall storm's runoff per drainage area, and the hydrographs as CSV.
import { readFileSync } from "node:fs";
import { basename, join } from "node:path";
import { caseSchema, type CaseFile } from "../case/schema.js";
import { Converter } from "../case/normalize.js";
import { CaseError } from "../case/errors.js";
import { areaRunoff, caseHydrology, hydrologyAreas, lagged, stormAreaHydrograph, type Catchment } from "../case/hydrology.js";
import { nrcsHydrograph } from "../hydrology/nrcsHydrograph.js";
import { hydrographCsv, hydrographJson, hydrographText, type GivenValues, type HydrographItem } from "../report/hydrograph.js";
import { layoutFor } from "../report/terminal.js";
import { writeFileAtomic } from "../io.js";
import { emit, load, safeName, UsageError } from "./common.js";

export interface HydrographCommandOptions {
  out?: string;
  json?: boolean;
  storm?: string;
  area?: string;
  wide?: boolean;
}

export function hydrographCommand(path: string, options: HydrographCommandOptions): number {
  const { case: c } = load(path);
  // The case is valid now; read its file once more for the hydrology details behind each storm.
  const file: CaseFile = caseSchema.parse(JSON.parse(readFileSync(path, "utf8")));
  const hydrology = caseHydrology(file, new Converter(file.units, basename(path)));
  const withRainfall = c.storms.filter((_, i) => hydrology.storms[i] !== null).map((s) => s.name);
  if (withRainfall.length === 0) {
    throw new CaseError([{ where: `${basename(path)}: storms`, found: "no storm with a rainfall", expected: "at least one storm described by its rainfall (storms[].rainfall) and a hydrology section" }]);
  }
  if (options.storm !== undefined && !withRainfall.includes(options.storm)) {
    throw new UsageError("--storm", options.storm, `the name of a storm with a rainfall (${withRainfall.join(", ")})`);
  }
  const areas = hydrologyAreas(hydrology);
  const pondAreas = hydrology.pondAreas.map((a) => a.pond);
  if (options.area !== undefined && !areas.some((a) => a.key === options.area) && !pondAreas.includes(options.area)) {
    throw new UsageError("--area", options.area, `an area of the hydrology section (${[...areas.map((a) => a.key), ...pondAreas].join(", ")}${pondAreas.length ? "; a pond's drainage area by the pond's name" : ""})`);
  }
  const items: HydrographItem[] = [];
  hydrology.storms.forEach((s, stormIndex) => {
    if (!s || (options.storm !== undefined && c.storms[stormIndex].name !== options.storm)) return;
    // NRCS: the peak under the other unit-duration choice too, so the difference is plain.
    const other = hydrology.nrcs.unitDuration === "converged" ? "standard" : "converged";
    const alternateOf = (catchment: Catchment) =>
      s.method === "nrcs" && s.rainfall.kind !== "idf"
        ? lagged(nrcsHydrograph(catchment.area, areaRunoff(catchment, hydrology.runoffMethod), catchment.tc, s.rainfall.curve, { ...hydrology.nrcs, unitDuration: other }), catchment.lag)
        : null;
    for (const { key, catchment } of areas) {
      const result = stormAreaHydrograph(s, key);
      if (!result || (options.area !== undefined && options.area !== key)) continue;
      items.push({ stormIndex, area: key, pond: false, result, alternate: alternateOf(catchment), file: null });
    }
    for (const post of s.posts) {
      if (options.area !== undefined && options.area !== post.pond) continue;
      const catchment = hydrology.pondAreas.find((a) => a.pond === post.pond)!.catchment;
      items.push({ stormIndex, area: post.pond, pond: true, result: post.area, alternate: alternateOf(catchment), file: null });
    }
  });
  if (items.length === 0) throw new UsageError("--area", options.area ?? "", `an area the selected storms have (hydrology.pre, post, bypass or a point's${pondAreas.length ? ", or a pond's under hydrology.ponds" : ""})`);
  if (options.out !== undefined) assignFiles(items, options.out, c.storms.map((s) => s.name));
  // Everything is computed before anything is written; each file is written whole.
  for (const item of items) if (item.file) writeFileAtomic(item.file, hydrographCsv(c, item.result.hydrograph));
  const given: GivenValues[] = file.storms.map((s) => ({
    inflow: s.inflow !== undefined,
    target: s.target !== undefined,
    bypass: s.bypass !== undefined,
    points: (s.points ?? []).map((p) => ({ name: p.name, target: p.target !== undefined, bypass: p.bypass !== undefined })),
    inflows: Object.keys(s.inflows ?? {}),
  }));
  // --out names the CSV files; the tables always go to the terminal, so they fit it.
  const layout = layoutFor({ wide: options.wide });
  emit(options.json ? JSON.stringify(hydrographJson(c, hydrology, items, given), null, 2) : hydrographText(c, hydrology, items, given, layout), undefined);
  return 0;
}

/** `--out x.csv` takes exactly one hydrograph; any other `--out` is a directory of `<storm>-<area>.csv` files. */
function assignFiles(items: HydrographItem[], out: string, stormNames: string[]): void {
  if (out.toLowerCase().endsWith(".csv")) {
    if (items.length !== 1) {
      throw new UsageError("--out", out, `a directory (${items.length} hydrographs are selected; use --storm and --area to select one for a single file)`);
    }
    items[0].file = out;
    return;
  }
  const used = new Set<string>();
  for (const item of items) {
    const stem = `${safeName(stormNames[item.stormIndex])}-${safeName(item.area)}`;
    let name = `${stem}.csv`;
    for (let n = 2; used.has(name); n++) name = `${stem}-${n}.csv`;
    used.add(name);
    item.file = join(out, name);
  }
}
