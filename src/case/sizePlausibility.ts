// Sizes given as bare numbers that are implausible for their part: a bare length is read in the
// case's base unit (ft or m), so "diameter": 6 meant as inches becomes a 6-ft (72 in) orifice. Such a
// size gets a plausibility warning that says which unit was assumed: an opening larger than the barrel
// it drains into, or a size over 10 ft (US) or 3 m (SI). The case still loads and routes (the
// engineer may mean it). Works on the file's own values: only the file knows a number was bare. Each
// part names its own sizes (`fileSizes` of an element kind, the riser's and the barrel's files).
import type { CaseFile, Length } from "./schema.js";
import { baseLength, parseLength } from "../units.js";
import { formatter } from "../format.js";
import { partOf } from "../parts/registry.js";
import { riserFileSizes } from "../parts/riser.js";
import { barrelFileRise } from "../parts/barrel.js";
import type { FileSize } from "../parts/part.js";

/** A size above this (m) is implausible for an orifice, riser or barrel: 10 ft in US cases, 3 m in SI (common practice). */
export function largestPlausibleSize(units: CaseFile["units"]): number {
  return units === "US" ? 10 * 0.3048 : 3;
}

export interface SizeWarning {
  /** JSON path of the value. */
  part: string;
  reason: string;
}

/** The warnings on bare-number sizes in the outlet and the catalogue. */
export function bareSizeWarnings(file: CaseFile): SizeWarning[] {
  const f = formatter(file.units);
  const unit = file.units === "US" ? "ft" : "m";
  const small = file.units === "US" ? "in" : "mm";
  const limit = largestPlausibleSize(file.units);
  const si = (v: Length) => {
    const x = parseLength(v, file.units);
    return typeof x === "number" ? x : NaN;
  };
  const out: SizeWarning[] = [];
  // A system of ponds: each pond's outlet under its own path (the catalogue is compared with the outfall's barrel).
  const outlets = file.ponds ? file.ponds.map((p, i) => ({ outlet: p.outlet, root: `ponds[${i}].outlet` })) : file.outlet ? [{ outlet: file.outlet, root: "outlet" }] : [];
  const barrel = file.ponds ? file.ponds.find((p) => p.to === "outfall")?.outlet.barrel : file.outlet?.barrel;
  const barrelRise = barrel ? si(barrelFileRise(barrel).value) : null;
  // The catalogue's orifices drain into the outlet's barrel, or at least into the catalogue's largest.
  const largestBarrel = barrelRise ?? (file.catalogue?.barrel ? Math.max(...file.catalogue.barrel.diameters.map(si)) : null);
  const read = (value: number) => `${value} is a bare number, read as ${value} ${unit} (a length without a unit is in the case's unit, ${unit})`;
  const meant = (value: number) => ` If ${value} ${small} was meant, write "${value} ${small}".`;
  /** One size at `path`: warned when bare and larger than the barrel it drains into (`barrel`: its rise, null when not compared; `into`: its words), or over the limit. */
  const check = (path: string, value: Length, what: string, barrel: number | null, into = (rise: string) => `the ${rise} barrel it drains into`) => {
    if (typeof value !== "number") return;
    const size = value * baseLength(file.units);
    if (barrel !== null && size > barrel + 1e-9) {
      out.push({ part: path, reason: `${read(value)}: a ${f.size(size)} ${what} is larger than ${into(f.size(barrel))}.${meant(value)}` });
    } else if (size > limit + 1e-9) {
      out.push({ part: path, reason: `${read(value)}: a ${f.length(size)} ${what} is implausibly large (over ${f.length(limit)}).${meant(value)}` });
    }
  };
  for (const { outlet, root } of outlets) {
    const rise = outlet.barrel ? si(barrelFileRise(outlet.barrel).value) : null;
    /** A part's own size (`fileSizes`) under `at`. */
    const checkSize = (at: string, s: FileSize) => check(`${at}.${s.field}`, s.value, s.what, s.intoBarrel ? rise : null);
    (outlet.elements ?? []).forEach((e, i) => partOf(e).fileSizes(e).forEach((s) => checkSize(`${root}.elements[${i}]`, s)));
    if (outlet.riser) riserFileSizes(outlet.riser).forEach((s) => checkSize(`${root}.riser`, s));
    if (outlet.barrel) checkSize(`${root}.barrel`, barrelFileRise(outlet.barrel));
  }
  const cat = file.catalogue;
  const catalogueInto = (rise: string) => `${barrelRise !== null ? "the" : "the largest"} ${rise} barrel it would drain into`;
  (cat?.orifice?.diameters ?? []).forEach((d, i) => check(`catalogue.orifice.diameters[${i}]`, d, "orifice", largestBarrel, catalogueInto));
  (cat?.riser?.diameters ?? []).forEach((d, i) => check(`catalogue.riser.diameters[${i}]`, d, "riser", null));
  (cat?.barrel?.diameters ?? []).forEach((d, i) => check(`catalogue.barrel.diameters[${i}]`, d, "barrel", null));
  return out;
}
