// `outfit drawing`: the outlet's elevation drawing alone, as a standalone SVG file (the report's figure);
// on a system of ponds, one drawing per pond's outlet.
import { basename, dirname, join } from "node:path";
import { CaseError } from "../case/errors.js";
import { routeCase } from "../routing/routeCase.js";
import { casePlan } from "../assess/rules/walls.js";
import { routeSystemCase } from "../routing/routeSystem.js";
import { pondCase, pondRoutings } from "../assess/systemAssess.js";
import { drawingInput } from "../report/drawing/input.js";
import { outletDrawing } from "../report/drawing/outletDrawing.js";
import { standaloneSvg } from "../report/plot/svg.js";
import { printErr, writeFileAtomic } from "../io.js";
import { load, safeName, UsageError } from "./common.js";

export interface DrawingCommandOptions {
  out?: string;
  /** A system of ponds: only this pond's outlet. */
  pond?: string;
}

/** Default output: beside the case file, "case.outlet.svg" (a pond of a system: "case.<pond>.outlet.svg"). */
export function defaultDrawingOutput(input: string, pond?: string): string {
  return join(dirname(input), `${basename(input).replace(/\.json$/i, "")}${pond === undefined ? "" : `.${safeName(pond)}`}.outlet.svg`);
}

export function drawingCommand(input: string, options: DrawingCommandOptions): number {
  const { case: c } = load(input);
  if (c.system && c.system.ponds.length > 1) return systemDrawings(input, options);
  if (options.pond !== undefined) throw new UsageError("--pond", options.pond, "a case with a system of ponds (ponds)");
  if (!c.outlet) {
    throw new CaseError([{ where: `${basename(input)}: outlet`, found: "nothing (the field is missing)", expected: "an outlet to draw (elements, riser, barrel, spillway)" }]);
  }
  // The storms are routed for their peak stages, drawn across the structure; the openings are placed
  // on their wall as route and the rules place them.
  const routing = routeCase(c, c.outlet);
  const out = options.out ?? defaultDrawingOutput(input);
  const plan = casePlan(c, c.outlet, routing.storms);
  writeFileAtomic(out, standaloneSvg(outletDrawing("outlet", drawingInput(c, c.outlet, routing.storms, plan))));
  printErr(`outfit: wrote ${out}\n`);
  return 0;
}

/**
 * A system of ponds: each pond's outlet drawn with that pond's levels and its peak stages in the system
 * routed together. `--out x.svg` takes one pond (`--pond`); any other `--out` is a directory of
 * `<pond>.outlet.svg` files; without `--out`, `CASE.<pond>.outlet.svg` beside the case file.
 */
function systemDrawings(input: string, options: DrawingCommandOptions): number {
  const { case: c } = load(input);
  const system = c.system!;
  const names = system.ponds.map((p) => p.name);
  if (options.pond !== undefined && !names.includes(options.pond)) throw new UsageError("--pond", options.pond, `the name of a pond (${names.join(", ")})`);
  const chosen = system.ponds.flatMap((p, i) => (options.pond === undefined || p.name === options.pond ? [i] : []));
  const single = options.out !== undefined && options.out.toLowerCase().endsWith(".svg");
  if (single && chosen.length > 1) throw new UsageError("--out", options.out!, `a directory (${chosen.length} ponds have an outlet to draw; --pond NAME draws one into a single file)`);
  const routing = routeSystemCase(c);
  // Everything is drawn before anything is written; each file is written whole.
  const files = chosen.map((i) => {
    const name = system.ponds[i].name;
    const out = single ? options.out! : options.out !== undefined ? join(options.out, `${safeName(name)}.outlet.svg`) : defaultDrawingOutput(input, name);
    const view = pondCase(c, system, i);
    const storms = pondRoutings(routing, i);
    const svg = standaloneSvg(outletDrawing(`outlet-${i + 1}`, drawingInput(view, routing.outlets[i], storms, casePlan(view, routing.outlets[i], storms))));
    return { out, svg };
  });
  for (const { out, svg } of files) {
    writeFileAtomic(out, svg);
    printErr(`outfit: wrote ${out}\n`);
  }
  return 0;
}
