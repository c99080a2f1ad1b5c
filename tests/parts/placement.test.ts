// Where the openings sit on their wall, against plane geometry done by hand: the arc a chord takes on
// a round riser (s = D asin(c / D)), the clear web between two holes at given angles (arc between the
// centres less the two half arcs; diagonal webs by Pythagoras), a box riser's sides and corners, a
// headwall's ends, the barrel's hole on its centreline, the round stations the placement prefers, and
// the places as a drafter reads them: the wall developed seen from outside, left to right.
import { describe, expect, it } from "vitest";
import type { Outlet } from "../../src/model.js";
import { barrelStation, chordArc, placeAt, upstreamStation, usableWidth, wallEdges, wallLength, wallOf } from "../../src/parts/wall.js";
import { clearWeb, placeOpenings } from "../../src/parts/placement.js";

const FOOT = 0.3048;
const INCH = 0.0254;
const WEB = 0.5 * FOOT;

function orifice(diameter: number, invert: number, count = 1) {
  return { type: "orifice", shape: "circular", diameter, count, invert, coefficient: 0.61, keep: false };
}
function roundRiser(diameter: number, crest: number) {
  return { shape: "circular", diameter, crest, coefficient: 1.66, orificeCoefficient: 0.6, keep: false };
}
function outletOf(elements: object[], riser?: object, barrel?: object): Outlet {
  return { elements, ...(riser ? { riser } : {}), ...(barrel ? { barrel } : {}) } as unknown as Outlet;
}
const limits = { web: WEB, headwallWidth: null, highestStage: null };

describe("the wall's geometry", () => {
  it("a chord c on a round wall of diameter D takes the arc D asin(c / D); the diameter itself half the perimeter", () => {
    const d = 4 * FOOT;
    expect(chordArc(d, 1 * FOOT)).toBeCloseTo(d * Math.asin(0.25), 12);
    // 1 ft chord on a 4 ft riser: 4 asin(0.25) = 4 x 0.252680 = 1.01072 ft (a little more than the chord).
    expect(chordArc(d, 1 * FOOT) / FOOT).toBeCloseTo(1.01072, 5);
    expect(chordArc(d, d)).toBeCloseTo((Math.PI * d) / 2, 12);
    expect(chordArc(d, 2 * d)).toBeCloseTo((Math.PI * d) / 2, 12);
  });

  it("usable width: a plate with a web at each end across a round riser's diameter, a box's longest side, a headwall's stated width", () => {
    expect(usableWidth({ kind: "round riser", diameter: 4 * FOOT }, WEB)! / FOOT).toBeCloseTo(3, 12);
    expect(usableWidth({ kind: "box riser", length: 5 * FOOT, width: 3 * FOOT }, WEB)! / FOOT).toBeCloseTo(4, 12);
    expect(usableWidth({ kind: "headwall", width: 6 * FOOT }, WEB)! / FOOT).toBeCloseTo(5, 12);
    expect(usableWidth({ kind: "headwall", width: null }, WEB)).toBeNull();
  });

  it("a box's developed wall: from the downstream side's left end, its sides left to right seen from outside (downstream, left, upstream, right), each place a side and the offset from its left end", () => {
    // length 4 (along the barrel), width 3: downstream 3 wide, left 4, upstream 3, right 4; perimeter 14.
    const box = { kind: "box riser", length: 4, width: 3 } as const;
    expect(wallLength(box)).toBe(14);
    expect(wallEdges(box)).toEqual([0, 3, 7, 10]);
    // The barrel leaves through the downstream side's middle; the upstream side's middle faces the pond.
    expect(barrelStation(box)).toBe(1.5);
    expect(upstreamStation(box)).toBe(8.5);
    expect(placeAt(box, 0)).toEqual({ side: "downstream", offset: 0 });
    expect(placeAt(box, 3.5)).toEqual({ side: "left", offset: 0.5 });
    expect(placeAt(box, 8.5)).toEqual({ side: "upstream", offset: 1.5 });
    expect(placeAt(box, 12)).toEqual({ side: "right", offset: 2 });
    // Round the corner both ways: stations wrap.
    expect(placeAt(box, 15)).toEqual({ side: "downstream", offset: 1 });
    expect(placeAt(box, -1)).toEqual({ side: "right", offset: 3 });
  });

  it("a round riser's places: the angle from the barrel's centreline, a quarter of the perimeter along 90 degrees; a headwall's the offset from its left end", () => {
    const round = { kind: "round riser", diameter: 4 } as const;
    expect(barrelStation(round)).toBe(0);
    expect(upstreamStation(round)).toBeCloseTo(2 * Math.PI, 12);
    expect(placeAt(round, Math.PI)).toEqual({ angle: 90 });
    expect(placeAt(round, 4 * Math.PI + Math.PI)).toEqual({ angle: 90 });
    expect(placeAt(round, -Math.PI)).toEqual({ angle: 270 });
    expect(placeAt({ kind: "headwall", width: 6 }, 2.5)).toEqual({ offset: 2.5 });
    expect(barrelStation({ kind: "headwall", width: 6 })).toBeNull();
  });

  it("a riser's wall is its own; without one a headwall", () => {
    expect(wallOf(outletOf([], roundRiser(1.2, 101)), null)).toEqual({ kind: "round riser", diameter: 1.2 });
    expect(wallOf(outletOf([]), 2)).toEqual({ kind: "headwall", width: 2 });
  });
});

describe("the clear web between two holes", () => {
  const d = 4 * FOOT;
  const r = d / 2;
  const w = 1 * FOOT;
  const along = chordArc(d, w);
  const hole = (degrees: number, bottom: number) => ({ station: (r * degrees * Math.PI) / 180, along, bottom, top: bottom + w });

  it("side by side at 0 and 90 degrees on a 4 ft riser: the arc between the centres less the two half arcs", () => {
    // (D/2)(pi/2) - D asin(w/D) = 0.957557 - 0.308067 = 0.649490 m.
    const web = clearWeb(hole(0, 100), hole(90, 100), Math.PI * d);
    expect(web).toBeCloseTo(r * (Math.PI / 2) - d * Math.asin(0.25), 12);
    expect(web).toBeCloseTo(0.64949, 5);
  });

  it("the shorter way round the riser: 0 and 300 degrees are 60 degrees apart", () => {
    expect(clearWeb(hole(0, 100), hole(300, 100), Math.PI * d)).toBeCloseTo(r * (Math.PI / 3) - along, 12);
  });

  it("one above the other: the vertical gap; diagonally: Pythagoras of the two gaps", () => {
    expect(clearWeb(hole(0, 100), hole(0, 100 + w + 0.2), Math.PI * d)).toBeCloseTo(0.2, 12);
    const across = r * (Math.PI / 2) - along;
    expect(clearWeb(hole(0, 100), hole(90, 100 + w + 0.2), Math.PI * d)).toBeCloseTo(Math.hypot(across, 0.2), 12);
  });

  it("overlapping holes: negative, by the smaller overlap", () => {
    // Same angle, the second 0.1 m higher: they overlap by w - 0.1 up and by a whole arc across.
    expect(clearWeb(hole(0, 100), hole(0, 100.1), Math.PI * d)).toBeCloseTo(-(w - 0.1), 12);
  });
});

describe("openings placed on their wall", () => {
  it("two 1 ft orifices at one invert on a 4 ft riser: one faces the pond, the other at the nearest 5 degrees with twice the web (the smaller angle of the tie), numbered left to right", () => {
    const d = 4 * FOOT;
    const plan = placeOpenings(outletOf([orifice(1 * FOOT, 100, 2)], roundRiser(d, 103)), limits);
    expect(plan.openings.map((o) => [o.opening, o.place])).toEqual([[1, { angle: 120 }], [2, { angle: 180 }]]);
    // Twice the web (1 ft) needs 0.3048 - 0.05 x 0.1524 = 0.2972 m of arc between edges:
    // (D/2) dtheta - D asin(1/4) >= 0.2972 gives dtheta >= 56.9 degrees, so 60: web (D/2)(pi/3) - D asin(1/4).
    expect(plan.web).toBeCloseTo((d / 2) * (Math.PI / 3) - d * Math.asin(0.25), 12);
    expect(plan.closest).toEqual(expect.arrayContaining([{ kind: "opening", element: 0, opening: 1 }, { kind: "opening", element: 0, opening: 2 }]));
  });

  it("openings far apart in elevation stack on the upstream face; the web between them is the vertical gap", () => {
    const plan = placeOpenings(outletOf([orifice(6 * INCH, 100), orifice(8 * INCH, 101)], roundRiser(4 * FOOT, 103)), limits);
    expect(plan.openings.map((o) => o.place)).toEqual([{ angle: 180 }, { angle: 180 }]);
    expect(plan.web).toBeCloseTo(1 - 6 * INCH, 12);
  });

  it("the barrel's hole sits at 0 degrees, and an opening beside it in elevation keeps away from it", () => {
    const barrel = { shape: "circular", diameter: 2 * FOOT, length: 20, inletInvert: 99.5, outletInvert: 99, manningN: 0.013, entrance: "concrete-square-headwall", keep: false };
    const plan = placeOpenings(outletOf([orifice(15 * INCH, 100)], roundRiser(4 * FOOT, 103), barrel), limits);
    expect(plan.barrel).toMatchObject({ station: 0, place: { angle: 0 }, bottom: 99.5, top: 99.5 + 2 * FOOT, width: 2 * FOOT });
    expect(plan.openings[0].place).toEqual({ angle: 180 });
    // Opposite the barrel: half the perimeter less the two half arcs.
    const d = 4 * FOOT;
    expect(plan.web).toBeCloseTo((Math.PI * d) / 2 - (chordArc(d, 2 * FOOT) + chordArc(d, 15 * INCH)) / 2, 12);
  });

  it("a box riser: a weir goes to the side where it keeps twice the web from the corners, in its middle", () => {
    // 4 ft along the barrel, 3 ft across: a 2 ft weir on the 3 ft upstream side keeps 0.5 ft from each
    // corner, on a 4 ft side 1 ft (twice the web): the left and right sides tie, and it goes to the
    // first left to right seen from outside, the left side, in its middle: 2 ft from its left end.
    const box = { shape: "box", length: 4 * FOOT, width: 3 * FOOT, crest: 103, coefficient: 1.66, orificeCoefficient: 0.6, keep: false };
    const weir = { type: "weir", shape: "rectangular", length: 2 * FOOT, crest: 102, endContractions: 2, coefficient: 1.84, keep: false };
    const plan = placeOpenings(outletOf([weir], box), limits);
    expect(plan.openings[0].place).toEqual({ side: "left", offset: expect.closeTo(2 * FOOT, 12) });
    expect(plan.openings[0].station).toBeCloseTo(5 * FOOT, 12);
    expect(plan.width).toBeCloseTo(14 * FOOT, 12);
    expect(plan.web).toBeCloseTo(1 * FOOT, 12);
    expect(plan.closest![1]).toEqual({ kind: "edge" });
  });

  it("a headwall of stated width keeps the web to its ends; of unstated width it is as wide as its openings take with a web at each end", () => {
    const three = outletOf([orifice(1 * FOOT, 100, 3)]);
    const wide = placeOpenings(three, { ...limits, headwallWidth: 8 * FOOT });
    expect(wide.width).toBeCloseTo(8 * FOOT, 12);
    const offset = (o: { place: object }) => (o.place as { offset: number }).offset;
    expect(wide.openings.every((o) => offset(o) - 0.5 * FOOT >= WEB - 1e-9 && offset(o) + 0.5 * FOOT <= 8 * FOOT - WEB + 1e-9)).toBe(true);
    expect(wide.web).toBeGreaterThanOrEqual(WEB);
    const open = placeOpenings(three, limits);
    // Centres one opening plus one web apart about the middle; the headwall 3 x 1 + 2 x 0.5 + 2 x 0.5 = 5 ft
    // wide, so from its left end at 1, 2.5 and 4 ft.
    expect(open.width / FOOT).toBeCloseTo(5, 9);
    const offsets = open.openings.map(offset).sort((a, b) => a - b);
    expect(offsets.map((x) => x / FOOT)).toEqual([expect.closeTo(1, 9), expect.closeTo(2.5, 9), expect.closeTo(4, 9)]);
    expect(open.openings.map((o) => o.station)).toEqual(open.openings.map(offset));
  });

  it("a flow regulator is mounted on the wall where it overlaps no hole, and takes no part in the webs", () => {
    const regulator = { type: "regulator", invert: 100, heads: [0, 1, 2], flows: [0, 0.1, 0.15], keep: false };
    const d = 4 * FOOT;
    const alone = placeOpenings(outletOf([orifice(1 * FOOT, 100)], roundRiser(d, 103)), limits);
    const plan = placeOpenings(outletOf([orifice(1 * FOOT, 100), regulator], roundRiser(d, 103)), limits);
    expect(plan.openings).toHaveLength(1);
    expect(plan.devices).toHaveLength(1);
    expect(plan.devices[0].element).toBe(1);
    // The orifice as without it, the webs the same.
    expect(plan.openings[0].station).toBe(alone.openings[0].station);
    expect(plan.web).toBe(alone.web);
    // Beside the orifice at one level: its box clear of the orifice's arc.
    const apart = Math.abs(plan.devices[0].station - plan.openings[0].station);
    expect(apart - (chordArc(d, 1 * FOOT) + chordArc(d, plan.devices[0].width)) / 2).toBeGreaterThan(0);
  });

  it("an absurd count costs no more than a full wall: 123456789 orifices of 1 ft on a 4 ft riser place the 8 it holds and one more", () => {
    // Perimeter 4 pi = 12.566 ft; each takes 4 asin(1/4) = 1.0107 ft of arc and a 0.5 ft web after it:
    // floor(12.566 / 1.5107) = 8 fit, the 9th already shows the web lost ((12.566 - 9 x 1.0107) / 9 = 0.386 ft at best).
    const plan = placeOpenings(outletOf([orifice(1 * FOOT, 100, 123456789)], roundRiser(4 * FOOT, 103)), limits);
    expect(plan.openings).toHaveLength(9);
    expect(plan.unplaced).toBe(123456789 - 9);
    expect(plan.web!).toBeLessThanOrEqual(((Math.PI * 4 - 9 * 4 * Math.asin(0.25)) / 9) * FOOT + 1e-9);
    expect(plan.web!).toBeLessThan(WEB);
  });

  it("a box side of a kilometre is searched at most a hundred round stations each way from its middle", () => {
    const box = { shape: "box", length: 1000, width: 1, crest: 103, coefficient: 1.66, orificeCoefficient: 0.6, keep: false };
    const plan = placeOpenings(outletOf([orifice(0.3, 100, 3)], box), limits);
    expect(plan.openings).toHaveLength(3);
    expect(plan.unplaced).toBe(0);
    expect(plan.web!).toBeGreaterThanOrEqual(WEB);
  });

  it("a notch reaches the rim: a 90 degree v-notch 2 ft below a 4 ft riser's rim is 4 ft wide there", () => {
    const notch = { type: "weir", shape: "v-notch", angle: 90, crest: 100, coefficient: 1.38, keep: false };
    const plan = placeOpenings(outletOf([notch], roundRiser(4 * FOOT, 100 + 2 * FOOT)), limits);
    expect(plan.openings[0].width / FOOT).toBeCloseTo(4, 12);
    expect(plan.openings[0].top).toBeCloseTo(100 + 2 * FOOT, 12);
  });
});
