// Reads the plots of a report page back into data: each SVG's axis scales, its series (path
// coordinates inverted through the scales), its marked points and its reference lines, plus the
// browser's own geometry (rendered size, bounding boxes of the series).
import type { Page } from "playwright-core";

interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface PlotReading {
  figure: string;
  plot: string;
  rendered: { width: number; height: number };
  xDomain: number[];
  xRange: number[];
  yDomain: number[];
  yRange: number[];
  series: { key: string; label: string; d: string; box: Box }[];
  points: { group: string; x: number; y: number; label: string | null; xLow: number | null; xHigh: number | null }[];
  references: { key: string; axis: string; value: number }[];
}

export async function readPlots(page: Page): Promise<PlotReading[]> {
  return page.evaluate(() => {
    const nums = (text: string | null) => (text ?? "").trim().split(/\s+/).map(Number);
    return Array.from(document.querySelectorAll("svg[data-plot]")).map((svg) => {
      const rect = svg.getBoundingClientRect();
      return {
        figure: svg.closest("figure")?.getAttribute("data-figure") ?? "",
        plot: svg.getAttribute("data-plot") ?? "",
        rendered: { width: rect.width, height: rect.height },
        xDomain: nums(svg.getAttribute("data-x-domain")),
        xRange: nums(svg.getAttribute("data-x-range")),
        yDomain: nums(svg.getAttribute("data-y-domain")),
        yRange: nums(svg.getAttribute("data-y-range")),
        series: Array.from(svg.querySelectorAll("path[data-series]")).map((path) => {
          const box = (path as SVGPathElement).getBBox();
          return {
            key: path.getAttribute("data-series") ?? "",
            label: path.getAttribute("data-label") ?? "",
            d: path.getAttribute("d") ?? "",
            box: { x: box.x, y: box.y, width: box.width, height: box.height },
          };
        }),
        points: Array.from(svg.querySelectorAll("g[data-points] > g[data-x]")).map((g) => ({
          group: g.parentElement?.getAttribute("data-points") ?? "",
          x: Number(g.getAttribute("data-x")),
          y: Number(g.getAttribute("data-y")),
          label: g.getAttribute("data-label"),
          xLow: g.hasAttribute("data-x-low") ? Number(g.getAttribute("data-x-low")) : null,
          xHigh: g.hasAttribute("data-x-high") ? Number(g.getAttribute("data-x-high")) : null,
        })),
        references: Array.from(svg.querySelectorAll("[data-reference]")).map((line) => ({
          key: line.getAttribute("data-reference") ?? "",
          axis: line.getAttribute("data-axis") ?? "",
          value: Number(line.getAttribute("data-value")),
        })),
      };
    });
  });
}

/** Maps drawing coordinates back to data through a plot's axis attributes. */
export function inverters(plot: PlotReading) {
  const invert = (domain: number[], range: number[]) => (p: number) => domain[0] + ((p - range[0]) / (range[1] - range[0])) * (domain[1] - domain[0]);
  return { x: invert(plot.xDomain, plot.xRange), y: invert(plot.yDomain, plot.yRange) };
}

/** A series' vertices in data units, read from its path ("M x y L x y ..."). */
export function seriesData(plot: PlotReading, key: string): [number, number][] {
  const series = plot.series.find((s) => s.key === key);
  if (!series) throw new Error(`plot ${plot.figure}: no series ${key} (has ${plot.series.map((s) => s.key).join(", ")})`);
  const { x, y } = inverters(plot);
  return Array.from(series.d.matchAll(/[ML]\s*(-?[\d.]+)[ ,](-?[\d.]+)/g), (m) => [x(Number(m[1])), y(Number(m[2]))]);
}

/** Linear interpolation in a polyline with increasing x. */
export function interpolate(points: readonly (readonly [number, number])[], x: number): number {
  if (x <= points[0][0]) return points[0][1];
  for (let i = 1; i < points.length; i++) {
    if (points[i][0] >= x) {
      const [x0, y0] = points[i - 1];
      const [x1, y1] = points[i];
      return x1 > x0 ? y0 + ((y1 - y0) * (x - x0)) / (x1 - x0) : y1;
    }
  }
  return points[points.length - 1][1];
}
