import { describe, expect, it } from "vitest";
import { parseArea, parseDepth, parseIntensity, parseLength } from "../../src/units.js";

// Unit definitions: 1 ft = 0.3048 m (exact), 1 ac = 43,560 ft2, 1 mi2 = 640 ac, 1 ha = 10,000 m2.
describe("hydrology quantities with units", () => {
  it("areas: acres, hectares, square miles and kilometres, bare numbers in ac (US) or ha (SI)", () => {
    expect(parseArea("12 ac", "SI")).toBeCloseTo(12 * 4046.8564224, 6);
    expect(parseArea("4.9 ha", "US")).toBeCloseTo(49000, 9);
    expect(parseArea("1 mi2", "US")).toBeCloseTo(2589988.110336, 4);
    expect(parseArea("0.3 km2", "US")).toBeCloseTo(300000, 6);
    expect(parseArea(2, "US")).toBeCloseTo(2 * 4046.8564224, 6);
    expect(parseArea(2, "SI")).toBeCloseTo(20000, 9);
  });
  it("depths: inches and millimetres, bare numbers in in (US) or mm (SI)", () => {
    expect(parseDepth("3.2 in", "SI")).toBeCloseTo(0.08128, 12);
    expect(parseDepth("81 mm", "US")).toBeCloseTo(0.081, 12);
    expect(parseDepth(3.2, "US")).toBeCloseTo(0.08128, 12);
    expect(parseDepth(81, "SI")).toBeCloseTo(0.081, 12);
  });
  it("intensities: in/h and mm/h, bare numbers in in/h (US) or mm/h (SI)", () => {
    expect(parseIntensity("2.5 in/h", "SI")).toBeCloseTo((2.5 * 0.0254) / 3600, 15);
    expect(parseIntensity("60 mm/h", "US")).toBeCloseTo(0.06 / 3600, 15);
    expect(parseIntensity("60 mm/hr", "US")).toBeCloseTo(0.06 / 3600, 15);
    expect(parseIntensity(2.5, "US")).toBeCloseTo((2.5 * 0.0254) / 3600, 15);
  });
  it("name the expected units when a unit is wrong", () => {
    expect(parseArea("12 acres", "US")).toEqual({ error: "an area unit among ac, ha, km2, mi2, ft2, m2" });
    expect(parseIntensity("2 in", "US")).toEqual({ error: "an intensity unit among in/h, in/hr, mm/h, mm/hr" });
    expect(parseDepth("three inches", "US")).toHaveProperty("error");
  });
  it("leave lengths as they were", () => {
    expect(parseLength("6 in", "SI")).toBeCloseTo(0.1524, 12);
    expect(parseLength(2, "US")).toBeCloseTo(0.6096, 12);
    expect(parseLength("6 furlongs", "US")).toEqual({ error: 'a length unit among ft, foot, feet, in, inch, inches, ", m, mm, cm' });
  });
});
