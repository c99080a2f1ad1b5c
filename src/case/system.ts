// A system of ponds (the case file's `ponds`) in SI, with the checks across its entries: names unique,
// every `to` another pond or "outfall", no cycles, at least one pond at the outfall; each storm's
// inflows and pond targets naming ponds of the system.
import type { CaseFile, OutletFile, PondFile, StormFile } from "./schema.js";
import type { Hydrograph, Outlet, Pond, PondSystem, Storm } from "../model.js";
import { Converter } from "./converter.js";
import { show } from "./errors.js";
import { own } from "../own.js";
import { sumHydrographs } from "../hydrology/hydrograph.js";
import type { StormHydrology } from "./hydrology.js";

/** The name a pond's `to` gives for the system's outlet to the outside. */
export const OUTFALL = "outfall";

/** The ponds' names in the file's order. */
export function pondNames(file: CaseFile): string[] {
  return (file.ponds ?? []).map((p) => p.name);
}

/** The pond at the outfall that stands for the case where one pond is read: the first that drains there. */
export function outfallPond(system: PondSystem): number {
  return system.ponds.findIndex((p) => p.to === -1);
}

type PondReader = (p: PondFile, cv: Converter) => Pond;
type OutletReader = (o: OutletFile, cv: Converter, path: string) => Outlet;

/**
 * The file's `ponds` in SI. Each pond section is read as a single pond's is and its problems are
 * re-rooted at `ponds[i].pond`; a system may not also give `pond`, `outlet` or `site` (sizing a pond
 * from a site is for one pond).
 */
export function normalizeSystem(file: CaseFile, cv: Converter, readPond: PondReader, readOutlet: OutletReader): PondSystem | undefined {
  const entries = file.ponds!;
  if (file.pond) cv.problem("pond", "a pond beside ponds", "either pond (with outlet) or ponds, not both");
  if (file.outlet) cv.problem("outlet", "an outlet beside ponds", "each pond's outlet under ponds[i].outlet");
  if (file.site) cv.problem("site", "site limits beside ponds", "no site section in a system of ponds (a pond is sized from a site for one pond only)");
  const names = entries.map((e) => e.name);
  const index = new Map<string, number>();
  entries.forEach((e, i) => {
    if (e.name === OUTFALL) cv.problem(`ponds[${i}].name`, show(e.name), `a pond name other than "${OUTFALL}" (the word names the system's outlet)`);
    else if (index.has(e.name)) cv.problem(`ponds[${i}].name`, show(e.name), "a pond name not used by another pond");
    else index.set(e.name, i);
  });
  const to = entries.map((e, i) => {
    if (e.to === OUTFALL) return -1;
    const j = index.get(e.to);
    if (j === undefined) {
      cv.problem(`ponds[${i}].to`, show(e.to), `another pond's name (${names.filter((n) => n !== e.name).join(", ") || "none"}) or "${OUTFALL}"`);
      return -1;
    }
    if (j === i) cv.problem(`ponds[${i}].to`, show(e.to), `another pond's name or "${OUTFALL}" (a pond cannot drain into itself)`);
    return j;
  });
  if (!to.some((t) => t === -1)) cv.problem("ponds", "no pond whose to is \"outfall\"", `at least one pond draining to "${OUTFALL}"`);
  // Cycles: follow each pond's `to`; a chain that comes back to a pond it passed never reaches the outfall.
  const depth = entries.map(() => 0);
  const reported = new Set<number>();
  for (let i = 0; i < entries.length; i++) {
    const seen = [i];
    let j = to[i];
    while (j >= 0 && j !== i && !seen.includes(j)) {
      seen.push(j);
      j = to[j];
    }
    if (j >= 0 && to[i] !== i) {
      const cycle = seen.slice(seen.indexOf(j));
      if (!cycle.some((k) => reported.has(k))) {
        cycle.forEach((k) => reported.add(k));
        cv.problem(`ponds[${cycle[0]}].to`, show(entries[cycle[0]].to), `a chain of ponds that reaches "${OUTFALL}" (${[...cycle, cycle[0]].map((k) => names[k]).join(" -> ")} is a cycle)`);
      }
    }
    depth[i] = j < 0 ? seen.length - 1 : 0;
  }
  const ponds = entries.map((e, i) => ({ name: e.name, pond: rooted(cv, `ponds[${i}].pond`, (sub) => readPond(e.pond, sub)), outlet: readOutlet(e.outlet, cv, `ponds[${i}].outlet`), to: to[i] }));
  entries.forEach((e, i) => {
    // The system router has no exfiltration: refused rather than routed without it.
    if (e.pond.exfiltration) cv.problem(`ponds[${i}].pond.exfiltration`, "exfiltration in a system of ponds", "no exfiltration in a pond of a system (not modelled there yet; route that pond alone as a single pond)");
  });
  if (file.tailwater?.rating && to.filter((t) => t === -1).length > 1) {
    cv.problem("tailwater.rating", "a tailwater rating with several ponds draining to the outfall", 'a free outfall or a constant elevation (a rating shared by several ponds\' outflows is not modelled), or one pond draining to "outfall"');
  }
  // Upstream first: the ponds farthest (in links) from the outfall first, the file's order among equals.
  const order = entries.map((_, i) => i).sort((a, b) => depth[b] - depth[a] || a - b);
  return cv.problems.length > 0 && ponds.some((p) => !p.pond) ? undefined : { ponds, order };
}

/** Reads with a converter of its own and files its problems under `root` instead of "pond". */
function rooted<T>(cv: Converter, root: string, read: (sub: Converter) => T): T {
  const sub = new Converter(cv.units, cv.label);
  const result = read(sub);
  const prefix = `${cv.label}: pond`;
  for (const p of sub.problems) cv.problems.push(p.where.startsWith(prefix) ? { ...p, where: `${cv.label}: ${root}${p.where.slice(prefix.length)}` } : p);
  return result;
}

/**
 * A storm of a system: each pond's own inflow (`inflows`, by pond name; a pond not named has none,
 * a storm given by its rainfall takes its derived inflow for the pond the hydrology names) and the
 * system's inflow (their sum), and the pond targets.
 */
export function stormInflows(
  storm: StormFile,
  index: number,
  names: readonly string[],
  cv: Converter,
  read: (source: { file?: string; series?: [number, number | string][] }, path: string) => Hydrograph,
  derived: StormHydrology | null,
): Pick<Storm, "inflow" | "inflows" | "pondTargets"> {
  const path = `storms[${index}]`;
  const inflows: (Hydrograph | null)[] = names.map(() => null);
  // A `ponds` list of one takes a single pond's `inflow` (and its derived inflow) as well.
  if (storm.inflow !== undefined) {
    if (names.length > 1) cv.problem(`${path}.inflow`, "one inflow in a system of ponds", "each pond's inflow under inflows (an object from pond name to an inflow)");
    else if (storm.inflows !== undefined) cv.problem(`${path}.inflow`, "inflow beside inflows", "either inflow or inflows");
    else inflows[0] = read(storm.inflow, `${path}.inflow`);
  } else if (names.length === 1 && storm.inflows === undefined && derived?.post) inflows[0] = derived.post.hydrograph;
  for (const key of Object.keys(storm.inflows ?? {})) {
    const i = names.indexOf(key);
    if (i < 0) cv.problem(`${path}.inflows.${key}`, show(key), `the name of a pond (${names.join(", ")})`);
    else inflows[i] = read(own(storm.inflows!, key)!, `${path}.inflows.${key}`);
  }
  // A pond without an explicit inflow takes the runoff of its drainage area (hydrology.ponds).
  for (const post of derived?.posts ?? []) {
    const i = names.indexOf(post.pond);
    if (i >= 0 && inflows[i] === null) inflows[i] = post.area.hydrograph;
  }
  if (storm.rainfall === undefined && inflows.every((h) => h === null)) cv.problem(`${path}.inflows`, "no inflow to any pond", "an inflow to at least one pond");
  const pondTargets: (number | null)[] = names.map(() => null);
  for (const key of Object.keys(storm.pondTargets ?? {})) {
    const i = names.indexOf(key);
    if (i < 0) cv.problem(`${path}.pondTargets.${key}`, show(key), `the name of a pond (${names.join(", ")})`);
    else pondTargets[i] = cv.flowOf(own(storm.pondTargets!, key)!, `${path}.pondTargets.${key}`);
  }
  return { inflow: sumHydrographs(inflows), inflows, pondTargets };
}

