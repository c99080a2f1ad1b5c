// Loading and routing large inputs: a 10-day inflow at 1-second steps (864,001 CSV rows) and a case
// with 20 storms, each read from its own CSV; the time to load (read, parse, validate, convert)
// and to route, and the peak memory (resident set, and heap growth). Figures only, never asserted.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { loadCase } from "../src/case/load.js";
import { routeCase } from "../src/routing/routeCase.js";
import { collectGarbage, formatNumber, megabytes, report } from "./measure.js";
import type { BenchSection } from "./section.js";

/** An invented inflow (cfs) at t minutes: a storm peaking at 40 cfs on day 2, a smaller one on day 6. */
function inflowAt(minutes: number, days: number): number {
  const hours = minutes / 60;
  const end = days * 24;
  if (hours <= 0 || hours >= end) return 0;
  return 40 * Math.exp(-(((hours - 40) / 3) ** 2)) + 12 * Math.exp(-(((hours - 140) / 5) ** 2)) + 0.5 * Math.sin((Math.PI * hours) / end);
}

function csv(days: number, stepSeconds: number, scale: number): string {
  const rows = ["seconds,flow (cfs)"];
  for (let s = 0; s <= days * 86400; s += stepSeconds) rows.push(`${s},${(scale * inflowAt(s / 60, days)).toFixed(4)}`);
  return rows.join("\n") + "\n";
}

function caseJson(storms: { name: string; returnPeriod: number; file: string; target: number }[]) {
  return {
    name: "Bench: long-record basin (invented)",
    units: "US",
    pond: { bottom: 100, top: 110, storage: { prismoid: { length: 300, width: 150, sideSlope: 3 } } },
    storms: storms.map((s) => ({ name: s.name, returnPeriod: s.returnPeriod, target: s.target, inflow: { file: s.file } })),
    criteria: { drawdown: { hours: 72 } },
    outlet: {
      elements: [
        { type: "orifice", shape: "circular", diameter: "8 in", invert: 100 },
        { type: "weir", shape: "rectangular", length: 3, crest: 105 },
      ],
      riser: { shape: "circular", diameter: 5, crest: 107.5 },
      spillway: { crest: 108.5, length: 20, sideSlope: 3 },
    },
  };
}

/** Heap plus array buffers (the case's series are Float64Arrays, outside the heap). */
function memoryHeld(): number {
  collectGarbage();
  const m = process.memoryUsage();
  return m.heapUsed + m.arrayBuffers;
}

function measure(label: string, dir: string, json: unknown): void {
  const file = join(dir, `${label}.json`);
  writeFileSync(file, JSON.stringify(json));
  const heapBefore = memoryHeld();
  const t0 = process.hrtime.bigint();
  const loaded = loadCase(file);
  const t1 = process.hrtime.bigint();
  const routing = routeCase(loaded.case, loaded.case.outlet!);
  const t2 = process.hrtime.bigint();
  const heapAfter = memoryHeld();
  const points = loaded.case.storms.reduce((n, s) => n + s.inflow.times.length, 0);
  const steps = routing.storms.reduce((n, s) => n + s.result.steps, 0);
  report(`inputs: ${label}`, [
    ["storms", String(loaded.case.storms.length)],
    ["inflow points", formatNumber(points)],
    ["load (read, parse, validate, convert)", `${formatNumber(Number(t1 - t0) / 1e6)} ms`],
    ["route every storm", `${formatNumber(Number(t2 - t1) / 1e6)} ms (${formatNumber(steps)} steps)`],
    ["heap and array buffers held by the loaded case", megabytes(heapAfter - heapBefore)],
    ["peak resident memory so far", `${formatNumber(process.resourceUsage().maxRSS / 1024)} MB`],
  ]);
}

function run(): void {
  const dir = mkdtempSync(join(tmpdir(), "outfit-bench-inputs-"));
  try {
    writeFileSync(join(dir, "ten-days.csv"), csv(10, 1, 1));
    measure("one 10-day inflow at 1-second steps", dir, caseJson([{ name: "10-day record", returnPeriod: 10, file: "ten-days.csv", target: 30 }]));
    const storms = [];
    for (let i = 0; i < 20; i++) {
      const file = `storm-${i + 1}.csv`;
      writeFileSync(join(dir, file), csv(2, 60, 0.2 + 0.05 * i));
      storms.push({ name: `storm ${i + 1}`, returnPeriod: i + 1, file, target: 30 });
    }
    measure("20 storms of 2 days at 1-minute steps", dir, caseJson(storms));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export const inputsSection: BenchSection = { name: "inputs", run };
