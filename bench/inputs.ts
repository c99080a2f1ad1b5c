// Loading and routing large inputs: a 10-day inflow at 1-second steps (864,001 CSV rows) and a case
// with 20 storms, each read from its own CSV; the time to load (read, parse, validate, convert)
// and to route, and the peak memory (resident set, and heap growth); and `design` (the CLI, as a user
// runs it) on a million-row 1-second inflow with a budget of 2000 routings: wall time and peak
// resident memory. Figures only, never asserted.
import { spawn } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
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

/** Peak resident memory of a running process (kB), from /proc (Linux); null where it cannot be read. */
function peakResident(pid: number): number | null {
  try {
    const m = /VmHWM:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, "utf8"));
    return m ? Number(m[1]) : null;
  } catch {
    return null;
  }
}

/** `outfit design <case> --budget 2000 --quiet` in a child process: wall time (s), peak memory (kB). */
function designRun(file: string): Promise<{ seconds: number; peak: number | null; code: number | null }> {
  const cli = join(dirname(fileURLToPath(import.meta.url)), "..", "src", "cli.js");
  return new Promise((done) => {
    const t0 = process.hrtime.bigint();
    const child = spawn(process.execPath, [cli, "design", file, "--budget", "2000", "--quiet"], { stdio: "ignore" });
    let peak: number | null = null;
    const poll = setInterval(() => {
      const kB = child.pid === undefined ? null : peakResident(child.pid);
      if (kB !== null) peak = Math.max(peak ?? 0, kB);
    }, 50);
    child.on("exit", (code) => {
      clearInterval(poll);
      done({ seconds: Number(process.hrtime.bigint() - t0) / 1e9, peak, code });
    });
  });
}

async function measureDesign(dir: string): Promise<void> {
  const rows = ["seconds,flow (cfs)"];
  const days = 1e6 / 86400;
  for (let s = 0; s < 1e6; s++) rows.push(`${s},${inflowAt(s / 60, days).toFixed(4)}`);
  writeFileSync(join(dir, "million.csv"), rows.join("\n") + "\n");
  const json = caseJson([{ name: "long record", returnPeriod: 10, file: "million.csv", target: 20 }]) as Record<string, unknown>;
  const { elements: _elements, riser: _riser, ...site } = json.outlet as Record<string, unknown>;
  const file = join(dir, "design-long.json");
  writeFileSync(
    file,
    JSON.stringify({
      ...json,
      outlet: { ...site, barrel: { shape: "circular", diameter: "24 in", length: 60, inletInvert: 99.5, outletInvert: 99, manningN: 0.013, entrance: "concrete-square-headwall" } },
      catalogue: {
        orifice: { diameters: ["3 in", "4 in", "6 in", "8 in", "10 in", "12 in", "15 in", "18 in"], maxCount: 4 },
        weir: { shapes: ["rectangular", "v-notch"], lengths: [1, 1.5, 2, 3, 4, 6], angles: [22.5, 30, 45, 60, 90] },
        riser: { diameters: [3, 4, 5, 6] },
        barrel: { diameters: ["18 in", "24 in", "30 in", "36 in"] },
        maxStages: 3,
        elevationStep: 0.05,
      },
    }),
  );
  const r = await designRun(file);
  report("inputs: design on a 1-second inflow of 1,000,000 rows (budget 2000 routings, default workers)", [
    ["wall time (load, search on the thinned inflow, candidates on the full one)", `${formatNumber(r.seconds)} s (exit ${r.code})`],
    ["peak resident memory (all threads)", r.peak === null ? "not readable here (no /proc)" : `${formatNumber(r.peak / 1024)} MB`],
  ]);
}

async function run(): Promise<void> {
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
    await measureDesign(dir);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export const inputsSection: BenchSection = { name: "inputs", run };
