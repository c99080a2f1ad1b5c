// An outlet written back in the case file's `outlet` form, in the case's units, with every
// coefficient explicit, so that it can be pasted into a case and routed again.
import type { Outlet } from "../model.js";
import type { OutletFile } from "../case/schema.js";
import { toCaseUnits, type UnitSystem } from "../units.js";
import { trimNumber } from "../format.js";

export function outletToFile(outlet: Outlet, units: UnitSystem): OutletFile {
  const u = toCaseUnits(units);
  const size = (m: number) => `${trimNumber(u.smallLength(m), 6)} ${units === "US" ? "in" : "mm"}`;
  const file: OutletFile = {
    elements: outlet.elements.map((e) => {
      const keep = e.keep ? { keep: true } : {};
      switch (e.type) {
        case "orifice":
          return e.shape === "circular"
            ? { type: "orifice", shape: "circular", diameter: size(e.diameter), count: e.count, invert: u.length(e.invert), coefficient: e.coefficient, ...keep }
            : { type: "orifice", shape: "rectangular", width: size(e.width), height: size(e.height), count: e.count, invert: u.length(e.invert), coefficient: e.coefficient, ...keep };
        case "weir":
          return e.shape === "rectangular"
            ? { type: "weir", shape: "rectangular", length: u.length(e.length), crest: u.length(e.crest), endContractions: e.endContractions, coefficient: u.weirCoefficient(e.coefficient), ...keep }
            : { type: "weir", shape: "v-notch", angle: e.angle, crest: u.length(e.crest), coefficient: u.weirCoefficient(e.coefficient), ...keep };
        case "regulator":
          return {
            type: "regulator",
            invert: u.length(e.invert),
            rating: e.heads.map((h, i) => [u.length(h), u.flow(e.flows[i])] as [number, number]),
            ...keep,
          };
      }
    }),
  };
  if (outlet.riser) {
    const r = outlet.riser;
    const common = { crest: u.length(r.crest), coefficient: u.weirCoefficient(r.coefficient), orificeCoefficient: r.orificeCoefficient, ...(r.keep ? { keep: true } : {}) };
    file.riser = r.shape === "circular" ? { shape: "circular", diameter: u.length(r.diameter), ...common } : { shape: "box", length: u.length(r.length), width: u.length(r.width), ...common };
  }
  if (outlet.barrel) {
    const b = outlet.barrel;
    const common = {
      length: u.length(b.length),
      inletInvert: u.length(b.inletInvert),
      outletInvert: u.length(b.outletInvert),
      manningN: b.manningN,
      entrance: b.entrance as never,
      ...(b.keep ? { keep: true } : {}),
    };
    file.barrel = b.shape === "circular" ? { shape: "circular", diameter: size(b.diameter), ...common } : { shape: "box", span: u.length(b.span), rise: u.length(b.rise), ...common };
  }
  if (outlet.spillway) {
    const s = outlet.spillway;
    file.spillway = { crest: u.length(s.crest), length: u.length(s.length), sideSlope: s.sideSlope, coefficient: u.weirCoefficient(s.coefficient), ...(s.keep ? { keep: true } : {}) };
  }
  return file;
}
