// Invented barrels and outlets shared by the barrel and chamber tests (SI values).
import fc from "fast-check";
import type { Barrel, Outlet, Riser } from "../../src/model.js";
import type { CircularOrifice } from "../../src/parts/circularOrifice.js";
import type { RectangularWeir } from "../../src/parts/rectangularWeir.js";
import { approximateOutletHeadwater, barrelArea, barrelRise, KU_SI } from "../../src/hydraulics/barrel.js";
import { entrancesFor } from "../../src/parts/entrances.js";
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

/** Flow (m3/s) at which x = Ku Q/(A D^0.5) takes a value (US units). */
export function flowAt(b: Barrel, x: number): number {
  return (x * barrelArea(b) * Math.sqrt(barrelRise(b))) / KU_SI;
}

/** A random barrel of either shape with an entrance that fits it (SI), on slopes and lengths in the given ranges. */
export function barrelArbitrary(slope: { min: number; max: number }, length: { min: number; max: number }): fc.Arbitrary<Barrel> {
  return fc
    .record({
      box: fc.boolean(),
      rise: fc.double({ min: 0.2, max: 2.5, noNaN: true }),
      aspect: fc.double({ min: 0.5, max: 3, noNaN: true }),
      length: fc.double({ ...length, noNaN: true }),
      slope: fc.double({ ...slope, noNaN: true }),
      n: fc.double({ min: 0.009, max: 0.03, noNaN: true }),
      pick: fc.nat(),
    })
    .map(({ box, rise, aspect, length, slope, n, pick }): Barrel => {
      const names = entrancesFor(box ? "box" : "circular");
      const name = names[pick % names.length];
      return box ? boxBarrel(rise * aspect, rise, name, slope, length, n) : circularBarrel(rise, name, slope, { length, manningN: n });
    });
}

/** Flow at which HDS-5's approximate outlet-control HW/D reaches `ratio` (bisection; it rises with
 * flow), or null when it is there already at zero flow. */
export function flowAtApproximateRatio(b: Barrel, tw: number, ratio: number): number | null {
  const rise = barrelRise(b);
  if (approximateOutletHeadwater(b, 0, tw) / rise >= ratio) return null;
  let low = 0;
  let high = flowAt(b, 1e-3);
  while (approximateOutletHeadwater(b, high, tw) / rise < ratio) high *= 2;
  for (let i = 0; i < 200 && high - low > 1e-15 * high; i++) {
    const mid = 0.5 * (low + high);
    if (approximateOutletHeadwater(b, mid, tw) / rise < ratio) low = mid;
    else high = mid;
  }
  return high;
}
