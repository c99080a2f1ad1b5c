// A link between two ponds rated for `outfit rate`: the flow through a pond's outlet into the pond
// downstream as a table of both stages (direct evaluation, barrels by their pointwise HDS-5 forms),
// positive forward, negative where it runs back.
import type { Case, PondSystem } from "../model.js";
import { linkFlow } from "../hydraulics/link.js";
import { formatter, significant } from "../format.js";
import { toCaseUnits } from "../units.js";
import { describeOutlet } from "./describe.js";
import { PLAIN, renderTable, wrap, type Column, type Layout } from "./terminal.js";

export interface LinkRating {
  /** Upstream and downstream stages (m), and the flow (m3/s) at [upstream][downstream]. */
  up: number[];
  down: number[];
  flows: number[][];
}

/** Stages from a pond's floor to its top at `step` (m), the top always last. */
export function stagesOf(bottom: number, top: number, step: number): number[] {
  const out: number[] = [];
  for (let i = 0; ; i++) {
    const z = bottom + i * step;
    if (top - z < 1e-9 * step) break;
    out.push(z);
  }
  out.push(top);
  return out;
}

/** The link of pond `index` rated at its pond's stages (`upStep`) and the downstream pond's (`downStep`). */
export function linkRating(system: PondSystem, index: number, upStep: number, downStep: number): LinkRating {
  const p = system.ponds[index];
  const d = system.ponds[p.to];
  const up = stagesOf(p.pond.bottom, p.pond.top, upStep);
  const down = stagesOf(d.pond.bottom, d.pond.top, downStep);
  return { up, down, flows: up.map((x) => down.map((y) => linkFlow(p.outlet, x, y))) };
}

/** The downstream step for a text table: the row step if every column fits the width (or when wide), else the next round step that fits. */
export function downstreamStep(c: Case, system: PondSystem, index: number, step: number, layout: Layout): number {
  const d = system.ponds[system.ponds[index].to].pond;
  if (layout.wide || layout.width === null) return step;
  const fit = Math.max(2, Math.floor((layout.width - 10) / 9));
  const unit = c.units === "US" ? 0.3048 : 1;
  let s = step;
  while (stagesOf(d.bottom, d.top, s).length > fit) s = nextRound(s / unit) * unit;
  return s;
}

/** The next of 1, 2, 2.5 and 5 times a power of ten above x. */
function nextRound(x: number): number {
  const power = Math.pow(10, Math.floor(Math.log10(x)));
  for (const m of [1, 2, 2.5, 5, 10]) if (m * power > x * (1 + 1e-9)) return m * power;
  return 10 * power;
}

export function linkRatingText(c: Case, system: PondSystem, index: number, rating: LinkRating, layout: Layout = PLAIN): string {
  const f = formatter(c.units);
  const p = system.ponds[index];
  const to = system.ponds[p.to].name;
  const digits = c.units === "US" ? 2 : 3;
  const columns: Column[] = [
    { head: `Stage\n(${f.labels.length})`, align: "right" },
    ...rating.down.map((y): Column => ({ head: `${f.raw.length(y).toFixed(digits)}\n(${f.labels.flow})`, align: "right" })),
  ];
  const rows = rating.up.map((x, i) => [f.raw.length(x).toFixed(digits), ...rating.flows[i].map((q) => significant(f.raw.flow(q)))]);
  return [
    wrap(`Pond ${p.name} into ${to} through: ${describeOutlet(p.outlet, f)}`, layout.width),
    wrap(`Flow (${f.labels.flow}) by the stage of ${p.name} (rows) and of ${to} (columns, ${f.labels.length}); negative: back from ${to} into ${p.name}.`, layout.width),
    renderTable(layout, columns, rows).text,
  ].join("\n");
}

export function linkRatingJson(c: Case, system: PondSystem, index: number, rating: LinkRating) {
  const u = toCaseUnits(c.units);
  const p = system.ponds[index];
  return {
    name: p.name,
    to: system.ponds[p.to].name,
    upstreamStages: rating.up.map((z) => u.length(z)),
    downstreamStages: rating.down.map((z) => u.length(z)),
    /** [upstream][downstream]; positive into `to`, negative back. */
    flows: rating.flows.map((row) => row.map((q) => u.flow(q))),
  };
}

export function linkRatingCsv(c: Case, system: PondSystem, index: number, rating: LinkRating): string {
  const u = toCaseUnits(c.units);
  const L = formatter(c.units).labels;
  const p = system.ponds[index];
  const to = system.ponds[p.to].name;
  const lines = [`${p.name} stage (${L.length}),${to} stage (${L.length}),flow (${L.flow})`];
  rating.up.forEach((x, i) => rating.down.forEach((y, j) => lines.push([u.length(x).toFixed(4), u.length(y).toFixed(4), significant(u.flow(rating.flows[i][j]))].join(","))));
  return lines.join("\n") + "\n";
}
