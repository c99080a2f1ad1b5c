// The limiting part is named in the trade's words, and the barrel only where it cuts the openings'
// own (free) flow by more than NOTICEABLE_REDUCTION: checked against the openings' flow computed
// here with the barrel taken away (the openings then discharge freely).
import { describe, expect, it } from "vitest";
import { join } from "node:path";
import { loadCase } from "../../src/case/load.js";
import { outletDetail } from "../../src/hydraulics/outlet.js";
import { limitingPart, NOTICEABLE_REDUCTION } from "../../src/report/limiting.js";
import { ROOT } from "./support.js";

const { case: c } = loadCase(join(ROOT, "cases/demo/case.json"));
const outlet = c.outlet!;
const FOOT = 0.3048;
const withoutBarrel = { ...outlet, barrel: undefined, spillway: undefined };

describe("limiting part", () => {
  it.each([100.5, 101.5, 102.0, 102.35, 103.0, 104.0, 104.5, 105.0])("at %f ft: barrel named exactly when it cuts the free flow by more than 1 %", (stageFt) => {
    const stage = stageFt * FOOT;
    const d = outletDetail(outlet, c.tailwater, stage);
    const free = outletDetail(withoutBarrel, c.tailwater, stage).total;
    const cut = (free - d.barrel!) / free;
    const words = limitingPart(outlet, d);
    if (cut > NOTICEABLE_REDUCTION) expect(words).toMatch(/^barrel, (inlet|outlet) control$/);
    else expect(words).not.toMatch(/barrel/);
  });

  it("at the demo's 2-yr peak stage the chamber's small effect (under 1 %) is not called limiting", () => {
    const d = outletDetail(outlet, c.tailwater, 102.35 * FOOT);
    expect(d.control).toBe("barrel inlet control"); // the solver's exact control
    expect(limitingPart(outlet, d)).toBe("openings");
  });

  it("names nothing when nothing flows and the spillway when it carries most", () => {
    expect(limitingPart(outlet, outletDetail(outlet, c.tailwater, 100 * FOOT))).toBe("no flow");
    expect(limitingPart(outlet, outletDetail(outlet, c.tailwater, 106 * FOOT))).toBe("spillway");
  });
});
