// Every command on a system of ponds (the bundled cases/two-ponds: two ponds joined by an equaliser
// pipe, the lower pond's own inflow arriving first), run through the built command line as a user
// would; and a single pond written as a `ponds` list of one giving exactly the single pond's results.
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { looksLikeStackTrace, outfit, outfitWith, ROOT } from "./run.js";

const CASE = "cases/two-ponds/case.json";
const widest = (text: string) => Math.max(...text.split("\n").map((l) => l.length));

interface PondJson {
  name: string;
  maxStage: number;
  peakOutflow: number;
  peakReverse: number;
  massBalanceError: number;
  volumeBack: number;
}
interface StormJson {
  name: string;
  peakOutflow: number;
  target: number | null;
  ratio: number | null;
  volumeIn: number;
  volumeOut: number;
  ponds: PondJson[];
  series?: Record<string, number[]>;
}

describe("route on a system of ponds", () => {
  // With every step's series the JSON is larger than a pipe's buffer: written to a file.
  const out = join(mkdtempSync(join(tmpdir(), "outfit-system-route-")), "route.json");
  outfit("route", CASE, "--json", "--series", "--out", out);
  const json = JSON.parse(readFileSync(out, "utf8")) as { storms: StormJson[]; checks: { name: string; pond?: string; key: string }[]; compliant: boolean; ponds: { name: string; to: string }[] };

  it("reports per storm the flow at the outfall and each pond's maxStage, peakOutflow, peakReverse and massBalanceError (the contract's fields)", () => {
    expect(json.ponds.map((p) => [p.name, p.to])).toEqual([["upper", "lower"], ["lower", "outfall"]]);
    for (const storm of json.storms) {
      expect(storm.ratio).toBeCloseTo(storm.peakOutflow / storm.target!, 12);
      expect(storm.ponds.map((p) => p.name)).toEqual(["upper", "lower"]);
      for (const p of storm.ponds) {
        for (const field of ["maxStage", "peakOutflow", "peakReverse", "massBalanceError"] as const) expect(Number.isFinite(p[field]), `${storm.name} ${p.name} ${field}`).toBe(true);
        expect(Math.abs(p.massBalanceError)).toBeLessThan(1e-4);
      }
      // The pond at the outfall passes what reaches the outfall.
      expect(storm.ponds[1].peakOutflow).toBeCloseTo(storm.peakOutflow, 9);
      expect(storm.ponds[1].peakReverse).toBe(0);
    }
  });

  it("the demo's lower pond rises above the upper pond during every storm, and water flows back through the pipe", () => {
    for (const storm of json.storms) {
      const s = storm.series!;
      const above = s["lower stage (ft)"].some((z, i) => z > s["upper stage (ft)"][i] + 0.05 && s["upper outflow (cfs)"][i] < 0);
      expect(above, storm.name).toBe(true);
      expect(storm.ponds[0].peakReverse, storm.name).toBeGreaterThan(1);
      expect(storm.ponds[0].volumeBack, storm.name).toBeGreaterThan(100);
      // The series carry seven significant figures.
      expect(Math.min(...s["upper outflow (cfs)"]) / -storm.ponds[0].peakReverse).toBeCloseTo(1, 6);
    }
  });

  it("checks every pond by name and the targets at the outfall; the demo complies", () => {
    expect(json.compliant).toBe(true);
    const ponds = new Set(json.checks.map((c) => c.pond));
    expect([...ponds].sort()).toEqual(["lower", "outfall", "upper"]);
    expect(json.checks.filter((c) => c.pond === "outfall").every((c) => c.key.startsWith("peak-"))).toBe(true);
    expect(json.checks.some((c) => c.name === "upper: 100-yr freeboard")).toBe(true);
    expect(json.checks.some((c) => c.name === "lower: 10-yr spillway dry")).toBe(true);
  });

  it("prints tables within 80 columns at COLUMNS=80, each pond's and the outfall's", () => {
    const r = outfitWith({ COLUMNS: "80" }, "route", CASE);
    expect(r.status).toBe(0);
    expect(widest(r.stdout)).toBeLessThanOrEqual(80);
    expect(r.stdout).toContain("a system of 2 ponds: upper -> lower -> outfall");
    expect(r.stdout).toContain("At the outfall");
    expect(r.stdout).toContain("Pond upper (peak out: into lower through its outlet; peak back: from lower");
    expect(r.stdout).toMatch(/Caution:/);
  });

  it("writes each storm's series of every pond as CSV, which integrate again to the routed volumes", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-system-series-"));
    expect(outfit("route", CASE, "--csv-dir", dir).status).toBe(0);
    expect(readdirSync(dir).sort()).toEqual(["10-yr.csv", "100-yr.csv", "2-yr.csv"]);
    const lines = readFileSync(join(dir, "10-yr.csv"), "utf8").trim().split("\n");
    expect(lines[0]).toBe("time (min),outfall (cfs),upper inflow (cfs),upper stage (ft),upper storage (ft3),upper outflow (cfs),lower inflow (cfs),lower stage (ft),lower storage (ft3),lower outflow (cfs)");
    const rows = lines.slice(1).map((l) => l.split(",").map(Number));
    let volume = 0;
    for (let i = 1; i < rows.length; i++) volume += 0.5 * (rows[i][1] + rows[i - 1][1]) * (rows[i][0] - rows[i - 1][0]) * 60;
    const storm = json.storms.find((s) => s.name === "10-yr")!;
    expect(volume / storm.volumeOut).toBeCloseTo(1, 3);
  });
});

describe("route on a system of ponds with a bypass", () => {
  it("judges the target at the point of analysis (the flow reaching the outfall plus the bypass): JSON, tables and CSV say so", () => {
    const json = JSON.parse(readFileSync(join(ROOT, CASE), "utf8"));
    const bypass = { series: [[0, 0], [600, 2], [760, 9], [900, 3], [1200, 0]] };
    const file = join(ROOT, "cases", "two-ponds", "with-bypass.tmp.json");
    writeFileSync(file, JSON.stringify({ ...json, storms: json.storms.map((s: object) => ({ ...s, bypass })) }));
    const dir = mkdtempSync(join(tmpdir(), "outfit-system-bypass-"));
    try {
      const routed = JSON.parse(outfit("route", file, "--json").stdout) as { storms: (StormJson & { peakAtPoint: number; bypassAtPeak: number; peakBypass: number })[]; checks: { pond?: string; kind: string; value: number; storm: string }[] };
      for (const storm of routed.storms) {
        expect(storm.peakAtPoint, storm.name).toBeGreaterThan(storm.peakOutflow);
        expect(storm.peakAtPoint, storm.name).toBeLessThanOrEqual(storm.peakOutflow + storm.peakBypass + 1e-9);
        expect(storm.ratio).toBeCloseTo(storm.peakAtPoint / storm.target!, 12);
        const check = routed.checks.find((k) => k.pond === "outfall" && k.kind === "peak-upper" && k.storm === storm.name)!;
        expect(check.value).toBeCloseTo(storm.peakAtPoint, 9);
      }
      const text = outfitWith({ COLUMNS: "80" }, "route", file);
      expect(widest(text.stdout)).toBeLessThanOrEqual(80);
      expect(text.stdout).toContain("At point: the flow reaching the outfall");
      expect(outfit("route", file, "--csv-dir", dir).status).toBe(0);
      expect(readFileSync(join(dir, "10-yr.csv"), "utf8").split("\n")[0]).toMatch(/^time \(min\),outfall \(cfs\),bypass \(cfs\),at point \(cfs\),/);
    } finally {
      rmSync(file);
    }
  });
});

describe("the other commands on a system of ponds", () => {
  it("design --size-pond says it sizes one pond (exit 2, no stack); design itself designs the system (tests/search/systemDesign.test.ts)", () => {
    const r = outfit("design", CASE, "--size-pond");
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("ponds: found a system of 2 ponds");
    expect(r.stderr).toContain("designed together by outfit design (without --size-pond)");
    expect(looksLikeStackTrace(r.stderr)).toBe(false);
  });

  it("rate: the link as a table of both stages (back flow negative) and the pond at the outfall's rating, within 80 columns", () => {
    const r = outfitWith({ COLUMNS: "80" }, "rate", CASE);
    expect(r.status).toBe(0);
    expect(widest(r.stdout)).toBeLessThanOrEqual(80);
    expect(r.stdout).toContain("Flow (cfs) by the stage of upper (rows) and of lower (columns, ft); negative:");
    const rated = JSON.parse(outfit("rate", CASE, "--json").stdout) as { ponds: { name: string; to: string; flows?: number[][]; upstreamStages?: number[]; downstreamStages?: number[]; rating?: unknown }[] };
    const link = rated.ponds[0];
    expect(link.to).toBe("lower");
    // The level pipe passes the same flow either way for the same two levels.
    const nearest = (stages: number[], z: number) => stages.findIndex((s) => Math.abs(s - z) < 1e-6);
    const at = (up: number, down: number) => link.flows![nearest(link.upstreamStages!, up)][nearest(link.downstreamStages!, down)];
    expect(at(104, 105)).toBeCloseTo(-at(105, 104), 6);
    expect(at(104, 105)).toBeLessThan(0);
    expect(rated.ponds[1].rating).toBeDefined();
    expect(outfit("rate", CASE, "--csv").status).toBe(2);
    const csv = outfit("rate", CASE, "--csv", "--pond", "upper");
    expect(csv.status).toBe(0);
    expect(csv.stdout.split("\n")[0]).toBe("upper stage (ft),lower stage (ft),flow (cfs)");
  });

  it("volume: the system against the outfall's target and all ponds' storage, saying how", () => {
    const r = outfitWith({ COLUMNS: "80" }, "volume", CASE);
    expect(r.status).toBe(0);
    expect(widest(r.stdout)).toBeLessThanOrEqual(80);
    const v = JSON.parse(outfit("volume", CASE, "--json").stdout) as { how: string; availableStorage: number; ponds: { availableStorage: number }[] };
    expect(v.how).toContain("the inflow of all ponds together against the target at the outfall");
    expect(v.availableStorage).toBeCloseTo(v.ponds[0].availableStorage + v.ponds[1].availableStorage, 6);
  });

  it("hydrograph: each pond's drainage area, within 80 columns, and one pond's as a CSV file", () => {
    const r = outfitWith({ COLUMNS: "80" }, "hydrograph", CASE);
    expect(r.status).toBe(0);
    expect(widest(r.stdout)).toBeLessThanOrEqual(80);
    expect(r.stdout).toContain("used as: inflow of pond");
    const file = join(mkdtempSync(join(tmpdir(), "outfit-system-hydrograph-")), "upper-10yr.csv");
    expect(outfit("hydrograph", CASE, "--storm", "10-yr", "--area", "upper", "--out", file).status).toBe(0);
    expect(readFileSync(file, "utf8").split("\n")[0]).toBe("minutes,flow");
  });

  it("report: HTML and Markdown with each storm's stages of every pond and flows through the link; the plotted maxima are the routed ones", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-system-report-"));
    expect(outfit("report", CASE, "--out", join(dir, "r.html")).status).toBe(0);
    const html = readFileSync(join(dir, "r.html"), "utf8");
    expect(html).toContain("System of ponds");
    expect((html.match(/data-plot="stages"/g) ?? []).length).toBe(3);
    expect((html.match(/data-plot="flows"/g) ?? []).length).toBe(3);
    expect(html).toContain("Pond upper");
    expect(outfit("report", CASE, "--format", "md", "--out", join(dir, "md", "r.md")).status).toBe(0);
    const route = JSON.parse(outfit("route", CASE, "--json").stdout) as { storms: StormJson[] };
    const svg = readFileSync(join(dir, "md", "r.fig-09-storm-2-stages.svg"), "utf8");
    const [d0, d1] = attribute(svg, "data-y-domain");
    const [r0, r1] = attribute(svg, "data-y-range");
    for (const [k, pond] of route.storms[1].ponds.entries()) {
      const path = new RegExp(`data-series="stage-${k + 1}"[^>]* d="([^"]+)"`).exec(svg)![1];
      const ys = [...path.matchAll(/[ML][\d.-]+ ([\d.-]+)/g)].map((m) => d0 + ((Number(m[1]) - r0) * (d1 - d0)) / (r1 - r0));
      // Within half a pixel of the plot's height.
      expect(Math.abs(Math.max(...ys) - pond.maxStage)).toBeLessThan((0.5 * (d1 - d0)) / Math.abs(r1 - r0));
    }
  });
});

describe("the drawing of each pond's outlet", () => {
  const route = JSON.parse(outfit("route", CASE, "--json").stdout) as { storms: StormJson[] };
  const storm = (k: number, svg: string) => Number(new RegExp(`data-level="stage" data-storm="${route.storms[k].name}" data-value="([^"]*)"`).exec(svg)![1]);

  it("drawing writes one per pond, each with that pond's peak stages in the system and its own levels", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-system-drawing-"));
    expect(outfit("drawing", CASE, "--out", dir).status).toBe(0);
    expect(readdirSync(dir).sort()).toEqual(["lower.outlet.svg", "upper.outlet.svg"]);
    const [upper, lower] = ["upper", "lower"].map((name) => readFileSync(join(dir, `${name}.outlet.svg`), "utf8"));
    route.storms.forEach((s, k) => {
      expect(storm(k, upper)).toBeCloseTo(s.ponds[0].maxStage, 9);
      expect(storm(k, lower)).toBeCloseTo(s.ponds[1].maxStage, 9);
    });
    // The upper pond's outlet is the equaliser pipe alone: an endwall with the pipe's opening through it.
    expect(upper).toContain("data-barrel-opening");
    expect(upper).not.toContain("data-opening=");
    expect(lower).toContain('data-opening="E3"');
    expect(Number(/data-level="top" data-value="([^"]*)"/.exec(upper)![1])).toBeCloseTo(108, 9);
    expect(Number(/data-level="top" data-value="([^"]*)"/.exec(lower)![1])).toBeCloseTo(107, 9);
    // One pond into a single file; several ponds into a file, or an unknown pond, are usage errors.
    expect(outfit("drawing", CASE, "--pond", "lower", "--out", join(dir, "one.svg")).status).toBe(0);
    expect(readFileSync(join(dir, "one.svg"), "utf8")).toBe(lower);
    expect(outfit("drawing", CASE, "--out", join(dir, "both.svg")).status).toBe(2);
    expect(outfit("drawing", CASE, "--pond", "middle").status).toBe(2);
  });

  it("the system's report holds a drawing of each pond's outlet", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-system-report-drawing-"));
    expect(outfit("report", CASE, "--format", "md", "--out", join(dir, "r.md")).status).toBe(0);
    const files = readdirSync(dir).filter((f) => f.includes("outlet-drawing")).sort();
    expect(files).toEqual(["r.fig-02-pond-1-outlet-drawing.svg", "r.fig-05-pond-2-outlet-drawing.svg"]);
    const lower = readFileSync(join(dir, files[1]), "utf8");
    route.storms.forEach((s, k) => expect(storm(k, lower)).toBeCloseTo(s.ponds[1].maxStage, 9));
  });

  it("the system's report gives each pond's openings their places on its wall, as `route --json` does (a pond without openings has no table)", () => {
    const dir = mkdtempSync(join(tmpdir(), "outfit-system-report-wall-"));
    expect(outfit("report", CASE, "--format", "md", "--out", join(dir, "r.md")).status).toBe(0);
    const md = readFileSync(join(dir, "r.md"), "utf8");
    const tables = md.split("**Openings on the wall").slice(1);
    const json = JSON.parse(outfit("route", CASE, "--json").stdout);
    const walls = json.ponds.map((p: { wall: { openings: unknown[] } }) => p.wall).filter((w: { openings: unknown[] }) => w.openings.length > 0);
    expect(tables).toHaveLength(walls.length);
    expect(walls.length).toBeGreaterThan(0);
    walls.forEach((wall: { openings: { label: string; station: number; width: number }[] }, i: number) => {
      const rows = tables[i].split("\n").filter((line) => /^\| E\d+ /.test(line));
      expect(rows).toHaveLength(wall.openings.length);
      wall.openings.forEach((o, k) => {
        const cells = rows[k].split("|").map((x) => x.trim());
        expect(cells[1]).toBe(o.label);
        expect(Number(cells[5])).toBeCloseTo(o.station, 2);
        expect(Number(cells[8])).toBeCloseTo(o.width, 2);
      });
    });
  });
});

function attribute(svg: string, name: string): number[] {
  return new RegExp(`${name}="([^"]+)"`).exec(svg)![1].split(" ").map(Number);
}

describe("a single pond written as a `ponds` list of one", () => {
  it.each(["demo", "si-wet-barrel", "wet-value"])("%s: route gives exactly the single pond's results (JSON apart from each storm's ponds, and the tables)", (name) => {
    const file = join(ROOT, "cases", name, "case.json");
    const json = JSON.parse(readFileSync(file, "utf8"));
    const { pond, outlet, ...rest } = json;
    const one = join(ROOT, "cases", name, "as-system-of-one.tmp.json");
    writeFileSync(one, JSON.stringify({ ...rest, ponds: [{ name: "only", pond, outlet, to: "outfall" }] }));
    try {
      const single = JSON.parse(outfit("route", file, "--json").stdout);
      const system = JSON.parse(outfit("route", one, "--json").stdout);
      for (const [i, storm] of system.storms.entries()) {
        expect(storm.ponds).toEqual([expect.objectContaining({ name: "only", maxStage: single.storms[i].maxStage, peakOutflow: single.storms[i].peakOutflow, peakReverse: 0, massBalanceError: single.storms[i].massBalanceError })]);
        delete storm.ponds;
      }
      expect(JSON.stringify(system, null, 2)).toBe(JSON.stringify(single, null, 2));
      expect(outfit("route", one).stdout).toBe(outfit("route", file).stdout);
    } finally {
      rmSync(one);
    }
  });
});
