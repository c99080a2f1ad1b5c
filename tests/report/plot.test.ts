// The plotting module: scales, round ticks, escaping and a chart whose data reads back from its SVG.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { linearScale } from "../../src/report/plot/scale.js";
import { niceAxis, stepDecimals, tickLabel, tickStep } from "../../src/report/plot/ticks.js";
import { coordinate, escapeMarkup, standaloneSvg } from "../../src/report/plot/svg.js";
import { chart, markerPositions } from "../../src/report/plot/chart.js";
import { cycleStyle } from "../../src/report/plot/style.js";

describe("linear scale", () => {
  it("maps the domain's ends onto the range's ends, also reversed, and inverts", () => {
    const s = linearScale([100, 106], [300, 20]);
    expect(s(100)).toBe(300);
    expect(s(106)).toBe(20);
    expect(s(103)).toBe(160);
    expect(s.invert(160)).toBe(103);
  });
  it("refuses an empty domain", () => {
    expect(() => linearScale([1, 1], [0, 10])).toThrow(/increasing/);
  });
});

describe("round ticks", () => {
  it("steps by 1, 2 or 5 times a power of ten", () => {
    expect(tickStep(6, 6)).toBe(1);
    expect(tickStep(60, 6)).toBe(10);
    expect(tickStep(200_000, 6)).toBe(50_000);
    expect(tickStep(0.3, 6)).toBe(0.05);
    expect(tickStep(13, 6)).toBe(2);
  });
  it("covers any interval with 3 to 16 round ticks on whole multiples of the step", () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: 1e-3, max: 1e6, noNaN: true }), (min, span) => {
        const max = min + span;
        const axis = niceAxis(min, max);
        const mantissa = axis.step / Math.pow(10, Math.floor(Math.log10(axis.step) + 1e-9));
        expect([1, 2, 5]).toContainEqual(Number(mantissa.toPrecision(6)));
        expect(axis.domain[0]).toBeLessThanOrEqual(min + 1e-9 * span);
        expect(axis.domain[1]).toBeGreaterThanOrEqual(max - 1e-9 * span);
        expect(axis.ticks.length).toBeGreaterThanOrEqual(3);
        expect(axis.ticks.length).toBeLessThanOrEqual(16);
        for (const t of axis.ticks) expect(Math.abs(t / axis.step - Math.round(t / axis.step))).toBeLessThan(1e-6);
      }),
      // Narrow intervals far from zero, where floating-point rounding once left the data outside.
      { numRuns: 2000, examples: [[999999.9999999999, 0.001], [-999999.9999999999, 0.001]] },
    );
  });
  it("prints ticks with the decimals the step needs and thousands separated", () => {
    expect(stepDecimals(0.05)).toBe(2);
    expect(stepDecimals(5)).toBe(0);
    expect(tickLabel(200_000, 50_000)).toBe("200,000");
    expect(tickLabel(104.5, 0.5)).toBe("104.5");
    expect(tickLabel(0.1, 0.05)).toBe("0.10");
  });
});

describe("markup", () => {
  it("escapes the five special characters of HTML and SVG", () => {
    expect(escapeMarkup(`<a href="x">'&'</a>`)).toBe("&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;");
  });
  it("writes coordinates to 1/100 without negative zero", () => {
    expect(coordinate(12.3456)).toBe("12.35");
    expect(coordinate(-0.001)).toBe("0");
    expect(coordinate(40)).toBe("40");
  });
  it("makes a standalone SVG file with the SVG namespace", () => {
    expect(standaloneSvg('<svg viewBox="0 0 1 1"></svg>')).toBe('<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 1 1"></svg>\n');
  });
});

describe("chart", () => {
  const points: [number, number][] = [[0, 0], [1, 3.5], [2, 2], [4.5, 7.25]];
  const svg = chart({
    id: "t1",
    key: "test",
    title: "A <test> chart",
    description: "made up",
    x: { label: "Time", unit: "h", includeZero: true },
    y: { label: "Flow", unit: "cfs", includeZero: true },
    series: [
      { key: "a", label: "series a", points, style: cycleStyle(0) },
      { key: "b", label: "series b", points: points.map(([x, y]) => [x, y / 2]), style: cycleStyle(1) },
    ],
    bands: [
      { key: "b1", axis: "y", from: 1, to: 2, label: "band", colour: "#CC79A7" },
      { key: "b2", axis: "y", from: 5, to: 6, label: "band", colour: "#CC79A7" },
    ],
    references: [{ key: "top", axis: "y", value: 7, label: "top 7 cfs", style: cycleStyle(2) }],
    points: [{ key: "peaks", label: "peak", style: cycleStyle(3), points: [{ x: 4.5, y: 7.25, label: "p", xRange: [4, 5] }] }],
  });
  const attribute = (name: string) => /\s*(\S+) (\S+)/.exec(new RegExp(`${name}="([^"]*)"`).exec(svg)![1])!.slice(1).map(Number);

  it("puts the axis scales on the root and the data in the path, to 1/100 of a drawing unit", () => {
    const [d0, d1] = attribute("data-x-domain");
    const [r0, r1] = attribute("data-x-range");
    const [e0, e1] = attribute("data-y-domain");
    const [s0, s1] = attribute("data-y-range");
    expect([d0, d1, e0, e1]).toEqual([0, 5, 0, 8]);
    const d = /data-series="a"[^>]* d="([^"]*)"/.exec(svg)![1];
    const read = Array.from(d.matchAll(/[ML](\S+) (\S+)/g), (m) => [d0 + ((Number(m[1]) - r0) / (r1 - r0)) * (d1 - d0), e0 + ((Number(m[2]) - s0) / (s1 - s0)) * (e1 - e0)]);
    expect(read.length).toBe(points.length);
    read.forEach(([x, y], i) => {
      expect(Math.abs(x - points[i][0])).toBeLessThan((0.005 * (d1 - d0)) / Math.abs(r1 - r0) + 1e-12);
      expect(Math.abs(y - points[i][1])).toBeLessThan((0.005 * (e1 - e0)) / Math.abs(s1 - s0) + 1e-12);
    });
  });

  it("labels axes with units, escapes text and names each entry once in the legend", () => {
    expect(svg).toContain(">Time (h)<");
    expect(svg).toContain(">Flow (cfs)<");
    expect(svg).toContain("A &lt;test&gt; chart");
    expect(svg.match(/data-legend="/g)!.length).toBe(4); // two series, the point group, one band entry
    expect(svg.match(/data-band="/g)!.length).toBe(2);
    expect(svg).toContain('data-reference="top"');
    expect(svg).toMatch(/data-x="4.5" data-y="7.25" data-label="p" data-x-low="4" data-x-high="5"/);
  });

  it("spreads markers evenly along a line", () => {
    const marks = markerPositions([[0, 0], [60, 0]], 0.5);
    expect(marks.map(([x]) => x)).toEqual([5, 15, 25, 35, 45, 55]);
  });
});
