// `outfit volume`: how much storage each storm needs before any outlet exists, by several methods.
import { readFileSync } from "node:fs";
import { basename } from "node:path";
import { caseSchema, type CaseFile } from "../case/schema.js";
import { Converter } from "../case/normalize.js";
import type { Case } from "../model.js";
import { caseHydrology } from "../case/hydrology.js";
import { DISTRIBUTION_TYPES, type DistributionType } from "../hydrology/distributions.js";
import { tr55Group, type Tr55Group } from "../storage/estimate.js";
import { caseEstimates, type StormEstimateInputs } from "../sizing/stormEstimates.js";
import { systemEstimates, systemVolumeJson, systemVolumeText } from "../report/systemVolume.js";
import { volumeJson, volumeText } from "../report/volume.js";
import { layoutFor } from "../report/terminal.js";
import { emit, load, UsageError } from "./common.js";
import { baseLength } from "../units.js";

export interface VolumeCommandOptions {
  type?: string;
  json?: boolean;
  out?: string;
  wide?: boolean;
}

/** The TR-55 group of `--type`, if given. */
export function typeOption(text: string | undefined): Tr55Group | null {
  if (text === undefined) return null;
  if (!(DISTRIBUTION_TYPES as readonly string[]).includes(text)) throw new UsageError("--type", text, `an NRCS storm type: ${DISTRIBUTION_TYPES.join(", ")}`);
  return tr55Group(text as DistributionType);
}

/** What each storm's published estimates need: its TR-55 group (a storm's own rainfall distribution wins over `--type`) and a rational storm's duration sweep. */
export function estimateInputs(path: string, c: Case, type: Tr55Group | null): StormEstimateInputs[] {
  // The case is valid now; read its file once more for the hydrology behind each storm.
  const file: CaseFile = caseSchema.parse(JSON.parse(readFileSync(path, "utf8")));
  const hydrology = caseHydrology(file, new Converter(file.units, basename(path)));
  return c.storms.map((_, i) => {
    const h = hydrology.storms[i];
    return { group: h?.rainfall.kind === "distribution" ? tr55Group(h.rainfall.distribution) : type, rational: h?.method === "rational" ? h.sweep : null };
  });
}

/** Where a pond sized from the site comes from. */
function sizedPondNote(c: Case): string {
  return `none given; chosen from the site limits for the ${c.sizing!.storm} storm's routed estimate (see outfit pond), bottom ${(c.pond.bottom / baseLength(c.units)).toFixed(2)}, top ${(c.pond.top / baseLength(c.units)).toFixed(2)} ${c.units === "US" ? "ft" : "m"}`;
}

export function volumeCommand(path: string, options: VolumeCommandOptions): number {
  const type = typeOption(options.type);
  const { case: c } = load(path);
  const layout = layoutFor({ wide: options.wide, toFile: options.out !== undefined });
  if (c.system && c.system.ponds.length > 1) {
    const e = systemEstimates(c, c.system, estimateInputs(path, c, type));
    emit(options.json ? JSON.stringify(systemVolumeJson(c, c.system, e), null, 2) : systemVolumeText(c, c.system, e, layout), options.out);
    return 0;
  }
  const estimates = caseEstimates(c, estimateInputs(path, c, type));
  emit(options.json ? JSON.stringify(volumeJson(c, estimates), null, 2) : volumeText(c, estimates, c.sizing ? sizedPondNote(c) : null, layout), options.out);
  return 0;
}
