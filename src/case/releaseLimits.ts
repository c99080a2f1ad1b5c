// A storm's release limits (the plain `target` and each `releaseLimits` form) resolved to flows in SI;
// the smallest governs and becomes the storm's target.
import type { StormFile } from "./schema.js";
import type { ReleaseLimit } from "../model.js";
import type { Converter } from "./converter.js";
import { show } from "./errors.js";
import { parseArea, parseUnitAreaRate } from "../units.js";

export interface StormLimits {
  target: number | null;
  releaseLimits: ReleaseLimit[];
  governingLimit: ReleaseLimit | null;
}

/**
 * Resolves the limits of storm `index`. `derivedPrePeak` is the pre-development peak the hydrology
 * section derives for the storm (m3/s), null without one; it is also the target of a storm that
 * states none.
 */
export function stormLimits(storm: StormFile, index: number, cv: Converter, derivedPrePeak: number | null): StormLimits {
  const path = `storms[${index}]`;
  const label = (s: string | undefined) => s ?? null;
  const limits: ReleaseLimit[] = [];
  if (storm.target !== undefined) {
    limits.push({ form: "target", flow: cv.flowOf(storm.target, `${path}.target`), statement: "target", label: label(storm.targetSource) });
  } else if (derivedPrePeak !== null && storm.releaseLimits === undefined) {
    limits.push({ form: "target", flow: derivedPrePeak, statement: "pre-development peak (hydrology)", label: label(storm.targetSource) });
  }
  const flowOf = (value: number | string, where: string) => cv.flowOf(value, where);
  (storm.releaseLimits ?? []).forEach((r, i) => {
    const where = `${path}.releaseLimits[${i}]`;
    if (r.flow !== undefined) {
      limits.push({ form: "flow", flow: flowOf(r.flow, `${where}.flow`), statement: `flow ${String(r.flow)}`, label: label(r.source) });
    } else if (r.shareOfPre !== undefined) {
      const pre = r.prePeak !== undefined ? flowOf(r.prePeak, `${where}.prePeak`) : derivedPrePeak;
      if (pre === null) {
        cv.problem(`${where}.prePeak`, "none given", "a pre-development peak (prePeak), or a hydrology section with a pre-development area to derive it");
        return;
      }
      const of = r.prePeak !== undefined ? `given pre-development peak ${String(r.prePeak)}` : "pre-development peak (hydrology)";
      limits.push({ form: "share-of-pre", flow: r.shareOfPre * pre, statement: `${trimmed(100 * r.shareOfPre)} % of the ${of}`, label: label(r.source) });
    } else if (r.perArea !== undefined && r.area !== undefined) {
      const rate = parseUnitAreaRate(r.perArea, cv.units);
      const area = parseArea(r.area, cv.units);
      if (typeof rate !== "number") cv.problem(`${where}.perArea`, show(r.perArea), rate.error);
      if (typeof area !== "number") cv.problem(`${where}.area`, show(r.area), area.error);
      if (typeof rate !== "number" || typeof area !== "number") return;
      limits.push({ form: "per-area", flow: rate * area, statement: `${String(r.perArea)} over ${String(r.area)}`, label: label(r.source) });
    }
  });
  let governing: ReleaseLimit | null = null;
  for (const limit of limits) if (!governing || limit.flow < governing.flow) governing = limit;
  // A limit that resolves to no flow at all (a derived pre-development peak of zero: an IDF curve that
  // gives no rain at Tc) is no allowable release: every outlet would fail it.
  if (governing && !(governing.flow > 0)) cv.problem(path, `an allowable release of ${String(governing.flow)} (${governing.statement})`, "a release limit greater than zero; check the hydrology that derives it");
  return { target: governing?.flow ?? null, releaseLimits: limits, governingLimit: governing };
}

function trimmed(x: number): string {
  return String(Number(x.toPrecision(6)));
}
