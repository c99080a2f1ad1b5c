// Invented barrels and outlets shared by the barrel and chamber tests (SI values).
import type { Barrel, CircularOrifice, Outlet, RectangularWeir, Riser } from "../../src/case/model.js";
import { FOOT } from "../../src/units.js";

export const CFS = FOOT ** 3;

export function circularBarrel(diameter: number, entrance: string, slope: number, options: Partial<Barrel> = {}): Barrel {
  const length = options.length ?? 30;
  const outletInvert = options.outletInvert ?? 0;
  return {
    shape: "circular",
    diameter,
    length,
    inletInvert: outletInvert + slope * length,
    outletInvert,
    manningN: options.manningN ?? 0.013,
    entrance,
    keep: false,
  };
}

export function boxBarrel(span: number, rise: number, entrance: string, slope: number, length = 30, manningN = 0.013): Barrel {
  return { shape: "box", span, rise, length, inletInvert: slope * length, outletInvert: 0, manningN, entrance, keep: false };
}

export function orifice(diameter: number, invert: number, count = 1, coefficient = 0.61): CircularOrifice {
  return { type: "orifice", shape: "circular", diameter, invert, count, coefficient, keep: false };
}

export function weir(length: number, crest: number, coefficient = 1.84): RectangularWeir {
  return { type: "weir", shape: "rectangular", length, crest, endContractions: 0, coefficient, keep: false };
}

export function circularRiser(diameter: number, crest: number, coefficient = 1.66, orificeCoefficient = 0.6): Riser {
  return { shape: "circular", diameter, crest, coefficient, orificeCoefficient, keep: false };
}

/** The demo pond's outlet (cases/demo/case.json) in SI, with a barrel of the given diameter. */
export function demoOutlet(barrelDiameterInches: number | null): Outlet {
  const ft = (x: number) => x * FOOT;
  const outlet: Outlet = {
    elements: [orifice(ft(0.5), ft(100)), orifice(ft(10 / 12), ft(102)), { ...weir(ft(2), ft(103.5), 3.33 * Math.sqrt(FOOT)), endContractions: 2 }],
    riser: circularRiser(ft(4), ft(104.5), 3.0 * Math.sqrt(FOOT)),
  };
  if (barrelDiameterInches !== null) {
    outlet.barrel = {
      shape: "circular",
      diameter: ft(barrelDiameterInches / 12),
      length: ft(60),
      inletInvert: ft(99.5),
      outletInvert: ft(99),
      manningN: 0.013,
      entrance: "concrete-square-headwall",
      keep: false,
    };
  }
  return outlet;
}
