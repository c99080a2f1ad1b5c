// The case file's exfiltration (pond.exfiltration, site.exfiltration) in SI, checked against the storage.
import type { ExfiltrationFile } from "./schema.js";
import type { Exfiltration, Pond } from "../model.js";
import type { Converter } from "./converter.js";
import { parseIntensity } from "../units.js";
import { wettedBottom } from "../storage/exfiltration.js";

/** Hours an exfiltrating pond may take to drain after a storm's peak stage, when the case does not say (common practice: 72 h). */
export const DEFAULT_DRAIN_HOURS = 72;

/** The exfiltration of a pond, checked against its storage: a dry pond, a wetted bottom that can take water. */
export function normalizeExfiltration(x: ExfiltrationFile, pond: Pond, cv: Converter, path: string, wet: boolean): Exfiltration {
  const result: Exfiltration = {
    rate: cv.quantity(parseIntensity, x.rate, `${path}.rate`),
    sides: x.sides ?? false,
    drainHours: x.drainHours ?? DEFAULT_DRAIN_HOURS,
    label: x.source ?? null,
  };
  if (wet) cv.problem(path, "exfiltration from a wet pond", "a dry pond (no permanentPool): exfiltration would drain the permanent pool");
  if (!(wettedBottom(pond) > 0)) {
    const s = pond.storage;
    const pipes = s.kind === "underground" && s.units.kind === "pipeGallery";
    cv.problem(path, pipes ? "a pipe gallery without a stone bed" : "no wetted bottom", pipes ? "a stone bed (pond.storage.pipeGallery.stone): solid pipes do not exfiltrate" : "a storage with a floor area greater than zero");
  }
  return result;
}

